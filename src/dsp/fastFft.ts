/**
 * The fast transforms of the heavy paths (pass 1's Welch and spectrogram frames, the channel
 * extraction of `measure`, the channelizer of `survey`, the mask's max hold), in float32, with
 * their buffers where the engine computes: no copy per frame between the caller's window and the
 * power it sums. Two engines share one interface; fft.ts chooses between them.
 *
 * - `PffftFft`: PFFFT (J. Pommier, "PFFFT: a pretty fast FFT", SIMD radix-2/3/4/5 kernels; the
 *   BSD-licensed C compiled to WebAssembly with 128-bit SIMD by @echogarden/pffft-wasm). Buffers
 *   live in the module's linear memory. Its spectrum is in PFFFT's own ("unordered", z-domain)
 *   layout: natural bin k sits at float `layout.realIndex[k]` (real part) and that + 4
 *   (imaginary part); power sums and fast convolution never need the natural order, so they run
 *   on that layout and the order is restored once, at the end, through `layout.slotBin`.
 * - `FftJsFft`: fft.js (radix-4, the reference implementation of fft.ts) on Float32Array
 *   buffers, natural order (realIndex[k] = 2k, imaginary part + 1): the fallback where
 *   WebAssembly SIMD is missing, and the second implementation of every agreement test.
 *
 * Conventions (those of fft.ts): forward X[k] = Σ_n x[n]·e^(−j2πkn/N), unscaled; `inverse` is the
 * unscaled sum x[n] = Σ_k X[k]·e^(+j2πkn/N) (so inverse(forward(x)) = N·x; the 1/N goes into a
 * `multiply` scale or the caller's own factor).
 *
 * A buffer view (`time()`, `spectrum()`) is valid until the next allocation in the engine's
 * memory (a new engine of any size may grow it): take it again for each frame, never keep it.
 */

import type { FrameKernels } from "./frameKernels.js";

/** The implementations fft.ts can choose. */
export type FftImplementation = "pffft-simd" | "fftjs";

/** Where each bin of an engine's spectrum buffer is (see the module comment). */
export interface SpectrumLayout {
  /** Float index of Re X[k] for natural bin k (0 … N − 1); Im X[k] is at realIndex[k] + imagOffset. */
  readonly realIndex: Uint32Array;
  readonly imagOffset: number;
  /**
   * The natural bin of power slot j: `addPower` adds |X|² of slot j at index base + j, slots
   * being the spectrum's (re, im) pairs in memory order of their real parts.
   */
  readonly slotBin: Uint32Array;
  /** The slot of natural bin k: binSlot[slotBin[j]] = j. */
  readonly binSlot: Uint32Array;
}

/** A spectrum kept for `multiply` (an engine's filter response), in that engine's layout. */
export interface HeldSpectrum {
  readonly size: number;
  readonly implementation: FftImplementation;
}

/** Doubles kept where an engine's kernels can reach them (power sums): a view taken again at each use. */
export interface DoubleStore {
  readonly length: number;
  /** The values; valid until the next allocation in the engine's memory. */
  view(): Float64Array;
}

/** Float32 samples kept where an engine's kernels can reach them (decoded blocks): a view taken again at each use. */
export interface FloatStore {
  readonly length: number;
  /** The values; valid until the next allocation in the engine's memory. */
  view(): Float32Array;
}

/** A window prepared for an engine's `loadWindowed` (each coefficient twice, float32). */
export interface FrameWindow {
  /** Window length L (≤ the engine's N; the rest of the frame stays zero). */
  readonly length: number;
  readonly implementation: FftImplementation;
}

