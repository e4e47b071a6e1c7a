import { encodePng } from "./encodePng.js";
import { checkFigureSize, drawTitleBlock, PAGE_STYLE, textScaleFor } from "./figureFrame.js";
import { SERIES_COLOURS, type LineFigureAxisInput, type MarkerLine } from "./lineFigure.js";
import { drawMarkerLines } from "./markerLines.js";
import { drawPlotArea } from "./plotArea.js";
import { RgbaCanvas, type Rgb } from "./raster.js";
import type { FigureLayout } from "./spectrogramFigure.js";

/** What a histogram figure shows: one bar per bin, from the y axis' zero (or its minimum) up to the count. */
export interface HistogramFigureInput {
  readonly title: string;
  readonly subtitle: string;
  /** Centre of each bin in the x axis base unit (Hz, s or the linear unit), strictly ascending. */
  readonly binsCentre: ArrayLike<number>;
  /** Height of each bar in the y axis unit (a count or a fraction), ≥ 0; NaN draws no bar. */
  readonly counts: ArrayLike<number>;
  /** x range default: the outer edges of the first and last bins (and the markers). */
  readonly x: LineFigureAxisInput;
  /** y range default: 0 up to the tallest bar plus 5 %. */
  readonly y: LineFigureAxisInput;
  /** Labelled lines, drawn as in the line figure (e.g. the nominal FSK tone frequencies). */
  readonly markers?: readonly MarkerLine[];
  /** Default: the first of SERIES_COLOURS. */
  readonly barColour?: Rgb;
  /** Size of the whole image, at least 480 × 320 px. */
  readonly widthPx: number;
  readonly heightPx: number;
}

function checkInput(input: HistogramFigureInput): void {
  checkFigureSize("renderHistogram", input.widthPx, input.heightPx);
  const { binsCentre, counts } = input;
  if (binsCentre.length !== counts.length)
    throw new RangeError(`renderHistogram: ${binsCentre.length} bin centres and ${counts.length} counts`);
  for (let k = 0; k < binsCentre.length; k++) {
    const c = binsCentre[k]!;
    if (!Number.isFinite(c)) throw new RangeError(`renderHistogram: binsCentre[${k}] ${c} must be finite`);
    if (k > 0 && !(c > binsCentre[k - 1]!)) throw new RangeError(`renderHistogram: binsCentre must be strictly ascending (at index ${k})`);
    if (counts[k]! < 0) throw new RangeError(`renderHistogram: counts[${k}] ${counts[k]} must not be negative`);
  }
}

/**
 * Edges of every bin: halfway to each neighbour's centre, the outer edges mirrored from the
 * nearest gap; a single bin is one unit wide.
 */
function binEdges(centres: ArrayLike<number>): Float64Array {
  const n = centres.length;
  const edges = new Float64Array(n + 1);
  if (n === 0) return edges;
  if (n === 1) {
    edges[0] = centres[0]! - 0.5;
    edges[1] = centres[0]! + 0.5;
    return edges;
  }
  for (let k = 1; k < n; k++) edges[k] = (centres[k - 1]! + centres[k]!) / 2;
  edges[0] = centres[0]! - (edges[1]! - centres[0]!);
  edges[n] = centres[n - 1]! + (centres[n - 1]! - edges[n - 1]!);
  return edges;
}

function range(spec: LineFigureAxisInput, lo: number, hi: number): [number, number] {
  let min = spec.min ?? lo;
  let max = spec.max ?? hi;
  if (!(max > min)) {
    const half = min === 0 ? 1 : Math.abs(min) * 0.05;
    min -= half;
    max += half;
  }
  return [min, max];
}

/**
 * A histogram figure as PNG: a bar per bin (edges halfway between neighbouring centres; bars
 * at least 4 px wide keep a 1 px gap on their right), axes with ticks, labels and units as in
 * the line figure, a light grid, the line figure's labelled marker lines, and the title block.
 * xOf and yOf map axis values to continuous image coordinates (pixel column c covers
 * [c, c + 1)). Throws RangeError for a figure below 480 × 320 px, unequal array lengths, bin
 * centres that are not finite and ascending, a negative count, or a range with max ≤ min.
 */
export function renderHistogram(input: HistogramFigureInput): {
  png: Buffer;
  layout: FigureLayout;
  xOf(x: number): number;
  yOf(y: number): number;
} {
  checkInput(input);
  const { widthPx, heightPx, binsCentre, counts } = input;
  const n = binsCentre.length;
  const edges = binEdges(binsCentre);
  const markers = input.markers ?? [];
  let xLo = n > 0 ? edges[0]! : 0;
  let xHi = n > 0 ? edges[n]! : 1;
  let tallest = 0;
  for (let k = 0; k < n; k++) if (counts[k]! > tallest) tallest = counts[k]!;
  let yHi = tallest > 0 ? tallest * 1.05 : 1;
  for (const m of markers) {
    if (m.orientation === "vertical") [xLo, xHi] = [Math.min(xLo, m.value), Math.max(xHi, m.value)];
    else yHi = Math.max(yHi, m.value * 1.05);
  }
  const [xMin, xMax] = range(input.x, xLo, xHi);
  const [yMin, yMax] = range(input.y, 0, yHi);

  const s = textScaleFor(widthPx, heightPx);
  const canvas = new RgbaCanvas(widthPx, heightPx, PAGE_STYLE.pageColour);
  const plotTop = drawTitleBlock(canvas, input.title, input.subtitle, s) + 10 * s;
  const { plot, xOf, yOf, px, py } = drawPlotArea(canvas, {
    x: { name: input.x.name, quantity: input.x.quantity, min: xMin, max: xMax },
    y: { name: input.y.name, quantity: input.y.quantity, min: yMin, max: yMax },
    plotTop,
    textScale: s,
    figure: "renderHistogram",
  });

  canvas.setClip(plot);
  const colour = input.barColour ?? SERIES_COLOURS[0] ?? PAGE_STYLE.inkColour;
  const baseRow = Math.round(yOf(Math.min(yMax, Math.max(yMin, 0))));
  for (let k = 0; k < n; k++) {
    const count = counts[k]!;
    if (!Number.isFinite(count)) continue;
    const left = Math.floor(xOf(edges[k]!));
    // A bar narrower than a pixel still gets one column, the one under its centre.
    let right = Math.max(Math.floor(xOf(edges[k + 1]!)), left + 1);
    if (right - left >= 4) right -= 1;
    const top = Math.round(yOf(count));
    if (right - left === 1) canvas.fillRect({ x: px(binsCentre[k]!), y: top, width: 1, height: baseRow - top }, colour);
    else canvas.fillRect({ x: left, y: top, width: right - left, height: baseRow - top }, colour);
  }
  canvas.setClip(null);
  drawMarkerLines(canvas, plot, markers, px, py, s);
  return { png: encodePng(canvas), layout: { plot }, xOf, yOf };
}
