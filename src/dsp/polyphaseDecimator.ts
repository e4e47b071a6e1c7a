/**
 * Complex FIR filtering and downsampling by an integer factor D in one step, computing only the
 * outputs that are kept (the direct form evaluated at the output rate, which does the same
 * multiplications as the polyphase form: L/D per input sample; Crochiere & Rabiner 1983,
 * Multirate Digital Signal Processing, §3.3.2):
 *
 *   y[m] = Σ_{k=0}^{L−1} h[k]·x[m·D − k],   x[n] = 0 for n < 0,
 *
 * with real taps h and complex x. The last L − 1 inputs are kept between calls, so any partition
 * of the input into blocks gives the same outputs. After N inputs in all, ⌈N/D⌉ outputs have
 * been produced. Output m belongs to input time m·D; for linear-phase taps the filter delays the
 * signal by (L − 1)/2 input samples (`delaySamples`).
 *
 * With a KernelArena (chainKernels.ts) and symmetric taps, the buffers live in the arena and the
 * dot products run in its SIMD kernel, to the same values as the JavaScript loop.
 */
import type { KernelArena } from "./chainKernels.js";

/** Real-tap FIR decimator over interleaved I,Q blocks with history carried between calls. */
export class PolyphaseDecimator {
  /** Downsampling factor D (a positive integer; 1 filters without decimating). */
  readonly factor: number;
  /** Tap count L. */
  readonly tapCount: number;
  /** Group delay of symmetric taps, (L − 1)/2, in input samples. */
  readonly delaySamples: number;
  private readonly reversed: Float64Array;
  private readonly symmetric: boolean;
  // Interleaved working buffer: the L − 1 most recent inputs, then the new block.
  private buffer: Float32Array;
  // Inputs to skip at the start of the next block before the next kept output position.
  private phase = 0;
  // Samples announced by beginBlock and not yet filtered.
  private pending = 0;
  // With reuseOutput, the array every block's outputs are written to (grown when a block needs more).
  private output: Float32Array | null;
  // The kernels' arena (symmetric taps only), and where the taps, the working buffer and the
  // outputs sit in it (pointers, capacities in floats); `buffer` is then unused.
  private readonly arena: KernelArena | null;
  private readonly tapsPtr: number = 0;
  private bufPtr = 0;
  private bufFloats = 0;
  private outPtr = 0;
  private outFloats = 0;

  /**
   * `taps` real coefficients (at least one, all finite), `factor` a positive integer.
   * `reuseOutput` (default false): every call returns a view of one array of the decimator,
   * overwritten by the next call (for a caller that copies or consumes the outputs at once, so
   * that a long stream leaves no garbage behind); else a new array every call.
   * `arena`: run the SIMD kernel there (symmetric taps; else it is not used).
   * Throws RangeError otherwise.
   */
  constructor(taps: Float64Array, factor: number, reuseOutput = false, arena: KernelArena | null = null) {
    if (taps.length < 1) throw new RangeError(`taps length ${taps.length} is not at least 1`);
    for (let k = 0; k < taps.length; k++) {
      if (!Number.isFinite(taps[k])) throw new RangeError(`taps[${k}] ${taps[k]} is not finite`);
    }
    if (!(Number.isInteger(factor) && factor >= 1)) {
      throw new RangeError(`factor ${factor} is not a positive integer`);
    }
    this.factor = factor;
    this.tapCount = taps.length;
    this.delaySamples = (taps.length - 1) / 2;
    const L = taps.length;
    this.reversed = new Float64Array(L);
    for (let k = 0; k < L; k++) this.reversed[k] = taps[L - 1 - k] as number;
    let symmetric = true;
    for (let k = 0; k < L; k++) if (taps[k] !== taps[L - 1 - k]) symmetric = false;
    this.symmetric = symmetric;
    const floats = 2 * (L - 1) + 2 * 4096;
    this.output = reuseOutput ? new Float32Array(0) : null;
    this.arena = symmetric ? arena : null;
    if (this.arena === null) {
      this.buffer = new Float32Array(floats);
    } else {
      this.buffer = new Float32Array(0);
      this.tapsPtr = this.arena.alloc(8 * L);
      this.arena.f64(this.tapsPtr, L).set(this.reversed);
      this.bufPtr = this.arena.alloc(4 * floats);
      this.bufFloats = floats;
    }
  }

  /** The working buffer: the array, or a fresh view of it in the arena. */
  private workingBuffer(): Float32Array {
    return this.arena === null ? this.buffer : this.arena.f32(this.bufPtr, this.bufFloats);
  }

  /**
   * Back to the state of a new decimator: the history zeroed, the next input is a kept output's
   * position again. The outputs after a reset are those of a new decimator given the same inputs.
   */
  reset(): void {
    this.workingBuffer().fill(0, 0, 2 * (this.tapCount - 1));
    this.phase = 0;
    this.pending = 0;
  }

  /**
   * Filters the block `iq` (interleaved I,Q, any even length, including 0) and returns the kept
   * outputs it completes, interleaved, in a new array (or, with reuseOutput, the decimator's).
   */
  push(iq: Float32Array): Float32Array {
    if (iq.length % 2 !== 0) throw new RangeError(`iq length ${iq.length} is not even (interleaved I,Q)`);
    const arena = this.arena;
    if (arena !== null && arena.holds(iq)) {
      // A view into the arena (the stage before's outputs) is detached if beginBlock grows it: taken again after.
      const { byteOffset, length } = iq;
      const into = this.beginBlock(length / 2);
      into.set(arena.f32(byteOffset, length));
    } else {
      this.beginBlock(iq.length / 2).set(iq);
    }
    return this.endBlock();
  }

