/**
 * Frequency error in parts per million (REFERENCES.md §10, definition):
 *   ppm = (f_measured − f_assigned) / f_assigned × 10⁶.
 * E.g. +750 Hz at 150 MHz is +5 ppm.
 */
import { measurement, notAvailable, type Measurement } from "./measurement.js";

/** The note a carrier's method carries when the receiver's frequency reference is not in its
 * uncertainty (no --reference-ppm); report.md looks for it. */
export const REFERENCE_NOT_INCLUDED = "the receiver's frequency reference is not included (give --reference-ppm)";

/** (measuredHz − assignedHz)/assignedHz·1e6. Throws RangeError unless assignedHz > 0 and both are finite. */
export function frequencyErrorPpm(measuredHz: number, assignedHz: number): number {
  if (!(assignedHz > 0) || !Number.isFinite(assignedHz)) throw new RangeError(`assignedHz ${assignedHz} is not a positive finite frequency`);
  if (!Number.isFinite(measuredHz)) throw new RangeError(`measuredHz ${measuredHz} is not finite`);
  return ((measuredHz - assignedHz) / assignedHz) * 1e6;
}

/**
 * The same for a measured absolute frequency (Hz) with its uncertainty, which scales by
 * 1e6/assignedHz. Null when the measurement has no value.
 */
export function frequencyErrorPpmOf(measured: Measurement<"Hz">, assignedHz: number): Measurement<"Ppm"> {
  const method = `(measured - assigned)/assigned x 1e6, assigned ${assignedHz} Hz${measured.method.includes(REFERENCE_NOT_INCLUDED) ? `; ${REFERENCE_NOT_INCLUDED}` : ""}`;
  if (measured.value === null) return notAvailable("Ppm", method, "no measured frequency");
  const u = measured.uncertainty === null ? null : (measured.uncertainty / assignedHz) * 1e6;
  return measurement(frequencyErrorPpm(measured.value, assignedHz), "Ppm", u, method, measured.warnings);
}
