import { buildAxis, drawAxes, positionPx, xAxisDepthPx, yAxisDepthPx, type Axis } from "./axes.js";
import { colourBarLabelDepthPx, colourBarWidthPx, drawColourBar } from "./colourBar.js";
import { COLOUR_RAMP_RGB, rampColour, rampIndex } from "./colourRamp.js";
import { encodePng } from "./encodePng.js";
import { checkFigureSize, drawTitleBlock, PAGE_STYLE, pagePaddingPx, textScaleFor } from "./figureFrame.js";
import { textHeightPx } from "./font.js";
import { RgbaCanvas, type Rect, type Rgb } from "./raster.js";
import type { FigureLayout } from "./spectrogramFigure.js";

/** What a constellation figure shows. I and Q are unit-less (normalised by the caller). */
export interface ConstellationFigureInput {
  /** First line, e.g. "QPSK 9600 Bd · EVM 3.1 % rms · MER 30.2 dB". */
  readonly title: string;
  readonly subtitle: string;
  /** Received symbols at the decision instants, interleaved I, Q; NaN pairs are skipped. */
  readonly symbols: Float64Array;
  /** The ideal constellation points, interleaved I, Q, on the same scale as `symbols`. */
  readonly ideal: Float64Array;
  /** Size of the whole image, at least 480 × 320 px. */
  readonly widthPx: number;
  readonly heightPx: number;
  /**
   * Half-width of the square shown: both axes run from −extent to +extent. Default: 1.3 × the
   * largest |I| or |Q| of the ideal points (of the symbols when there are none), rounded up to
   * a multiple of 0.1; 1.5 when neither has a finite value.
   */
  readonly extent?: number;
}

/** Cells along each side of the density grid (fewer when the plot is narrower than this in pixels). */
export const CONSTELLATION_GRID_CELLS = 200;

/**
 * Colour of the ideal-point crosses: a mid-light green (OKLab L ≈ 0.70), lighter than the
 * ramp's dark end, darker than its light end, and of a hue (≈ 140° in OKLCh) the ramp never
 * reaches in between (its hue turns from 165° at the dark end through blue and rose).
 */
export const IDEAL_POINT_COLOUR: Rgb = [40, 190, 60];

const IDEAL_POINT_OUTLINE: Rgb = [0, 0, 0];
// Grid lines in empty cells: a neutral grey a little lighter than ramp entry 0.
const DARK_GRID_COLOUR: Rgb = [58, 64, 70];

function checkInput(input: ConstellationFigureInput): void {
  checkFigureSize("renderConstellation", input.widthPx, input.heightPx);
  if (input.symbols.length % 2 !== 0) throw new RangeError(`renderConstellation: symbols has ${input.symbols.length} values, not whole I,Q pairs`);
  if (input.ideal.length % 2 !== 0) throw new RangeError(`renderConstellation: ideal has ${input.ideal.length} values, not whole I,Q pairs`);
  const e = input.extent;
  if (e !== undefined && !(e > 0 && Number.isFinite(e))) throw new RangeError(`renderConstellation: extent ${e} must be a positive finite number`);
}

function largestComponent(values: Float64Array): number {
  let m = 0;
  for (const v of values) if (Number.isFinite(v) && Math.abs(v) > m) m = Math.abs(v);
  return m;
}

function defaultExtent(input: ConstellationFigureInput): number {
  const m = largestComponent(input.ideal) || largestComponent(input.symbols) / 1.3;
  return m > 0 ? Math.ceil(m * 13 - 1e-9) / 10 : 1.5;
}

/**
 * Counts of symbols per cell of a cells × cells grid over [−extent, extent]², row 0 at the
 * bottom (lowest Q). Symbols outside the square are left out.
 */
function densityGrid(symbols: Float64Array, extent: number, cells: number): Uint32Array {
  const counts = new Uint32Array(cells * cells);
  const perUnit = cells / (2 * extent);
  for (let k = 0; k + 1 < symbols.length; k += 2) {
    const col = Math.floor((symbols[k]! + extent) * perUnit);
    const row = Math.floor((symbols[k + 1]! + extent) * perUnit);
    // NaN fails both comparisons and is skipped with the out-of-range symbols.
    if (col >= 0 && col < cells && row >= 0 && row < cells) counts[row * cells + col]! += 1;
  }
  return counts;
}

