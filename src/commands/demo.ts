/**
 * `iqaudit demo`: writes the sample scenario's captures into <out>/captures (if missing) and runs
 * every command that exists so far on each of them, into <out>/<capture name>/. It grows with
 * each capability of the tool. Each capture's folder is published whole (publishFolder): its
 * inspect.json, written last, lists every other file of it (the measure-* report folders' files
 * too) with its SHA-256.
 */
import { basename, dirname, join } from "node:path";
import {
  SCENARIO_CAPTURES, SCENARIO_LICENCES, emissionEdgesHz, emissionTransmitter, writeScenario, writeScenarioLicences, type ScenarioFile,
} from "../scenario/index.js";
import { checkCommand } from "./check.js";
import { archiveAdd, archiveCompare, archiveHistory } from "./archive.js";
import { existsSync } from "node:fs";
import { rm } from "node:fs/promises";
import type { CheckReport } from "../report/checkReport.js";
import type { MeasureReport } from "../report/measureReport.js";
import { inspectCommand } from "./inspect.js";
import { spectrogramCommand } from "./spectrogram.js";
import { measureCommand } from "./measure.js";
import type { CaptureArgs } from "./analyseCapture.js";
import type { Pass1Options } from "../analysis/index.js";
import { inspectText } from "../report/inspectText.js";
import { publishFolder, writeFileAtomic, type FolderSpec, type FolderWriter } from "../report/index.js";
import { surveyCommand } from "./survey.js";
import type { InspectReport } from "../report/inspectReport.js";
import { formatHz } from "../report/format.js";
import { displayClass } from "../report/className.js";

export interface DemoOptions {
  readonly outDir: string;
  /** Makes a progress callback for a step (the CLI passes its terminal display). */
  readonly progress?: ((label: string) => { onProgress: Pass1Options["onProgress"]; done(): void }) | undefined;
}

export interface DemoSummary {
  readonly outDir: string;
  readonly files: readonly string[];
  readonly text: string;
  readonly warnings: readonly string[];
}

export async function demoCommand(options: DemoOptions): Promise<DemoSummary> {
  const capturesDir = join(options.outDir, "captures");
  const scenario = await writeScenario(capturesDir);
  await writeScenarioLicences(capturesDir);
  const written: string[] = [];
  const warnings: string[] = [];
  const lines: string[] = [`iqaudit demo: ${scenario.length} sample captures in ${capturesDir}`, ""];
  for (const file of scenario) {
    const name = basename(file.path).replace(/\.[^.]+$/, "");
    const dir = join(options.outDir, name);
    const { report, measured, checked, rows } = await publishFolder(dir, DEMO_FOLDER, (w) => demoFolder(file, w, options));
    const inspectJson = join(dir, "inspect.json");
    const png = join(dir, "spectrogram.png");
    written.push(inspectJson, join(dir, "inspect.txt"), png);
    for (const m of measured) written.push(...m.files);
    for (const c of checked) written.push(...c.files);
    warnings.push(...report.warnings.map((w) => `${basename(file.path)}: ${w}`));
    for (const m of measured) {
      warnings.push(...m.report.warnings.filter((w) => !report.warnings.includes(w)).map((w) => `${basename(file.path)} ${m.label}: ${w}`));
    }
    const q = report.quality;
    lines.push(
      `${basename(file.path)}: ${file.description}`,
      `  ${report.capture.format} at ${report.capture.sampleRateHz} S/s, ${report.capture.durationS.toFixed(2)} s; ` +
        `noise floor ${q.noiseFloorDbfsPerHz.toFixed(1)} dBFS/Hz; strongest line ${formatHz(report.spectrum.peakOffsetHz)} offset ` +
        `at ${report.spectrum.peakDbfs.toFixed(1)} dBFS; clipping ${q.clippingPercent.toFixed(3)} %; ` +
        `IQ ${q.iqGainImbalanceDb.toFixed(2)} dB / ${q.iqPhaseImbalanceDeg.toFixed(2)}°`,
      ...measured.map((m) => `  ${m.label}: ${measuredLine(m.report)}\n    -> ${m.files[m.files.length - 1] ?? ""}`),
      ...checked.map((c) => `  licence check (${c.against}): ${checkedLine(c.report)}\n    -> ${c.files[c.files.length - 1] ?? ""}`),
      `  -> ${inspectJson}, ${png} (${rows} rows)`,
      "",
    );
  }
  lines.push(...(await surveyDemo(scenario, options.outDir, written, warnings)));
  lines.push(...(await archiveDemo(scenario, options.outDir, written)));
  lines.push("Results are indicative; see iqaudit --help for the cautions of transmitter testing.", "");
  const text = lines.join("\n");
  await writeFileAtomic(join(options.outDir, "SUMMARY.txt"), text);
  // The same note of two captures (one emission measured in both) is said of each; a line repeated word for word, once.
  return { outDir: options.outDir, files: written, text, warnings: [...new Set(warnings)] };
}

