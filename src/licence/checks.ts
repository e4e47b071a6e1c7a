/**
 * The terms of a licence against the measured figures, one check a term present in the licence
 * (docs/licence.md, "Checks"): frequency, deviation, bandwidth, designator, mask and
 * adjacentChannel. Each gives the limit, the measured value, its expanded uncertainty (k = 2),
 * the margin (positive inside), simple acceptance (`pass`) and the ILAC-G8:09/2019 §4.2.3
 * decision with the guard band w = U (decision.ts). The inputs are plain numbers: this room does
 * not depend on how they were measured.
 */
import { decide, worstDecision, type Decision } from "./decision.js";
import { parseDesignator } from "./designator.js";
import type { Licence } from "./licence.js";
import type { Mask } from "./masks.js";
import { checkMask, type MaskResult, type MaskSpectrum } from "./maskCheck.js";
import { adjacentChannelPower, type AdjacentChannelInput, type AdjacentChannelResult } from "./adjacentChannel.js";

export type CheckName = "frequency" | "deviation" | "bandwidth" | "designator" | "mask" | "adjacentChannel";

/** A measured figure: value, expanded uncertainty (k = 2) or null, and its method. */
export interface Figure {
  readonly value: number | null;
  readonly uncertainty: number | null;
  readonly method: string;
}

export interface PeakFigure extends Figure {
  /** When it happened, s from the span start. */
  readonly timeS: number | null;
}

export interface CheckInputs {
  /** Measured carrier, absolute RF, Hz (corrected for --ppm). */
  readonly carrierFrequencyHz: Figure;
  readonly positiveDeviationHz: PeakFigure;
  readonly negativeDeviationHz: PeakFigure;
  readonly occupiedBandwidthHz: Figure;
  /** The measured class and designator, and the classifier's confidence 0..1. */
  readonly emissionClass: string;
  readonly designator: string | null;
  readonly classConfidence: number;
  readonly classMethod: string;
  /** The mask's spectrum and how it was read, when the licence has a mask. */
  readonly maskSpectrum: MaskReading | null;
  /** The inputs of the adjacent channel power but its spacing and bandwidth (taken from the licence). */
  readonly adjacent: Omit<AdjacentChannelInput, "spacingHz" | "bandwidthHz"> | null;
}

/** The spectrum a mask is judged on, and how it was read. */
export interface MaskReading extends MaskSpectrum {
  readonly method: string;
  /** Expanded uncertainty (k = 2) of each point's level, dB. */
  readonly uncertaintyDb: number;
  /** The reference level, dBFS, and what it is. */
  readonly referenceDbfs: number;
  readonly reference: "carrier" | "peak";
  readonly detector: "peak-hold" | "average";
  /** Resolution bandwidth (the frames' ENBW), Hz. */
  readonly resolutionHz: number;
}

export interface CheckEntry {
  readonly name: CheckName;
  /** Unit of limit, measured, uncertainty and margin ("ppm", "Hz", "dB"), null for a designator. */
  readonly unit: string | null;
  /** "upper": measured ≤ limit passes; "match": symbols compared; "information": no limit, not in the verdict. */
  readonly kind: "upper" | "match" | "information";
  readonly limit: number | string | null;
  readonly measured: number | string | null;
  readonly uncertainty: number | null;
  /** Limit − measured (upper), in the unit; null for match and information. */
  readonly margin: number | null;
  /** 100·margin/|limit|: positive inside the limit, negative outside; null where the limit is 0 or there is none. */
  readonly marginPercent: number | null;
  /** Simple acceptance (ILAC-G8 w = 0; touching the limit passes); null for information. */
  readonly pass: boolean | null;
  readonly decision: Decision | null;
  /** The licence fields the check used. */
  readonly fields: readonly (keyof Licence)[];
  readonly method: string;
  readonly notes: readonly string[];
}