/**
 * The colour bar's axis in log10(1 + count), `lengthPx` long: a tick at 0 (empty cells, the
 * bottom of the bar), at 1, 10, 100, … up to the largest count, and at 2, 5, 20, 50, … where
 * they keep 2.5 line heights from their neighbours (buildAxis's vertical spacing). The densest
 * cell always gets the top of the ramp.
 */
function countAxis(maxCount: number, lengthPx: number, textScale: number): Axis {
  const top = Math.max(1, maxCount);
  const max = Math.log10(1 + top);
  const pxOf = (c: number): number => (Math.log10(1 + c) / max) * lengthPx;
  const minGapPx = 2.5 * textHeightPx(textScale);
  const counts = [0];
  for (let c = 1; c <= top; c *= 10) counts.push(c);
  for (const m of [2, 5]) {
    for (let c = m; c <= top; c *= 10) {
      const below = Math.max(...counts.filter((x) => x < c));
      const above = Math.min(Infinity, ...counts.filter((x) => x > c));
      if (pxOf(c) - pxOf(below) >= minGapPx && (above === Infinity || pxOf(above) - pxOf(c) >= minGapPx)) counts.push(c);
    }
  }
  counts.sort((a, b) => a - b);
  return { min: 0, max, title: "Symbols per cell", ticks: counts.map((c) => ({ value: Math.log10(1 + c), label: String(c) })) };
}

// A crosshair centred on pixel (cx, cy): a dot of `pen` px and four arms from `gap` to `arm` px
// out, each over a black outline so that it reads on dark and light cells alike; the gap
// leaves the cells next to the ideal point in view.
function drawCrosshair(canvas: RgbaCanvas, cx: number, cy: number, gap: number, arm: number, pen: number): void {
  const h = Math.floor(pen / 2);
  const bars: Rect[] = [
    { x: cx - h, y: cy - h, width: pen, height: pen },
    { x: cx + gap, y: cy - h, width: arm - gap + 1, height: pen },
    { x: cx - arm, y: cy - h, width: arm - gap + 1, height: pen },
    { x: cx - h, y: cy + gap, width: pen, height: arm - gap + 1 },
    { x: cx - h, y: cy - arm, width: pen, height: arm - gap + 1 },
  ];
  for (const r of bars) canvas.fillRect({ x: r.x - 1, y: r.y - 1, width: r.width + 2, height: r.height + 2 }, IDEAL_POINT_OUTLINE);
  for (const r of bars) canvas.fillRect(r, IDEAL_POINT_COLOUR);
}

/**
 * A constellation figure as PNG: a square plot with equal scales on I and Q (both from −extent
 * to +extent), the density of the symbols as a histogram over a grid of
 * {@link CONSTELLATION_GRID_CELLS}² cells coloured by the OKLab ramp in log10(1 + count) (empty
 * cells the darkest colour, with a grid drawn through them), a colour bar "Symbols per cell",
 * the ideal points as outlined crosses in {@link IDEAL_POINT_COLOUR}, and the title block.
 * xOf(i) and yOf(q) give continuous image coordinates (pixel column c covers [c, c + 1)), and
 * xOf(1) − xOf(0) = yOf(0) − yOf(1). Throws RangeError for a figure below 480 × 320 px, an odd
 * number of values, or an extent that is not positive.
 */
