import { axisGapPx, positionPx, tickLengthPx, type Axis } from "./axes.js";
import { rampColour, rampIndex } from "./colourRamp.js";
import { capMiddlePx, textHeightPx, textWidthPx } from "./font.js";
import type { Rect, Rgb, RgbaCanvas } from "./raster.js";

/** Colours and size of a colour bar's text. */
export interface ColourBarStyle {
  readonly textScale: number;
  readonly frameColour: Rgb;
  readonly textColour: Rgb;
}

/** Width of the bar itself for a figure `widthPx` wide: 1.8 % of it, at least 12 px. */
export function colourBarWidthPx(widthPx: number): number {
  return Math.max(12, Math.round(widthPx * 0.018));
}

/** Space right of the bar its ticks, labels and rotated title need, in pixels. */
export function colourBarLabelDepthPx(axis: Axis, textScale: number): number {
  const widest = Math.max(0, ...axis.ticks.map((t) => textWidthPx(t.label, textScale)));
  return tickLengthPx(textScale) + 3 * axisGapPx(textScale) + widest + textHeightPx(textScale);
}

/**
 * Draws a vertical colour bar in `bar`: the colour ramp from axis.min (bottom) to axis.max
 * (top), mapped exactly as the plot maps values (see rampIndex), a frame, ticks and labels on
 * the right, and the axis title (with its unit) rotated beside them.
 */
export function drawColourBar(canvas: RgbaCanvas, bar: Rect, axis: Axis, style: ColourBarStyle): void {
  const s = style.textScale;
  canvas.setClip(null);
  for (let row = 0; row < bar.height; row++) {
    // Value at the centre of this pixel row.
    const value = axis.max - ((row + 0.5) / bar.height) * (axis.max - axis.min);
    canvas.fillRect({ x: bar.x, y: bar.y + row, width: bar.width, height: 1 }, rampColour(rampIndex(value, axis.min, axis.max)));
  }
  canvas.strokeRect({ x: bar.x - 1, y: bar.y - 1, width: bar.width + 2, height: bar.height + 2 }, style.frameColour);
  const tick = tickLengthPx(s);
  const gap = axisGapPx(s);
  const right = bar.x + bar.width;
  let widest = 0;
  for (const t of axis.ticks) {
    const py = Math.min(bar.y + bar.height - 1, Math.max(bar.y, Math.floor(positionPx(t.value, axis, bar.y, bar.height, true))));
    canvas.line(right + 1, py, right + tick, py, style.frameColour, { widthPx: s });
    widest = Math.max(widest, textWidthPx(t.label, s));
    canvas.text(t.label, right + tick + gap, py - capMiddlePx(s), style.textColour, { scale: s });
  }
  const titleLength = textWidthPx(axis.title, s);
  canvas.text(axis.title, right + tick + 2 * gap + widest, bar.y + Math.floor((bar.height - titleLength) / 2), style.textColour, {
    scale: s,
    rotationDeg: 90,
  });
}
