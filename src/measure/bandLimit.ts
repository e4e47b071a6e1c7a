/**
 * Band-limiting a complex record by zeroing DFT bins outside [lowerHz, upperHz] (zero-padded to
 * at least twice its length, so the circular wrap stays in the padding). Module-internal.
 */
import { fftPlan } from "../dsp/index.js";

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
  const plan = fftPlan(size);
  const a = plan.createBuffer();
  const b = plan.createBuffer();
  for (let k = 0; k < 2 * n; k++) a[k] = iq[k] as number;
  plan.forward(b, a);
  let kept = 0;
  for (let k = 0; k < size; k++) {
    const f = (k < size / 2 ? k : k - size) * (fs / size);
    if (f < lowerHz || f > upperHz) { b[2 * k] = 0; b[2 * k + 1] = 0; } else kept++;
  }
  plan.inverse(a, b);
  return { iq: Float64Array.from(a.slice(0, 2 * n)), widthHz: (kept * fs) / size };
}

/** The record limited to [lowerHz, upperHz], interleaved I,Q float32, same length and rate. */
export function bandLimit(iq: Float32Array | Float64Array, fs: number, lowerHz: number, upperHz: number): Float32Array {
  return Float32Array.from(bandLimitedRecord(iq, fs, lowerHz, upperHz).iq);
}
