/**
 * A figure as it goes into a report (STYLE.md §4): its value, unit, expanded uncertainty (k = 2)
 * and a one-line method. `value` is null when the input cannot support the figure, and the reason
 * is in `warnings`. Measurement functions are pure: samples or a PSD in, Measurements out.
 */
export interface Measurement<U extends string = string> {
  readonly value: number | null;
  /** "Hz", "Db", "Dbfs", "Percent", "Bd", "S", "Ppm", "" (dimensionless), as in interface.md. */
  readonly unit: U;
  /** Expanded uncertainty (k = 2) in `unit`, or null when none can be stated. */
  readonly uncertainty: number | null;
  /** One line: estimator, parameters, reference. */
  readonly method: string;
  readonly warnings: readonly string[];
}

export function measurement<U extends string>(
  value: number | null,
  unit: U,
  uncertainty: number | null,
  method: string,
  warnings: readonly string[] = [],
): Measurement<U> {
  const finite = value !== null && Number.isFinite(value) ? value : null;
  const u = uncertainty !== null && Number.isFinite(uncertainty) ? Math.abs(uncertainty) : null;
  const w = value !== null && finite === null ? [...warnings, `${method}: the estimate was not finite`] : warnings;
  return { value: finite, unit, uncertainty: finite === null ? null : u, method, warnings: w };
}

/** A figure that does not apply or could not be formed, with the reason. */
export function notAvailable<U extends string>(unit: U, method: string, reason: string): Measurement<U> {
  return { value: null, unit, uncertainty: null, method, warnings: [reason] };
}