export interface CheckOutcome {
  readonly checks: readonly CheckEntry[];
  /** "pass" when every judged check passes by simple acceptance. */
  readonly verdict: "pass" | "fail";
  /** The worst decision of the judged checks. */
  readonly decision: Decision;
  /** The mask's point-by-point result (for the figure), when a mask was checked. */
  readonly mask: MaskResult | null;
  readonly adjacent: AdjacentChannelResult | null;
  /** Terms of the licence that could not be checked, with the reason. */
  readonly skipped: readonly string[];
}

export function evaluateLicence(licence: Licence, mask: Mask | null, inputs: CheckInputs): CheckOutcome {
  const skipped: string[] = [];
  const checks: CheckEntry[] = [];
  const add = (c: CheckEntry | string | null): void => {
    if (typeof c === "string") skipped.push(c);
    else if (c !== null) checks.push(c);
  };
  add(frequencyCheck(licence, inputs));
  add(deviationCheck(licence, inputs));
  add(bandwidthCheck(licence, inputs));
  add(designatorCheck(licence, inputs));
  const masked = mask === null || inputs.maskSpectrum === null ? null : maskCheck(mask, inputs.maskSpectrum);
  if (mask !== null && inputs.maskSpectrum === null) skipped.push("mask: no spectrum at the mask's resolution");
  if (masked !== null) add(masked.entry);
  const acp = adjacentCheck(licence, inputs);
  add(acp.entry);
  const judged = checks.filter((c) => c.kind !== "information");
  return {
    checks,
    verdict: judged.every((c) => c.pass === true) ? "pass" : "fail",
    decision: worstDecision(judged.map((c) => c.decision as Decision)),
    mask: masked?.result ?? null,
    adjacent: acp.result,
    skipped,
  };
}

/** An upper-limit check from a value, its uncertainty and the limit. */
function upperCheck(
  name: CheckName, unit: string, limit: number, measured: number, judgedValue: number, u: number | null,
  fields: readonly (keyof Licence)[], method: string, notes: readonly string[],
): CheckEntry {
  const d = decide(judgedValue, limit, u, "upper");
  const allNotes = d.uncertaintyKnown ? notes : [...notes, "no uncertainty could be stated: the decision is simple acceptance (guard band 0)"];
  return {
    name, unit, kind: "upper", limit, measured, uncertainty: u, margin: d.margin, marginPercent: d.marginPercent,
    pass: d.pass, decision: d.decision, fields, method, notes: allNotes,
  };
}

/** Carrier error against the tolerance, in ppm or Hz as the licence states it; judged on |error|. */
function frequencyCheck(licence: Licence, inputs: CheckInputs): CheckEntry | string | null {
  const ppm = licence.frequencyTolerancePpm;
  const hz = licence.frequencyToleranceHz;
  if (ppm === undefined && hz === undefined) return null;
  const assigned = licence.assignedFrequencyHz;
  if (assigned === undefined) return "frequency: the licence gives a tolerance but no assigned frequency (assignedFrequencyHz, or --assigned)";
  const c = inputs.carrierFrequencyHz;
  if (c.value === null) return `frequency: no carrier frequency was measured (${c.method})`;
  const errorHz = c.value - assigned;
  const method = `carrier error = measured − assigned (${assigned} Hz); ${c.method}`;
  const tolField: keyof Licence = ppm !== undefined ? "frequencyTolerancePpm" : "frequencyToleranceHz";
  if (ppm !== undefined) {
    const errorPpm = (errorHz / assigned) * 1e6;
    const u = c.uncertainty === null ? null : (c.uncertainty / assigned) * 1e6;
    return upperCheck("frequency", "ppm", ppm, errorPpm, Math.abs(errorPpm), u, ["assignedFrequencyHz", tolField], `${method}; ppm = error/assigned × 1e6; judged on |error|`, []);
  }
  return upperCheck("frequency", "Hz", hz as number, errorHz, Math.abs(errorHz), c.uncertainty, ["assignedFrequencyHz", tolField], `${method}; judged on |error|`, []);
}

