import type { AxisQuantity } from "./axes.js";
import { encodePng } from "./encodePng.js";
import { checkFigureSize, drawTitleBlock, fitText, PAGE_STYLE, pagePaddingPx, textScaleFor } from "./figureFrame.js";
import { capMiddlePx, textHeightPx, textWidthPx } from "./font.js";
import { drawPlotArea } from "./plotArea.js";
import { RgbaCanvas, type Rgb } from "./raster.js";
import { drawMarkerLines } from "./markerLines.js";
import { SERIES_PALETTE_RGB } from "./seriesPalette.js";
import type { FigureLayout } from "./spectrogramFigure.js";

/** One curve: points (xValues[i], yValues[i]) joined in order; a NaN in either breaks the line. */
export interface LineSeries {
  /** Name in the legend, e.g. "PSD, Welch mean". */
  readonly label: string;
  /** In the x axis base unit (Hz, s or the linear unit). */
  readonly xValues: ArrayLike<number>;
  /** In the y axis base unit; same length as xValues. */
  readonly yValues: ArrayLike<number>;
  /** Default: the next colour of SERIES_COLOURS. */
  readonly colour?: Rgb;
  readonly dashed?: boolean;
}

/** A labelled straight line across the plot: vertical at an x value, or horizontal at a y value. */
export interface MarkerLine {
  readonly orientation: "vertical" | "horizontal";
  /** Position in the base unit of the axis it marks (x for vertical, y for horizontal). */
  readonly value: number;
  /** Short text beside the line, e.g. "OBW lower edge". */
  readonly label: string;
  /** Default: MARKER_COLOUR. */
  readonly colour?: Rgb;
}

/** A span of x shaded across the whole plot height, drawn under the series (e.g. where a limit is broken). */
export interface ShadedSpan {
  readonly fromX: number;
  readonly toX: number;
  readonly colour: Rgb;
}

/** A point marked with a ring and a text beside it (e.g. the worst margin). */
export interface PointNote {
  readonly x: number;
  readonly y: number;
  readonly text: string;
  /** Default: MARKER_COLOUR. */
  readonly colour?: Rgb;
}

/** One axis of a line figure. The range defaults to the data (and markers); y gets 5 % headroom each side. */
export interface LineFigureAxisInput {
  /** Name without the unit; the unit (SI-prefixed for hertz and seconds) is added in brackets. */
  readonly name: string;
  readonly quantity: AxisQuantity;
  readonly min?: number;
  readonly max?: number;
}

/** What a line figure shows. */
export interface LineFigureInput {
  readonly title: string;
  readonly subtitle: string;
  readonly x: LineFigureAxisInput;
  readonly y: LineFigureAxisInput;
  readonly series: readonly LineSeries[];
  readonly markers?: readonly MarkerLine[];
  readonly shaded?: readonly ShadedSpan[];
  readonly notes?: readonly PointNote[];
  /** Size of the whole image, at least 480 × 320 px. */
  readonly widthPx: number;
  readonly heightPx: number;
}

/** Default series colours, in order: plum, teal, vermilion, indigo, cerulean, lilac (seriesPalette.ts). */
export const SERIES_COLOURS: readonly Rgb[] = SERIES_PALETTE_RGB;

/** Default colour of marker lines: a deep red. */
export const MARKER_COLOUR: Rgb = [178, 34, 52];

function extent(values: Iterable<number>): [number, number] | null {
  let lo = Infinity;
  let hi = -Infinity;
  for (const v of values) {
    if (!Number.isFinite(v)) continue;
    if (v < lo) lo = v;
    if (v > hi) hi = v;
  }
  return lo <= hi ? [lo, hi] : null;
}

function* arrayValues(a: ArrayLike<number>): Iterable<number> {
  for (let i = 0; i < a.length; i++) yield a[i] ?? NaN;
}

function* seriesAndMarkerValues(input: LineFigureInput, axis: "x" | "y"): Iterable<number> {
  for (const s of input.series) yield* arrayValues(axis === "x" ? s.xValues : s.yValues);
  for (const m of input.markers ?? []) if ((m.orientation === "vertical") === (axis === "x")) yield m.value;
}

function axisRange(input: LineFigureInput, axis: "x" | "y"): [number, number] {
  const spec = input[axis];
  const data = extent(seriesAndMarkerValues(input, axis)) ?? [0, 1];
  const headroom = axis === "y" ? 0.05 * (data[1] - data[0]) : 0;
  let lo = spec.min ?? data[0] - headroom;
  let hi = spec.max ?? data[1] + headroom;
  if (!(hi > lo)) {
    // A flat series: open a range around it.
    const half = lo === 0 ? 1 : Math.abs(lo) * 0.05;
    lo -= half;
    hi += half;
  }
  return [lo, hi];
}

/**
 * A line figure as PNG: several series on one pair of axes (ticks, labels and units on both),
 * vertical and horizontal marker lines with their labels inside the plot, a legend row under
 * the subtitle, and a light grid. xOf and yOf map axis values to continuous image coordinates
 * (pixel column c covers [c, c + 1)). Throws RangeError for a figure below 480 × 320 px, a
 * series whose arrays differ in length, or an axis range with max ≤ min.
 */
