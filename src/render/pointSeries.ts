import type { PlotArea } from "./plotArea.js";
import { drawPolyline } from "./polyline.js";
import type { Rgb, RgbaCanvas } from "./raster.js";

/**
 * Measured points, each drawn as a filled square with an optional vertical bar from y − e to
 * y + e with short caps (e = the expanded uncertainty of that point). A NaN x or y skips the
 * point and breaks the joining line.
 */
export interface PointSeries {
  /** Name in the legend, e.g. "OBW, 99 %". */
  readonly label: string;
  /** In the x axis base unit (Unix seconds on a time-utc axis). */
  readonly xValues: ArrayLike<number>;
  /** In the y axis base unit; same length as xValues. */
  readonly yValues: ArrayLike<number>;
  /** Half-length of each bar in the y base unit (the expanded uncertainty, > 0); NaN or absent = no bar. */
  readonly yErrors?: ArrayLike<number>;
  /** Default: the line figure's next series colour. */
  readonly colour?: Rgb;
  /** Also draw a thin line from each point to the next. */
  readonly joined?: boolean;
}

/**
 * Throws RangeError naming `figure` and the series when its arrays differ in length or an error
 * is not finite and > 0 (NaN is allowed: no bar). An uncertainty is never shown as zero.
 */
export function checkPointSeries(series: PointSeries, figure: string): void {
  const { label, xValues, yValues, yErrors } = series;
  if (xValues.length !== yValues.length) throw new RangeError(`${figure}: point series "${label}" has ${xValues.length} x values and ${yValues.length} y values`);
  if (yErrors === undefined) return;
  if (yErrors.length !== yValues.length) throw new RangeError(`${figure}: point series "${label}" has ${yValues.length} y values and ${yErrors.length} errors`);
  for (let i = 0; i < yErrors.length; i++) {
    const e = yErrors[i] ?? NaN;
    if (e <= 0 || e === Infinity) throw new RangeError(`${figure}: point series "${label}" error ${i} is ${e}; an uncertainty must be finite and > 0, or NaN for none`);
  }
}

function errorAt(series: PointSeries, i: number): number {
  return series.yErrors?.[i] ?? NaN;
}

/** The values an axis range must hold: every x, or every y − e and y + e (y alone where there is no bar). */
export function* pointSeriesValues(series: PointSeries, axis: "x" | "y"): Iterable<number> {
  for (let i = 0; i < series.xValues.length; i++) {
    if (axis === "x") {
      yield series.xValues[i] ?? NaN;
      continue;
    }
    const y = series.yValues[i] ?? NaN;
    const e = errorAt(series, i);
    if (Number.isNaN(e)) yield y;
    else yield* [y - e, y + e];
  }
}

/** Width of the line joining points, in pixels: thinner than a line series' textScale. */
export function joinLineWidthPx(textScale: number): number {
  return Math.max(1, textScale - 1);
}

/** Half the side of a point's square, in pixels: the square is 4·textScale + 1 px wide. */
export function pointMarkerHalfPx(textScale: number): number {
  return 2 * textScale;
}

/**
 * One point in pixel coordinates: the bar from row `barTop` to `barBottom` (null for none) with
 * caps 6·textScale + 1 px wide, then the square centred on (column, row) over it.
 */
export function drawPoint(canvas: RgbaCanvas, column: number, row: number, bar: readonly [number, number] | null, colour: Rgb, textScale: number): void {
  const s = textScale;
  if (bar !== null) {
    const cap = 3 * s;
    canvas.line(column, bar[0], column, bar[1], colour, { widthPx: s });
    canvas.line(column - cap, bar[0], column + cap, bar[0], colour, { widthPx: s });
    canvas.line(column - cap, bar[1], column + cap, bar[1], colour, { widthPx: s });
  }
  const h = pointMarkerHalfPx(s);
  canvas.fillRect({ x: column - h, y: row - h, width: 2 * h + 1, height: 2 * h + 1 }, colour);
}

// What drawPointSeries needs of the plot area.
type BarArea = Pick<PlotArea, "plot" | "px" | "py" | "yOf">;

// The row of a bar end: py inside the plot, one row beyond its edge outside (so no cap shows).
function barRow(area: BarArea, y: number): number {
  const { plot } = area;
  const p = area.yOf(y);
  if (p < plot.y) return plot.y - 1;
  return p > plot.y + plot.height ? plot.y + plot.height : area.py(y);
}

/**
 * Draws a point series in `area.plot`: the joining line when `joined`, then each point with its
 * bar. A bar running off the plot shows no cap at that end. textScale is the font scale.
 */
export function drawPointSeries(canvas: RgbaCanvas, series: PointSeries, colour: Rgb, area: BarArea, textScale: number): void {
  const { px, py } = area;
  // The joining line goes under the points, thinner than a line series.
  if (series.joined === true) drawPolyline(canvas, series.xValues, series.yValues, colour, { widthPx: joinLineWidthPx(textScale) }, px, py);
  for (let i = 0; i < series.xValues.length; i++) {
    const x = series.xValues[i] ?? NaN;
    const y = series.yValues[i] ?? NaN;
    if (!Number.isFinite(x) || !Number.isFinite(y)) continue;
    const e = errorAt(series, i);
    drawPoint(canvas, px(x), py(y), Number.isNaN(e) ? null : [barRow(area, y + e), barRow(area, y - e)], colour, textScale);
  }
}
