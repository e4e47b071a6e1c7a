/**
 * The inner loops shared by the Welch, spectrogram and max-hold accumulators (not part of the
 * public surface). Kept as small monomorphic functions: V8 optimises them once, for one set of
 * types. The frame is windowed straight into the fast engine's time buffer, and the power is
 * summed from its spectrum buffer in the engine's slot order (fastFft.ts): no copy per frame.
 */
import type { DoubleStore, FastFft, FrameWindow } from "./fastFft.js";

/**
 * Windows `count` consecutive frames of `iq` (interleaved float32) and adds their periodograms
 * |X_k|² (unscaled, in the engine's slot order) into sum[base + j], keeping the per-slot maximum
 * in max[base + j]. Frame f starts at complex sample `firstSample + f·hop` of `iq`. The window
 * and stores are the engine's own (prepareWindow, createStore).
 */
export function accumulateFrames(
  engine: FastFft,
  iq: Float32Array,
  firstSample: number,
  count: number,
  hop: number,
  window: FrameWindow,
  sum: DoubleStore,
  max: DoubleStore | null,
  base: number,
): void {
  const group = framesPerStage(window.length, hop);
  for (let f0 = 0; f0 < count; f0 += group) {
    const g = Math.min(group, count - f0);
    const x = stagedFrames(engine, iq, firstSample + f0 * hop, g, hop, window.length);
    for (let f = 0; f < g; f++) {
      engine.loadWindowed(x, f * hop, window);
      engine.forward();
      engine.addPower(sum, max, base);
    }
  }
}

/** Complex samples staged in the engine's memory at a time (FastFft.staged): 64 Ki, 512 KiB. */
const STAGE_SAMPLES = 65_536;

/**
 * Frames handled per staged span, for frames of `frameLength` samples at `hop`: as many as fit
 * in STAGE_SAMPLES, at least one. A block in a plain array is staged span by span, so that the
 * staging buffer stays that size whatever the block's length (a whole 2^20-sample record, say).
 */
export function framesPerStage(frameLength: number, hop: number): number {
  return Math.max(1, Math.floor((STAGE_SAMPLES - frameLength) / hop) + 1);
}

/**
 * The span of `iq` holding `frames` frames of `frameLength` samples at `hop`, the first at complex
 * sample `firstSample`, staged in the engine's memory (FastFft.staged): frame f at f·hop of it.
 */
export function stagedFrames(engine: FastFft, iq: Float32Array, firstSample: number, frames: number, hop: number, frameLength: number): Float32Array {
  return engine.staged(iq.subarray(2 * firstSample, 2 * (firstSample + (frames - 1) * hop + frameLength)));
}
