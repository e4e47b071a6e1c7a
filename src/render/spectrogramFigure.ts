import { buildAxis, drawAxes, xAxisDepthPx, yAxisDepthPx } from "./axes.js";
import { colourBarLabelDepthPx, colourBarWidthPx, drawColourBar } from "./colourBar.js";
import { COLOUR_RAMP_RGB, rampIndex } from "./colourRamp.js";
import { encodePng } from "./encodePng.js";
import { checkFigureSize, drawTitleBlock, PAGE_STYLE, pagePaddingPx, textScaleFor } from "./figureFrame.js";
import { measureText, RgbaCanvas, type Rgb } from "./raster.js";
import { textHeightPx } from "./font.js";

/** What a spectrogram figure shows. Frequencies in Hz, times in s, levels in `unitLabel`. */
export interface SpectrogramFigureInput {
  readonly rows: number;
  readonly bins: number;
  /** rows × bins, row-major; row 0 = earliest time; bin 0 = lowest frequency. */
  readonly valuesDb: Float32Array;
  /** Offset from the capture centre of the LOW edge of bin 0, in Hz. */
  readonly frequencyStartHz: number;
  /** Offset of the HIGH edge of the last bin, in Hz. */
  readonly frequencyStopHz: number;
  /** RF centre of the capture when known: the frequency axis then shows absolute RF. */
  readonly centerHz: number | null;
  /** Start of row 0 and end of the last row, in s from the first sample of the capture. */
  readonly timeStartS: number;
  readonly timeStopS: number;
  /** Levels mapped to the darkest and the lightest colour; values outside are clamped. */
  readonly dbRange: { readonly minDb: number; readonly maxDb: number };
  /** Unit of the levels, e.g. "dBFS/Hz"; shown in the colour bar's title. */
  readonly unitLabel: string;
  /** First line at the top, e.g. the capture's file name. */
  readonly title: string;
  /** Second line, e.g. "2.4 MS/s · FFT 1024 · RBW 3.52 kHz · 1000 rows (mean)". */
  readonly subtitle: string;
  /** Size of the whole image, at least 480 × 320 px. */
  readonly widthPx: number;
  readonly heightPx: number;
  /** Regions to box and number over the plot (a survey's emissions and artefacts); none by default. */
  readonly regions?: readonly SpectrogramRegion[] | undefined;
}

/**
 * A time-frequency rectangle drawn over the spectrogram: an emission as a solid box, an artefact
 * (a receiver's DC spike or IQ image) as a dashed one, each with its label in a tag at its
 * top-left corner. Frequencies are offsets from the capture centre, as frequencyStartHz.
 */
export interface SpectrogramRegion {
  readonly lowerHz: number;
  readonly upperHz: number;
  readonly startS: number;
  readonly endS: number;
  /** Short text of the tag, e.g. the emission's number "3". */
  readonly label: string;
  readonly kind: "emission" | "artefact";
}

/** Box colours: white with a dark outline reads on every colour of the ramp. */
const REGION_STYLE = { box: [255, 255, 255] as Rgb, outline: [20, 20, 24] as Rgb, tagText: [20, 20, 24] as Rgb };

/** Where the data sits in a figure: the plot rectangle in image pixels (x right, y down). */
export interface FigureLayout {
  readonly plot: { x: number; y: number; width: number; height: number };
}

/** Which source cells feed each pixel: an inclusive index range per pixel. */
interface CellRanges {
  readonly lo: Int32Array;
  readonly hi: Int32Array;
}

/**
 * Maps `cells` source cells onto `pixels` pixels. More cells than pixels: each pixel takes the
 * cells whose centres fall inside it (to be combined by max). Fewer: nearest neighbour, the
 * cell under the pixel's centre.
 */
function cellRanges(cells: number, pixels: number): CellRanges {
  const lo = new Int32Array(pixels).fill(-1);
  const hi = new Int32Array(pixels).fill(-1);
  if (cells > pixels) {
    for (let k = 0; k < cells; k++) {
      const p = Math.min(pixels - 1, Math.floor(((k + 0.5) * pixels) / cells));
      if (lo[p] === -1) lo[p] = k;
      hi[p] = k;
    }
  } else {
    for (let p = 0; p < pixels; p++) {
      const k = Math.min(cells - 1, Math.floor(((p + 0.5) * cells) / pixels));
      lo[p] = k;
      hi[p] = k;
    }
  }
  return { lo, hi };
}

