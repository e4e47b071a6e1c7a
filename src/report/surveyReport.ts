/**
 * The `survey` report (interface.md, `survey --json`, schema `iqaudit/survey/1`): the capture,
 * its health, and every emission found blind with its place in frequency and time, its power,
 * class and designator, and its own `measure` report. Receiver artefacts (the DC spike, an IQ
 * image) are entries too, marked in `artefact`, so that a reader sees what was set aside.
 * Built from the survey room's detection and the emissions' measure reports.
 */
import type { CaptureMeta, SampleSpan } from "../capture/index.js";
import type { Pass1Result } from "../analysis/index.js";
import { captureSection, qualitySection, type CaptureSection, type QualitySection } from "./inspectReport.js";
import type { MeasureReport } from "./measureReport.js";
import { TOOL_NAME, TOOL_VERSION } from "../version.js";

/** One entry of `emissions` (interface.md field list). */
export interface SurveyEmission {
  /** 1, 2, …: the number in the table and on the figure. */
  readonly id: number;
  readonly offsetHz: number;
  readonly frequencyHz: number | null;
  /** 99 % occupied bandwidth. */
  readonly bandwidthHz: number | null;
  /** Mean channel power while on. */
  readonly powerDbfs: number | null;
  /** Highest channel power in any time slice. */
  readonly peakDbfs: number | null;
  readonly snrDb: number | null;
  readonly startS: number;
  readonly endS: number;
  readonly dutyCyclePercent: number | null;
  readonly class: string | null;
  readonly order: number | null;
  readonly designator: string | null;
  /** null for an emission; "dc" or "image" for a receiver artefact. */
  readonly artefact: "dc" | "image" | null;
  /** For an image, the id of the emission it mirrors. */
  readonly imageOf?: number | null;
  /** Bursts of one transmitter on this frequency counted as one emission. */
  readonly burstCount?: number | null;
  /** That emission's `measure` analysis over the time it is present; null for an artefact. */
  readonly report: MeasureReport | null;
}

export interface SurveyReport {
  readonly schema: "iqaudit/survey/1";
  readonly tool: { readonly name: string; readonly version: string };
  readonly measuredAt: string;
  readonly capture: CaptureSection;
  readonly quality: QualitySection;
  readonly emissions: readonly SurveyEmission[];
  readonly methods: Readonly<Record<string, string>>;
  readonly warnings: readonly string[];
  /** Every other file of the survey folder with its SHA-256 (with -o), else absent. */
  readonly files?: readonly { readonly path: string; readonly sha256: string }[];
}

/** What buildSurveyReport needs of one detected emission (src/survey's DetectedEmission). */
export interface SurveyDetected {
  readonly id: number;
  readonly offsetHz: number;
  readonly bandwidthHz: number;
  readonly powerDbfs: number;
  readonly peakDbfs: number;
  readonly snrDb: number;
  readonly startS: number;
  readonly endS: number;
  readonly dutyCyclePercent: number;
  readonly burstCount: number;
  readonly artefact: "dc" | "image" | null;
  readonly mirrorOfId: number | null;
}

/**
 * The survey report from the detection (every entry, artefacts included) and the measure
 * reports of the emissions (keyed by id). The class, order and designator come from each
 * emission's own measurement; placement, power and time from the detection.
 */
export function buildSurveyReport(
  meta: CaptureMeta, span: SampleSpan, pass1: Pass1Result, detected: readonly SurveyDetected[],
  reports: ReadonlyMap<number, MeasureReport>, methods: Readonly<Record<string, string>>, warnings: readonly string[],
  measuredAt: Date = new Date(),
): SurveyReport {
  // Numbered in frequency order, the emissions first (1 … n), then the artefacts: the numbers of
  // the table, the figure and the sub-folders.
  const ordered = [...detected].sort((x, y) => Number(x.artefact !== null) - Number(y.artefact !== null) || x.offsetHz - y.offsetHz);
  const number = new Map(ordered.map((d, i) => [d.id, i + 1]));
  const emissions = ordered.map((d): SurveyEmission => {
    const r = reports.get(d.id) ?? null;
    return {
      id: number.get(d.id) as number, offsetHz: d.offsetHz, frequencyHz: meta.centerHz === null ? null : meta.centerHz + d.offsetHz,
      // The emission's own measurement resolves its band finer than the pass-1 spectrum.
      bandwidthHz: r?.bandwidth.occupiedHz ?? d.bandwidthHz, powerDbfs: d.powerDbfs, peakDbfs: d.peakDbfs, snrDb: d.snrDb,
      startS: d.startS, endS: d.endS, dutyCyclePercent: d.dutyCyclePercent, burstCount: d.burstCount,
      class: r === null ? null : r.modulation.class, order: r === null ? null : r.modulation.order,
      designator: r === null ? null : r.emission.designator, artefact: d.artefact,
      imageOf: d.mirrorOfId === null ? null : (number.get(d.mirrorOfId) ?? null), report: r,
    };
  });
  return {
    schema: "iqaudit/survey/1", tool: { name: TOOL_NAME, version: TOOL_VERSION }, measuredAt: measuredAt.toISOString(),
    capture: captureSection(meta, span, pass1.sha256), quality: qualitySection(pass1), emissions, methods, warnings,
  };
}