/** One engine instance: its own time and spectrum buffers of one size (module comment). */
export interface FastFft {
  /** Transform length N (complex points). */
  readonly size: number;
  readonly implementation: FftImplementation;
  readonly layout: SpectrumLayout;
  /** The time-domain input, 2N floats interleaved re, im: read by `forward`, left as it was. */
  time(): Float32Array;
  /** The spectrum buffer, 2N floats in `layout`: output of `forward`, input of `inverse`. */
  spectrum(): Float32Array;
  /** The time-domain output of `inverse`, 2N floats interleaved (a buffer of its own, not `time()`). */
  output(): Float32Array;
  /** spectrum ← DFT(time), unscaled. */
  forward(): void;
  /** output ← unscaled inverse DFT of spectrum (N·x for a spectrum that `forward` made of x). */
  inverse(): void;
  /** spectrum ← spectrum · h · scale, bin by bin (h from `hold` of an engine of this size and kind). */
  multiply(h: HeldSpectrum, scale: number): void;
  /** A copy of the current spectrum, kept for `multiply`. */
  hold(): HeldSpectrum;
  /**
   * For every slot j of the spectrum, p = re² + im²: sum[base + j] += p and, with `max`,
   * max[base + j] = max(max[base + j], p). Slot j is natural bin layout.slotBin[j].
   */
  addPower(sum: DoubleStore, max: DoubleStore | null, base: number): void;
  /** As `addPower`, into float32 stores (the spectrogram's rows: half the memory). */
  addPowerFloat(sum: FloatStore, max: FloatStore | null, base: number): void;
  /** A store of `length` zeroed doubles for `addPower`. */
  createStore(length: number): DoubleStore;
  /** A store of `length` zeroed floats for `addPowerFloat`. */
  createFloatStore(length: number): FloatStore;
  /** The window w (length L ≤ N) prepared for `loadWindowed`. */
  prepareWindow(w: Float64Array): FrameWindow;
  /**
   * time[2n], time[2n + 1] ← w[n]·(I, Q) of complex sample `start + n` of `iq`, n < L (the
   * window's length; time beyond 2L is left as it is, zero unless written). Fastest when `iq`
   * is a view of a `FloatStore` of this implementation (in the engine's memory).
   */
  loadWindowed(iq: Float32Array, start: number, window: FrameWindow): void;
  /**
   * `iq` where `loadWindowed` is fastest: itself when it lies in the engine's memory (or the
   * engine has none), else a copy in a staging buffer of the engine's, valid until the next
   * `staged` call or allocation in that memory. One copy of a span of frames (framePower.ts
   * stagedFrames, at most 64 Ki samples), so that its frames are windowed without a copy each.
   */
  staged(iq: Float32Array): Float32Array;
}

/** The parts of the PFFFT WebAssembly module that the engine calls (Emscripten exports). */
export interface PffftModule {
  HEAPF32: Float32Array;
  _pffft_new_setup(size: number, transform: number): number;
  _pffft_aligned_malloc(bytes: number): number;
  _pffft_aligned_free(pointer: number): void;
  _pffft_transform(setup: number, input: number, output: number, work: number, direction: number): void;
  _pffft_zreorder(setup: number, input: number, output: number, direction: number): void;
  _pffft_zconvolve_accumulate(setup: number, a: number, b: number, ab: number, scaling: number): void;
  _pffft_simd_size(): number;
}

const PFFFT_COMPLEX = 1;
const PFFFT_FORWARD = 0;
const PFFFT_BACKWARD = 1;

/** Setups and layouts of the PFFFT engine, one per size for the life of the process. */
const pffftSetups = new Map<number, { setup: number; layout: SpectrumLayout }>();

/** True when PFFFT can transform N complex points: N a multiple of 16 (SIMD width squared), so every power of two from 16. */
export function pffftSupports(size: number): boolean {
  return Number.isInteger(size) && size >= 16 && size % 16 === 0;
}

/** PFFFT's module and the frame kernels bound to its memory (fft.ts loads both). */
export interface PffftContext {
  readonly module: PffftModule;
  readonly kernels: FrameKernels;
}

class PffftHeld implements HeldSpectrum {
  readonly implementation = "pffft-simd";
  constructor(readonly size: number, readonly pointer: number) {}
}

/** Frees a block of the module's memory once the object that owns it is collected. */
const pffftFree = new FinalizationRegistry<{ module: PffftModule; pointers: number[] }>(({ module, pointers }) => {
  for (const p of pointers) module._pffft_aligned_free(p);
});

/** A typed-array kind that can view the module's memory. */
interface HeapArrayKind<A extends Float32Array | Float64Array> {
  readonly BYTES_PER_ELEMENT: number;
  new (buffer: ArrayBufferLike, byteOffset: number, length: number): A;
}

/** `length` values of one kind in the module's memory (16-byte aligned), zeroed; the view taken again after growth. */
class PffftArray<A extends Float32Array | Float64Array> {
  readonly pointer: number;
  private cached: A;

  constructor(private readonly module: PffftModule, readonly length: number, private readonly kind: HeapArrayKind<A>) {
    this.pointer = allocate(module, kind.BYTES_PER_ELEMENT * Math.max(length, 1));
    pffftFree.register(this, { module, pointers: [this.pointer] });
    this.cached = new kind(module.HEAPF32.buffer, this.pointer, length);
    this.cached.fill(0);
  }

