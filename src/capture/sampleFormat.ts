/**
 * Sample encodings and their conversion to interleaved float32, full scale = 1.0.
 *
 * Scaling (interface.md, conventions; REFERENCES.md §9, common practice):
 *   u8  (offset binary): x = (u - 127.5) / 127.5
 *   i8:  x = s / 128      i16: x = s / 32768      i24: x = s / 8388608      i32: x = s / 2147483648
 *   f32, f64: as stored (full scale 1.0 by convention)
 * A sample (frame) with a NaN or infinite component is counted and decoded as 0 + 0j, so no
 * non-finite value ever reaches the accumulators. A component at the extreme code of an integer
 * format (or at |x| >= 1 for a float format) counts as clipped.
 */
import type { SampleFormat } from "./source.js";
import { kernelScrub } from "../dsp/index.js";

export interface FormatInfo {
  readonly format: SampleFormat;
  readonly complex: boolean;
  readonly kind: "uint" | "int" | "float";
  readonly bits: 8 | 16 | 24 | 32 | 64;
  readonly littleEndian: boolean;
  /** Bytes of one component. */
  readonly componentBytes: number;
  /** Bytes of one sample frame (2 components when complex). */
  readonly frameBytes: number;
}

export const SAMPLE_FORMATS: readonly SampleFormat[] = [
  "cu8", "ci8", "ci16_le", "ci16_be", "ci24_le", "ci32_le", "cf32_le", "cf64_le",
  "ru8", "ri8", "ri16_le", "ri16_be", "ri24_le", "ri32_le", "rf32_le", "rf64_le",
];

export function isSampleFormat(s: string): s is SampleFormat {
  return (SAMPLE_FORMATS as readonly string[]).includes(s);
}

export function formatInfo(format: SampleFormat): FormatInfo {
  const complex = format[0] === "c";
  const kind = format[1] === "u" ? "uint" : format[1] === "i" ? "int" : "float";
  const bits = Number.parseInt(format.slice(2), 10) as FormatInfo["bits"];
  const componentBytes = bits / 8;
  return {
    format,
    complex,
    kind,
    bits,
    littleEndian: !format.endsWith("_be"),
    componentBytes,
    frameBytes: componentBytes * (complex ? 2 : 1),
  };
}

/** Counts gathered while decoding. `clippedComponents` counts I and Q separately. */
export interface DecodeCounts {
  clippedComponents: number;
  nonFiniteSamples: number;
}

/**
 * Decodes the whole frames in `bytes` into `out` (interleaved I,Q; Q = 0 for a real format).
 * `out` must hold at least 2 × frames values. Returns the number of frames decoded and the
 * clipping / non-finite counts. `swapIq` exchanges I and Q (a complex format only).
 */
export function decodeSamples(
  format: SampleFormat,
  bytes: Uint8Array,
  out: Float32Array,
  swapIq = false,
): DecodeCounts & { frames: number } {
  const info = formatInfo(format);
  const frames = Math.floor(bytes.byteLength / info.frameBytes);
  const components = frames * (info.complex ? 2 : 1);
  const counts = { clippedComponents: 0, nonFiniteSamples: 0 };
  const view = new DataView(bytes.buffer, bytes.byteOffset, bytes.byteLength);
  // Decode the components into out: in place for complex, at even slots for real.
  const stride = info.complex ? 1 : 2;
  switch (format) {
    case "cu8":
    case "ru8":
      counts.clippedComponents = decodeU8(bytes, components, out, stride);
      break;
    case "ci8":
    case "ri8":
      counts.clippedComponents = decodeI8(bytes, components, out, stride);
      break;
    case "ci16_le":
    case "ri16_le":
    case "ci16_be":
    case "ri16_be":
      counts.clippedComponents = decodeI16(view, components, out, stride, info.littleEndian);
      break;
    case "ci24_le":
    case "ri24_le":
      counts.clippedComponents = decodeI24(bytes, components, out, stride);
      break;
    case "ci32_le":
    case "ri32_le":
      counts.clippedComponents = decodeI32(view, components, out, stride);
      break;
    case "cf32_le":
    case "rf32_le":
      decodeF32(bytes, view, components, out, stride);
      break;
    case "cf64_le":
    case "rf64_le":
      decodeF64(view, components, out, stride);
      break;
  }
  if (!info.complex) {
    for (let k = 0; k < frames; k++) out[2 * k + 1] = 0;
  }
  if (info.kind === "float") {
    const r = scrubFloat(out, frames);
    counts.clippedComponents = r.clipped;
    counts.nonFiniteSamples = r.nonFinite;
  }
  if (swapIq && info.complex) swapPairs(out, frames);
  return { ...counts, frames };
}

function decodeU8(b: Uint8Array, n: number, out: Float32Array, stride: number): number {
  let clipped = 0;
  for (let k = 0; k < n; k++) {
    const u = b[k] as number;
    if (u === 0 || u === 255) clipped++;
    out[k * stride] = (u - 127.5) / 127.5;
  }
  return clipped;
}

