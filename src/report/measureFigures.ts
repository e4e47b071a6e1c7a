/**
 * The figures of a `measure` report: the channel's PSD with its occupied-bandwidth edges, the
 * x-dB line and the carrier marked; the instantaneous frequency (FM) or the envelope (AM) over
 * time with the peak lines. Numbers in, PNG bytes out; the caller writes them.
 */
import { binFrequencyHz, type WelchPsd } from "../dsp/index.js";
import { renderConstellation, renderHistogram, renderLineFigure, SERIES_COLOURS, type MarkerLine, type Rgb } from "../render/index.js";
import { formatHz } from "./format.js";

// Marker colours beside the PSD (series colour 0): the palette's second and third, and a neutral grey.
const CARRIER_COLOUR: Rgb = SERIES_COLOURS[1] ?? [0, 0, 0];
const X_DB_COLOUR: Rgb = SERIES_COLOURS[2] ?? [0, 0, 0];
const NOISE_FLOOR_COLOUR: Rgb = [96, 100, 108];

export interface SpectrumFigureInput {
  readonly title: string;
  /** PSD of the channel baseband (FS²/Hz), centred order, 0 Hz = the channel centre. */
  readonly psd: WelchPsd;
  /** Offset of the channel centre from the capture centre, and the channel's width, Hz. */
  readonly channelOffsetHz: number;
  readonly channelWidthHz: number;
  /** Capture centre, when known: the axis then shows absolute RF. */
  readonly centerHz: number | null;
  /** All offsets from the capture centre, Hz. */
  readonly lowerEdgeHz: number | null;
  readonly upperEdgeHz: number | null;
  readonly carrierOffsetHz: number | null;
  readonly xDb: number;
  /** Whether the x-dB level is read from the mean PSD or its max-hold (drawn as a second trace). */
  readonly xDbReference?: "average" | "peak-hold";
  readonly xDbLevelDbfsPerHz: number | null;
  readonly noiseFloorDbfsPerHz: number;
  readonly widthPx?: number;
  readonly heightPx?: number;
}

/**
 * A PSD in dB for a trace, every value at least `clampDb`: a bin of zero power (no log), a NaN,
 * or one far under the floor is drawn at clampDb, below the axis minimum, so that the line runs
 * off the bottom of the plot and back instead of breaking (a NaN breaks a polyline).
 */
export function traceDb(densityPerHz: ArrayLike<number>, clampDb: number): Float64Array {
  const out = new Float64Array(densityPerHz.length);
  for (let i = 0; i < out.length; i++) {
    const p = densityPerHz[i] as number;
    const db = p > 0 && Number.isFinite(p) ? 10 * Math.log10(p) : -Infinity;
    out[i] = Math.max(db, clampDb);
  }
  return out;
}

export function spectrumFigure(input: SpectrumFigureInput): Buffer {
  const { psd } = input;
  const base = input.centerHz ?? 0;
  const axisMinDb = input.noiseFloorDbfsPerHz - 20;
  // 10 dB under the axis: far enough that the clipped line reads as "below the plot".
  const mean = traceDb(psd.densityPerHz, axisMinDb - 10);
  const hold = traceDb(psd.maxHoldPerHz, axisMinDb - 10);
  // The channel only: beyond it the PSD shows the extraction filter's skirts, not the emission.
  const xs: number[] = [];
  const ys: number[] = [];
  const hs: number[] = [];
  for (let i = 0; i < psd.fftLength; i++) {
    const f = binFrequencyHz(psd, i);
    if (Math.abs(f) > input.channelWidthHz / 2) continue;
    xs.push(base + input.channelOffsetHz + f);
    ys.push(mean[i] as number);
    hs.push(hold[i] as number);
  }
  const x = Float64Array.from(xs);
  const y = Float64Array.from(ys);
  const markers: MarkerLine[] = [];
  if (input.lowerEdgeHz !== null) markers.push({ orientation: "vertical", value: base + input.lowerEdgeHz, label: "99 % OBW lower" });
  if (input.upperEdgeHz !== null) markers.push({ orientation: "vertical", value: base + input.upperEdgeHz, label: "99 % OBW upper" });
  if (input.carrierOffsetHz !== null) {
    markers.push({ orientation: "vertical", value: base + input.carrierOffsetHz, label: "carrier", colour: CARRIER_COLOUR });
  }
  if (input.xDbLevelDbfsPerHz !== null) {
    markers.push({ orientation: "horizontal", value: input.xDbLevelDbfsPerHz, label: `${input.xDb} dB below ${input.xDbReference === "peak-hold" ? "max-hold peak" : "peak"}`, colour: X_DB_COLOUR });
  }
  markers.push({ orientation: "horizontal", value: input.noiseFloorDbfsPerHz, label: "noise floor", colour: NOISE_FLOOR_COLOUR });
  const png = renderLineFigure({
    title: `PSD of the channel: ${input.title}`,
    subtitle: `Welch ${psd.fftLength}-point ${psd.window}, ${psd.segmentCount} segments, RBW ${formatHz(psd.enbwHz)}, ` +
      `${input.centerHz === null ? "offset from the capture centre" : "absolute RF"}`,
    x: { name: input.centerHz === null ? "Frequency offset" : "Frequency", quantity: { kind: "hertz" } },
    y: { name: "PSD", quantity: { kind: "linear", unit: "dBFS/Hz" }, min: axisMinDb },
    series: [
      { label: "PSD (Welch mean)", xValues: x, yValues: y },
      ...(input.xDbReference === "peak-hold" ? [{ label: "max-hold (x-dB reference)", xValues: x, yValues: Float64Array.from(hs) }] : []),
    ],
    markers,
    widthPx: input.widthPx ?? 1200,
    heightPx: input.heightPx ?? 700,
  });
  return png.png;
}