  view(): A {
    const buffer = this.module.HEAPF32.buffer;
    if (this.cached.buffer !== buffer) this.cached = new this.kind(buffer, this.pointer, this.length);
    return this.cached;
  }
}

/** `length` doubles in the module's memory. */
export class PffftDoubles extends PffftArray<Float64Array> implements DoubleStore {
  constructor(module: PffftModule, length: number) {
    super(module, length, Float64Array);
  }
}

/** `length` float32 values in the module's memory. */
export class PffftFloats extends PffftArray<Float32Array> implements FloatStore {
  constructor(module: PffftModule, length: number) {
    super(module, length, Float32Array);
  }
}

class PffftWindow implements FrameWindow {
  readonly implementation = "pffft-simd";
  /** The window as float32 pairs (w0, w0, w1, w1, …), padded to a multiple of 4 floats. */
  readonly store: PffftFloats;
  constructor(module: PffftModule, w: Float64Array) {
    this.store = new PffftFloats(module, 4 * Math.ceil((2 * w.length) / 4));
    const v = this.store.view();
    for (let i = 0; i < w.length; i++) v[2 * i] = v[2 * i + 1] = w[i] as number;
  }
  get length(): number {
    return this.store.length >> 1;
  }
}

/** The PFFFT engine of one size (module comment). */
export class PffftFft implements FastFft {
  readonly implementation = "pffft-simd";
  readonly layout: SpectrumLayout;
  private readonly module: PffftModule;
  private readonly kernels: FrameKernels;
  private readonly setup: number;
  private readonly timePointer: number;
  private readonly outputPointer: number;
  private readonly workPointer: number;
  /** Two spectrum buffers: `multiply` writes the product into the other one and swaps. */
  private spectrumPointer: number;
  private otherPointer: number;
  private heap: Float32Array;
  private timeView: Float32Array;
  private spectrumView: Float32Array;
  private outputView: Float32Array;
  /** Samples copied in for `staged`, grown to the largest span staged. */
  private stage: PffftFloats | null = null;

  /** Throws RangeError unless pffftSupports(size). */
  constructor(context: PffftContext, readonly size: number) {
    if (!pffftSupports(size)) throw new RangeError(`PFFFT transform of ${size} points: not a multiple of 16`);
    const module = context.module;
    this.module = module;
    this.kernels = context.kernels;
    const { setup, layout } = pffftSetup(module, size);
    this.setup = setup;
    this.layout = layout;
    const bytes = 8 * size;
    this.timePointer = allocate(module, bytes);
    this.outputPointer = allocate(module, bytes);
    this.workPointer = allocate(module, bytes);
    this.spectrumPointer = allocate(module, bytes);
    this.otherPointer = allocate(module, bytes);
    pffftFree.register(this, { module, pointers: [this.timePointer, this.outputPointer, this.workPointer, this.spectrumPointer, this.otherPointer] });
    this.heap = module.HEAPF32;
    this.heap.fill(0, this.timePointer >> 2, (this.timePointer >> 2) + 2 * size);
    this.heap.fill(0, this.spectrumPointer >> 2, (this.spectrumPointer >> 2) + 2 * size);
    this.timeView = this.view(this.timePointer);
    this.spectrumView = this.view(this.spectrumPointer);
    this.outputView = this.view(this.outputPointer);
  }

  time(): Float32Array {
    this.refresh();
    return this.timeView;
  }

  spectrum(): Float32Array {
    this.refresh();
    return this.spectrumView;
  }

  output(): Float32Array {
    this.refresh();
    return this.outputView;
  }

  forward(): void {
    this.module._pffft_transform(this.setup, this.timePointer, this.spectrumPointer, this.workPointer, PFFFT_FORWARD);
  }

  inverse(): void {
    this.module._pffft_transform(this.setup, this.spectrumPointer, this.outputPointer, this.workPointer, PFFFT_BACKWARD);
  }

