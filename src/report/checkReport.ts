/**
 * The `check --json` document (interface.md, schema iqaudit/check/1): the verdict and decision,
 * one entry a check, the licence values with where each came from, the mask's reading, what
 * could not be checked, the cautions, and the measure report of the emission.
 */
import type { CheckEntry, CheckInputs, CheckOutcome, Decision, Licence, Mask, MergedLicence } from "../licence/index.js";
import type { MeasureReport } from "./measureReport.js";
import type { PublishedFile } from "./folderWriter.js";

/** The cautions every check report carries (README "Cautions"; REFERENCES.md "Cautions"). */
export const CHECK_CAUTIONS: readonly string[] = [
  "Indicative only: this is an engineering check from a recorded capture, not an accredited test; it depends on the receiver's calibration (frequency reference, gain flatness, IQ balance, dynamic range).",
  "The licence and the national regulation that governs it prevail; formal compliance evidence comes from an accredited test laboratory with traceable instruments and the standard's own procedure.",
  "Test into a dummy load through a calibrated attenuator; never connect a transmitter straight to a receiver input; keep to RF exposure limits; transmitting needs a licence for the band, power and mode.",
];

export interface CheckPlacementInfo {
  readonly offsetHz: number;
  /** The wide channel of the mask and the adjacent channels, Hz. */
  readonly widthHz: number;
  /** The channel the emission itself was measured in, Hz. */
  readonly measureWidthHz: number;
  readonly centredOn: string;
}

export interface CheckReport {
  readonly schema: "iqaudit/check/1";
  readonly verdict: "pass" | "fail";
  readonly decision: Decision;
  readonly checks: readonly CheckEntry[];
  readonly licence: {
    readonly template: string | null;
    readonly file: string | null;
    readonly values: Licence;
    readonly origins: MergedLicence["origins"];
    readonly dropped: MergedLicence["dropped"];
  };
  readonly channel: CheckPlacementInfo;
  readonly mask: {
    readonly name: string;
    readonly description: string;
    readonly source: string;
    readonly reference: "carrier" | "peak";
    readonly referenceDbfs: number;
    readonly detector: "peak-hold" | "average";
    readonly resolutionHz: number;
    readonly noiseDb: number;
    readonly coveredHz: number;
    readonly uncertaintyDb: number;
    readonly worst: { readonly offsetHz: number; readonly levelDb: number; readonly allowedDb: number; readonly marginDb: number; readonly timeS: number | null } | null;
    readonly violations: readonly { readonly fromHz: number; readonly toHz: number; readonly worstMarginDb: number }[];
    readonly unverifiable: readonly { readonly fromHz: number; readonly toHz: number }[];
  } | null;
  readonly skipped: readonly string[];
  readonly cautions: readonly string[];
  readonly report: MeasureReport;
  readonly files: readonly PublishedFile[];
  readonly warnings: readonly string[];
}

export interface CheckReportInput {
  readonly merged: MergedLicence;
  readonly mask: Mask | null;
  readonly outcome: CheckOutcome;
  readonly measure: MeasureReport;
  readonly placement: CheckPlacementInfo;
  readonly inputs: CheckInputs;
}

export function buildCheckReport(input: CheckReportInput): CheckReport {
  const { merged, outcome, measure } = input;
  const p = input.placement;
  return {
    schema: "iqaudit/check/1",
    verdict: outcome.verdict,
    decision: outcome.decision,
    checks: outcome.checks,
    licence: { template: merged.template, file: merged.file, values: merged.licence, origins: merged.origins, dropped: merged.dropped },
    channel: { offsetHz: p.offsetHz, widthHz: p.widthHz, measureWidthHz: p.measureWidthHz, centredOn: p.centredOn },
    mask: maskSection(input),
    skipped: outcome.skipped,
    cautions: CHECK_CAUTIONS,
    report: measure,
    files: [],
    warnings: measure.warnings,
  };
}

function maskSection(input: CheckReportInput): CheckReport["mask"] {
  const { mask, outcome } = input;
  const r = input.inputs.maskSpectrum;
  const m = outcome.mask;
  if (mask === null || r === null || m === null) return null;
  return {
    name: mask.name, description: mask.description, source: mask.source,
    reference: r.reference, referenceDbfs: r.referenceDbfs, detector: r.detector, resolutionHz: r.resolutionHz,
    noiseDb: r.noiseDb, coveredHz: r.coveredHz, uncertaintyDb: r.uncertaintyDb,
    worst: m.worst,
    violations: m.violations,
    unverifiable: m.unverifiable.map((s) => ({ fromHz: s.fromHz, toHz: s.toHz })),
  };
}
