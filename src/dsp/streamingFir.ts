/**
 * Two real FIR filters run at once over one real stream, block by block, by FFT overlap-save
 * (Oppenheim & Schafer, Discrete-Time Signal Processing, 3rd ed., §8.7.3). The two tap sets are
 * packed as one complex filter c = a + j·b: for a real input x, c * x = a * x + j·(b * x), so one
 * forward and one inverse transform of N points give both outputs.
 *
 *   ya[m] = Σ_k a[k]·x[m − k],   yb[m] = Σ_k b[k]·x[m − k],   x[n] = 0 for n < 0,
 *
 * for m = 0, 1, …: the full convolution from a zero history, in order, whatever the block sizes.
 * Outputs come out in chunks of N − L + 1 (L the longer tap count, N the transform size, a power
 * of two ≥ 4L), so up to N − L samples are held back until the next push. The transforms run
 * in the fast engine (fastFft.ts, float32): the input is written into its time buffer, the
 * product of the spectra formed in its own layout. Memory: the engine's buffers (six of 2N
 * floats with the held filter spectrum) and two output arrays of N − L + 1 doubles, fixed at
 * construction.
 */
import { fastFft, type FastFft, type HeldSpectrum } from "./fft.js";

/** Receives each chunk: outputs m = firstIndex … firstIndex + count − 1 (views valid during the call). */
export type FirSink = (a: Float64Array, b: Float64Array, count: number, firstIndex: number) => void;

/** A streaming pair of real FIR filters over one real input (module comment). */
export class StreamingFirPair {
  /** Taps of the longer set, L. */
  readonly tapCount: number;
  /** Transform size N. */
  readonly fftSize: number;
  private readonly engine: FastFft;
  /** The spectrum of the packed filter a + j·b, in the engine's layout. */
  private readonly filter: HeldSpectrum;
  private readonly outA: Float64Array;
  private readonly outB: Float64Array;
  /** Samples in `input` past the L − 1 of history. */
  private filled = 0;
  private produced = 0;

  /** Throws RangeError for an empty or non-finite tap set. `b` defaults to no second filter (zeros). */
  constructor(a: Float64Array, b?: Float64Array) {
    const second = b ?? new Float64Array(1);
    for (const [name, t] of [["a", a], ["b", second]] as const) {
      if (t.length < 1) throw new RangeError(`taps ${name} are empty`);
      for (let k = 0; k < t.length; k++) if (!Number.isFinite(t[k])) throw new RangeError(`taps ${name}[${k}] ${t[k]} is not finite`);
    }
    const l = Math.max(a.length, second.length);
    let n = 2;
    while (n < 4 * l) n *= 2;
    this.tapCount = l;
    this.fftSize = n;
    this.engine = fastFft(n);
    const taps = this.engine.time();
    for (let k = 0; k < a.length; k++) taps[2 * k] = a[k] as number;
    for (let k = 0; k < second.length; k++) taps[2 * k + 1] = second[k] as number;
    this.engine.forward();
    this.filter = this.engine.hold();
    this.engine.time().fill(0);
    this.outA = new Float64Array(n - l + 1);
    this.outB = new Float64Array(n - l + 1);
  }

  /** Outputs handed to the sink so far. */
  get outputCount(): number {
    return this.produced;
  }

  /** Feeds x[from … to) (consecutive with the previous push) and hands every completed chunk to `sink`. */
  push(x: ArrayLike<number>, sink: FirSink, from = 0, to = x.length): void {
    const hist = this.tapCount - 1;
    const block = this.fftSize - hist;
    for (let i = from; i < to;) {
      const input = this.engine.time();
      const take = Math.min(block - this.filled, to - i);
      for (let j = 0; j < take; j++) input[2 * (hist + this.filled + j)] = x[i + j] as number;
      this.filled += take;
      i += take;
      if (this.filled === block) this.runChunk(sink);
    }
  }

  /** One overlap-save step: the N − L + 1 valid outputs of the buffer, then its last L − 1 inputs become the history. */
  private runChunk(sink: FirSink): void {
    const n = this.fftSize;
    const hist = this.tapCount - 1;
    const engine = this.engine;
    engine.forward();
    engine.multiply(this.filter, 1 / n);
    engine.inverse();
    const output = engine.output();
    const count = n - hist;
    for (let j = 0; j < count; j++) {
      this.outA[j] = output[2 * (hist + j)] as number;
      this.outB[j] = output[2 * (hist + j) + 1] as number;
    }
    sink(this.outA, this.outB, count, this.produced);
    this.produced += count;
    const input = engine.time();
    input.copyWithin(0, 2 * count, 2 * (count + hist));
    this.filled = 0;
  }
}