/** The larger of the positive and negative peak deviation against the maximum. */
function deviationCheck(licence: Licence, inputs: CheckInputs): CheckEntry | string | null {
  const limit = licence.maxDeviationHz;
  if (limit === undefined) return null;
  const p = inputs.positiveDeviationHz;
  const n = inputs.negativeDeviationHz;
  if (p.value === null || n.value === null) return `deviation: no peak deviation was measured (${p.method})`;
  const worse = p.value >= n.value ? p : n;
  const side = worse === p ? "positive" : "negative";
  const at = (x: PeakFigure): string => (x.timeS === null ? "" : ` at ${x.timeS.toFixed(3)} s`);
  const notes = [
    `positive peak ${p.value.toFixed(0)} Hz${at(p)}; negative peak ${n.value.toFixed(0)} Hz${at(n)}; the ${side} one is judged`,
  ];
  return upperCheck("deviation", "Hz", limit, worse.value as number, worse.value as number, worse.uncertainty, ["maxDeviationHz"], worse.method, notes);
}

/** The 99 % occupied bandwidth against the authorised bandwidth, else the designator's necessary bandwidth. */
function bandwidthCheck(licence: Licence, inputs: CheckInputs): CheckEntry | string | null {
  const authorised = licence.authorisedBandwidthHz;
  const designated = licence.emissionDesignator === undefined ? null : parseDesignator(licence.emissionDesignator).bandwidthHz;
  const limit = authorised ?? designated;
  if (limit === null) return null;
  const obw = inputs.occupiedBandwidthHz;
  if (obw.value === null) return `bandwidth: no occupied bandwidth was measured (${obw.method})`;
  const field: keyof Licence = authorised !== undefined ? "authorisedBandwidthHz" : "emissionDesignator";
  const notes = authorised === undefined
    ? [`no authorised bandwidth in the licence: judged against the designator's necessary bandwidth, ${limit} Hz`]
    : [];
  notes.push("47 CFR 90.209 note 3 extends the authorised band to any discrete line of 0.25 % of the total power or more: not applied");
  return upperCheck("bandwidth", "Hz", limit, obw.value, obw.value, obw.uncertainty, [field], obw.method, notes);
}

/** Symbols of the measured emission against the licence's (RR Appendix 1; F and G interchangeable, 47 CFR 2.201 note). */
function designatorCheck(licence: Licence, inputs: CheckInputs): CheckEntry | string | null {
  const text = licence.emissionDesignator;
  if (text === undefined) return null;
  const licensed = parseDesignator(text);
  const measured = inputs.designator === null ? null : safeSymbols(inputs.designator);
  if (measured === null) return `designator: no emission designator could be formed from the measurement (class ${inputs.emissionClass})`;
  const first = (s: string): string => (s === "G" ? "F" : s);
  const same = first(measured[0] as string) === first(licensed.first) && measured[1] === licensed.second;
  const sure = inputs.classConfidence >= 0.9;
  const decision: Decision = same ? (sure ? "pass" : "conditional-pass") : sure ? "fail" : "conditional-fail";
  const notes = [
    "the first two symbols (modulation of the main carrier, nature of the modulating signal) are compared; the third (type of information) cannot be told from the signal and is not judged",
    "F and G are taken as the same first symbol (47 CFR 2.201 note); the bandwidth part is judged by the bandwidth check",
  ];
  if (!sure) notes.push(`the class was found with confidence ${inputs.classConfidence.toFixed(2)} (below 0.9): the decision is conditional`);
  return {
    name: "designator", unit: null, kind: "match", limit: licensed.text, measured: inputs.designator,
    uncertainty: null, margin: null, marginPercent: null, pass: same, decision, fields: ["emissionDesignator"],
    method: `measured class ${inputs.emissionClass}: ${inputs.classMethod}`, notes,
  };
}

function safeSymbols(designator: string): string | null {
  try {
    return parseDesignator(designator).classSymbols;
  } catch {
    return null;
  }
}

