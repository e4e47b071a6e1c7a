/**
 * The one FFT of iqaudit: the only module that imports an FFT library. Two kinds of transform:
 *
 * - `fftPlan(N)`: the reference, fft.js (radix-4, complex, double precision) on plain `number[]`
 *   buffers, for the light uses (filter design, one-off checks) and as the reference the fast
 *   engines are tested against.
 * - `fastFft(N)`: the engine of the heavy paths (fastFft.ts), float32, its buffers inside the
 *   engine: PFFFT compiled to WebAssembly with 128-bit SIMD (@echogarden/pffft-wasm, BSD-3-Clause)
 *   when this process can run it, else fft.js on Float32Array buffers.
 * - `transformInPlace` (transformInPlace.ts): long one-off transforms of a whole record, double precision.
 *
 * How the fast engine is chosen, once per process: the environment variable IQAUDIT_FFT =
 * `fftjs` forces fft.js; `pffft` demands PFFFT (a process that cannot load it then stops with
 * one line saying why); unset or `auto` takes PFFFT when its SIMD module loads (WebAssembly
 * SIMD, in Node since 16.4) and fft.js otherwise. Sizes PFFFT cannot do (below 16 points) use
 * fft.js whatever the choice. `fftImplementation()` tells what was chosen and why, for reports
 * and benchmarks; `setFftImplementation` changes it for tests that run both.
 *
 * Conventions (set here, once):
 * - Buffers of `fftPlan` are plain `number[]` of length 2N, interleaved re, im, made by
 *   `createBuffer()`. fft.js runs fastest on plain arrays.
 * - `forward` is the unscaled DFT X[k] = Σ_n x[n]·exp(−j2πkn/N) (the sign of the engineering
 *   convention, e.g. Oppenheim & Schafer, Discrete-Time Signal Processing, eq. 8.11).
 *   `fftPlan`'s `inverse` is scaled by 1/N, so inverse(forward(x)) = x; the fast engine's
 *   inverse is unscaled (fastFft.ts).
 * - Bin order is natural: bin 0 is DC, bins 1..N/2−1 are positive frequencies k·fs/N, bin N/2 is
 *   the Nyquist bin (reported as −fs/2), bins N/2+1..N−1 are the negative frequencies
 *   (k − N)·fs/N. `toCentredOrder` turns that into centred order, index i ↔ (i − N/2)·fs/N,
 *   which is the order of every PSD and spectrogram iqaudit hands on. The fast engine's
 *   spectrum has a layout of its own (fastFft.ts), mapped to natural order by its `layout`.
 * - N is a power of two, at least 2 (an fft.js requirement).
 */
import { readFileSync } from "node:fs";
import FFT from "fft.js";
import { FftJsFft, PffftDoubles, PffftFft, PffftFloats, pffftSupports, plainFloatStore, type FastFft, type FftImplementation, type FloatStore, type PffftContext, type PffftModule } from "./fastFft.js";
import { FrameKernels } from "./frameKernels.js";

export { isFftSize, naturalBinIndex, toCentredOrder } from "./fftOrder.js";
export { transformInPlace } from "./transformInPlace.js";
export {
  slotsToNatural, naturalToSlots, type DoubleStore, type FastFft, type FftImplementation, type FloatStore, type FrameWindow,
  type HeldSpectrum, type SpectrumLayout,
} from "./fastFft.js";

/** What was chosen for the fast engine, and why. */
export interface FftChoice {
  readonly implementation: FftImplementation;
  /** One line: the setting and, when PFFFT is not used, the reason. */
  readonly reason: string;
  /** Why the IQAUDIT_FFT setting cannot be honoured, or null. */
  readonly problem: string | null;
}

/** PFFFT's SIMD module with the frame kernels on its memory, or why it could not be loaded (loaded once, when this module is). */
const pffft: { context: PffftContext | null; failure: string } = await loadPffft();

/**
 * Loads PFFFT's SIMD build through Emscripten's `instantiateWasm` hook, instantiating its .wasm
 * here so that its memory is known, and binds the frame kernels to that memory.
 */
