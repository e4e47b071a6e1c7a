/**
 * Band-limiting a complex record by zeroing DFT bins outside [lowerHz, upperHz] (zero-padded to
 * at least twice its length, so the circular wrap stays in the padding). Module-internal.
 * Memory: the padded record, transformed in place (16 bytes a point: 8 MiB for 2^18 samples
 * padded to 2^19); the result is the head of it.
 */
import { transformInPlace } from "../dsp/index.js";

/**
 * The record limited to [lowerHz, upperHz] in double precision, interleaved I,Q, same length and
 * rate, and the width of the band actually kept (kept bins × fs/size, Hz).
 */
export function bandLimitedRecord(
  iq: Float32Array | Float64Array, fs: number, lowerHz: number, upperHz: number,
): { iq: Float64Array; widthHz: number } {
  const n = iq.length >> 1;
  if (lowerHz <= -fs / 2 && upperHz >= fs / 2) return { iq: Float64Array.from(iq), widthHz: fs };
  let size = 2;
  while (size < 2 * n) size *= 2;
  const x = new Float64Array(2 * size);
  for (let k = 0; k < 2 * n; k++) x[k] = iq[k] as number;
  transformInPlace(x);
  let kept = 0;
  for (let k = 0; k < size; k++) {
    const f = (k < size / 2 ? k : k - size) * (fs / size);
    if (f < lowerHz || f > upperHz) { x[2 * k] = 0; x[2 * k + 1] = 0; } else kept++;
  }
  transformInPlace(x, "inverse");
  return { iq: x.subarray(0, 2 * n), widthHz: (kept * fs) / size };
}

/** The record limited to [lowerHz, upperHz], interleaved I,Q float32, same length and rate. */
export function bandLimit(iq: Float32Array | Float64Array, fs: number, lowerHz: number, upperHz: number): Float32Array {
  return Float32Array.from(bandLimitedRecord(iq, fs, lowerHz, upperHz).iq);
}
