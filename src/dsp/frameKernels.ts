/**
 * The per-frame loops of the PFFFT engine in WebAssembly SIMD (frameKernels.wat, assembled into
 * frameKernelsWasm.ts), instantiated on the PFFFT module's own memory so that they read and
 * write the engine's buffers in place. All pointers are byte offsets into that memory.
 */
import { FRAME_KERNELS_WASM_BASE64 } from "./frameKernelsWasm.js";

interface KernelExports {
  window(src: number, win: number, dst: number, count: number): void;
  power(spec: number, sum: number, max: number, count: number): void;
  power32(spec: number, sum: number, max: number, count: number): void;
  moments(src: number, count: number, out: number): void;
  scrub(src: number, frames: number, out: number): void;
}

/** The kernels, bound to one memory. */
export class FrameKernels {
  private readonly exports: KernelExports;

  /** Throws (a WebAssembly.CompileError or LinkError) where WebAssembly SIMD is missing. */
  constructor(memory: WebAssembly.Memory) {
    const bytes = Uint8Array.from(atob(FRAME_KERNELS_WASM_BASE64), (c) => c.charCodeAt(0));
    const instance = new WebAssembly.Instance(new WebAssembly.Module(bytes), { env: { memory } });
    this.exports = instance.exports as unknown as KernelExports;
  }

  /** dst[i] = src[i]·win[i], i < count floats (count a multiple of 4; win 16-byte aligned, dst too). */
  window(src: number, win: number, dst: number, count: number): void {
    this.exports.window(src, win, dst, count);
  }

  /** Power of `count` slots of a z-domain spectrum into float64 sums (and maxima when max ≠ 0). */
  power(spec: number, sum: number, max: number, count: number): void {
    this.exports.power(spec, sum, max, count);
  }

  /** As `power`, into float32 sums and maxima. */
  power32(spec: number, sum: number, max: number, count: number): void {
    this.exports.power32(spec, sum, max, count);
  }

  /** Shifted sums of `count` (≥ 1) complex float32 samples into 7 float64 at `out`: K_I, K_Q, Σd_I, Σd_Q, Σd_I², Σd_Q², Σd_I·d_Q, d = x − K, K the first sample (frameKernels.wat). */
  moments(src: number, count: number, out: number): void {
    this.exports.moments(src, count, out);
  }

  /** Zeroes samples with a non-finite component; writes (non-finite samples, clipped components) as two int32 at `out`. */
  scrub(src: number, frames: number, out: number): void {
    this.exports.scrub(src, frames, out);
  }
}
