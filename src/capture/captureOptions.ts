/**
 * The capture options a user gives on the command line, their checks, and the wording of the
 * warning when a flag overrides a value found in the file's metadata.
 */
import { UsageError } from "../errors.js";
import { centerProblem, SAMPLE_RATE_MIN_HZ, sampleRateProblem } from "./acceptedRanges.js";
import type { Origin, SampleFormat } from "./source.js";

/** Every field optional; each comes from a CLI flag (named in brackets). */
export interface CaptureOptions {
  /** [--format] How to read the file: a raw sample format, or "wav". Overrides SigMF core:datatype. */
  readonly format?: SampleFormat | "wav" | undefined;
  /** [--rate] Sample rate, samples/s (Hz). Overrides the rate from a header or the file name. */
  readonly sampleRateHz?: number | undefined;
  /** [--center] RF centre frequency of the capture, Hz. Overrides SigMF core:frequency. */
  readonly centerHz?: number | undefined;
  /** [--ppm] Receiver clock error, ppm; stored in the metadata, applied by the measurements. */
  readonly ppm?: number | undefined;
  /** [--swap-iq] Exchange I and Q on reading. */
  readonly swapIq?: boolean | undefined;
  /** [--real] Accept a 1-channel WAV or a real SigMF datatype as a real signal (Q = 0). */
  readonly real?: boolean | undefined;
}

/**
 * Throws a UsageError for a rate or a centre outside the accepted ranges (acceptedRanges.ts) and
 * for a non-finite ppm.
 */
export function checkCaptureOptions(options: CaptureOptions): void {
  const rate = options.sampleRateHz;
  const rateProblem = rate === undefined ? null : sampleRateProblem(rate);
  if (rateProblem !== null) {
    // A typed rate under 1 kS/s is in practice one without its prefix (500 for 500k).
    const hint = (rate as number) > 0 && (rate as number) < SAMPLE_RATE_MIN_HZ ? "; was a k or M left off?" : "";
    throw new UsageError("--rate", `${shortNumber(rate as number)} ${rateProblem}${hint}`);
  }
  const centre = options.centerHz;
  const centreProblem = centre === undefined ? null : centerProblem(centre);
  if (centreProblem !== null) throw new UsageError("--center", `${shortNumber(centre as number)} ${centreProblem}`);
  if (options.ppm !== undefined && !Number.isFinite(options.ppm)) {
    throw new UsageError("--ppm", `${options.ppm} is not a finite clock error in ppm`);
  }
}

/**
 * A number written short for a message, rounded to `digits` significant digits: values from
 * 1e-3 to 1e5 as decimals, anything else in exponent form (2400000 → "2.4e6", 1.5e8 → "1.5e8",
 * 0.25 → "0.25", 1/1.2e6 → "8.33333e-7" with 6 digits).
 */
export function shortNumber(x: number, digits = 12): string {
  if (!Number.isFinite(x)) return String(x);
  x = Number(x.toPrecision(digits));
  if (Number.isInteger(x) && Math.abs(x) < 1e5) return String(x);
  if (Math.abs(x) >= 1e-3 && Math.abs(x) < 1e5) return String(x);
  return x.toExponential().replace("e+", "e");
}

/** "--center 1e8 overrides the SigMF core:frequency 1.5e8." */
export function overrideWarning(flag: string, flagValue: string | number, source: string, fileValue: string | number): string {
  const f = typeof flagValue === "number" ? shortNumber(flagValue) : flagValue;
  const v = typeof fileValue === "number" ? shortNumber(fileValue) : fileValue;
  return `${flag} ${f} overrides the ${source} ${v}.`;
}

/**
 * One metadata value: the flag's value when given (with a warning when the file says otherwise),
 * else the value found in the file (with its origin), else null with origin "unknown".
 * `foundLabel` names the file's value in the warning, e.g. "SigMF core:frequency".
 */
export function flagOrFound(
  flag: string,
  flagValue: number | undefined,
  found: number | null,
  foundOrigin: Origin,
  foundLabel: string,
  warnings: string[],
): { value: number | null; origin: Origin } {
  if (flagValue !== undefined) {
    if (found !== null && found !== flagValue) warnings.push(overrideWarning(flag, flagValue, foundLabel, found));
    return { value: flagValue, origin: "flag" };
  }
  return found === null ? { value: null, origin: "unknown" } : { value: found, origin: foundOrigin };
}
