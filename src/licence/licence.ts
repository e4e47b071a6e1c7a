/**
 * The licence terms a `check` compares an emission with, and the licence file that states them
 * (docs/interface.md "Licence file"; docs/licence.md for every field, its unit and default).
 */
import { LicenceFileError } from "../errors.js";
import { FIELD_RULES, describeJson } from "./fieldRules.js";
import { jsonSyntaxProblem } from "./jsonSyntax.js";
import { ruleMaskReference } from "./masks.js";

/** What 0 dB of a mask is: the unmodulated carrier (the total mean power), or the highest emission inside the authorised bandwidth. */
export type MaskReference = "carrier" | "peak";
/** How the spectrum under a mask is held over the recording: its maximum, or its mean. */
export type MaskDetector = "peak-hold" | "average";
/** Mask points: [|offset| from the assigned frequency, Hz; highest allowed level, dB relative to the reference (<= 0)]. */
export type MaskPoints = readonly (readonly [number, number])[];

/** Licence terms; every field is optional and a check runs for each one present. */
export interface Licence {
  /** The assigned (centre) frequency, Hz. */
  assignedFrequencyHz?: number | undefined;
  /** Frequency tolerance, ± parts per million of the assigned frequency. */
  frequencyTolerancePpm?: number | undefined;
  /** Frequency tolerance, ± Hz (instead of frequencyTolerancePpm, never with it). */
  frequencyToleranceHz?: number | undefined;
  /** ITU emission designator, e.g. "16K0F3E" (RR Appendix 1). */
  emissionDesignator?: string | undefined;
  /** Highest allowed FM peak deviation, Hz. */
  maxDeviationHz?: number | undefined;
  /** Channel spacing, Hz: where the adjacent channels lie. */
  channelSpacingHz?: number | undefined;
  /** Resolution bandwidth the mask levels are read in, Hz (default 300 Hz). */
  maskResolutionHz?: number | undefined;
  /** Authorised bandwidth, Hz. */
  authorisedBandwidthHz?: number | undefined;
  /** Mask points, or the name of a rule mask (RULE_MASK_NAMES). */
  mask?: MaskPoints | string | undefined;
  /** What 0 dB of the mask is (default "carrier"). */
  maskReference?: MaskReference | undefined;
  /** How the spectrum is held for the mask (default "peak-hold"). */
  maskDetector?: MaskDetector | undefined;
  /** Mean transmitter power, W: the P of the 43 + 10 log10(P) terms of the rule masks. */
  transmitterPowerW?: number | undefined;
}

/** Every licence field, in the order docs and reports list them. */
export const LICENCE_FIELDS: readonly (keyof Licence)[] = [
  "assignedFrequencyHz", "frequencyTolerancePpm", "frequencyToleranceHz", "emissionDesignator",
  "maxDeviationHz", "channelSpacingHz", "maskResolutionHz", "authorisedBandwidthHz", "mask",
  "maskReference", "maskDetector", "transmitterPowerW",
];

export function isLicenceField(name: string): name is keyof Licence {
  return (LICENCE_FIELDS as readonly string[]).includes(name);
}

/**
 * The licence in `text` (the contents of `fileName`, UTF-8 JSON). Throws LicenceFileError naming
 * the file, the field and the rule for: text that is not JSON (field "(file)", with line and
 * column), a top level that is not an object (field "(top level)"), an unknown field, a value of
 * the wrong type or outside its range (docs/licence.md), or fields that contradict each other.
 */
export function parseLicence(text: string, fileName: string): Licence {
  const root = parseJsonObject(text, fileName, "licence fields");
  const licence: Record<string, unknown> = {};
  for (const [name, value] of Object.entries(root)) {
    licence[checkField(name, value, fileName)] = value;
  }
  checkCombination(licence as Licence, fileName);
  return licence as Licence;
}

/**
 * `name` as a licence field once its value obeys the field's rule; else LicenceFileError naming
 * the field as `label` (a template names it "values.<name>").
 */
export function checkField(name: string, value: unknown, fileName: string, label = name): keyof Licence {
  if (!isLicenceField(name)) throw new LicenceFileError(fileName, label, `is not a licence field${nearestFields(name)}; known: ${LICENCE_FIELDS.join(", ")}`);
  const problem = FIELD_RULES[name](value);
  if (problem !== null) throw new LicenceFileError(fileName, label, problem);
  return name;
}

/** Refuses fields that each obey their rule but contradict each other. */
export function checkCombination(licence: Licence, fileName: string): void {
  if (licence.frequencyTolerancePpm !== undefined && licence.frequencyToleranceHz !== undefined) {
    throw new LicenceFileError(fileName, "frequencyToleranceHz", "frequencyTolerancePpm is given too: pick one (a tolerance in ppm or in Hz, not both)");
  }
  const rule = typeof licence.mask === "string" ? ruleMaskReference(licence.mask) : null;
  if (rule !== null && licence.maskReference !== undefined && licence.maskReference !== rule.reference) {
    throw new LicenceFileError(fileName, "maskReference", `"${licence.maskReference}" contradicts mask ${String(licence.mask)}, whose reference is "${rule.reference}" (${rule.source}); leave maskReference out`);
  }
}

/** The JSON object in `text` (the contents of `fileName`, holding `what`), or LicenceFileError. */
export function parseJsonObject(text: string, fileName: string, what: string): Record<string, unknown> {
  const root = parseJson(text, fileName);
  if (typeof root !== "object" || root === null || Array.isArray(root)) {
    throw new LicenceFileError(fileName, "(top level)", `must be a JSON object of ${what}, not ${describeJson(root)}`);
  }
  return root as Record<string, unknown>;
}

function parseJson(text: string, fileName: string): unknown {
  // A byte-order mark from an editor is not part of the JSON.
  const body = text.startsWith("\uFEFF") ? text.slice(1) : text;
  if (body.trim() === "") throw new LicenceFileError(fileName, "(file)", 'is empty; a licence file is a JSON object such as {"maxDeviationHz": 5000}');
  try {
    return JSON.parse(body) as unknown;
  } catch {
    const where = jsonSyntaxProblem(body);
    const rule = where === null ? "is not valid JSON" : `is not valid JSON: line ${where.line}, column ${where.column}: expected ${where.expected}`;
    throw new LicenceFileError(fileName, "(file)", rule);
  }
}

/** ", did you mean X?" for a name that differs from known fields only in case or a missing unit suffix. */
function nearestFields(name: string): string {
  const lower = name.toLowerCase();
  if (lower.length < 3) return "";
  const near = LICENCE_FIELDS.filter((f) => f.toLowerCase().startsWith(lower) || lower.startsWith(f.toLowerCase()));
  return near.length === 0 ? "" : ` (did you mean ${near.join(" or ")}?)`;
}