/** A demo capture folder: inspect.json is its manifest; folders of an earlier version had no `files` in it. */
const DEMO_FOLDER: FolderSpec = {
  manifest: "inspect.json",
  legacyEntry: (name) => name === "inspect.txt" || name === "spectrogram.png" || name.startsWith("measure-") || name.startsWith("check-"),
};

interface DemoFolder {
  readonly report: InspectReport;
  readonly measured: readonly MeasuredTransmitter[];
  readonly checked: readonly CheckedTransmitter[];
  readonly rows: number;
}

/** One capture's folder: inspect.txt, spectrogram.png, a measure-<transmitter>/ report folder each, inspect.json last. */
async function demoFolder(file: ScenarioFile, w: FolderWriter, options: DemoOptions): Promise<DemoFolder> {
  const capture = scenarioArgs(file);
  const progress = options.progress?.(`inspect ${basename(file.path)}`) ?? { onProgress: undefined, done: () => undefined };
  const report = await inspectCommand(file.path, { capture, pass1: { onProgress: progress.onProgress } });
  progress.done();
  await w.write("inspect.txt", inspectText(report));
  const s = await spectrogramCommand(file.path, { capture, outputPath: "spectrogram.png", outFolder: w });
  // Each transmitter of the capture, measured in its assigned channel against its nominal frequency.
  const measured = await measureTransmitters(file, capture, w);
  const checked = await checkTransmitters(file, capture, w);
  await w.write("inspect.json", `${JSON.stringify({ ...report, files: w.files() }, null, 2)}\n`);
  return { report, measured, checked, rows: s.rows };
}

interface CheckedTransmitter {
  readonly against: string;
  readonly report: CheckReport;
  readonly files: readonly string[];
}

/** The capture's transmitters that hold a licence in the scenario (licences.ts), each checked against it into check-<id>/. */
async function checkTransmitters(file: ScenarioFile, capture: CaptureArgs, folder: FolderWriter): Promise<CheckedTransmitter[]> {
  const scenario = SCENARIO_CAPTURES.find((c) => c.id === file.captureId);
  if (scenario === undefined) return [];
  const out: CheckedTransmitter[] = [];
  for (const l of SCENARIO_LICENCES) {
    if (!scenario.emissions.some((e) => e.transmitterId === l.transmitterId)) continue;
    const licencePath = l.fileName === null ? undefined : join(dirname(file.path), l.fileName);
    const assigned = l.licence["assignedFrequencyHz"];
    const r = await checkCommand(file.path, {
      capture,
      licencePath,
      template: l.template ?? undefined,
      assignedHz: l.template !== null && typeof assigned === "number" ? assigned : undefined,
      outFolder: folder.sub(`check-${l.transmitterId}`),
    });
    out.push({ against: l.template === null ? `licence ${l.fileName ?? ""}` : `template ${l.template}`, report: r.report, files: r.files });
  }
  return out;
}

/** "PASS" or "FAIL: deviation 3.399 kHz against 2.500 kHz at 13.260 s", one line. */
function checkedLine(r: CheckReport): string {
  const failed = r.checks.filter((c) => c.pass === false);
  const verdict = `${r.verdict.toUpperCase()} (decision ${r.decision})`;
  if (failed.length === 0) return `${verdict}; ${r.checks.filter((c) => c.pass === true).map((c) => c.name).join(", ")} inside the licence`;
  return `${verdict}: ${failed.map((c) => `${c.name} measured ${typeof c.measured === "number" ? c.measured.toFixed(c.unit === "ppm" ? 3 : c.unit === "dB" ? 1 : 0) : String(c.measured)} ${c.unit ?? ""} against ${String(c.limit)} ${c.unit ?? ""}${c.notes[0] === undefined ? "" : ` (${c.notes[0]})`}`).join("; ")}`;
}