export function renderLineFigure(input: LineFigureInput): {
  png: Buffer;
  layout: FigureLayout;
  xOf(x: number): number;
  yOf(y: number): number;
} {
  const { widthPx, heightPx } = input;
  checkFigureSize("renderLineFigure", widthPx, heightPx);
  for (const s of input.series)
    if (s.xValues.length !== s.yValues.length)
      throw new RangeError(`renderLineFigure: series "${s.label}" has ${s.xValues.length} x values and ${s.yValues.length} y values`);
  const [xMin, xMax] = axisRange(input, "x");
  const [yMin, yMax] = axisRange(input, "y");
  if (!(xMax > xMin) || !(yMax > yMin)) throw new RangeError(`renderLineFigure: axis range must have max > min`);

  const s = textScaleFor(widthPx, heightPx);
  const pad = pagePaddingPx(s);
  const lineH = textHeightPx(s);
  const canvas = new RgbaCanvas(widthPx, heightPx, PAGE_STYLE.pageColour);
  let top = drawTitleBlock(canvas, input.title, input.subtitle, s) + 4 * s;
  const colours = input.series.map((series, i) => series.colour ?? SERIES_COLOURS[i % SERIES_COLOURS.length] ?? MARKER_COLOUR);

  // Legend: a swatch and the label per series, wrapping onto further rows.
  const swatchPx = 14 * s;
  let legendX = pad;
  input.series.forEach((series, i) => {
    const label = fitText(series.label, widthPx - 2 * pad - swatchPx - 4 * s, s);
    const itemWidth = swatchPx + 4 * s + textWidthPx(label, s);
    if (legendX > pad && legendX + itemWidth > widthPx - pad) {
      legendX = pad;
      top += lineH + 3 * s;
    }
    const colour = colours[i] ?? MARKER_COLOUR;
    const midY = top + capMiddlePx(s);
    canvas.line(legendX, midY, legendX + swatchPx - 1, midY, colour, series.dashed === true ? { widthPx: 2 * s, dashPx: [4 * s, 3 * s] } : { widthPx: 2 * s });
    canvas.text(label, legendX + swatchPx + 4 * s, top, PAGE_STYLE.inkColour, { scale: s });
    legendX += itemWidth + 14 * s;
  });
  if (input.series.length > 0) top += lineH;

  const plotTop = top + 8 * s;
  const { plot, xOf, yOf, px, py } = drawPlotArea(canvas, {
    x: { name: input.x.name, quantity: input.x.quantity, min: xMin, max: xMax },
    y: { name: input.y.name, quantity: input.y.quantity, min: yMin, max: yMax },
    plotTop,
    textScale: s,
    figure: "renderLineFigure",
  });

  canvas.setClip(plot);
  for (const span of input.shaded ?? []) {
    const a = Math.floor(Math.min(px(span.fromX), px(span.toX)));
    const b = Math.ceil(Math.max(px(span.fromX), px(span.toX)));
    canvas.fillRect({ x: a, y: plot.y, width: Math.max(1, b - a), height: plot.height }, span.colour);
  }
  input.series.forEach((series, i) => {
    const colour = colours[i] ?? MARKER_COLOUR;
    const style = series.dashed === true ? { widthPx: s, dashPx: [5 * s, 3 * s] as const } : { widthPx: s };
    let prev: [number, number] | null = null;
    for (let k = 0; k < series.xValues.length; k++) {
      const x = series.xValues[k] ?? NaN;
      const y = series.yValues[k] ?? NaN;
      if (!Number.isFinite(x) || !Number.isFinite(y)) {
        prev = null;
        continue;
      }
      const point: [number, number] = [px(x), py(y)];
      if (prev === null) canvas.line(point[0], point[1], point[0], point[1], colour, style);
      else canvas.line(prev[0], prev[1], point[0], point[1], colour, style);
      prev = point;
    }
  });

  drawMarkerLines(canvas, plot, input.markers ?? [], px, py, s);
  for (const note of input.notes ?? []) drawNote(canvas, plot, note, px, py, s);
  canvas.setClip(null);

  return { png: encodePng(canvas), layout: { plot }, xOf, yOf };
}

/** A ring at the note's point and its text on a page-coloured patch beside it, kept inside the plot. */
function drawNote(canvas: RgbaCanvas, plot: { x: number; y: number; width: number; height: number }, note: PointNote, px: (x: number) => number, py: (y: number) => number, s: number): void {
  const colour = note.colour ?? MARKER_COLOUR;
  const cx = Math.round(px(note.x));
  const cy = Math.round(py(note.y));
  const r = 5 * s;
  for (let k = 0; k < 32; k++) {
    const a0 = (2 * Math.PI * k) / 32;
    const a1 = (2 * Math.PI * (k + 1)) / 32;
    canvas.line(cx + r * Math.cos(a0), cy + r * Math.sin(a0), cx + r * Math.cos(a1), cy + r * Math.sin(a1), colour, { widthPx: s });
  }
  const w = textWidthPx(note.text, s) + 4 * s;
  const h = textHeightPx(s) + 2 * s;
  const right = cx + r + 3 * s + w <= plot.x + plot.width;
  const x = right ? cx + r + 3 * s : cx - r - 3 * s - w;
  const y = Math.min(plot.y + plot.height - h, Math.max(plot.y, cy - r - h));
  canvas.fillRect({ x, y, width: w, height: h }, PAGE_STYLE.pageColour);
  canvas.text(note.text, x + 2 * s, y + s, colour, { scale: s });
}