async function loadPffft(): Promise<{ context: PffftContext | null; failure: string }> {
  if (process.env.IQAUDIT_FFT === "fftjs") return { context: null, failure: "IQAUDIT_FFT=fftjs" };
  try {
    const entry = import.meta.resolve("@echogarden/pffft-wasm/simd");
    const wasm = new WebAssembly.Module(readFileSync(new URL("pffft.wasm", entry)));
    let memory: WebAssembly.Memory | null = null;
    const instantiateWasm = (imports: Record<string, Record<string, unknown>>, receive: (instance: WebAssembly.Instance) => void): Record<string, unknown> => {
      const instance = new WebAssembly.Instance(wasm, imports);
      memory = Object.values(instance.exports).find((e) => e instanceof WebAssembly.Memory) as WebAssembly.Memory | null ?? null;
      receive(instance);
      return instance.exports;
    };
    const factory = (await import("@echogarden/pffft-wasm/simd")).default;
    const module = (await factory({ instantiateWasm })) as PffftModule;
    if (memory === null) throw new Error("its module exports no memory");
    return { context: { module, kernels: new FrameKernels(memory) }, failure: "" };
  } catch (e) {
    return { context: null, failure: `the PFFFT SIMD module did not load (${e instanceof Error ? e.message : String(e)})` };
  }
}

let choice: FftChoice = initialChoice(process.env.IQAUDIT_FFT);

/**
 * The choice of the setting. A setting that cannot be honoured (an unknown value; `pffft` where it
 * does not load) leaves fft.js chosen and a `problem`, which the CLI reports as one line and
 * `fastFft` throws, so that nothing is computed with an engine that was not asked for.
 */
function initialChoice(setting: string | undefined): FftChoice {
  if (setting === "fftjs") return { implementation: "fftjs", reason: "fft.js, forced by IQAUDIT_FFT=fftjs", problem: null };
  if (setting !== undefined && setting !== "" && setting !== "auto" && setting !== "pffft") {
    return { implementation: "fftjs", reason: "fft.js", problem: `IQAUDIT_FFT=${setting} is not one of fftjs, pffft, auto` };
  }
  if (pffft.context !== null) {
    return { implementation: "pffft-simd", reason: `PFFFT SIMD (WebAssembly)${setting === "pffft" ? ", IQAUDIT_FFT=pffft" : ""}`, problem: null };
  }
  if (setting === "pffft") return { implementation: "fftjs", reason: "fft.js", problem: `IQAUDIT_FFT=pffft, but ${pffft.failure}` };
  return { implementation: "fftjs", reason: `fft.js: ${pffft.failure}`, problem: null };
}

/** The fast engine's implementation and the reason it was chosen. */
export function fftImplementation(): FftChoice {
  return choice;
}

/** Whether PFFFT can be used in this process (for tests that run both implementations). */
export function pffftAvailable(): boolean {
  return pffft.context !== null;
}

/** Sets the implementation of engines made from now on (tests run both). Throws RangeError if PFFFT is asked for and cannot load. */
export function setFftImplementation(implementation: FftImplementation): void {
  if (implementation === "pffft-simd" && pffft.context === null) throw new RangeError(`PFFFT is not available: ${pffft.failure}`);
  choice = { implementation, reason: implementation === "fftjs" ? "fft.js, set by the caller" : "PFFFT SIMD (WebAssembly), set by the caller", problem: null };
}

/**
 * A new fast engine of N points with its own buffers (fastFft.ts), of the chosen implementation,
 * or of `implementation` when given. Throws RangeError unless N is a power of two ≥ 2, or when
 * the IQAUDIT_FFT setting cannot be honoured (FftChoice.problem).
 */
export function fastFft(size: number, implementation: FftImplementation = choice.implementation): FastFft {
  if (choice.problem !== null) throw new RangeError(choice.problem);
  if (!Number.isInteger(size) || size < 2 || (size & (size - 1)) !== 0) {
    throw new RangeError(`fftLength ${size} is not a power of two of at least 2`);
  }
  if (implementation === "pffft-simd" && pffft.context !== null && pffftSupports(size)) return new PffftFft(pffft.context, size);
  return new FftJsFft(fftJsEngine(size), size);
}

/**
 * A store of `length` float32 samples where the chosen engine's kernels read them fastest (the
 * PFFFT module's memory), for decoded blocks that are then windowed, transformed and measured.
 */
export function sampleStore(length: number): FloatStore {
  if (choice.implementation === "pffft-simd" && pffft.context !== null) return new PffftFloats(pffft.context.module, length);
  return plainFloatStore(length);
}

/**
 * mean I, mean Q, Σ(I−μI)², Σ(Q−μQ)², Σ(I−μI)(Q−μQ) of complex samples first … n − 1 of `iq`
 * computed by the SIMD kernel in one pass on data shifted by its first sample when `iq` lies in the PFFFT module's memory; null otherwise (the
 * caller then computes them itself).
 */
