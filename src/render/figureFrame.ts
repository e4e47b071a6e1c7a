import { textHeightPx, textWidthPx } from "./font.js";
import type { Rgb, RgbaCanvas } from "./raster.js";
import { wrapText } from "./wrapText.js";

/** The page style shared by every figure: a white page, dark ink, a grey frame. */
export const PAGE_STYLE = {
  pageColour: [255, 255, 255] as Rgb,
  inkColour: [28, 30, 34] as Rgb,
  secondaryInkColour: [88, 92, 100] as Rgb,
  frameColour: [60, 64, 70] as Rgb,
  gridColour: [226, 228, 232] as Rgb,
} as const;

/** Smallest figure the renderers accept, in pixels (below it the labels no longer fit). */
export const MIN_FIGURE_SIZE = { widthPx: 480, heightPx: 320 } as const;

/** Throws RangeError naming `figure` when widthPx × heightPx is not whole or is below {@link MIN_FIGURE_SIZE}. */
export function checkFigureSize(figure: string, widthPx: number, heightPx: number): void {
  if (!Number.isInteger(widthPx) || widthPx < MIN_FIGURE_SIZE.widthPx)
    throw new RangeError(`${figure}: widthPx ${widthPx} must be an integer of at least ${MIN_FIGURE_SIZE.widthPx}`);
  if (!Number.isInteger(heightPx) || heightPx < MIN_FIGURE_SIZE.heightPx)
    throw new RangeError(`${figure}: heightPx ${heightPx} must be an integer of at least ${MIN_FIGURE_SIZE.heightPx}`);
}

/** Font scale for labels: 2 on figures at least 900 × 600 px, else 1. Titles use one step more. */
export function textScaleFor(widthPx: number, heightPx: number): number {
  return widthPx >= 900 && heightPx >= 600 ? 2 : 1;
}

/** Outer margin of the page at font scale `textScale`, in pixels. */
export function pagePaddingPx(textScale: number): number {
  return 8 * textScale;
}

/** `text`, shortened with "…" at the end so that it is at most `maxWidthPx` wide at `scale` (just "…" if nothing fits). */
export function fitText(text: string, maxWidthPx: number, scale: number): string {
  if (textWidthPx(text, scale) <= maxWidthPx) return text;
  const chars = [...text];
  // Widths grow with the prefix: bisect for the longest prefix that fits with the ellipsis.
  let lo = 0;
  let hi = chars.length;
  while (lo < hi) {
    const mid = Math.ceil((lo + hi) / 2);
    if (textWidthPx(`${chars.slice(0, mid).join("")}…`, scale) <= maxWidthPx) lo = mid;
    else hi = mid - 1;
  }
  return `${chars.slice(0, lo).join("").trimEnd()}…`;
}

/**
 * Draws the title (font scale + 1) and subtitle (secondary ink) at the top left of the page,
 * each wrapped onto as many lines as it needs (wrapText: never cut short), and returns the y
 * coordinate just below them, in pixels.
 */
export function drawTitleBlock(canvas: RgbaCanvas, title: string, subtitle: string, textScale: number): number {
  const pad = pagePaddingPx(textScale);
  const maxWidth = canvas.width - 2 * pad;
  const titleScale = textScale + 1;
  let y = pad;
  for (const line of wrapText(title, maxWidth, titleScale)) {
    canvas.text(line, pad, y, PAGE_STYLE.inkColour, { scale: titleScale });
    y += textHeightPx(titleScale) + 2 * textScale;
  }
  if (subtitle !== "") {
    for (const line of wrapText(subtitle, maxWidth, textScale)) {
      canvas.text(line, pad, y, PAGE_STYLE.secondaryInkColour, { scale: textScale });
      y += textHeightPx(textScale);
    }
  }
  return y;
}
