// Helpers for the block-contract tests: the same samples fed as one block, as random-sized
// blocks each carrying a prefix of `prefix` samples before its owned start, and to two
// accumulators taking alternate blocks (the orchestrator's two workers).
import { afterAll, beforeAll } from "vitest";
import { fftImplementation, pffftAvailable, setFftImplementation, type FftImplementation } from "../../src/dsp/index.js";
import { SeededRandom } from "../../src/scenario/index.js";

export interface BlockSink {
  push(iq: Float32Array, dataStart: number, ownedStart?: number): void;
}

/** Owned ranges [start, stop) of random sizes 1..maxOwned covering [0, total). */
export function randomPartition(total: number, maxOwned: number, seed: number): Array<[number, number]> {
  const rng = new SeededRandom(seed);
  const parts: Array<[number, number]> = [];
  let start = 0;
  while (start < total) {
    const stop = Math.min(total, start + 1 + rng.integer(maxOwned));
    parts.push([start, stop]);
    start = stop;
  }
  return parts;
}

/** Feeds `iq` (interleaved) owned range by owned range, each block with its prefix. */
export function pushBlocks(sinks: readonly BlockSink[], iq: Float32Array, parts: Array<[number, number]>, prefix: number): void {
  parts.forEach(([owned, stop], i) => {
    const dataStart = Math.max(0, owned - prefix);
    const sink = sinks[i % sinks.length] as BlockSink;
    sink.push(iq.subarray(2 * dataStart, 2 * stop), dataStart, owned);
  });
}

/** Largest |a − b| over max |a|, for comparing results computed in different orders. */
export function maxRelativeDifference(a: ArrayLike<number>, b: ArrayLike<number>): number {
  let scale = 0;
  let diff = 0;
  for (let i = 0; i < a.length; i++) {
    scale = Math.max(scale, Math.abs(a[i] as number));
    diff = Math.max(diff, Math.abs((a[i] as number) - (b[i] as number)));
  }
  return scale > 0 ? diff / scale : diff;
}

/** A complex tone A·e^(j(2πf n/fs + phase)) of n samples, interleaved float32. */
export function complexTone(n: number, amplitude: number, frequencyHz: number, sampleRateHz: number, phaseRad = 0): Float32Array {
  const out = new Float32Array(2 * n);
  for (let k = 0; k < n; k++) {
    const a = (2 * Math.PI * frequencyHz * k) / sampleRateHz + phaseRad;
    out[2 * k] = amplitude * Math.cos(a);
    out[2 * k + 1] = amplitude * Math.sin(a);
  }
  return out;
}

/** The fast-FFT implementations this process can run: PFFFT SIMD (where it loads) and fft.js. */
export const FFT_IMPLEMENTATIONS: FftImplementation[] = pffftAvailable() ? ["pffft-simd", "fftjs"] : ["fftjs"];

/** Inside a describe: its tests run with `implementation` chosen, the process's choice restored after. */
export function useFftImplementation(implementation: FftImplementation): void {
  const before = fftImplementation().implementation;
  beforeAll(() => setFftImplementation(implementation));
  afterAll(() => setFftImplementation(before));
}