export function kernelMoments(iq: Float32Array, first: number, n: number): Float64Array | null {
  const context = pffft.context;
  if (context === null || iq.buffer !== context.module.HEAPF32.buffer || n <= first) return null;
  const out = kernelOut ?? (kernelOut = new PffftDoubles(context.module, 7));
  const count = n - first;
  context.kernels.moments(iq.byteOffset + 8 * first, count, out.pointer);
  // From the sums about K (shifted data: Chan, Golub & LeVeque 1983): μ = K + Σd/n,
  // Σ(x − μ)² = Σd² − (Σd)²/n, Σ(I − μI)(Q − μQ) = Σd_I·d_Q − Σd_I·Σd_Q/n.
  const [kI, kQ, sI, sQ, sII, sQQ, sIQ] = out.view() as unknown as [number, number, number, number, number, number, number];
  return Float64Array.of(kI + sI / count, kQ + sQ / count, sII - (sI * sI) / count, sQQ - (sQ * sQ) / count, sIQ - (sI * sQ) / count);
}

/** The kernels' small output (7 doubles), shared: one kernel call at a time in a thread. */
let kernelOut: PffftDoubles | null = null;

/**
 * The scrub of float samples by the SIMD kernel, when `iq` lies in the PFFFT module's memory:
 * samples 0 … frames − 1 with a NaN or infinite component become 0 and are counted, components
 * with |x| ≥ 1 are counted as clipped. Null otherwise (the caller then scrubs them itself).
 */
export function kernelScrub(iq: Float32Array, frames: number): { clipped: number; nonFinite: number } | null {
  const context = pffft.context;
  if (context === null || iq.buffer !== context.module.HEAPF32.buffer || 2 * frames > iq.length) return null;
  const out = kernelOut ?? (kernelOut = new PffftDoubles(context.module, 7));
  context.kernels.scrub(iq.byteOffset, frames, out.pointer);
  const counts = new Int32Array(context.module.HEAPF32.buffer, out.pointer, 2);
  return { nonFinite: counts[0] as number, clipped: counts[1] as number };
}

const fftJsEngines = new Map<number, FFT>();

/** One fft.js instance per size (its tables; it keeps no state between calls). */
function fftJsEngine(size: number): FFT {
  let engine = fftJsEngines.get(size);
  if (engine === undefined) {
    engine = new FFT(size);
    if (size <= CACHED_MAX_SIZE) fftJsEngines.set(size, engine);
  }
  return engine;
}

/** A planned transform of one size: twiddles and bit reversal computed once, then reused. */
export interface FftPlan {
  /** Transform length N (complex points). */
  readonly size: number;
  /** A zeroed interleaved buffer of 2N numbers, the only kind `forward`/`inverse` accept. */
  createBuffer(): number[];
  /** out ← DFT(input), unscaled. `out` and `input` must be different buffers. */
  forward(out: number[], input: number[]): void;
  /** out ← IDFT(input), scaled by 1/N. `out` and `input` must be different buffers. */
  inverse(out: number[], input: number[]): void;
}

const plans = new Map<number, FftPlan>();
/** Plans up to this size are kept for the life of the process; larger ones are built for the
 * call and left to the garbage collector, so their tables (16 bytes a point) do not stay
 * resident (long transforms of a whole record use `transformInPlace` instead). */
const CACHED_MAX_SIZE = 1 << 16;

/**
 * The plan for size N, created on first use and cached by size for the life of the process.
 * Throws RangeError unless N is a power of two ≥ 2.
 */
export function fftPlan(size: number): FftPlan {
  const cached = plans.get(size);
  if (cached !== undefined) return cached;
  if (!Number.isInteger(size) || size < 2 || (size & (size - 1)) !== 0) {
    throw new RangeError(`fftLength ${size} is not a power of two of at least 2`);
  }
  const engine = new FFT(size);
  const plan: FftPlan = {
    size,
    createBuffer: () => doubleBuffer(engine.createComplexArray()),
    forward: (out, input) => engine.transform(out, input),
    inverse: (out, input) => engine.inverseTransform(out, input),
  };
  if (size <= CACHED_MAX_SIZE) plans.set(size, plan);
  return plan;
}

/**
 * Zeroes `a` through a non-integer value, so that V8 stores it as an array of doubles from the
 * start; fft.js is then compiled once for that element kind and never has to deoptimise when a
 * buffer changes from small integers to doubles.
 */
function doubleBuffer(a: number[]): number[] {
  for (let i = 0; i < a.length; i++) a[i] = 0.5;
  for (let i = 0; i < a.length; i++) a[i] = 0;
  return a;
}

