/**
 * Figure text: IBM Plex Sans Regular (see fontFile.ts) drawn with anti-aliasing by our own
 * coverage rasteriser (outlineRaster.ts). One glyph per code point from the font's cmap, pen
 * advanced by the glyph's advance width; no kerning and no ligatures (labels are mostly numbers,
 * and Plex's figures are tabular); a character the font lacks draws its .notdef box.
 *
 * Sizes go by a text scale step, as the figures' layouts do: the capital height is
 * round(8 × 1.25^(scale − 1)) px, i.e. 8, 10 and 13 px at scales 1, 2 and 3 (a type scale of
 * ratio 1.25), and the em is chosen so that flat capitals (H) are exactly that many pixels
 * tall, their top and bottom edges on pixel boundaries. At scale 2 (tick labels of a figure
 * 900 px wide or more) the em is 14.3 px. Rasterised glyphs are cached per (glyph, size,
 * quarter-pixel phase of the pen), so only a process's first figure pays for them: a 1200 × 700
 * line figure renders in 220–430 ms the first time (font loaded, glyphs rasterised) and 96 ms
 * after, against 130–175 ms and 87 ms with the former bitmap font (src/bench/figureBench.ts).
 */
import { figureFont } from "./fontFile.js";
import { rasteriseOutline, type CoverageBitmap } from "./outlineRaster.js";

const CAP_HEIGHT_AT_SCALE_1_PX = 8;
const SIZE_RATIO_PER_STEP = 1.25;
// Pen positions are kept to a quarter pixel; each phase has its own cached bitmap.
const PEN_PHASES = 4;
// Ink that spills this little past the line box is not given a row of its own.
const BOX_SLACK_PX = 0.1;

/** Vertical metrics of the text at one scale, in pixels; the box is ascentPx + descentPx tall. */
export interface FontMetricsPx {
  /** The em size the outlines are scaled to. */
  readonly sizePx: number;
  /** Height of capitals and figures above the baseline (a whole number). */
  readonly capHeightPx: number;
  readonly xHeightPx: number;
  /** From the top of the text box to the baseline: the tallest printable ASCII ink, rounded up. */
  readonly ascentPx: number;
  /** From the baseline to the bottom of the box: the deepest printable ASCII descender, rounded up. */
  readonly descentPx: number;
}

const metricsCache = new Map<number, FontMetricsPx>();
const glyphCache = new Map<string, CoverageBitmap>();
let asciiInk: { yMax: number; yMin: number } | null = null;

// The ink extent of printable ASCII (0x20–0x7E), in font units, y up.
function asciiInkUnits(): { yMax: number; yMin: number } {
  if (asciiInk === null) {
    const font = figureFont();
    let yMax = 0;
    let yMin = 0;
    for (let code = 0x21; code <= 0x7e; code++) {
      const box = font.charToGlyph(String.fromCharCode(code)).getBoundingBox();
      yMax = Math.max(yMax, box.y2);
      yMin = Math.min(yMin, box.y1);
    }
    asciiInk = { yMax, yMin };
  }
  return asciiInk;
}

/** Metrics at text scale `scale` (any positive number; the figures use 1, 2 and 3). */
export function fontMetricsPx(scale: number): FontMetricsPx {
  if (!(scale > 0) || !Number.isFinite(scale)) throw new RangeError(`text scale ${scale} must be a positive number`);
  const cached = metricsCache.get(scale);
  if (cached !== undefined) return cached;
  const font = figureFont();
  const { sCapHeight, sxHeight } = font.tables.os2;
  const capHeightPx = Math.round(CAP_HEIGHT_AT_SCALE_1_PX * SIZE_RATIO_PER_STEP ** (scale - 1));
  const pxPerUnit = capHeightPx / sCapHeight;
  const ink = asciiInkUnits();
  const metrics: FontMetricsPx = {
    sizePx: font.unitsPerEm * pxPerUnit,
    capHeightPx,
    xHeightPx: sxHeight * pxPerUnit,
    ascentPx: Math.ceil(ink.yMax * pxPerUnit - BOX_SLACK_PX),
    descentPx: Math.ceil(-ink.yMin * pxPerUnit - BOX_SLACK_PX),
  };
  metricsCache.set(scale, metrics);
  return metrics;
}

