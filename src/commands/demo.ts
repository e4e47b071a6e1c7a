/**
 * `iqaudit demo`: writes the sample scenario's captures into <out>/captures (if missing) and runs
 * every command that exists so far on each of them, into <out>/<capture name>/. It grows with
 * each capability of the tool.
 */
import { basename, join } from "node:path";
import { writeScenario, type ScenarioFile } from "../scenario/index.js";
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
    // The strongest emission of each capture, measured into its own report folder.
    const measured = await measureCommand(file.path, { capture, outDir: join(dir, "measure") });
    written.push(...measured.files);
    const m = measured.report;
    warnings.push(...report.warnings.map((w) => `${basename(file.path)}: ${w}`));
    warnings.push(...measured.report.warnings.filter((w) => !report.warnings.includes(w)).map((w) => `${basename(file.path)} measure: ${w}`));
    const q = report.quality;
    lines.push(
      `${basename(file.path)}: ${file.description}`,
      `  ${report.capture.format} at ${report.capture.sampleRateHz} S/s, ${report.capture.durationS.toFixed(2)} s; ` +
        `noise floor ${q.noiseFloorDbfsPerHz.toFixed(1)} dBFS/Hz; strongest line ${formatHz(report.spectrum.peakOffsetHz)} offset ` +
        `at ${report.spectrum.peakDbfs.toFixed(1)} dBFS; clipping ${q.clippingPercent.toFixed(3)} %; ` +
        `IQ ${q.iqGainImbalanceDb.toFixed(2)} dB / ${q.iqPhaseImbalanceDeg.toFixed(2)}°`,
      `  strongest emission: ${m.modulation.class} at ${m.carrier.offsetHz === null ? "?" : formatHz(m.carrier.offsetHz)} offset` +
        `, OBW ${m.bandwidth.occupiedHz === null ? "?" : formatHz(m.bandwidth.occupiedHz)}, designator ${m.emission.designator ?? "n/a"}` +
        (m.fm === null || m.fm.peakDeviationHz === null ? "" : `, peak deviation ${formatHz(m.fm.peakDeviationHz)}`) +
        (m.fm === null || m.fm.toneHz === null ? "" : `, tone ${m.fm.toneHz.toFixed(1)} Hz`) +
        (m.am === null || m.am.modulationDepthPercent === null ? "" : `, depth ${m.am.modulationDepthPercent.toFixed(1)} %`),
      `  -> ${inspectJson}, ${png} (${s.rows} rows), ${join(dir, "measure", "report.md")}`,
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