  multiply(h: HeldSpectrum, scale: number): void {
    if (!(h instanceof PffftHeld) || h.size !== this.size) throw new RangeError(`multiply by a ${h.implementation} spectrum of ${h.size} points in a ${this.size}-point PFFFT engine`);
    this.refresh();
    const from = this.otherPointer >> 2;
    this.heap.fill(0, from, from + 2 * this.size);
    this.module._pffft_zconvolve_accumulate(this.setup, this.spectrumPointer, h.pointer, this.otherPointer, scale);
    [this.spectrumPointer, this.otherPointer] = [this.otherPointer, this.spectrumPointer];
    this.spectrumView = this.view(this.spectrumPointer);
  }

  hold(): HeldSpectrum {
    const pointer = allocate(this.module, 8 * this.size);
    this.refresh();
    const from = this.spectrumPointer >> 2;
    this.heap.copyWithin(pointer >> 2, from, from + 2 * this.size);
    const held = new PffftHeld(this.size, pointer);
    pffftFree.register(held, { module: this.module, pointers: [pointer] });
    return held;
  }

  addPower(sum: DoubleStore, max: DoubleStore | null, base: number): void {
    if (!(sum instanceof PffftDoubles) || (max !== null && !(max instanceof PffftDoubles))) throw new RangeError("addPower needs stores made by this engine (createStore)");
    if (base < 0 || base + this.size > sum.length || (max !== null && base + this.size > max.length)) throw new RangeError(`addPower at ${base}: outside the store`);
    this.kernels.power(this.spectrumPointer, sum.pointer + 8 * base, max === null ? 0 : max.pointer + 8 * base, this.size);
  }

  addPowerFloat(sum: FloatStore, max: FloatStore | null, base: number): void {
    if (!(sum instanceof PffftFloats) || (max !== null && !(max instanceof PffftFloats))) throw new RangeError("addPowerFloat needs stores made by this engine (createFloatStore)");
    if (base < 0 || base + this.size > sum.length || (max !== null && base + this.size > max.length)) throw new RangeError(`addPowerFloat at ${base}: outside the store`);
    this.kernels.power32(this.spectrumPointer, sum.pointer + 4 * base, max === null ? 0 : max.pointer + 4 * base, this.size);
  }

  createStore(length: number): DoubleStore {
    return new PffftDoubles(this.module, length);
  }

  createFloatStore(length: number): FloatStore {
    return new PffftFloats(this.module, length);
  }

  prepareWindow(w: Float64Array): FrameWindow {
    if (w.length > this.size) throw new RangeError(`window of ${w.length} points in a ${this.size}-point engine`);
    return new PffftWindow(this.module, w);
  }

  staged(iq: Float32Array): Float32Array {
    if (iq.buffer === this.module.HEAPF32.buffer) return iq;
    // The allocation may grow the memory: `iq` is not in it, and the views are taken after.
    if (this.stage === null || this.stage.length < iq.length) this.stage = new PffftFloats(this.module, iq.length + (iq.length >> 1));
    const into = this.stage.view().subarray(0, iq.length);
    into.set(iq);
    return into;
  }

  loadWindowed(iq: Float32Array, start: number, window: FrameWindow): void {
    if (!(window instanceof PffftWindow)) throw new RangeError("loadWindowed needs a window made by this engine (prepareWindow)");
    this.refresh();
    const count = 2 * window.length;
    if (start < 0 || 2 * start + count > iq.length) throw new RangeError(`frame at ${start} of ${window.length} samples: outside the ${iq.length / 2} samples`);
    if (iq.buffer === this.heap.buffer && count % 4 === 0) {
      this.kernels.window(iq.byteOffset + 8 * start, window.store.pointer, this.timePointer, count);
      return;
    }
    const w = window.store.view();
    const t = this.timeView;
    for (let i = 0, j = 2 * start; i < count; i++, j++) t[i] = (w[i] as number) * (iq[j] as number);
  }

  /** Takes new views when the module's memory has grown (its old buffer is then detached). */
  private refresh(): void {
    if (this.module.HEAPF32 === this.heap) return;
    this.heap = this.module.HEAPF32;
    this.timeView = this.view(this.timePointer);
    this.spectrumView = this.view(this.spectrumPointer);
    this.outputView = this.view(this.outputPointer);
  }

  private view(pointer: number): Float32Array {
    return this.heap.subarray(pointer >> 2, (pointer >> 2) + 2 * this.size);
  }
}

function allocate(module: PffftModule, bytes: number): number {
  const p = module._pffft_aligned_malloc(bytes);
  if (p === 0) throw new RangeError(`the FFT engine could not allocate ${bytes} bytes`);
  return p;
}

