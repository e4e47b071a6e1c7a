import { fitText, PAGE_STYLE, pagePaddingPx } from "./figureFrame.js";
import { capMiddlePx, textHeightPx, textWidthPx } from "./font.js";
import type { RgbaCanvas } from "./raster.js";

/** One legend entry: its label and how to draw its swatch. */
export interface LegendItem {
  readonly label: string;
  /** Draws the swatch from column `x` over `widthPx` columns, centred on row `midY`. */
  readonly drawSwatch: (x: number, midY: number, widthPx: number) => void;
}

/**
 * Draws the legend under the title block from row `top`: a 14·textScale px swatch and the label
 * per item, left to right, wrapping onto further rows at the page padding. Returns the row just
 * below the last legend line (`top` itself when there are no items).
 */
export function drawLegendRow(canvas: RgbaCanvas, items: readonly LegendItem[], top: number, textScale: number): number {
  const s = textScale;
  const pad = pagePaddingPx(s);
  const lineH = textHeightPx(s);
  const swatchPx = 14 * s;
  let legendX = pad;
  let row = top;
  for (const item of items) {
    const label = fitText(item.label, canvas.width - 2 * pad - swatchPx - 4 * s, s);
    const itemWidth = swatchPx + 4 * s + textWidthPx(label, s);
    if (legendX > pad && legendX + itemWidth > canvas.width - pad) {
      legendX = pad;
      row += lineH + 3 * s;
    }
    item.drawSwatch(legendX, row + capMiddlePx(s), swatchPx);
    canvas.text(label, legendX + swatchPx + 4 * s, row, PAGE_STYLE.inkColour, { scale: s });
    legendX += itemWidth + 14 * s;
  }
  return items.length > 0 ? row + lineH : row;
}