/**
 * What the command line would need to read the scenario file: raw files carry rate and centre in
 * their names and SigMF in its metadata; a WAV header has no centre frequency, so it is given.
 */
function scenarioArgs(file: ScenarioFile): CaptureArgs {
  return file.container === "wav" ? { centerHz: file.centerHz } : {};
}

interface MeasuredTransmitter {
  readonly label: string;
  readonly report: MeasureReport;
  readonly files: readonly string[];
}

/** The scenario's transmitters in this capture, each measured in its channel (skipped when the channel is not inside the capture). */
async function measureTransmitters(file: ScenarioFile, capture: CaptureArgs, folder: FolderWriter): Promise<MeasuredTransmitter[]> {
  const scenario = SCENARIO_CAPTURES.find((c) => c.id === file.captureId);
  if (scenario === undefined) return [];
  const out: MeasuredTransmitter[] = [];
  for (const e of scenario.emissions) {
    const tx = emissionTransmitter(e);
    const offsetHz = tx.nominalFrequencyHz - scenario.centerHz;
    // The channel: the emission's own band (as its SigMF annotation gives it) with a 25 % margin,
    // at most the assigned channel spacing.
    const edges = emissionEdgesHz(tx);
    const widthHz = Math.min(tx.channelSpacingHz, Math.max(1.25 * (edges.upperHz - edges.lowerHz), 2000));
    if (Math.abs(offsetHz) + widthHz / 2 > scenario.sampleRateHz / 2) continue;
    const r = await measureCommand(file.path, {
      capture,
      channel: { offsetHz, widthHz },
      nominalHz: tx.nominalFrequencyHz,
      outFolder: folder.sub(`measure-${tx.id}`),
    });
    out.push({ label: tx.label, report: r.report, files: r.files });
  }
  return out;
}

function measuredLine(m: MeasureReport): string {
  const parts = [
    displayClass(m.modulation.class, m.modulation.order),
    `designator ${m.emission.designator ?? "n/a"}`,
    m.carrier.errorPpm === null ? "" : `error ${m.carrier.errorPpm.toFixed(3)} ppm`,
    m.bandwidth.occupiedHz === null ? "" : `OBW ${formatHz(m.bandwidth.occupiedHz)}`,
    m.fm?.peakDeviationHz == null ? "" : `peak deviation ${formatHz(m.fm.peakDeviationHz)}`,
    m.fm?.toneHz == null ? "" : `tone ${m.fm.toneHz.toFixed(1)} Hz`,
    m.am?.modulationDepthPercent == null ? "" : `depth ${m.am.modulationDepthPercent.toFixed(1)} %`,
    m.digital.symbolRateBd === null ? "" : `${m.digital.symbolRateBd.toFixed(0)} Bd`,
    m.digital.evmRmsPercent === null ? "" : `EVM ${m.digital.evmRmsPercent.toFixed(2)} %`,
    m.fsk.shiftHz === null ? "" : `shift ${formatHz(m.fsk.shiftHz)}`,
    m.ook.dutyCyclePercent === null ? "" : `duty ${m.ook.dutyCyclePercent.toFixed(1)} %`,
  ];
  return parts.filter((p) => p !== "").join(", ");
}

/**
 * The demo's own archive, `<outDir>/archive/archive.sqlite` (never the user's): every check-*
 * folder tagged with its transmitter and every measure-* folder with `measure:<transmitter>`, each
 * with the time its capture was recorded (the scenario's; WAV and raw files do not carry it),
 * and the site survey; then the two visits of the launch channel compared and its carrier error's
 * history drawn (`launch-history.png`). An earlier demo run's archive in the same folder is removed first.
 */
