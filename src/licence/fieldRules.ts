/**
 * The rule each licence field's value obeys (docs/licence.md, "Licence file"), shared by licence
 * files and licence templates. Each rule returns the broken rule as a phrase that follows the
 * field name ("must be a number > 0 (Hz), not "5k""), or null when the value is good.
 */
import { parseDesignator } from "./designator.js";
import type { Licence } from "./licence.js";
import { RULE_MASK_NAMES, maskPointsProblem } from "./masks.js";

type FieldRule = (value: unknown) => string | null;

/** A JSON value in a few words, for "…, not <value>". */
export function describeJson(value: unknown): string {
  if (value === null) return "null";
  if (Array.isArray(value)) return "an array";
  if (typeof value === "object") return "an object";
  if (typeof value === "string") return JSON.stringify(value.length > 40 ? `${value.slice(0, 40)}…` : value);
  return String(value);
}

/** A number > 0 in `unit`. JSON cannot write NaN, but 1e999 reads as Infinity. */
function positive(unit: string): FieldRule {
  return (v) => {
    if (typeof v !== "number") return `must be a number > 0 (${unit}), not ${describeJson(v)}`;
    if (!Number.isFinite(v)) return `must be a finite number > 0 (${unit}), not ${v} (a number too large for a double)`;
    if (!(v > 0)) return `must be > 0 (${unit}), not ${v}`;
    return null;
  };
}

function oneOf(values: readonly string[]): FieldRule {
  const list = values.map((x) => `"${x}"`).join(" or ");
  return (v) => (typeof v === "string" && values.includes(v) ? null : `must be ${list}, not ${describeJson(v)}`);
}

function designator(v: unknown): string | null {
  if (typeof v !== "string") return `must be an emission designator string such as "16K0F3E", not ${describeJson(v)}`;
  try {
    parseDesignator(v);
    return null;
  } catch (e) {
    if (e instanceof RangeError) return `is not an emission designator (RR Appendix 1): ${e.message}`;
    throw e;
  }
}

function mask(v: unknown): string | null {
  if (typeof v === "string") {
    return RULE_MASK_NAMES.includes(v) ? null : `${JSON.stringify(v)} is not a rule mask; known: ${RULE_MASK_NAMES.join(", ")} (or give [offsetHz, levelDbc] pairs)`;
  }
  if (!Array.isArray(v)) return `must be an array of [offsetHz, levelDbc] pairs or the name of a rule mask (${RULE_MASK_NAMES.join(", ")}), not ${describeJson(v)}`;
  return maskPointsProblem(v);
}

/** The rule of every field (keyed by name, so adding a field without a rule does not compile). */
export const FIELD_RULES: Readonly<Record<keyof Licence, FieldRule>> = {
  assignedFrequencyHz: positive("Hz"),
  frequencyTolerancePpm: positive("ppm"),
  frequencyToleranceHz: positive("Hz"),
  emissionDesignator: designator,
  maxDeviationHz: positive("Hz"),
  channelSpacingHz: positive("Hz"),
  maskResolutionHz: positive("Hz"),
  authorisedBandwidthHz: positive("Hz"),
  mask,
  maskReference: oneOf(["carrier", "peak"]),
  maskDetector: oneOf(["peak-hold", "average"]),
  transmitterPowerW: positive("W"),
};
