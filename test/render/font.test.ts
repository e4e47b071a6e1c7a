import { describe, expect, it } from "vitest";
import { FONT_METRICS, glyphFor, RgbaCanvas, textHeightPx, textWidthPx, type Rgb } from "../../src/render/index.js";

const WHITE: Rgb = [255, 255, 255];
const BLACK: Rgb = [0, 0, 0];

// Printable ASCII is 0x20 (space) to 0x7E (tilde): ANSI X3.4-1986 / RFC 20.
const PRINTABLE_ASCII = Array.from({ length: 0x7e - 0x20 + 1 }, (_, i) => String.fromCharCode(0x20 + i));

/** Ink pixels of `text` drawn at (ox, oy) on a fresh canvas, as "x,y" strings. */
function inkOf(text: string, scale: number, ox = 10, oy = 10): Set<string> {
  const canvas = new RgbaCanvas(80, 60, WHITE);
  canvas.text(text, ox, oy, BLACK, { scale });
  const ink = new Set<string>();
  for (let y = 0; y < canvas.height; y++)
    for (let x = 0; x < canvas.width; x++) if (canvas.getPixel(x, y)[0] === 0) ink.add(`${x},${y}`);
  return ink;
}

describe("font", () => {
  it("glyphFor(c) has a glyph of its own for every printable ASCII character (ANSI X3.4)", () => {
    for (const ch of PRINTABLE_ASCII) expect(glyphFor(ch).defined, JSON.stringify(ch)).toBe(true);
  });

  it("text(c) draws every printable ASCII glyph inside its 6 × 9 cell, with ink unless it is the space", () => {
    for (const ch of PRINTABLE_ASCII) {
      const ink = inkOf(ch, 1);
      for (const p of ink) {
        const [x, y] = p.split(",").map(Number) as [number, number];
        expect(x - 10, `${JSON.stringify(ch)} column`).toBeGreaterThanOrEqual(0);
        expect(x - 10, `${JSON.stringify(ch)} column`).toBeLessThan(FONT_METRICS.glyphWidthPx);
        expect(y - 10, `${JSON.stringify(ch)} row`).toBeGreaterThanOrEqual(0);
        expect(y - 10, `${JSON.stringify(ch)} row`).toBeLessThan(FONT_METRICS.cellHeightPx);
      }
      if (ch === " ") expect(ink.size).toBe(0);
      else expect(ink.size, JSON.stringify(ch)).toBeGreaterThan(0);
    }
  });

  it("text(c) gives every printable ASCII character a bitmap different from all others (legibility: common practice)", () => {
    const seen = new Map<string, string>();
    for (const ch of PRINTABLE_ASCII) {
      const key = [...inkOf(ch, 1)].sort().join(";");
      expect(seen.get(key), `${JSON.stringify(ch)} looks like ${seen.get(key)}`).toBeUndefined();
      seen.set(key, ch);
    }
  });

  it("glyphFor(c) covers the unit and caption signs ° µ ± ² · ×, and stands in a box for others", () => {
    for (const ch of ["°", "µ", "±", "²", "·", "×"]) expect(glyphFor(ch).defined, ch).toBe(true);
    expect(glyphFor("\u03a9").defined).toBe(false);
  });

  it("text(c, scale 2) draws each ink pixel as a 2 × 2 block: four times the ink (integer scaling)", () => {
    for (const ch of ["A", "g", "0", "µ"]) expect(inkOf(ch, 2).size).toBe(4 * inkOf(ch, 1).size);
  });

  it("textWidthPx / textHeightPx follow the 6 px advance and 9 px cell, less the trailing blank column", () => {
    expect(textWidthPx("", 1)).toBe(0);
    expect(textWidthPx("ab", 1)).toBe(11);
    expect(textWidthPx("MHz", 2)).toBe(34);
    expect(textHeightPx(2)).toBe(18);
  });
});