function checkInput(input: SpectrogramFigureInput): void {
  const { rows, bins } = input;
  checkFigureSize("renderSpectrogram", input.widthPx, input.heightPx);
  if (!Number.isInteger(rows) || rows < 1) throw new RangeError(`renderSpectrogram: rows ${rows} must be a positive integer`);
  if (!Number.isInteger(bins) || bins < 1) throw new RangeError(`renderSpectrogram: bins ${bins} must be a positive integer`);
  if (input.valuesDb.length !== rows * bins)
    throw new RangeError(`renderSpectrogram: valuesDb has ${input.valuesDb.length} values, rows × bins is ${rows * bins}`);
  if (!(input.frequencyStopHz > input.frequencyStartHz))
    throw new RangeError(`renderSpectrogram: frequencyStopHz ${input.frequencyStopHz} must exceed frequencyStartHz ${input.frequencyStartHz}`);
  if (!(input.timeStopS > input.timeStartS))
    throw new RangeError(`renderSpectrogram: timeStopS ${input.timeStopS} must exceed timeStartS ${input.timeStartS}`);
  if (!(input.dbRange.maxDb > input.dbRange.minDb))
    throw new RangeError(`renderSpectrogram: dbRange.maxDb ${input.dbRange.maxDb} must exceed minDb ${input.dbRange.minDb}`);
}

/**
 * The plot height, in pixel rows, of a widthPx × heightPx spectrogram figure with a one-line
 * title and a one-line subtitle (the layout of renderSpectrogram): the default number of
 * spectrogram rows, one row per pixel row, so that no row is hidden by the max over rows and
 * none is drawn twice. A title that wraps makes the plot a little shorter; the rows then fold by max.
 */
export function spectrogramPlotRows(widthPx: number, heightPx: number): number {
  const s = textScaleFor(widthPx, heightPx);
  const titleBottom = pagePaddingPx(s) + textHeightPx(s + 1) + 2 * s + textHeightPx(s);
  return Math.max(1, heightPx - pagePaddingPx(s) - xAxisDepthPx(s) - (titleBottom + 10 * s));
}

/**
 * A spectrogram figure as PNG: frequency across (low at left), time down (start at top), each
 * value coloured by the OKLab ramp between dbRange.minDb and maxDb, with axes, units, a colour
 * bar, the title and the subtitle. With more bins than plot columns (or more rows than plot
 * rows) each pixel shows the MAX of the cells whose centres fall in it, so a narrow carrier or
 * a short burst stays visible; with fewer, nearest neighbour. NaN cells are skipped.
 * xOfFrequencyHz (an offset from the capture centre, Hz) and yOfTimeS (s) give continuous image
 * coordinates: pixel column c covers [c, c + 1). Throws RangeError for a bad input.
 */
export function renderSpectrogram(input: SpectrogramFigureInput): {
  png: Buffer;
  layout: FigureLayout;
  xOfFrequencyHz(offsetHz: number): number;
  yOfTimeS(t: number): number;
} {
  checkInput(input);
  const { widthPx, heightPx, rows, bins, valuesDb } = input;
  const s = textScaleFor(widthPx, heightPx);
  const pad = pagePaddingPx(s);
  const canvas = new RgbaCanvas(widthPx, heightPx, PAGE_STYLE.pageColour);
  const titleBottom = drawTitleBlock(canvas, input.title, input.subtitle, s);

  const plotTop = titleBottom + 10 * s;
  const plotHeight = heightPx - pad - xAxisDepthPx(s) - plotTop;
  const timeAxis = buildAxis({
    min: input.timeStartS,
    max: input.timeStopS,
    quantity: { kind: "seconds" },
    name: "Time",
    lengthPx: plotHeight,
    orientation: "vertical",
    textScale: s,
  });
  const { minDb, maxDb } = input.dbRange;
  const levelAxis = buildAxis({
    min: minDb,
    max: maxDb,
    quantity: { kind: "linear", unit: input.unitLabel },
    name: "Level",
    lengthPx: plotHeight,
    orientation: "vertical",
    textScale: s,
  });
  const plotLeft = pad + yAxisDepthPx(timeAxis, s);
  const barWidth = colourBarWidthPx(widthPx);
  const barGap = 12 * s;
  const plotWidth = widthPx - plotLeft - barGap - barWidth - colourBarLabelDepthPx(levelAxis, s) - pad;
  if (plotWidth < 64 || plotHeight < 64)
    throw new RangeError(`renderSpectrogram: ${widthPx} × ${heightPx} px leaves no room for the plot`);
  const plot = { x: plotLeft, y: plotTop, width: plotWidth, height: plotHeight };

  const centre = input.centerHz;
  const frequencyAxis = buildAxis({
    min: input.frequencyStartHz + (centre ?? 0),
    max: input.frequencyStopHz + (centre ?? 0),
    quantity: { kind: "hertz" },
    name: centre === null ? "Frequency offset from capture centre" : "Frequency",
    lengthPx: plotWidth,
    orientation: "horizontal",
    textScale: s,
  });

  const columns = cellRanges(bins, plotWidth);
  const lines = cellRanges(rows, plotHeight);
  const rowMax = new Float32Array(bins);
  for (let py = 0; py < plotHeight; py++) {
    rowMax.fill(-Infinity);
    for (let r = lines.lo[py]!; r <= lines.hi[py]!; r++) {
      const base = r * bins;
      for (let k = 0; k < bins; k++) {
        const v = valuesDb[base + k]!;
        if (v > rowMax[k]!) rowMax[k] = v;
      }
    }
    const rowStart = ((plotTop + py) * widthPx + plotLeft) * 4;
    for (let px = 0; px < plotWidth; px++) {
      let m = -Infinity;
      for (let k = columns.lo[px]!; k <= columns.hi[px]!; k++) {
        const v = rowMax[k]!;
        if (v > m) m = v;
      }
      const c = rampIndex(m, minDb, maxDb) * 3;
      const i = rowStart + px * 4;
      canvas.data[i] = COLOUR_RAMP_RGB[c]!;
      canvas.data[i + 1] = COLOUR_RAMP_RGB[c + 1]!;
      canvas.data[i + 2] = COLOUR_RAMP_RGB[c + 2]!;
    }
  }

  drawAxes(canvas, plot, frequencyAxis, timeAxis, {
    textScale: s,
    frameColour: PAGE_STYLE.frameColour,
    textColour: PAGE_STYLE.inkColour,
    gridColour: null,
    yMinAtTop: true,
  });
  drawColourBar(canvas, { x: plotLeft + plotWidth + barGap, y: plotTop, width: barWidth, height: plotHeight }, levelAxis, {
    textScale: s,
    frameColour: PAGE_STYLE.frameColour,
    textColour: PAGE_STYLE.inkColour,
  });

  const spanHz = input.frequencyStopHz - input.frequencyStartHz;
  const spanS = input.timeStopS - input.timeStartS;
  const xOfFrequencyHz = (offsetHz: number): number => plotLeft + ((offsetHz - input.frequencyStartHz) / spanHz) * plotWidth;
  const yOfTimeS = (t: number): number => plotTop + ((t - input.timeStartS) / spanS) * plotHeight;
  for (const r of input.regions ?? []) drawRegion(canvas, plot, r, xOfFrequencyHz, yOfTimeS, s);
  return { png: encodePng(canvas), layout: { plot }, xOfFrequencyHz, yOfTimeS };
}

