/**
 * `iqaudit demo`: writes the sample scenario's captures into <out>/captures (if missing) and runs
 * every command that exists so far on each of them, into <out>/<capture name>/. It grows with
 * each capability of the tool.
 */
import { basename, join } from "node:path";
import { SCENARIO_CAPTURES, emissionEdgesHz, scenarioTransmitter, writeScenario, type ScenarioFile } from "../scenario/index.js";
import type { MeasureReport } from "../report/measureReport.js";
import { inspectCommand } from "./inspect.js";
import { spectrogramCommand } from "./spectrogram.js";
import { measureCommand } from "./measure.js";
import type { CaptureArgs } from "./analyseCapture.js";
import type { Pass1Options } from "../analysis/index.js";
import { inspectText } from "../report/inspectText.js";
import { writeFileAtomic } from "../report/index.js";
import { formatHz } from "../report/format.js";

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
  const written: string[] = [];
  const warnings: string[] = [];
  const lines: string[] = [`iqaudit demo: ${scenario.length} sample captures in ${capturesDir}`, ""];
  for (const file of scenario) {
    const name = basename(file.path).replace(/\.[^.]+$/, "");
    const dir = join(options.outDir, name);
    const capture = scenarioArgs(file);
    const progress = options.progress?.(`inspect ${basename(file.path)}`) ?? { onProgress: undefined, done: () => undefined };
    const report = await inspectCommand(file.path, { capture, pass1: { onProgress: progress.onProgress } });
    progress.done();
    const inspectJson = join(dir, "inspect.json");
    await writeFileAtomic(inspectJson, `${JSON.stringify(report, null, 2)}\n`);
    await writeFileAtomic(join(dir, "inspect.txt"), inspectText(report));
    const png = join(dir, "spectrogram.png");
    const s = await spectrogramCommand(file.path, { capture, outputPath: png });
    written.push(inspectJson, join(dir, "inspect.txt"), png);
    // Each transmitter of the capture, measured in its assigned channel against its nominal frequency.
    const measured = await measureTransmitters(file, capture, dir);
    for (const m of measured) written.push(...m.files);
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
      `  -> ${inspectJson}, ${png} (${s.rows} rows)`,
      "",
    );
  }
  lines.push("Results are indicative; see iqaudit --help for the cautions of transmitter testing.", "");
  const text = lines.join("\n");
  await writeFileAtomic(join(options.outDir, "SUMMARY.txt"), text);
  return { outDir: options.outDir, files: written, text, warnings };
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
async function measureTransmitters(file: ScenarioFile, capture: CaptureArgs, dir: string): Promise<MeasuredTransmitter[]> {
  const scenario = SCENARIO_CAPTURES.find((c) => c.id === file.captureId);
  if (scenario === undefined) return [];
  const out: MeasuredTransmitter[] = [];
  for (const e of scenario.emissions) {
    const tx = scenarioTransmitter(e.transmitterId);
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
      outDir: join(dir, `measure-${tx.id}`),
    });
    out.push({ label: tx.label, report: r.report, files: r.files });
  }
  return out;
}

function measuredLine(m: MeasureReport): string {
  const parts = [
    `${m.modulation.class}${m.modulation.order === null ? "" : ` ${m.modulation.order}`}`,
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
