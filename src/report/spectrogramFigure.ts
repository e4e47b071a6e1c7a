/**
 * Turns pass 1's spectrogram rows into the figure: dB values (dBFS/Hz), axes from the capture's
 * rate, centre and span, and a title line that says how it was made.
 */
import type { AnalysedCapture } from "../commands/analyseCapture.js";
import { powerToDb } from "../dsp/index.js";
import { autoDbRange, renderSpectrogram, type FigureLayout, type SpectrogramRegion } from "../render/index.js";
import { formatHz, formatRate } from "./format.js";

export interface SpectrogramFigureOptions {
  readonly title: string;
  readonly widthPx: number;
  readonly heightPx: number;
  readonly dbRange?: { readonly minDb: number; readonly maxDb: number } | undefined;
  readonly reduce: "mean" | "max";
  /** Regions boxed over the plot (a survey's emissions and artefacts), times from the span's start. */
  readonly regions?: readonly SpectrogramRegion[] | undefined;
  /** Only the bins whose centres lie in this band (offsets from the capture centre, Hz): a measured channel. Default the whole span. */
  readonly frequencyWindowHz?: { readonly lowerHz: number; readonly upperHz: number } | undefined;
}

/** The bins of the band [lowerHz, upperHz] (bin k centred at −fs/2 + k·Δf), at least two. */
function binWindow(bins: number, fs: number, df: number, band: SpectrogramFigureOptions["frequencyWindowHz"]): { first: number; count: number } {
  if (band === undefined) return { first: 0, count: bins };
  const lo = Math.max(0, Math.min(bins - 2, Math.ceil((band.lowerHz + fs / 2) / df)));
  const hi = Math.min(bins - 1, Math.max(lo + 1, Math.floor((band.upperHz + fs / 2) / df)));
  return { first: lo, count: hi - lo + 1 };
}

export function spectrogramFigure(
  a: AnalysedCapture,
  options: SpectrogramFigureOptions,
): { png: Buffer; dbRange: { minDb: number; maxDb: number }; plot: FigureLayout["plot"]; frequencySpanHz: readonly [number, number] } {
  const s = a.pass1.spectrogram;
  const source = options.reduce === "max" ? s.maxPerHz : s.meanPerHz;
  const fs = a.meta.sampleRateHz;
  const { first, count } = binWindow(s.fftLength, fs, s.binWidthHz, options.frequencyWindowHz);
  const valuesDb = new Float32Array(s.rowCount * count);
  for (let r = 0; r < s.rowCount; r++) {
    for (let k = 0; k < count; k++) valuesDb[r * count + k] = powerToDb(source[r * s.fftLength + first + k] as number);
  }
  const dbRange = options.dbRange ?? autoDbRange(valuesDb, a.pass1.noiseFloor.dbfsPerHz);
  const t0 = a.span.startSample / fs;
  let fewest = Number.POSITIVE_INFINITY;
  let most = 0;
  for (const f of s.framesPerRow) {
    fewest = Math.min(fewest, f);
    most = Math.max(most, f);
  }
  const perRow = fewest === most ? `${most} frame${most === 1 ? "" : "s"}` : `${fewest}–${most} frames`;
  const rbw = s.binWidthHz * 1.5; // Hann ENBW, 1.5 bins (Harris 1978, Table 1)
  const subtitle = [
    formatRate(fs),
    a.meta.centerHz === null ? "centre unknown" : `centre ${formatHz(a.meta.centerHz)}`,
    `FFT ${s.fftLength} Hann`,
    `RBW ${formatHz(rbw)}`,
    `${s.rowCount} rows, each the ${options.reduce} of ${perRow}`,
  ].join(" · ");
  const frequencyStartHz = -fs / 2 + (first - 0.5) * s.binWidthHz;
  const frequencyStopHz = -fs / 2 + (first + count - 0.5) * s.binWidthHz;
  const figure = renderSpectrogram({
    rows: s.rowCount,
    bins: count,
    valuesDb,
    frequencyStartHz,
    frequencyStopHz,
    centerHz: a.meta.centerHz,
    timeStartS: t0 + (s.rowStartS[0] ?? 0),
    timeStopS: t0 + (s.rowStopS[s.rowCount - 1] ?? a.span.sampleCount / fs),
    dbRange,
    unitLabel: "dBFS/Hz",
    title: options.title,
    subtitle,
    widthPx: options.widthPx,
    heightPx: options.heightPx,
    regions: options.regions?.map((r) => ({ ...r, startS: r.startS + t0, endS: r.endS + t0 })),
  });
  return { png: figure.png, dbRange, plot: figure.layout.plot, frequencySpanHz: [frequencyStartHz, frequencyStopHz] };
}