  /**
   * The place for the next `sampleCount` inputs (interleaved, 2·sampleCount floats), for a caller
   * that writes them in place (ChannelExtractor's mixer) instead of handing over a block; then
   * call `endBlock`. `push(iq)` is `beginBlock(n).set(iq)` followed by `endBlock()`.
   */
  beginBlock(sampleCount: number): Float32Array {
    if (!(Number.isInteger(sampleCount) && sampleCount >= 0)) {
      throw new RangeError(`sampleCount ${sampleCount} is not a non-negative integer`);
    }
    const history = this.tapCount - 1;
    const total = history + sampleCount;
    const arena = this.arena;
    if (arena !== null) {
      if (this.bufFloats < 2 * total) {
        const floats = 2 * total + 2 * (total >> 1);
        const ptr = arena.alloc(4 * floats);
        arena.f32(ptr, 2 * history).set(arena.f32(this.bufPtr, 2 * history));
        this.bufPtr = ptr;
        this.bufFloats = floats;
      }
      this.pending = sampleCount;
      return arena.f32(this.bufPtr + 8 * history, 2 * sampleCount);
    }
    if (this.buffer.length < 2 * total) {
      const grown = new Float32Array(2 * total + 2 * (total >> 1));
      grown.set(this.buffer.subarray(0, 2 * history));
      this.buffer = grown;
    }
    this.pending = sampleCount;
    return this.buffer.subarray(2 * history, 2 * total);
  }

  /** Filters the inputs written since `beginBlock` and returns the kept outputs, interleaved. */
  endBlock(): Float32Array {
    const n = this.pending;
    this.pending = 0;
    const total = this.tapCount - 1 + n;
    const D = this.factor;
    const outCount = this.phase < n ? Math.floor((n - 1 - this.phase) / D) + 1 : 0;
    if (this.arena !== null) return this.endBlockInArena(this.arena, n, total, outCount);
    const buf = this.buffer;
    const out = this.outputArray(2 * outCount);
    // Output j's newest input sits at buffer index history + phase + j·D; its oldest at phase + j·D.
    if (this.symmetric) {
      symmetricDots(buf, this.phase, D, outCount, this.reversed, out);
    } else {
      plainDots(buf, this.phase, D, outCount, this.reversed, out);
    }
    this.phase = outCount * D + this.phase - n;
    buf.copyWithin(0, 2 * n, 2 * total);
    return out;
  }

  /** endBlock with the buffers in the arena: the SIMD kernel; the outputs a view there (reuseOutput) or a copy. */
  private endBlockInArena(arena: KernelArena, n: number, total: number, outCount: number): Float32Array {
    if (this.outFloats < 2 * outCount) {
      this.outFloats = 2 * outCount + 2 * (outCount >> 1);
      this.outPtr = arena.alloc(4 * this.outFloats);
    }
    arena.symdots(this.bufPtr, this.phase, this.factor, outCount, this.tapsPtr, this.tapCount, this.outPtr);
    this.phase = outCount * this.factor + this.phase - n;
    arena.f32(this.bufPtr, 2 * total).copyWithin(0, 2 * n, 2 * total);
    const out = arena.f32(this.outPtr, 2 * outCount);
    return this.output === null ? out.slice() : out;
  }

  /** A new array of `length` values, or with reuseOutput a view of the decimator's own. */
  private outputArray(length: number): Float32Array {
    if (this.output === null) return new Float32Array(length);
    if (this.output.length < length) this.output = new Float32Array(length + (length >> 1));
    return this.output.subarray(0, length);
  }
}

/** out[j] = Σ_k hr[k]·buf[first + j·D + k], k = 0..L−1 (complex buf, real hr). */
function plainDots(buf: Float32Array, first: number, D: number, count: number, hr: Float64Array, out: Float32Array): void {
  const L = hr.length;
  for (let j = 0; j < count; j++) {
    let re = 0;
    let im = 0;
    let p = 2 * (first + j * D);
    for (let k = 0; k < L; k++, p += 2) {
      const h = hr[k] as number;
      re += h * (buf[p] as number);
      im += h * (buf[p + 1] as number);
    }
    out[2 * j] = re;
    out[2 * j + 1] = im;
  }
}

/**
 * As plainDots for hr[k] = hr[L−1−k]: pairs the samples that share a tap, halving the
 * multiplications (common practice for linear-phase FIR filters).
 */
function symmetricDots(buf: Float32Array, first: number, D: number, count: number, hr: Float64Array, out: Float32Array): void {
  const L = hr.length;
  const pairs = L >> 1;
  const middle = (L & 1) === 1;
  for (let j = 0; j < count; j++) {
    let re = 0;
    let im = 0;
    let a = 2 * (first + j * D);
    let b = a + 2 * (L - 1);
    // Two accumulator pairs shorten the chain of dependent additions (common practice).
    let re1 = 0;
    let im1 = 0;
    let k = 0;
    for (; k + 1 < pairs; k += 2, a += 4, b -= 4) {
      const h = hr[k] as number;
      const g = hr[k + 1] as number;
      re += h * ((buf[a] as number) + (buf[b] as number));
      im += h * ((buf[a + 1] as number) + (buf[b + 1] as number));
      re1 += g * ((buf[a + 2] as number) + (buf[b - 2] as number));
      im1 += g * ((buf[a + 3] as number) + (buf[b - 1] as number));
    }
    if (k < pairs) {
      const h = hr[k] as number;
      re += h * ((buf[a] as number) + (buf[b] as number));
      im += h * ((buf[a + 1] as number) + (buf[b + 1] as number));
      a += 2;
    }
    re += re1;
    im += im1;
    if (middle) {
      const h = hr[pairs] as number;
      re += h * (buf[a] as number);
      im += h * (buf[a + 1] as number);
    }
    out[2 * j] = re;
    out[2 * j + 1] = im;
  }
}
