/**
 * `iqaudit measure <capture>`: the full measurement of one emission (the strongest, or the one
 * picked with --channel): pass 1 over the capture, pass 2 over the emission's channel, the
 * figures with their uncertainty and method, and a report folder (report.json, report.md, PNGs).
 */
import { basename, join } from "node:path";
import type { Pass1Options } from "../analysis/index.js";
import { checkMeasureOptions, measureEmission, type MeasureEmissionOptions } from "../analysis/measureEmission.js";
import type { EmissionFigures } from "../analysis/emissionFigures.js";
import { withAnalysedCapture, type AnalysedCapture, type CaptureArgs } from "./analyseCapture.js";
import { buildMeasureReport, type MeasureReport } from "../report/measureReport.js";
import { measureMarkdown } from "../report/measureMarkdown.js";
import { constellationFigure, frequencyHistogramFigure, spectrumFigure, traceFigure } from "../report/measureFigures.js";
import { spectrogramFigure } from "../report/spectrogramFigure.js";
import { writeFileAtomic } from "../report/index.js";
import { formatHz } from "../report/format.js";

export interface MeasureOptions extends MeasureEmissionOptions {
  readonly capture: CaptureArgs;
  /** Folder for report.json, report.md and the figures; nothing is written without it. */
  readonly outDir?: string | undefined;
  readonly pass1?: Pass1Options | undefined;
}

export interface MeasureResult {
  readonly report: MeasureReport;
  /** Files written, report.json last. */
  readonly files: readonly string[];
}

export async function measureCommand(path: string, options: MeasureOptions): Promise<MeasureResult> {
  return withAnalysedCapture(path, options.capture, options.pass1 ?? {}, async (a, source) => {
    const figures = await measureEmission(source, a.span, a.pass1, options);
    const report = buildMeasureReport(a.meta, a.span, a.pass1, figures, a.warnings);
    const files = options.outDir === undefined ? [] : await writeReportFolder(options.outDir, a, figures, report);
    return { report, files };
  }, (meta, span) => checkMeasureOptions(options, meta, span));
}

/** Figures first, then report.md, then report.json: a folder with report.json in it is complete. */
async function writeReportFolder(dir: string, a: AnalysedCapture, f: EmissionFigures, r: MeasureReport): Promise<string[]> {
  const name = basename(a.meta.path);
  const written: string[] = [];
  const put = async (file: string, data: string | Uint8Array): Promise<void> => {
    const p = join(dir, file);
    await writeFileAtomic(p, data);
    written.push(p);
  };
  await put("spectrogram.png", spectrogramFigure(a, { title: name, widthPx: 1200, heightPx: 800, reduce: "mean" }).png);
  if (f.channelPsd !== null) {
    const xDbLevel = r.bandwidth.xDbHz === null ? null : maxDb(f.channelPsd.densityPerHz) - r.bandwidth.xDb;
    await put(
      "spectrum.png",
      spectrumFigure({
        title: name,
        psd: f.channelPsd,
        channelOffsetHz: f.channel.offsetHz,
        channelWidthHz: f.channel.widthHz,
        centerHz: a.meta.centerHz,
        lowerEdgeHz: r.bandwidth.lowerEdgeHz,
        upperEdgeHz: r.bandwidth.upperEdgeHz,
        carrierOffsetHz: r.carrier.offsetHz,
        xDb: r.bandwidth.xDb,
        xDbLevelDbfsPerHz: xDbLevel,
        noiseFloorDbfsPerHz: f.noiseFloorDbfsPerHz,
      }),
    );
  }
  if (f.fm !== null && r.fm !== null) {
    const pos = r.fm.positiveDeviationHz;
    const neg = r.fm.negativeDeviationHz;
    await put(
      "deviation.png",
      traceFigure({
        title: `Deviation from the carrier: ${name}`,
        subtitle: `FM discriminator after a ${formatHz(f.fm.audioBandwidthHz)} audio low-pass; lines at the peak deviations`,
        ...f.fm.trace,
        yName: "Deviation",
        yUnit: "hertz",
        markers: [
          ...(pos === null ? [] : [{ orientation: "horizontal" as const, value: pos, label: `+${formatHz(pos)}` }]),
          ...(neg === null ? [] : [{ orientation: "horizontal" as const, value: -neg, label: `-${formatHz(neg)}` }]),
        ],
      }),
    );
  }
  if (f.am !== null && r.am !== null) {
    const mp = r.am.positiveDepthPercent;
    const mn = r.am.negativeDepthPercent;
    await put(
      "envelope.png",
      traceFigure({
        title: `Envelope re carrier: ${name}`,
        subtitle: "envelope after the audio low-pass; 0 % = carrier; lines at m+ and m-",
        ...f.am.trace,
        yName: "Envelope",
        yUnit: "% of carrier",
        markers: [
          ...(mp === null ? [] : [{ orientation: "horizontal" as const, value: mp, label: `m+ ${mp.toFixed(1)} %` }]),
          ...(mn === null ? [] : [{ orientation: "horizontal" as const, value: -mn, label: `m- ${mn.toFixed(1)} %` }]),
        ],
      }),
    );
  }
  if (f.digital?.recovered != null && f.digital.constellation !== null) {
    await put(
      "constellation.png",
      constellationFigure({
        name,
        symbols: f.digital.recovered.symbols,
        ideal: f.digital.recovered.ideal,
        constellation: f.digital.constellation,
        evmRmsPercent: r.digital.evmRmsPercent,
        merDb: r.digital.merDb,
        symbolRateBd: r.digital.symbolRateBd,
      }),
    );
  }
  if (f.fsk !== null) {
    await put(
      "frequency-histogram.png",
      frequencyHistogramFigure({
        name,
        binsHz: f.fsk.histogram.binsHz,
        counts: f.fsk.histogram.counts,
        channelOffsetHz: f.channel.offsetHz,
        tonesHz: r.fsk.toneFrequenciesHz ?? [],
      }),
    );
  }
  const pngs = written.map((p) => basename(p));
  await put("report.md", measureMarkdown(r, pngs));
  await put("report.json", `${JSON.stringify(r, null, 2)}\n`);
  return written;
}

function maxDb(d: Float64Array): number {
  let m = 0;
  for (const v of d) if (v > m) m = v;
  return 10 * Math.log10(Math.max(m, 1e-30));
}
