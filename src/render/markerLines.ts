import { textHeightPx, textWidthPx } from "./font.js";
import { PAGE_STYLE } from "./figureFrame.js";
import { MARKER_COLOUR, type MarkerLine } from "./lineFigure.js";
import type { Rect, Rgb, RgbaCanvas } from "./raster.js";

function overlaps(a: Rect, b: Rect): boolean {
  return a.x < b.x + b.width && b.x < a.x + a.width && a.y < b.y + b.height && b.y < a.y + a.height;
}

// Moves `box` down (or up when `step` < 0) until it is clear of every placed box or leaves the plot.
function clearOf(box: Rect, placed: readonly Rect[], step: number, plot: Rect): Rect {
  let b = box;
  for (let i = 0; i < 40 && placed.some((p) => overlaps(p, b)); i++) b = { ...b, y: b.y + step };
  return { ...b, y: Math.min(plot.y + plot.height - b.height, Math.max(plot.y, b.y)) };
}

/**
 * Draws marker lines across `plot` as the line figure does: dashed, in the marker's colour
 * (default MARKER_COLOUR), a vertical one in pixel column px(value) with its label near the top
 * on the side away from the plot's centre, a horizontal one in row py(value) with its label at
 * the right; labels step clear of each other and sit on a page-coloured patch drawn last.
 * px and py give the pixel column or row of an axis value; textScale is the font scale.
 */
export function drawMarkerLines(
  canvas: RgbaCanvas,
  plot: Rect,
  markers: readonly MarkerLine[],
  px: (x: number) => number,
  py: (y: number) => number,
  textScale: number,
): void {
  const s = textScale;
  const lineH = textHeightPx(s);
  const inset = 3 * s;
  const placed: Rect[] = [];
  const labels: { box: Rect; text: string; colour: Rgb }[] = [];
  canvas.setClip(plot);
  for (const marker of markers) {
    const colour = marker.colour ?? MARKER_COLOUR;
    const dash = { widthPx: s, dashPx: [6 * s, 4 * s] as const };
    const w = textWidthPx(marker.label, s) + 2 * s;
    const h = lineH + 2 * s;
    let box: Rect;
    if (marker.orientation === "vertical") {
      const x = px(marker.value);
      canvas.line(x, plot.y, x, plot.y + plot.height - 1, colour, dash);
      const leftHalf = x < plot.x + plot.width / 2;
      const outer = leftHalf ? x - inset - w : x + inset;
      const inner = leftHalf ? x + inset : x - inset - w;
      const fits = outer >= plot.x && outer + w <= plot.x + plot.width;
      box = clearOf({ x: fits ? outer : inner, y: plot.y + inset, width: w, height: h }, placed, h + s, plot);
    } else {
      const y = py(marker.value);
      canvas.line(plot.x, y, plot.x + plot.width - 1, y, colour, dash);
      const above = y - inset - h;
      box = clearOf({ x: plot.x + plot.width - inset - w, y: above >= plot.y ? above : y + inset, width: w, height: h }, placed, -(h + s), plot);
    }
    placed.push(box);
    labels.push({ box, text: marker.label, colour });
  }
  // Labels last, so that no line crosses them.
  for (const { box, text, colour } of labels) {
    canvas.fillRect(box, PAGE_STYLE.pageColour);
    canvas.text(text, box.x + s, box.y + s, colour, { scale: s });
  }
  canvas.setClip(null);
}