/** Every point of the mask spectrum against the mask; the worst point is the check's figure. */
function maskCheck(mask: Mask, spectrum: MaskReading): { entry: CheckEntry | string; result: MaskResult } {
  const result = checkMask(mask, spectrum);
  const w = result.worst;
  if (w === null) return { entry: "mask: no point of the spectrum could be judged (the mask sets no limit inside the covered offsets, or every point lies at the noise)", result };
  const notes = [...mask.notes];
  const khz = (f: number): string => `${(f / 1000).toFixed(2)} kHz`;
  notes.push(`worst point at ${khz(w.offsetHz)}: ${w.levelDb.toFixed(1)} dB against ${w.allowedDb.toFixed(1)} dB allowed${w.timeS === null ? "" : `, reached at ${w.timeS.toFixed(3)} s`}`);
  for (const v of result.violations) notes.push(`outside the mask from ${khz(v.fromHz)} to ${khz(v.toHz)} (worst margin ${v.worstMarginDb.toFixed(1)} dB)`);
  if (result.unverifiable.length > 0) {
    notes.push(`${result.unverifiable.length} span(s) not verifiable, where the mask lies below the measurement's noise (${spectrum.noiseDb.toFixed(1)} dB) + 6 dB and the reading is noise: ${result.unverifiable.map((s) => `${khz(s.fromHz)}..${khz(s.toHz)}`).join(", ")}`);
  }
  if (result.uncoveredFromHz !== null) notes.push(`the capture covers offsets up to ${khz(spectrum.coveredHz)}; the mask's limits from ${khz(result.uncoveredFromHz)} outward were not checked`);
  const fields: (keyof Licence)[] = ["mask", "maskReference", "maskDetector", "maskResolutionHz"];
  const entry = upperCheck("mask", "dB", w.allowedDb, w.levelDb, w.levelDb, spectrum.uncertaintyDb, fields, `${mask.description} (${mask.source}); ${spectrum.method}`, notes);
  return { entry, result };
}

/** Adjacent channel power, when the licence gives a channel spacing: information (no cited limit, docs/licence.md). */
function adjacentCheck(licence: Licence, inputs: CheckInputs): { entry: CheckEntry | string | null; result: AdjacentChannelResult | null } {
  const spacing = licence.channelSpacingHz;
  if (spacing === undefined) return { entry: null, result: null };
  if (inputs.adjacent === null) return { entry: "adjacentChannel: no spectrum of the adjacent channels", result: null };
  const b = integrationBandwidth(licence);
  if (b === null) return { entry: "adjacentChannel: no integration bandwidth (give authorisedBandwidthHz or emissionDesignator)", result: null };
  const result = adjacentChannelPower({ ...inputs.adjacent, spacingHz: spacing, bandwidthHz: b.hz });
  if (result === null || (result.lower === null && result.upper === null)) {
    return { entry: `adjacentChannel: the capture does not cover the adjacent channels at ±${spacing} Hz with ±${b.hz / 2} Hz around them`, result };
  }
  const sides = [result.lower, result.upper].filter((s) => s !== null);
  const worst = sides.reduce((a, s) => (s.relativeDb > a.relativeDb ? s : a));
  const fmt = (s: typeof result.lower, label: string): string => (s === null ? `${label}: not covered` : `${label}: ${s.atMost ? "at most " : ""}${s.relativeDb.toFixed(1)} dB`);
  return {
    entry: {
      name: "adjacentChannel", unit: "dB", kind: "information", limit: null, measured: worst.relativeDb, uncertainty: null,
      margin: null, marginPercent: null, pass: null, decision: null, fields: ["channelSpacingHz", b.field],
      method: `power in ${b.hz} Hz (${b.field}) centred ±${spacing} Hz from the assigned frequency, relative to the power in the same width on it; whole-span Welch PSD, noise density removed`,
      notes: [fmt(result.lower, "lower adjacent"), fmt(result.upper, "upper adjacent"), "the licence states no adjacent-channel limit: shown for information, not in the verdict"],
    },
    result,
  };
}

function integrationBandwidth(licence: Licence): { hz: number; field: keyof Licence } | null {
  if (licence.authorisedBandwidthHz !== undefined) return { hz: licence.authorisedBandwidthHz, field: "authorisedBandwidthHz" };
  if (licence.emissionDesignator !== undefined) return { hz: parseDesignator(licence.emissionDesignator).bandwidthHz, field: "emissionDesignator" };
  return null;
}