export function renderConstellation(input: ConstellationFigureInput): {
  png: Buffer;
  layout: FigureLayout;
  xOf(i: number): number;
  yOf(q: number): number;
} {
  checkInput(input);
  const { widthPx, heightPx } = input;
  const extent = input.extent ?? defaultExtent(input);
  const s = textScaleFor(widthPx, heightPx);
  const pad = pagePaddingPx(s);
  const canvas = new RgbaCanvas(widthPx, heightPx, PAGE_STYLE.pageColour);
  const plotTop = drawTitleBlock(canvas, input.title, input.subtitle, s) + 10 * s;

  // Side of the square: the height left under the title, unless the width is shorter.
  const tall = heightPx - pad - xAxisDepthPx(s) - plotTop;
  const axisRequest = { min: -extent, max: extent, quantity: { kind: "linear", unit: "" }, textScale: s } as const;
  const draftY = buildAxis({ ...axisRequest, name: "Quadrature (normalised)", lengthPx: tall, orientation: "vertical" });
  const barWidth = colourBarWidthPx(widthPx);
  const barGap = 12 * s;
  const draftBar = countAxis(1000, tall, s);
  const besidePlot = yAxisDepthPx(draftY, s) + barGap + barWidth + colourBarLabelDepthPx(draftBar, s);
  const side = Math.min(tall, widthPx - 2 * pad - besidePlot);
  if (side < 64) throw new RangeError(`renderConstellation: ${widthPx} × ${heightPx} px leaves no room for the plot`);

  // Equal ticks on both axes: whichever orientation needs the coarser step sets them for both.
  const vertical = buildAxis({ ...axisRequest, name: "Quadrature (normalised)", lengthPx: side, orientation: "vertical" });
  const horizontal = buildAxis({ ...axisRequest, name: "In-phase (normalised)", lengthPx: side, orientation: "horizontal" });
  const ticks = vertical.ticks.length <= horizontal.ticks.length ? vertical.ticks : horizontal.ticks;
  const iAxis: Axis = { ...horizontal, ticks };
  const qAxis: Axis = { ...vertical, ticks };

  const cells = Math.min(CONSTELLATION_GRID_CELLS, side);
  const counts = densityGrid(input.symbols, extent, cells);
  const maxCount = counts.reduce((m, c) => Math.max(m, c), 0);
  const barAxis = countAxis(maxCount, side, s);

  // Centre the group (y axis, plot, colour bar) across the page.
  const groupWidth = yAxisDepthPx(qAxis, s) + side + barGap + barWidth + colourBarLabelDepthPx(barAxis, s);
  const plotLeft = Math.max(pad, Math.floor((widthPx - groupWidth) / 2)) + yAxisDepthPx(qAxis, s);
  const plot: Rect = { x: plotLeft, y: plotTop, width: side, height: side };

  canvas.fillRect(plot, rampColour(0));
  drawAxes(canvas, plot, iAxis, qAxis, {
    textScale: s,
    frameColour: PAGE_STYLE.frameColour,
    textColour: PAGE_STYLE.inkColour,
    gridColour: DARK_GRID_COLOUR,
    yMinAtTop: false,
  });
  // Each plot pixel shows the cell under its centre; empty cells keep the grid.
  for (let py = 0; py < side; py++) {
    const row = Math.min(cells - 1, Math.floor(((side - py - 0.5) * cells) / side));
    for (let px = 0; px < side; px++) {
      const count = counts[row * cells + Math.min(cells - 1, Math.floor(((px + 0.5) * cells) / side))]!;
      if (count === 0) continue;
      const c = rampIndex(Math.log10(1 + count), barAxis.min, barAxis.max) * 3;
      const i = ((plot.y + py) * widthPx + plot.x + px) * 4;
      canvas.data[i] = COLOUR_RAMP_RGB[c]!;
      canvas.data[i + 1] = COLOUR_RAMP_RGB[c + 1]!;
      canvas.data[i + 2] = COLOUR_RAMP_RGB[c + 2]!;
    }
  }

  const xOf = (i: number): number => positionPx(i, iAxis, plot.x, plot.width, false);
  const yOf = (q: number): number => positionPx(q, qAxis, plot.y, plot.height, true);
  canvas.setClip(plot);
  const arm = 6 * s;
  for (let k = 0; k + 1 < input.ideal.length; k += 2) {
    const i = input.ideal[k]!;
    const q = input.ideal[k + 1]!;
    if (Number.isFinite(i) && Number.isFinite(q)) drawCrosshair(canvas, Math.floor(xOf(i)), Math.floor(yOf(q)), 2 * s + 1, arm, s);
  }
  canvas.setClip(null);

  drawColourBar(canvas, { x: plot.x + side + barGap, y: plot.y, width: barWidth, height: side }, barAxis, {
    textScale: s,
    frameColour: PAGE_STYLE.frameColour,
    textColour: PAGE_STYLE.inkColour,
  });
  return { png: encodePng(canvas), layout: { plot }, xOf, yOf };
}