/**
 * The setup of one size and its layout, read from PFFFT itself: a buffer whose float i holds i,
 * reordered from the z-domain to natural order (`pffft_zreorder`, a pure permutation of floats),
 * tells where each natural bin's real part sits.
 */
function pffftSetup(module: PffftModule, size: number): { setup: number; layout: SpectrumLayout } {
  const known = pffftSetups.get(size);
  if (known !== undefined) return known;
  const setup = module._pffft_new_setup(size, PFFFT_COMPLEX);
  if (setup === 0) throw new RangeError(`PFFFT has no setup for ${size} points`);
  const a = allocate(module, 8 * size);
  const b = allocate(module, 8 * size);
  const heap = module.HEAPF32;
  for (let i = 0; i < 2 * size; i++) heap[(a >> 2) + i] = i;
  module._pffft_zreorder(setup, a, b, PFFFT_FORWARD);
  const realIndex = new Uint32Array(size);
  const slotBin = new Uint32Array(size);
  const binSlot = new Uint32Array(size);
  const ordered = module.HEAPF32;
  for (let k = 0; k < size; k++) {
    const f = ordered[(b >> 2) + 2 * k] as number;
    realIndex[k] = f;
    // Slot j: the pair whose real part is float 8·⌊j/4⌋ + (j mod 4), imaginary 4 floats on.
    const j = 4 * Math.floor(f / 8) + (f % 8);
    slotBin[j] = k;
    binSlot[k] = j;
  }
  module._pffft_aligned_free(a);
  module._pffft_aligned_free(b);
  const entry = { setup, layout: { realIndex, imagOffset: 4, slotBin, binSlot } };
  pffftSetups.set(size, entry);
  return entry;
}

/** What the fft.js engine needs of fft.js (fft.ts passes the class in). */
export interface FftJsEngine {
  transform(out: ArrayLike<number> & { [i: number]: number }, data: ArrayLike<number>): void;
  inverseTransform(out: ArrayLike<number> & { [i: number]: number }, data: ArrayLike<number>): void;
}

class FftJsHeld implements HeldSpectrum {
  readonly implementation = "fftjs";
  constructor(readonly size: number, readonly values: Float32Array) {}
}

const naturalLayouts = new Map<number, SpectrumLayout>();

/** The natural-order layout of N bins: realIndex[k] = 2k, imaginary part next, slot j = bin j. */
function naturalLayout(size: number): SpectrumLayout {
  let layout = naturalLayouts.get(size);
  if (layout === undefined) {
    const realIndex = new Uint32Array(size);
    const slotBin = new Uint32Array(size);
    for (let k = 0; k < size; k++) {
      realIndex[k] = 2 * k;
      slotBin[k] = k;
    }
    layout = { realIndex, imagOffset: 1, slotBin, binSlot: slotBin };
    naturalLayouts.set(size, layout);
  }
  return layout;
}

/** The fft.js engine of one size (module comment): Float32Array buffers, natural order. */
export class FftJsFft implements FastFft {
  readonly implementation = "fftjs";
  readonly layout: SpectrumLayout;
  private readonly timeBuffer: Float32Array;
  private readonly outputBuffer: Float32Array;
  private spectrumBuffer: Float32Array;
  private otherBuffer: Float32Array;

  constructor(private readonly engine: FftJsEngine, readonly size: number) {
    this.layout = naturalLayout(size);
    this.timeBuffer = new Float32Array(2 * size);
    this.outputBuffer = new Float32Array(2 * size);
    this.spectrumBuffer = new Float32Array(2 * size);
    this.otherBuffer = new Float32Array(2 * size);
  }

  time(): Float32Array {
    return this.timeBuffer;
  }

  spectrum(): Float32Array {
    return this.spectrumBuffer;
  }

  output(): Float32Array {
    return this.outputBuffer;
  }

  forward(): void {
    this.engine.transform(this.spectrumBuffer, this.timeBuffer);
  }

  /** fft.js's inverse is scaled by 1/N; this one is not (module comment), so N is put back. */
  inverse(): void {
    this.engine.inverseTransform(this.outputBuffer, this.spectrumBuffer);
    const x = this.outputBuffer;
    const n = this.size;
    for (let i = 0; i < x.length; i++) x[i] = (x[i] as number) * n;
  }