async function archiveDemo(scenario: readonly ScenarioFile[], outDir: string, written: string[]): Promise<string[]> {
  const location = { archivePath: join(outDir, "archive", "archive.sqlite") };
  // A demo run's archive holds that run: an earlier run's is replaced, not added to.
  await rm(join(outDir, "archive"), { recursive: true, force: true });
  const added: { id: number; captureId: string; kind: string; tx: string }[] = [];
  for (const file of scenario) {
    const capture = SCENARIO_CAPTURES.find((c) => c.id === file.captureId);
    if (capture === undefined) continue;
    const folder = join(outDir, basename(file.path).replace(/\.[^.]+$/, ""));
    for (const e of capture.emissions) {
      for (const [sub, tags] of [[`check-${e.transmitterId}`, [e.transmitterId]], [`measure-${e.transmitterId}`, [`measure:${e.transmitterId}`]]] as const) {
        const dir = join(folder, sub);
        if (!existsSync(join(dir, sub.startsWith("check-") ? "check.json" : "report.json"))) continue;
        const r = await archiveAdd([dir], { ...location, tags: [...tags, "site:ostrel-bay"], capturedAt: capture.datetime });
        for (const x of r.entries) added.push({ id: x.id, captureId: capture.id, kind: x.kind, tx: e.transmitterId });
      }
    }
  }
  const survey = join(outDir, "site-survey");
  if (existsSync(join(survey, "survey.json"))) await archiveAdd([survey], { ...location, tags: ["site:ostrel-bay"] });
  const visits = added.filter((a) => a.kind === "check" && a.tx === "launch" && a.captureId.startsWith("launch"));
  const lines = [`archive: ${added.length + 1} entries in ${location.archivePath}`];
  if (visits.length >= 2) {
    const c = await archiveCompare((visits[0] as { id: number }).id, (visits[visits.length - 1] as { id: number }).id, location);
    const e = c.figures.find((f) => f.field === "carrier.errorPpm");
    if (e !== undefined) {
      lines.push(`  the launch channel's two visits (entries ${c.first.id}, ${c.second.id}): carrier error ${e.first.toFixed(3)} -> ${e.second.toFixed(3)} ppm, ` +
        `change ${e.change >= 0 ? "+" : ""}${e.change.toFixed(3)} ppm ${e.significant === true ? "beyond" : "within"} the combined uncertainty ${e.combinedUncertainty?.toFixed(4) ?? "(not known)"} ppm`);
    }
    const png = join(outDir, "launch-history.png");
    const h = await archiveHistory({ ...location, tag: "launch", field: "carrier.errorPpm", outPath: png });
    written.push(png);
    lines.push(`  history of the launch channel's carrier error: ${h.points.length} checks${h.limit === null ? "" : `, limit ±${h.limit.value} ppm`} -> ${png}`);
  }
  lines.push("");
  return lines;
}

/**
 * The blind survey of the site's wideband capture (`iqaudit survey`), into `<outDir>/site-survey/`:
 * the table of what it found, beside the transmitters the scenario says are there.
 */
async function surveyDemo(scenario: readonly ScenarioFile[], outDir: string, written: string[], warnings: string[]): Promise<string[]> {
  const site = scenario.find((f) => f.captureId === "survey");
  if (site === undefined) return [];
  const folder = join(outDir, "site-survey");
  const { report, files } = await surveyCommand(site.path, { capture: {}, outDir: folder });
  written.push(...files);
  warnings.push(...report.warnings.map((w) => `${basename(site.path)} survey: ${w}`));
  const found = report.emissions.filter((e) => e.artefact === null);
  const set = report.emissions.filter((e) => e.artefact !== null);
  return [
    `${basename(site.path)}: blind survey, ${found.length} emissions found (the scenario has ${SCENARIO_CAPTURES.find((c) => c.id === "survey")?.emissions.length ?? "?"}), ${set.length} receiver artefacts set aside`,
    ...found.map((e) => `  ${e.id}. ${e.frequencyHz === null ? formatHz(e.offsetHz) : formatHz(e.frequencyHz)}: ${displayClass(e.class, e.order)}, ${e.designator ?? "no designator"}${e.report?.digital.symbolRateBd == null ? "" : `, ${e.report.digital.symbolRateBd.toFixed(1)} Bd`}, duty ${e.dutyCyclePercent?.toFixed(0) ?? "?"} %`),
    ...set.map((e) => `  ${e.id}. ${e.frequencyHz === null ? formatHz(e.offsetHz) : formatHz(e.frequencyHz)}: ${e.artefact === "dc" ? "the receiver's DC spike" : `IQ image of ${e.imageOf ?? "?"}`}`),
    `  -> ${join(folder, "survey.md")}, ${join(folder, "survey.png")}`,
    "",
  ];
}
