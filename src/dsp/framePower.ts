/**
 * The inner loops shared by the Welch and spectrogram accumulators (not part of the public
 * surface). Kept as small monomorphic functions: V8 optimises them once, for one set of types.
 */
import type { FftPlan } from "./fft.js";

/**
 * Windows `count` consecutive frames of `iq` (interleaved float32) and adds their periodograms
 * |X_k|² (natural bin order, unscaled) into sum[base + k], keeping the per-bin maximum in
 * max[base + k]. Frame f starts at complex sample `firstSample + f·hop` of `iq`.
 * `input` and `output` are the plan's scratch buffers.
 */
export function accumulateFrames(
  plan: FftPlan,
  iq: Float32Array,
  firstSample: number,
  count: number,
  hop: number,
  window: Float64Array,
  input: number[],
  output: number[],
  sum: Float64Array,
  max: Float64Array,
  base: number,
): void {
  for (let f = 0; f < count; f++) {
    loadWindowedFrame(iq, firstSample + f * hop, window, input);
    plan.forward(output, input);
    addPower(output, sum, max, base);
  }
}

/** input[2n], input[2n+1] ← w[n]·(I, Q) of complex sample `start + n` of `iq`, n = 0..N−1. */
export function loadWindowedFrame(iq: Float32Array, start: number, window: Float64Array, input: number[]): void {
  const n = window.length;
  let j = 2 * start;
  for (let i = 0, k = 0; i < n; i++, k += 2, j += 2) {
    const w = window[i] as number;
    input[k] = w * (iq[j] as number);
    input[k + 1] = w * (iq[j + 1] as number);
  }
}

/** sum[base + k] += |X_k|², max[base + k] = max(max[base + k], |X_k|²), for the N bins of `x`. */
export function addPower(x: number[], sum: Float64Array, max: Float64Array, base: number): void {
  const n = x.length >>> 1;
  for (let k = 0, j = 0, b = base; k < n; k++, j += 2, b++) {
    const re = x[j] as number;
    const im = x[j + 1] as number;
    const p = re * re + im * im;
    sum[b] = (sum[b] as number) + p;
    if (p > (max[b] as number)) max[b] = p;
  }
}
