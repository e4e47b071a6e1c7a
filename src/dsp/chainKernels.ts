/**
 * The channel extractor's loops in WebAssembly SIMD: the mixer (Nco) and the symmetric-tap dot
 * products of the decimator (PolyphaseDecimator), the "mix" and "symdots" functions of
 * frameKernels.wat. They do the JavaScript loops' operations in the same order in float64x2, so
 * their outputs are the JavaScript loops' to the bit (a test checks it); they are faster because
 * each complex sample is one vector and there are no bounds checks.
 *
 * Each extractor has an arena: a WebAssembly memory of its own holding its taps, tables and
 * sample buffers, so that nothing else grows it (growth detaches the views into it; the users
 * take fresh views after any allocation). Used on the SIMD path, the one where the fast FFT
 * engine is PFFFT (fft.ts; IQAUDIT_FFT=fftjs takes the JavaScript loops throughout).
 */
import { FRAME_KERNELS_WASM_BASE64 } from "./frameKernelsWasm.js";
import { fftImplementation } from "./fft.js";

interface ChainExports {
  mix(y: number, count: number, table: number, c: number, s: number): void;
  symdots(buf: number, first: number, D: number, count: number, taps: number, L: number, out: number): void;
}

const PAGE_BYTES = 65_536;

let compiled: WebAssembly.Module | null | undefined;

/** The kernels' module, compiled once; null where WebAssembly SIMD is missing. */
function kernelModule(): WebAssembly.Module | null {
  if (compiled === undefined) {
    try {
      compiled = new WebAssembly.Module(Uint8Array.from(atob(FRAME_KERNELS_WASM_BASE64), (c) => c.charCodeAt(0)));
    } catch {
      compiled = null;
    }
  }
  return compiled;
}

/** Whether extractors use the kernels by default: on the SIMD path, when the module compiles. */
export function chainKernelsByDefault(): boolean {
  return fftImplementation().implementation === "pffft-simd" && kernelModule() !== null;
}

/** A bump allocator over a memory of its own, with the kernels bound to it. Pointers are byte offsets. */
export class KernelArena {
  private readonly memory: WebAssembly.Memory;
  private readonly exports: ChainExports;
  private top = 16;

  /** Throws where WebAssembly SIMD is missing. */
  constructor(initialBytes = 4 * PAGE_BYTES) {
    const module = kernelModule();
    if (module === null) throw new Error("WebAssembly SIMD is not available");
    this.memory = new WebAssembly.Memory({ initial: Math.max(1, Math.ceil(initialBytes / PAGE_BYTES)) });
    this.exports = new WebAssembly.Instance(module, { env: { memory: this.memory } }).exports as unknown as ChainExports;
  }

  /** `bytes` zeroed bytes, 16-byte aligned; grows the memory when needed (detaching every view into it). */
  alloc(bytes: number): number {
    const ptr = (this.top + 15) & ~15;
    const end = ptr + bytes;
    const have = this.memory.buffer.byteLength;
    if (end > have) this.memory.grow(Math.ceil((end - have) / PAGE_BYTES));
    this.top = end;
    return ptr;
  }

  f32(ptr: number, length: number): Float32Array {
    return new Float32Array(this.memory.buffer, ptr, length);
  }

  f64(ptr: number, length: number): Float64Array {
    return new Float64Array(this.memory.buffer, ptr, length);
  }

  /** Whether `view` lies in this arena's memory (its byteOffset is then its pointer). */
  holds(view: ArrayBufferView): boolean {
    return view.buffer === this.memory.buffer;
  }

  /** The mixer in place over `count` samples at `y`, table entries from `table` (frameKernels.wat "mix"). */
  mix(y: number, count: number, table: number, c: number, s: number): void {
    this.exports.mix(y, count, table, c, s);
  }

  /** The symmetric-tap dot products (frameKernels.wat "symdots"). */
  symdots(buf: number, first: number, D: number, count: number, taps: number, L: number, out: number): void {
    this.exports.symdots(buf, first, D, count, taps, L, out);
  }
}
