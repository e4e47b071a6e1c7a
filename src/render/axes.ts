import { capMiddlePx, textHeightPx, textWidthPx } from "./font.js";
import type { Rect, Rgb, RgbaCanvas } from "./raster.js";
import { CALENDAR_STEPS, calendarStepSeconds, calendarTickValues, formatCalendarLabel } from "./calendarTicks.js";
import { formatTickLabel, nextNiceStep, niceNumber, siScaleForHz, siScaleForSeconds, ticksWithStep, type SiScale } from "./ticks.js";

// The most ticks an axis gets, however long it is.
const MAX_TICKS = 12;
// The most ticks a calendar-time axis gets: its labels are long and read one by one.
const MAX_CALENDAR_TICKS = 10;

/**
 * What an axis measures: hertz and seconds get SI prefixes chosen to fit; `linear` keeps its
 * unit as given; `time-utc` is Unix time (seconds since 1970-01-01T00:00:00Z) with calendar
 * ticks and ISO 8601 labels in UTC, and the title "name (UTC)".
 */
export type AxisQuantity =
  | { readonly kind: "hertz" }
  | { readonly kind: "seconds" }
  | { readonly kind: "linear"; readonly unit: string }
  | { readonly kind: "time-utc" };

// The quantities whose labels are numbers with an SI or given unit.
type NumericQuantity = Exclude<AxisQuantity, { readonly kind: "time-utc" }>;

/** One tick: its value in the axis base unit (Hz, s, or the linear unit) and its label text. */
export interface AxisTick {
  readonly value: number;
  readonly label: string;
}

/** A finished axis: value range in base units, title with its unit in brackets, ticks. */
export interface Axis {
  readonly min: number;
  readonly max: number;
  readonly title: string;
  readonly ticks: readonly AxisTick[];
}

/** Inputs of {@link buildAxis}. */
export interface AxisRequest {
  /** Range in base units (Hz, s, ...), max > min. */
  readonly min: number;
  readonly max: number;
  readonly quantity: AxisQuantity;
  /** Name without the unit, e.g. "Time"; the title becomes "Time (ms)". */
  readonly name: string;
  /** Length of the axis on the page, in pixels. */
  readonly lengthPx: number;
  readonly orientation: "horizontal" | "vertical";
  /** Integer font scale of the tick labels. */
  readonly textScale: number;
}

function scaleFor(quantity: NumericQuantity, min: number, max: number): SiScale {
  const largest = Math.max(Math.abs(min), Math.abs(max));
  if (quantity.kind === "hertz") return siScaleForHz(largest);
  if (quantity.kind === "seconds") return siScaleForSeconds(largest);
  return { symbol: quantity.unit, factor: 1 };
}

// Room a tick's label needs along the axis: the widest label and two character widths when
// horizontal, two and a half line heights when vertical.
function labelRoomPx(ticks: readonly AxisTick[], horizontal: boolean, textScale: number): number {
  return horizontal ? Math.max(...ticks.map((t) => textWidthPx(t.label, textScale))) + textWidthPx("00", textScale) : 2.5 * textHeightPx(textScale);
}

/**
 * An axis with as many nice ticks (1, 2 or 5 × 10^k apart, as in Heckbert 1990) as fit, at
 * most 12, without their labels crowding: horizontal labels keep at least two figure widths
 * ("00") apart, vertical ones two and a half line heights. Labels carry enough decimals to
 * tell neighbours apart; the title is "name (unit)" with the SI prefix chosen for the range.
 * A `time-utc` axis steps through {@link CALENDAR_STEPS} instead, at most 10 ticks.
 */
export function buildAxis(request: AxisRequest): Axis {
  const { min, max, quantity, lengthPx, textScale } = request;
  if (quantity.kind === "time-utc") return buildCalendarAxis(request);
  const scale = scaleFor(quantity, min, max);
  const title = scale.symbol === "" ? request.name : `${request.name} (${scale.symbol})`;
  const horizontal = request.orientation === "horizontal";
  // Walk up the 1-2-5 steps from one giving about 12 ticks; keep the first whose labels fit.
  let step = niceNumber((max - min) / MAX_TICKS, false);
  let ticks: AxisTick[] = [];
  for (let attempt = 0; attempt < 40; attempt++, step = nextNiceStep(step)) {
    const candidate = ticksWithStep(min, max, step).values.map((value) => ({ value, label: formatTickLabel(value, step, scale) }));
    // Never trade two or more ticks for one.
    if (candidate.length < 2 && ticks.length >= 2) break;
    ticks = candidate;
    const stepPx = (step / (max - min)) * lengthPx;
    if (stepPx >= labelRoomPx(ticks, horizontal, textScale) || ticks.length <= 2) break;
  }
  return { min, max, title, ticks };
}

// Pixels between the closest two neighbouring ticks (months differ in length).
function closestGapPx(ticks: readonly AxisTick[], min: number, max: number, lengthPx: number): number {
  let gap = Infinity;
  for (let i = 1; i < ticks.length; i++) gap = Math.min(gap, (ticks[i]?.value ?? 0) - (ticks[i - 1]?.value ?? 0));
  return (gap / (max - min)) * lengthPx;
}

