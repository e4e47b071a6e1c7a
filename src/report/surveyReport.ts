/**
 * The `survey` report (interface.md, `survey --json`, schema `iqaudit/survey/1`): the capture,
 * its health, and every emission found blind with its place in frequency and time, its power,
 * class and designator, and its own `measure` report. Receiver artefacts (the DC spike, an IQ
 * image) are entries too, marked in `artefact`, so that a reader sees what was set aside.
 * Types only; the survey room builds it.
 */
import type { CaptureSection, QualitySection } from "./inspectReport.js";
import type { MeasureReport } from "./measureReport.js";

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
}