/** One region (SpectrogramRegion): its box clipped to the plot, at least 3 px each way, and its tag. */
function drawRegion(
  canvas: RgbaCanvas, plot: { x: number; y: number; width: number; height: number }, r: SpectrogramRegion,
  xOf: (hz: number) => number, yOf: (s: number) => number, textScale: number,
): void {
  const clamp = (v: number, lo: number, hi: number): number => Math.min(hi, Math.max(lo, v));
  let x0 = clamp(Math.floor(xOf(Math.min(r.lowerHz, r.upperHz))), plot.x, plot.x + plot.width - 1);
  let x1 = clamp(Math.ceil(xOf(Math.max(r.lowerHz, r.upperHz))), plot.x, plot.x + plot.width - 1);
  let y0 = clamp(Math.floor(yOf(Math.min(r.startS, r.endS))), plot.y, plot.y + plot.height - 1);
  let y1 = clamp(Math.ceil(yOf(Math.max(r.startS, r.endS))), plot.y, plot.y + plot.height - 1);
  if (x1 - x0 < 3) { x0 = Math.max(plot.x, x0 - 2); x1 = Math.min(plot.x + plot.width - 1, x0 + 4); }
  if (y1 - y0 < 3) { y0 = Math.max(plot.y, y0 - 2); y1 = Math.min(plot.y + plot.height - 1, y0 + 4); }
  const dash: readonly [number, number] | undefined = r.kind === "artefact" ? [5, 4] : undefined;
  const style = { widthPx: r.kind === "artefact" ? 1 : 2, ...(dash === undefined ? {} : { dashPx: dash }) };
  // A dark outline one pixel outside, then the white box: visible on dark and light cells alike.
  canvas.strokeRect({ x: x0 - 1, y: y0 - 1, width: x1 - x0 + 2, height: y1 - y0 + 2 }, REGION_STYLE.outline);
  for (const [ax, ay, bx, by] of [[x0, y0, x1, y0], [x0, y1, x1, y1], [x0, y0, x0, y1], [x1, y0, x1, y1]] as const) {
    canvas.line(ax, ay, bx, by, REGION_STYLE.box, style);
  }
  const tag = measureText(r.label, textScale);
  const tx = clamp(x0, plot.x, plot.x + plot.width - tag.widthPx - 4);
  const ty = clamp(y0 - tag.heightPx - 4, plot.y, plot.y + plot.height - tag.heightPx - 4);
  canvas.fillRect({ x: tx, y: ty, width: tag.widthPx + 4, height: tag.heightPx + 4 }, REGION_STYLE.box);
  canvas.strokeRect({ x: tx, y: ty, width: tag.widthPx + 4, height: tag.heightPx + 4 }, REGION_STYLE.outline);
  canvas.text(r.label, tx + 2, ty + 2, REGION_STYLE.tagText, { scale: textScale });
}