export interface TraceFigureInput {
  readonly title: string;
  readonly subtitle: string;
  readonly timeS: ArrayLike<number>;
  readonly min: ArrayLike<number>;
  readonly max: ArrayLike<number>;
  readonly yName: string;
  /** "hertz" for instantaneous frequency, or a linear unit such as "% of carrier". */
  readonly yUnit: "hertz" | string;
  readonly markers: readonly MarkerLine[];
  readonly widthPx?: number;
  readonly heightPx?: number;
}

/** A min/max trace over time (one pair of values a time bucket), drawn as two lines. */
export function traceFigure(input: TraceFigureInput): Buffer {
  const quantity = input.yUnit === "hertz" ? ({ kind: "hertz" } as const) : ({ kind: "linear", unit: input.yUnit } as const);
  return renderLineFigure({
    title: input.title,
    subtitle: input.subtitle,
    x: { name: "Time", quantity: { kind: "seconds" } },
    y: { name: input.yName, quantity },
    series: [
      { label: "maximum in each time slice", xValues: input.timeS, yValues: input.max },
      { label: "minimum in each time slice", xValues: input.timeS, yValues: input.min },
    ],
    markers: input.markers,
    widthPx: input.widthPx ?? 1200,
    heightPx: input.heightPx ?? 600,
  }).png;
}

/** The recovered constellation as a density plot with the ideal points marked; EVM and MER in the title. */
export function constellationFigure(input: {
  readonly name: string;
  readonly symbols: Float64Array;
  readonly ideal: Float64Array;
  readonly constellation: string;
  readonly evmRmsPercent: number | null;
  readonly merDb: number | null;
  readonly symbolRateBd: number | null;
}): Buffer {
  const evm = input.evmRmsPercent === null ? "EVM n/a" : `EVM ${input.evmRmsPercent.toFixed(2)} % RMS`;
  const mer = input.merDb === null ? "" : `, MER ${input.merDb.toFixed(1)} dB`;
  return renderConstellation({
    title: `${input.constellation.toUpperCase()}  ${evm}${mer}`,
    subtitle:
      `${input.name} · ${input.symbols.length / 2} symbols` +
      `${input.symbolRateBd === null ? "" : ` at ${input.symbolRateBd.toFixed(1)} Bd`} · crosses: ideal points`,
    symbols: input.symbols,
    ideal: input.ideal,
    widthPx: 900,
    heightPx: 800,
  }).png;
}

/** Histogram of the instantaneous frequency of an FSK emission with its tones marked (offsets from the capture centre). */
export function frequencyHistogramFigure(input: {
  readonly name: string;
  readonly binsHz: ArrayLike<number>;
  readonly counts: ArrayLike<number>;
  readonly channelOffsetHz: number;
  readonly tonesHz: readonly (number | null)[];
}): Buffer {
  const bins = Array.from(input.binsHz, (f) => f + input.channelOffsetHz);
  const markers: MarkerLine[] = [];
  input.tonesHz.forEach((t, i) => {
    if (t !== null) markers.push({ orientation: "vertical", value: t, label: `tone ${i + 1}: ${formatHz(t)}` });
  });
  return renderHistogram({
    title: `Instantaneous frequency: ${input.name}`,
    subtitle: "FM discriminator of the channel; the tones are the histogram's modes",
    binsCentre: bins,
    counts: input.counts,
    x: { name: "Frequency offset", quantity: { kind: "hertz" } },
    y: { name: "Samples", quantity: { kind: "linear", unit: "count" } },
    markers,
    widthPx: 1200,
    heightPx: 600,
  }).png;
}
