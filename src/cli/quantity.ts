/**
 * Parses command-line quantities once, at the edge (STYLE.md §9): "2.4M", "48k", "2.4e6",
 * "156.8MHz", "-12.5k", "250ms". SI prefixes p n u µ m k M G T (k also as K); an optional unit
 * suffix must match the expected one (Hz, s; "sps" and "S/s" also for rates).
 */
import { UsageError } from "../errors.js";

const PREFIX: Record<string, number> = {
  p: 1e-12, n: 1e-9, u: 1e-6, "µ": 1e-6, m: 1e-3, "": 1, k: 1e3, K: 1e3, M: 1e6, G: 1e9, T: 1e12,
};

export type QuantityUnit = "Hz" | "s" | "rate" | "none";

const SUFFIXES: Record<QuantityUnit, readonly string[]> = {
  Hz: ["Hz", "hz"],
  s: ["s"],
  rate: ["Hz", "hz", "sps", "S/s", "Sps"],
  none: [],
};

export interface QuantityRule {
  readonly unit: QuantityUnit;
  /** Smallest allowed value and whether it is itself allowed. */
  readonly min?: number;
  readonly minInclusive?: boolean;
}

/** Parses `text` for `option` (e.g. "--rate"); throws UsageError with one line when it cannot. */
export function parseQuantity(option: string, text: string, rule: QuantityRule): number {
  const m = /^\s*([-+]?(?:\d+\.?\d*|\.\d+)(?:[eE][-+]?\d+)?)\s*([pnuµmkKMGT]?)\s*([A-Za-z/]*)\s*$/.exec(text);
  const unitWords = SUFFIXES[rule.unit];
  if (m === null || (m[3] !== "" && !unitWords.includes(m[3] as string))) {
    const example = rule.unit === "s" ? "1.5, 250ms" : rule.unit === "none" ? "5, -2.5" : "2.4M, 48k, 2.4e6";
    throw new UsageError(option, `'${text}' is not a number (examples: ${example})`);
  }
  // "m" before a rate/Hz unit is milli; a bare "M" is mega: the SI symbols are case-sensitive.
  const value = Number(m[1]) * (PREFIX[m[2] as string] as number);
  if (!Number.isFinite(value)) throw new UsageError(option, `'${text}' is not a finite number`);
  if (rule.min !== undefined) {
    const ok = rule.minInclusive === true ? value >= rule.min : value > rule.min;
    if (!ok) {
      const bound = rule.minInclusive === true ? `at least ${rule.min}` : `greater than ${rule.min}`;
      throw new UsageError(option, `${text} must be ${bound}`);
    }
  }
  return value;
}

/** A positive whole number, e.g. `--rows 1000`. */
export function parseCount(option: string, text: string, min = 1): number {
  const v = Number(text);
  if (!/^\s*\d+\s*$/.test(text) || !Number.isSafeInteger(v) || v < min) {
    throw new UsageError(option, `'${text}' must be a whole number of at least ${min}`);
  }
  return v;
}

/** An FFT length: a power of two between 16 and 1 048 576. */
export function parseFftLength(option: string, text: string): number {
  const v = parseCount(option, text, 16);
  if ((v & (v - 1)) !== 0 || v > 1 << 20) throw new UsageError(option, `${v} must be a power of two between 16 and 1048576`);
  return v;
}