  multiply(h: HeldSpectrum, scale: number): void {
    if (!(h instanceof FftJsHeld) || h.size !== this.size) throw new RangeError(`multiply by a ${h.implementation} spectrum of ${h.size} points in a ${this.size}-point fft.js engine`);
    const x = this.spectrumBuffer;
    const y = this.otherBuffer;
    const v = h.values;
    for (let i = 0; i < x.length; i += 2) {
      const xr = x[i] as number;
      const xi = x[i + 1] as number;
      const hr = v[i] as number;
      const hi = v[i + 1] as number;
      y[i] = (xr * hr - xi * hi) * scale;
      y[i + 1] = (xr * hi + xi * hr) * scale;
    }
    [this.spectrumBuffer, this.otherBuffer] = [this.otherBuffer, this.spectrumBuffer];
  }

  hold(): HeldSpectrum {
    return new FftJsHeld(this.size, this.spectrumBuffer.slice());
  }

  addPower(sum: DoubleStore, max: DoubleStore | null, base: number): void {
    addPowerNatural(this.spectrumBuffer, sum.view(), max === null ? null : max.view(), base);
  }

  addPowerFloat(sum: FloatStore, max: FloatStore | null, base: number): void {
    addPowerNatural(this.spectrumBuffer, sum.view(), max === null ? null : max.view(), base);
  }

  createStore(length: number): DoubleStore {
    const values = new Float64Array(length);
    return { length, view: () => values };
  }

  createFloatStore(length: number): FloatStore {
    return plainFloatStore(length);
  }

  prepareWindow(w: Float64Array): FrameWindow {
    if (w.length > this.size) throw new RangeError(`window of ${w.length} points in a ${this.size}-point engine`);
    return new FftJsWindow(w);
  }

  staged(iq: Float32Array): Float32Array {
    return iq;
  }

  loadWindowed(iq: Float32Array, start: number, window: FrameWindow): void {
    if (!(window instanceof FftJsWindow)) throw new RangeError("loadWindowed needs a window made by this engine (prepareWindow)");
    const w = window.values;
    if (start < 0 || 2 * (start + w.length) > iq.length) throw new RangeError(`frame at ${start} of ${w.length} samples: outside the ${iq.length / 2} samples`);
    const t = this.timeBuffer;
    for (let i = 0, j = 2 * start; i < w.length; i++, j += 2) {
      const c = w[i] as number;
      t[2 * i] = c * (iq[j] as number);
      t[2 * i + 1] = c * (iq[j + 1] as number);
    }
  }
}

/**
 * For the N natural-order bins of `x`: p = re² + im², total[base + k] += p and, with `top`,
 * top[base + k] = max(top[base + k], p) (stored at the arrays' precision).
 */
function addPowerNatural(x: Float32Array, total: Float64Array | Float32Array, top: Float64Array | Float32Array | null, base: number): void {
  const n = x.length >> 1;
  for (let k = 0, b = base; k < n; k++, b++) {
    const re = x[2 * k] as number;
    const im = x[2 * k + 1] as number;
    const p = re * re + im * im;
    total[b] = (total[b] as number) + p;
    if (top !== null && p > (top[b] as number)) top[b] = p;
  }
}

class FftJsWindow implements FrameWindow {
  readonly implementation = "fftjs";
  constructor(readonly values: Float64Array) {}
  get length(): number {
    return this.values.length;
  }
}

/** A FloatStore in the JavaScript heap (the fft.js engine's, and PFFFT's before it loads). */
export function plainFloatStore(length: number): FloatStore {
  const values = new Float32Array(length);
  return { length, view: () => values };
}

/**
 * values[base + j] of slot order → natural order: out[k] = values[base + j] for slotBin[j] = k,
 * for the N slots from `base`, written at out[outBase + k].
 */
export function slotsToNatural(layout: SpectrumLayout, values: Float64Array | Float32Array, base: number, out: Float64Array | Float32Array, outBase: number): void {
  const slotBin = layout.slotBin;
  for (let j = 0; j < slotBin.length; j++) out[outBase + (slotBin[j] as number)] = values[base + j] as number;
}

/** The inverse of slotsToNatural: out[outBase + j] = values[base + slotBin[j]]. */
export function naturalToSlots(layout: SpectrumLayout, values: Float64Array | Float32Array, base: number, out: Float64Array | Float32Array, outBase: number): void {
  const slotBin = layout.slotBin;
  for (let j = 0; j < slotBin.length; j++) out[outBase + j] = values[base + (slotBin[j] as number)] as number;
}
