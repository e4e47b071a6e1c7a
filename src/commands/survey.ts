/**
 * `iqaudit survey <capture>`: every emission of a wideband capture, found blind, measured on its
 * own channel (src/survey), and a folder a person reads: survey.json (last), survey.md (the
 * table), survey.png (the spectrogram with each emission boxed and numbered, artefacts dashed)
 * and one sub-folder per emission with its report, all published whole. With
 * `sigmfAnnotations`, also `<capture>.survey.sigmf-meta` beside the capture.
 */
import { readFile } from "node:fs/promises";
import { basename, join } from "node:path";
import type { Pass1Options } from "../analysis/index.js";
import type { CaptureMeta } from "../capture/index.js";
import { withAnalysedCapture, type AnalysedCapture, type CaptureArgs } from "./analyseCapture.js";
import { buildMeasureReport, type MeasureReport } from "../report/measureReport.js";
import { measureMarkdown } from "../report/measureMarkdown.js";
import { spectrogramFigure } from "../report/spectrogramFigure.js";
import { buildSurveyReport, publishFolder, surveyMarkdown, writeFileAtomic, type FolderWriter, type SurveyReport } from "../report/index.js";
import type { FolderSpec } from "../report/index.js";
import { annotatedSigmfMeta, surveyCapture, surveySigmfMetaPath, type SurveyOptions, type SurveyResult } from "../survey/index.js";
import { TOOL_NAME, TOOL_VERSION } from "../version.js";

export interface SurveyCommandOptions extends SurveyOptions {
  readonly capture: CaptureArgs;
  /** Folder for survey.json, survey.md, survey.png and the emissions' sub-folders; nothing is written without it. */
  readonly outDir?: string | undefined;
  /** Also write `<capture>.survey.sigmf-meta` beside the capture. */
  readonly sigmfAnnotations?: boolean | undefined;
  readonly pass1?: Pass1Options | undefined;
  /** Bytes of the extraction read done, of the total (the second read of the file). */
  readonly extractionProgress?: ((doneBytes: number, totalBytes: number) => void) | undefined;
}

export interface SurveyCommandResult {
  readonly report: SurveyReport;
  /** Files written (in their final place). */
  readonly files: readonly string[];
}

/** A survey folder: survey.json lists every other file (a folder of an earlier survey is replaced). */
export const SURVEY_FOLDER: FolderSpec = { manifest: "survey.json", legacyEntry: () => false };

export async function surveyCommand(path: string, options: SurveyCommandOptions): Promise<SurveyCommandResult> {
  const run = (write: (a: AnalysedCapture, report: SurveyReport) => Promise<SurveyCommandResult>): Promise<SurveyCommandResult> =>
    withAnalysedCapture(path, options.capture, options.pass1 ?? {}, async (a, source) => {
      const fb = a.meta.frameBytes;
      const onProgress = options.extractionProgress === undefined ? options.onProgress
        : (done: number, total: number): void => options.extractionProgress?.(done * fb, total * fb);
      const report = surveyReportOf(a, await surveyCapture(source, a.span, a.pass1, { ...options, onProgress }));
      const written = await write(a, report);
      if (options.sigmfAnnotations !== true) return written;
      return { ...written, files: [...written.files, await writeAnnotations(a.meta, report)] };
    });
  const outDir = options.outDir;
  if (outDir === undefined) return run(async (_a, report) => ({ report, files: [] }));
  return publishFolder(outDir, SURVEY_FOLDER, (w) => run((a, report) => writeSurveyFolder(w, a, report)));
}

function surveyReportOf(a: AnalysedCapture, r: SurveyResult): SurveyReport {
  const reports = new Map<number, MeasureReport>();
  for (const m of r.measured) reports.set(m.emission.id, buildMeasureReport(a.meta, a.span, a.pass1, m.figures, []));
  const methods = {
    detection: `pass-1 spectrogram rows against a floor per bin, threshold for a false-alarm probability per cell (chi-square law of averaged periodograms, docs/methods.md "Survey"), ${r.detection.emissions.length} regions`,
    extraction: "every emission's channel from one read of the file (overlap-save channelizer, docs/methods.md), over the time the emission is present",
    emissions: "each emission measured as `iqaudit measure` does on its own channel (its report in `report`)",
  };
  return buildSurveyReport(a.meta, a.span, a.pass1, r.detection.emissions, reports, methods, [...new Set([...a.warnings, ...r.warnings])]);
}

/** survey.png, one sub-folder per emission, survey.md, then survey.json listing them all. */
async function writeSurveyFolder(w: FolderWriter, a: AnalysedCapture, report: SurveyReport): Promise<SurveyCommandResult> {
  const regions = report.emissions.map((e) => ({
    lowerHz: e.offsetHz - (e.bandwidthHz ?? 0) / 2, upperHz: e.offsetHz + (e.bandwidthHz ?? 0) / 2, startS: e.startS, endS: e.endS,
    label: String(e.id), kind: e.artefact === null ? "emission" as const : "artefact" as const,
  }));
  await w.write("survey.png", spectrogramFigure(a, { title: `Survey: ${basename(a.meta.path)}`, widthPx: 1400, heightPx: 900, reduce: "max", regions }).png);
  for (const e of report.emissions) {
    if (e.report === null) continue;
    const sub = w.sub(emissionFolder(e.id));
    await sub.write("report.md", measureMarkdown(e.report, []));
    await sub.write("report.json", `${JSON.stringify({ ...e.report, files: sub.files().filter((f) => f.path !== "report.json") }, null, 2)}\n`);
  }
  await w.write("survey.md", surveyMarkdown(report));
  const listed: SurveyReport = { ...report, files: w.files() };
  await w.write("survey.json", `${JSON.stringify(listed, null, 2)}\n`);
  return { report: listed, files: w.files().map((f) => join(w.target, f.path)) };
}

/** `emission-01`, … : the sub-folder of emission `id`. */
export function emissionFolder(id: number): string {
  return `emission-${String(id).padStart(2, "0")}`;
}

/** `<capture>.survey.sigmf-meta` beside the capture (module comment of src/survey/sigmfAnnotations.ts). */
async function writeAnnotations(meta: CaptureMeta, report: SurveyReport): Promise<string> {
  const base = meta.container === "sigmf" ? (JSON.parse((await readFile(meta.path, "utf8")).replace(/^\uFEFF/, "")) as Record<string, unknown>) : null;
  const fs = meta.sampleRateHz;
  const annotations = report.emissions.filter((e) => e.artefact === null).map((e) => ({
    startSample: Math.round(e.startS * fs) + report.capture.startS * fs,
    sampleCount: Math.round((e.endS - e.startS) * fs),
    lowerOffsetHz: e.offsetHz - (e.bandwidthHz ?? 0) / 2,
    upperOffsetHz: e.offsetHz + (e.bandwidthHz ?? 0) / 2,
    label: `${e.id} ${e.class ?? "unknown"}${e.order === null ? "" : ` ${e.order}`}`,
    comment: `${e.designator ?? "no designator"}; ${e.dutyCyclePercent?.toFixed(0) ?? "?"} % duty; iqaudit survey`,
  }));
  const doc = annotatedSigmfMeta({
    base, datatype: meta.format, sampleRateHz: fs, centerHz: meta.centerHz, dataFileName: basename(meta.dataPath),
    headerBytes: meta.container === "wav" ? meta.dataOffsetBytes : 0, generator: `${TOOL_NAME} ${TOOL_VERSION}`, annotations,
  });
  const target = surveySigmfMetaPath(meta.path);
  await writeFileAtomic(target, `${JSON.stringify(doc, null, 2)}\n`);
  return target;
}