// The calendar steps from the shortest giving at most MAX_CALENDAR_TICKS up, as in buildAxis.
function buildCalendarAxis(request: AxisRequest): Axis {
  const { min, max, lengthPx, textScale } = request;
  const horizontal = request.orientation === "horizontal";
  let ticks: AxisTick[] = [];
  for (const step of CALENDAR_STEPS) {
    if ((max - min) / calendarStepSeconds(step) > 2 * MAX_CALENDAR_TICKS) continue;
    const candidate = calendarTickValues(min, max, step).map((value) => ({ value, label: formatCalendarLabel(value, step) }));
    if (candidate.length > MAX_CALENDAR_TICKS) continue;
    if (candidate.length < 2 && ticks.length >= 2) break;
    ticks = candidate;
    if (ticks.length <= 2 || closestGapPx(ticks, min, max, lengthPx) >= labelRoomPx(ticks, horizontal, textScale)) break;
  }
  return { min, max, title: `${request.name} (UTC)`, ticks };
}

/**
 * Page position of `value` along an axis: start + (value − min)/(max − min)·length, or measured
 * from the far end when `reversed` (a y axis whose minimum is at the bottom). Continuous
 * coordinates: pixel column c covers [c, c + 1).
 */
export function positionPx(value: number, axis: Pick<Axis, "min" | "max">, startPx: number, lengthPx: number, reversed: boolean): number {
  const f = (value - axis.min) / (axis.max - axis.min);
  return reversed ? startPx + (1 - f) * lengthPx : startPx + f * lengthPx;
}

/** Colours and sizes for {@link drawAxes}. */
export interface AxesStyle {
  readonly textScale: number;
  readonly frameColour: Rgb;
  readonly textColour: Rgb;
  /** Grid lines across the plot at each tick, or null for none. */
  readonly gridColour: Rgb | null;
  /** True when the y minimum is at the top (time running down), false when at the bottom. */
  readonly yMinAtTop: boolean;
}

/** Length of a tick mark outside the frame, in pixels, at font scale `textScale`. */
export function tickLengthPx(textScale: number): number {
  return 4 * textScale;
}

/** Gap between a tick mark, its label and the axis title, in pixels. */
export function axisGapPx(textScale: number): number {
  return 3 * textScale;
}

/** Space below the plot the x axis needs: tick, label line, title line and gaps, in pixels. */
export function xAxisDepthPx(textScale: number): number {
  return tickLengthPx(textScale) + 3 * axisGapPx(textScale) + 2 * textHeightPx(textScale);
}

/** Space left of the plot the y axis needs: tick, widest label, rotated title and gaps, in pixels. */
export function yAxisDepthPx(axis: Axis, textScale: number): number {
  const widest = Math.max(0, ...axis.ticks.map((t) => textWidthPx(t.label, textScale)));
  return tickLengthPx(textScale) + 3 * axisGapPx(textScale) + widest + textHeightPx(textScale);
}

/** Pixel column or row of a tick drawn at continuous position `p`, kept on the plot's edge pixels. */
function tickPixel(p: number, startPx: number, lengthPx: number): number {
  return Math.min(startPx + lengthPx - 1, Math.max(startPx, Math.floor(p)));
}

/**
 * Draws the frame just outside `plot`, the ticks and labels of `x` below it and of `y` to its
 * left, and both titles (the y title rotated to read bottom to top).
 */
export function drawAxes(canvas: RgbaCanvas, plot: Rect, x: Axis, y: Axis, style: AxesStyle): void {
  const s = style.textScale;
  const tick = tickLengthPx(s);
  const gap = axisGapPx(s);
  const lineH = textHeightPx(s);
  canvas.setClip(null);
  if (style.gridColour !== null) {
    const grid = style.gridColour;
    for (const t of x.ticks) {
      const px = tickPixel(positionPx(t.value, x, plot.x, plot.width, false), plot.x, plot.width);
      canvas.line(px, plot.y, px, plot.y + plot.height - 1, grid);
    }
    for (const t of y.ticks) {
      const py = tickPixel(positionPx(t.value, y, plot.y, plot.height, !style.yMinAtTop), plot.y, plot.height);
      canvas.line(plot.x, py, plot.x + plot.width - 1, py, grid);
    }
  }
  canvas.strokeRect({ x: plot.x - 1, y: plot.y - 1, width: plot.width + 2, height: plot.height + 2 }, style.frameColour);

  const bottom = plot.y + plot.height;
  for (const t of x.ticks) {
    const px = tickPixel(positionPx(t.value, x, plot.x, plot.width, false), plot.x, plot.width);
    canvas.line(px, bottom, px, bottom + tick - 1, style.frameColour, { widthPx: s });
    const w = textWidthPx(t.label, s);
    canvas.text(t.label, px - Math.floor(w / 2), bottom + tick + gap, style.textColour, { scale: s });
  }
  const xTitleWidth = textWidthPx(x.title, s);
  canvas.text(x.title, plot.x + Math.floor((plot.width - xTitleWidth) / 2), bottom + tick + 2 * gap + lineH, style.textColour, { scale: s });

  let widest = 0;
  for (const t of y.ticks) {
    const py = tickPixel(positionPx(t.value, y, plot.y, plot.height, !style.yMinAtTop), plot.y, plot.height);
    canvas.line(plot.x - tick, py, plot.x - 2, py, style.frameColour, { widthPx: s });
    const w = textWidthPx(t.label, s);
    widest = Math.max(widest, w);
    // Centre the label's figures (cap height) on the tick.
    canvas.text(t.label, plot.x - tick - gap - w, py - capMiddlePx(s), style.textColour, { scale: s });
  }
  const yTitleLength = textWidthPx(y.title, s);
  const yTitleX = plot.x - tick - 2 * gap - widest - lineH;
  canvas.text(y.title, yTitleX, plot.y + Math.floor((plot.height - yTitleLength) / 2), style.textColour, { scale: s, rotationDeg: 90 });
}