function decodeI8(b: Uint8Array, n: number, out: Float32Array, stride: number): number {
  let clipped = 0;
  for (let k = 0; k < n; k++) {
    const s = ((b[k] as number) << 24) >> 24;
    if (s === -128 || s === 127) clipped++;
    out[k * stride] = s / 128;
  }
  return clipped;
}

function decodeI16(v: DataView, n: number, out: Float32Array, stride: number, le: boolean): number {
  let clipped = 0;
  for (let k = 0; k < n; k++) {
    const s = v.getInt16(2 * k, le);
    if (s === -32768 || s === 32767) clipped++;
    out[k * stride] = s / 32768;
  }
  return clipped;
}

function decodeI24(b: Uint8Array, n: number, out: Float32Array, stride: number): number {
  let clipped = 0;
  for (let k = 0; k < n; k++) {
    const o = 3 * k;
    const s = (((b[o] as number) | ((b[o + 1] as number) << 8) | ((b[o + 2] as number) << 16)) << 8) >> 8;
    if (s === -8388608 || s === 8388607) clipped++;
    out[k * stride] = s / 8388608;
  }
  return clipped;
}

function decodeI32(v: DataView, n: number, out: Float32Array, stride: number): number {
  let clipped = 0;
  for (let k = 0; k < n; k++) {
    const s = v.getInt32(4 * k, true);
    if (s === -2147483648 || s === 2147483647) clipped++;
    out[k * stride] = s / 2147483648;
  }
  return clipped;
}

function decodeF32(b: Uint8Array, v: DataView, n: number, out: Float32Array, stride: number): void {
  if (stride === 1 && b.byteOffset % 4 === 0) {
    out.set(new Float32Array(b.buffer, b.byteOffset, n));
    return;
  }
  for (let k = 0; k < n; k++) out[k * stride] = v.getFloat32(4 * k, true);
}

function decodeF64(v: DataView, n: number, out: Float32Array, stride: number): void {
  for (let k = 0; k < n; k++) out[k * stride] = v.getFloat64(8 * k, true);
}

/**
 * Zeroes frames with a non-finite component; counts them and the components at |x| >= 1. By the
 * SIMD kernel when `out` lies in the fast engine's memory (dsp kernelScrub: the same rule), else here.
 */
function scrubFloat(out: Float32Array, frames: number): { clipped: number; nonFinite: number } {
  const kernel = kernelScrub(out, frames);
  if (kernel !== null) return kernel;
  let clipped = 0;
  let nonFinite = 0;
  for (let k = 0; k < frames; k++) {
    const i = out[2 * k] as number;
    const q = out[2 * k + 1] as number;
    // One test on the usual path: both inside (-1, 1). NaN fails every comparison, so a NaN
    // or an infinity also takes the slow path below.
    if (i < 1 && i > -1 && q < 1 && q > -1) continue;
    // x - x is NaN exactly when x is NaN or infinite.
    if (i - i !== 0 || q - q !== 0) {
      nonFinite++;
      out[2 * k] = 0;
      out[2 * k + 1] = 0;
      continue;
    }
    if (i >= 1 || i <= -1) clipped++;
    if (q >= 1 || q <= -1) clipped++;
  }
  return { clipped, nonFinite };
}

function swapPairs(out: Float32Array, frames: number): void {
  for (let k = 0; k < frames; k++) {
    const t = out[2 * k] as number;
    out[2 * k] = out[2 * k + 1] as number;
    out[2 * k + 1] = t;
  }
}

/**
 * Encodes interleaved I,Q values (full scale 1.0) in `format`, rounding to the nearest code and
 * saturating at the extreme codes. For a real format only the I values are written. Used by the
 * sample generator and the tests.
 */
export function encodeSamples(format: SampleFormat, iq: ArrayLike<number>): Uint8Array {
  const info = formatInfo(format);
  const frames = Math.floor(iq.length / 2);
  const out = new Uint8Array(frames * info.frameBytes);
  const view = new DataView(out.buffer);
  const step = info.complex ? 1 : 2;
  let c = 0;
  for (let k = 0; k < iq.length && (step === 1 || k % 2 === 0); k += step) {
    const x = iq[k] as number;
    const o = c * info.componentBytes;
    switch (info.kind) {
      case "uint":
        out[o] = clampRound(x * 127.5 + 127.5, 0, 255);
        break;
      case "int":
        writeInt(view, o, info.bits, clampRound(x * 2 ** (info.bits - 1), -(2 ** (info.bits - 1)), 2 ** (info.bits - 1) - 1), info.littleEndian);
        break;
      case "float":
        if (info.bits === 32) view.setFloat32(o, x, true);
        else view.setFloat64(o, x, true);
        break;
    }
    c++;
  }
  return out;
}

function clampRound(x: number, lo: number, hi: number): number {
  const r = Math.round(x);
  return r < lo ? lo : r > hi ? hi : r;
}

function writeInt(v: DataView, o: number, bits: number, s: number, le: boolean): void {
  if (bits === 8) v.setInt8(o, s);
  else if (bits === 16) v.setInt16(o, s, le);
  else if (bits === 24) {
    v.setUint8(o, s & 0xff);
    v.setUint8(o + 1, (s >> 8) & 0xff);
    v.setUint8(o + 2, (s >> 16) & 0xff);
  } else v.setInt32(o, s, le);
}
