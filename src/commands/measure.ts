/**
 * `iqaudit measure <capture>`: the full measurement of one emission (the strongest, or the one
 * picked with --channel): pass 1 over the capture, pass 2 over the emission's channel, the
 * figures with their uncertainty and method, and a report folder (report.json, report.md, PNGs).
 */
import { basename, join } from "node:path";
import type { Pass1Options } from "../analysis/index.js";
import { checkMeasureOptions, measureEmission, pass2BesidePass1, type MeasureEmissionOptions } from "../analysis/measureEmission.js";
import type { EmissionFigures } from "../analysis/emissionFigures.js";
import { resolveChannel, type ChannelRequest } from "../analysis/channelRequest.js";
import { withAnalysedCapture, type AnalysedCapture, type CaptureArgs } from "./analyseCapture.js";
import { buildMeasureReport, type MeasureReport } from "../report/measureReport.js";
import { measureMarkdown } from "../report/measureMarkdown.js";
import { constellationFigure, frequencyHistogramFigure, spectrumFigure, traceFigure } from "../report/measureFigures.js";
import { spectrogramFigure } from "../report/spectrogramFigure.js";
import { spectrogramPlotRows, type SpectrogramRegion } from "../render/index.js";
import { publishFolder, REPORT_FOLDER, type FolderWriter } from "../report/index.js";
import { formatHz } from "../report/format.js";

export interface MeasureOptions extends MeasureEmissionOptions {
  readonly capture: CaptureArgs;
  /** Folder for report.json, report.md and the figures, published whole; nothing is written without it. */
  readonly outDir?: string | undefined;
  /** Instead of outDir: a folder inside one being published (the demo's), written into as it is. */
  readonly outFolder?: FolderWriter | undefined;
  readonly pass1?: Pass1Options | undefined;
  /**
   * `--channel` as typed (an offset, or an absolute frequency beyond the sample rate): resolved
   * against the capture's metadata once it is open (resolveChannel) and measured as `channel`.
   */
  readonly channelAsGiven?: ChannelRequest | undefined;
}

export interface MeasureResult {
  readonly report: MeasureReport;
  /** Files written (in the folder's final place), report.json last. */
  readonly files: readonly string[];
}

export async function measureCommand(path: string, options: MeasureOptions): Promise<MeasureResult> {
  const { outDir, outFolder } = options;
  if (outFolder !== undefined) return measured(path, options, (a, f, r) => writeReportFolder(outFolder, a, f, r));
  if (outDir === undefined) return measured(path, options, async (_a, _f, report) => ({ report, files: [] }));
  return publishFolder(outDir, REPORT_FOLDER, (w) => measured(path, options, (a, f, r) => writeReportFolder(w, a, f, r)));
}

/** Pass 1, pass 2 and the report, handed to `then` while the capture is open. */
async function measured<T>(path: string, options: MeasureOptions, then: (a: AnalysedCapture, f: EmissionFigures, r: MeasureReport) => Promise<T>): Promise<T> {
  let resolved: MeasureOptions = options;
  const pass1 = { spectrogramRows: spectrogramPlotRows(FIGURE_SIZE.widthPx, FIGURE_SIZE.heightPx), ...options.pass1 };
  return withAnalysedCapture(path, options.capture, pass1, async (a, source) => {
    const figures = await measureEmission(source, a.span, a.pass1, resolved);
    return then(a, figures, buildMeasureReport(a.meta, a.span, a.pass1, figures, a.warnings));
  }, (meta, span) => {
    const asGiven = options.channelAsGiven;
    if (asGiven !== undefined) resolved = { ...options, channel: resolveChannel(asGiven, meta) };
    checkMeasureOptions(resolved, meta, span);
    // A channel known now is extracted in pass 1's read (no second read of the span).
    return { channel: pass2BesidePass1(resolved, meta) };
  });
}

/** Figures first, then report.md, then report.json listing both with their SHA-256. */
export async function writeReportFolder(w: FolderWriter, a: AnalysedCapture, f: EmissionFigures, r: MeasureReport): Promise<MeasureResult> {
  await writeFigures(w, a, f, r);
  const pngs = w.files().map((file) => file.path);
  await w.write("report.md", measureMarkdown(r, pngs));
  const report: MeasureReport = { ...r, files: w.files() };
  await w.write("report.json", `${JSON.stringify(report, null, 2)}\n`);
  return { report, files: w.files().map((file) => join(w.target, file.path)) };
}

async function writeFigures(w: FolderWriter, a: AnalysedCapture, f: EmissionFigures, r: MeasureReport): Promise<void> {
  const name = basename(a.meta.path);
  const put = (file: string, data: Uint8Array): Promise<void> => w.write(file, data);
  await put("spectrogram.png", channelSpectrogram(a, f, r, name));
  if (f.channelPsd !== null) {
    const reference = r.bandwidth.xDbReference === "peak-hold" ? f.channelPsd.maxHoldPerHz : f.channelPsd.densityPerHz;
    const xDbLevel = r.bandwidth.xDbHz === null ? null : maxDb(reference) - r.bandwidth.xDb;
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
        xDbReference: r.bandwidth.xDbReference,
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
}

/**
 * The measured channel's part of the pass-1 spectrogram: the frequency axis the channel with a
 * tenth of its width each side, the channel (dashed) and the 99 % OBW edges (solid) boxed over
 * the whole time span.
 */
function channelSpectrogram(a: AnalysedCapture, f: EmissionFigures, r: MeasureReport, name: string): Buffer {
  const { offsetHz, widthHz } = f.channel;
  const whole = { title: `Spectrogram of the measured channel: ${name}`, widthPx: FIGURE_SIZE.widthPx, heightPx: FIGURE_SIZE.heightPx, reduce: "mean" as const };
  if (!(widthHz > 0)) return spectrogramFigure(a, { ...whole, title: name }).png;
  const spanS = a.span.sampleCount / a.meta.sampleRateHz;
  const lower = r.bandwidth.lowerEdgeHz;
  const upper = r.bandwidth.upperEdgeHz;
  const regions: SpectrogramRegion[] = [
    { lowerHz: offsetHz - widthHz / 2, upperHz: offsetHz + widthHz / 2, startS: 0, endS: spanS, label: "channel", kind: "artefact" },
    ...(lower === null || upper === null ? [] : [{ lowerHz: lower, upperHz: upper, startS: 0, endS: spanS, label: "99 % OBW", kind: "emission" as const }]),
  ];
  const margin = 0.1 * widthHz;
  return spectrogramFigure(a, {
    ...whole,
    frequencyWindowHz: { lowerHz: offsetHz - widthHz / 2 - margin, upperHz: offsetHz + widthHz / 2 + margin },
    regions,
  }).png;
}

/** The size of a measure report's spectrogram, and so its default row count (one per pixel row of the plot). */
const FIGURE_SIZE = { widthPx: 1200, heightPx: 800 } as const;

function maxDb(d: Float64Array): number {
  let m = 0;
  for (const v of d) if (v > m) m = v;
  return 10 * Math.log10(Math.max(m, 1e-30));
}
