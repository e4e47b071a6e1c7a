import type { AxisQuantity } from "./axes.js";
import { encodePng } from "./encodePng.js";
import { checkFigureSize, drawTitleBlock, PAGE_STYLE, textScaleFor } from "./figureFrame.js";
import { textHeightPx, textWidthPx } from "./font.js";
import { drawLegendRow, type LegendItem } from "./legendRow.js";
import { drawPlotArea } from "./plotArea.js";
import { drawPolyline } from "./polyline.js";
import { checkPointSeries, drawPoint, drawPointSeries, joinLineWidthPx, pointSeriesValues, type PointSeries } from "./pointSeries.js";
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

/**
 * One axis of a line figure. The range defaults to the data (and markers, and the points with
 * their bars); y gets 5 % headroom each side, and so does x when the figure has points, so that
 * the end points are drawn whole. A range with nothing in it opens around the value, by a day
 * each side on a time-utc axis.
 */
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
  /** Points with uncertainty bars, drawn over the series and marker lines; in the legend after the series. */
  readonly points?: readonly PointSeries[];
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

// A flat time axis opens by this much each side: one day, in seconds.
const FLAT_TIME_HALF_SPAN_S = 86_400;

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
  for (const p of input.points ?? []) yield* pointSeriesValues(p, axis);
  for (const m of input.markers ?? []) if ((m.orientation === "vertical") === (axis === "x")) yield m.value;
}

function axisRange(input: LineFigureInput, axis: "x" | "y"): [number, number] {
  const spec = input[axis];
  const data = extent(seriesAndMarkerValues(input, axis)) ?? [0, 1];
  const withPoints = (input.points?.length ?? 0) > 0;
  const headroom = axis === "y" || withPoints ? 0.05 * (data[1] - data[0]) : 0;
  let lo = spec.min ?? data[0] - headroom;
  let hi = spec.max ?? data[1] + headroom;
  if (!(hi > lo)) {
    // A flat series: open a range around it.
    const half = spec.quantity.kind === "time-utc" ? FLAT_TIME_HALF_SPAN_S : lo === 0 ? 1 : Math.abs(lo) * 0.05;
    lo -= half;
    hi += half;
  }
  return [lo, hi];
}

/**
 * A line figure as PNG: several series on one pair of axes (ticks, labels and units on both),
 * points with uncertainty bars, vertical and horizontal marker lines with their labels inside
 * the plot, a legend row under the subtitle, and a light grid. xOf and yOf map axis values to
 * continuous image coordinates (pixel column c covers [c, c + 1)). Throws RangeError for a
 * figure below 480 × 320 px, a series whose arrays differ in length, a point series with an
 * error that is not finite and > 0 (NaN: no bar), or an axis range with max ≤ min.
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
  for (const p of input.points ?? []) checkPointSeries(p, "renderLineFigure");
  const [xMin, xMax] = axisRange(input, "x");
  const [yMin, yMax] = axisRange(input, "y");
  if (!(xMax > xMin) || !(yMax > yMin)) throw new RangeError(`renderLineFigure: axis range must have max > min`);

  const s = textScaleFor(widthPx, heightPx);
  const canvas = new RgbaCanvas(widthPx, heightPx, PAGE_STYLE.pageColour);
  const top = drawTitleBlock(canvas, input.title, input.subtitle, s) + 4 * s;
  const colours = input.series.map((series, i) => series.colour ?? defaultColour(i));
  const points = input.points ?? [];
  const pointColours = points.map((p, j) => p.colour ?? defaultColour(input.series.length + j));
  const legend = [
    ...input.series.map((series, i) => lineLegendItem(canvas, series, colours[i] ?? MARKER_COLOUR, s)),
    ...points.map((p, j) => pointLegendItem(canvas, p, pointColours[j] ?? MARKER_COLOUR, s)),
  ];

  const plotTop = drawLegendRow(canvas, legend, top, s) + 8 * s;
  const area = drawPlotArea(canvas, {
    x: { name: input.x.name, quantity: input.x.quantity, min: xMin, max: xMax },
    y: { name: input.y.name, quantity: input.y.quantity, min: yMin, max: yMax },
    plotTop,
    textScale: s,
    figure: "renderLineFigure",
  });
  const { plot, xOf, yOf, px, py } = area;

  canvas.setClip(plot);
  for (const span of input.shaded ?? []) {
    const a = Math.floor(Math.min(px(span.fromX), px(span.toX)));
    const b = Math.ceil(Math.max(px(span.fromX), px(span.toX)));
    canvas.fillRect({ x: a, y: plot.y, width: Math.max(1, b - a), height: plot.height }, span.colour);
  }
  input.series.forEach((series, i) => {
    const colour = colours[i] ?? MARKER_COLOUR;
    const style = series.dashed === true ? { widthPx: s, dashPx: [5 * s, 3 * s] as const } : { widthPx: s };
    drawPolyline(canvas, series.xValues, series.yValues, colour, style, px, py);
  });

  drawMarkerLines(canvas, plot, input.markers ?? [], px, py, s);
  // Points over the marker lines and their labels: a limit's label must not hide a measurement.
  canvas.setClip(plot);
  points.forEach((p, j) => drawPointSeries(canvas, p, pointColours[j] ?? MARKER_COLOUR, area, s));
  canvas.setClip(null);
  for (const note of input.notes ?? []) drawNote(canvas, plot, note, px, py, s);
  canvas.setClip(null);

  return { png: encodePng(canvas), layout: { plot }, xOf, yOf };
}

function defaultColour(index: number): Rgb {
  return SERIES_COLOURS[index % SERIES_COLOURS.length] ?? MARKER_COLOUR;
}

// A line series' swatch: a short thick line, dashed when the series is.
function lineLegendItem(canvas: RgbaCanvas, series: LineSeries, colour: Rgb, s: number): LegendItem {
  const style = series.dashed === true ? { widthPx: 2 * s, dashPx: [4 * s, 3 * s] as const } : { widthPx: 2 * s };
  return { label: series.label, drawSwatch: (x, midY, widthPx) => canvas.line(x, midY, x + widthPx - 1, midY, colour, style) };
}

// A point series' swatch: one point with a bar, on a thin line when the points are joined.
function pointLegendItem(canvas: RgbaCanvas, series: PointSeries, colour: Rgb, s: number): LegendItem {
  const drawSwatch = (x: number, midY: number, widthPx: number): void => {
    if (series.joined === true) canvas.line(x, midY, x + widthPx - 1, midY, colour, { widthPx: joinLineWidthPx(s) });
    drawPoint(canvas, x + Math.floor(widthPx / 2), midY, [midY - 3 * s, midY + 3 * s], colour, s);
  };
  return { label: series.label, drawSwatch };
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