/** Pen positions (px from the start, before rounding) of each code point of `text`, and the total advance. */
function layout(text: string, sizePx: number): { glyphIndices: number[]; penPx: number[]; advancePx: number } {
  const font = figureFont();
  const pxPerUnit = sizePx / font.unitsPerEm;
  const glyphIndices: number[] = [];
  const penPx: number[] = [];
  let pen = 0;
  for (const ch of text) {
    const glyph = font.charToGlyph(ch);
    glyphIndices.push(glyph.index);
    penPx.push(pen);
    pen += glyph.advanceWidth * pxPerUnit;
  }
  return { glyphIndices, penPx, advancePx: pen };
}

/** True when the font has a glyph of its own for `character` (one code point). */
export function hasGlyph(character: string): boolean {
  return figureFont().charToGlyphIndex(character) !== 0;
}

/** Advance width of `text` at `scale`, in pixels, rounded up: the sum of its glyphs' advance widths. */
export function textWidthPx(text: string, scale: number): number {
  return Math.ceil(layout(text, fontMetricsPx(scale).sizePx).advancePx);
}

/** Height in pixels of the text box at `scale`: ascent plus descent (descenders included). */
export function textHeightPx(scale: number): number {
  const m = fontMetricsPx(scale);
  return m.ascentPx + m.descentPx;
}

/**
 * From the top of the text box to the middle of the capital height, in whole pixels: the offset
 * that centres a label's figures on a tick at row y when the box's top is y − this.
 */
export function capMiddlePx(scale: number): number {
  const m = fontMetricsPx(scale);
  return m.ascentPx - Math.floor(m.capHeightPx / 2);
}

// The glyph's coverage with its pen at x = phase (0 ≤ phase < 1), baseline at y = 0.
function glyphBitmap(glyphIndex: number, sizePx: number, phase: number): CoverageBitmap {
  const key = `${glyphIndex}|${sizePx}|${phase}`;
  let bitmap = glyphCache.get(key);
  if (bitmap === undefined) {
    bitmap = rasteriseOutline(figureFont().glyphs.get(glyphIndex).getPath(phase, 0, sizePx).commands);
    glyphCache.set(key, bitmap);
  }
  return bitmap;
}

/**
 * Calls `plot(dx, dy, coverage)` for every pixel that `text` at `scale` inks, with (dx, dy)
 * relative to the top-left corner of its box (baseline at dy = ascentPx) and coverage in 0–1,
 * the fraction of the pixel inside the glyph outline. Glyphs come left to right; ink may reach
 * a pixel or so left of dx = 0 where a glyph overhangs its pen position.
 */
export function forEachInkPixel(text: string, scale: number, plot: (dx: number, dy: number, coverage: number) => void): void {
  const metrics = fontMetricsPx(scale);
  const { glyphIndices, penPx } = layout(text, metrics.sizePx);
  for (let g = 0; g < glyphIndices.length; g++) {
    const pen = Math.round((penPx[g] ?? 0) * PEN_PHASES) / PEN_PHASES;
    const originX = Math.floor(pen);
    const bitmap = glyphBitmap(glyphIndices[g] ?? 0, metrics.sizePx, pen - originX);
    for (let r = 0; r < bitmap.height; r++) {
      for (let c = 0; c < bitmap.width; c++) {
        const coverage = bitmap.coverage[r * bitmap.width + c] ?? 0;
        if (coverage > 0) plot(originX + bitmap.left + c, metrics.ascentPx + bitmap.top + r, coverage);
      }
    }
  }
}
