import { readFileSync } from "node:fs";
import { createRequire } from "node:module";
import type { Font } from "opentype.js";
import { PNG } from "pngjs";
import { describe, expect, it } from "vitest";
import { encodePng, fitText, fontMetricsPx, forEachInkPixel, hasGlyph, RgbaCanvas, textHeightPx, textWidthPx, type Rgb } from "../../src/render/index.js";

const WHITE: Rgb = [255, 255, 255];
const BLACK: Rgb = [0, 0, 0];

// Printable ASCII is 0x20 (space) to 0x7E (tilde): ANSI X3.4-1986 / RFC 20.
const PRINTABLE_ASCII = Array.from({ length: 0x7e - 0x20 + 1 }, (_, i) => String.fromCharCode(0x20 + i));

// The font file read on its own, by opentype.js, for metrics independent of the renderer.
const FONT: Font = (createRequire(import.meta.url)("opentype.js") as { parse(b: ArrayBuffer): Font }).parse(
  (() => {
    const bytes = readFileSync(new URL("../../assets/fonts/IBMPlexSans_400Regular.ttf", import.meta.url));
    return bytes.buffer.slice(bytes.byteOffset, bytes.byteOffset + bytes.byteLength);
  })(),
);

/** Pixels by darkness (0 page … 255 full ink) of `text` drawn in black on white at (ox, oy), through PNG and pngjs. */
function drawAndDecode(text: string, scale: number, width: number, height: number, ox: number, oy: number): { ink: Uint8Array; width: number; height: number } {
  const canvas = new RgbaCanvas(width, height, WHITE);
  canvas.text(text, ox, oy, BLACK, { scale });
  const image = PNG.sync.read(encodePng(canvas));
  const ink = new Uint8Array(width * height);
  for (let i = 0; i < width * height; i++) ink[i] = 255 - (image.data[i * 4] ?? 255);
  return { ink, width, height };
}

function inkBounds({ ink, width, height }: { ink: Uint8Array; width: number; height: number }): { left: number; right: number; top: number; bottom: number } {
  let left = Infinity;
  let right = -Infinity;
  let top = Infinity;
  let bottom = -Infinity;
  for (let y = 0; y < height; y++)
    for (let x = 0; x < width; x++)
      if ((ink[y * width + x] ?? 0) > 0) {
        left = Math.min(left, x);
        right = Math.max(right, x);
        top = Math.min(top, y);
        bottom = Math.max(bottom, y);
      }
  return { left, right, top, bottom };
}

describe("figure text", () => {
  it("hasGlyph(c) is true for printable ASCII (ANSI X3.4) and the signs the figures print; a lacking character draws .notdef", () => {
    for (const ch of PRINTABLE_ASCII) expect(hasGlyph(ch), JSON.stringify(ch)).toBe(true);
    // The non-ASCII characters found in figure titles, labels and units (src/render, src/report), and a few more of the trade.
    for (const ch of ["°", "µ", "μ", "±", "²", "³", "·", "×", "−", "√", "Δ", "–", "—", "…", "≤", "≥", "π", "σ", "Σ"]) expect(hasGlyph(ch), ch).toBe(true);
    // U+4E00, a CJK ideograph: IBM Plex Sans (Latin, Greek, Cyrillic) has none, so its .notdef box is drawn.
    expect(hasGlyph("\u4e00")).toBe(false);
    let inked = 0;
    forEachInkPixel("\u4e00", 2, () => inked++);
    expect(inked).toBeGreaterThan(0);
  });

  it('text("Hg 164.975 MHz") inks the box the font tables give: advances summed, glyph bounds scaled (±1 px)', () => {
    const text = "Hg 164.975 MHz";
    const scale = 2;
    // Scale 2 sets capitals 10 px tall (font.ts's type scale); the em follows from the OS/2 cap height.
    const pxPerUnit = 10 / FONT.tables.os2.sCapHeight;
    const glyphs = [...text].map((ch) => FONT.charToGlyph(ch));
    const pen: number[] = [];
    let advance = 0;
    for (const g of glyphs) {
      pen.push(advance);
      advance += g.advanceWidth * pxPerUnit;
    }
    const boxes = glyphs.map((g) => g.getBoundingBox());
    const inked = boxes.map((b, i) => ({ b, pen: pen[i]! })).filter(({ b }) => b.x2 > b.x1);
    const expectedLeft = Math.min(...inked.map(({ b, pen: p }) => p + b.x1 * pxPerUnit));
    const expectedRight = Math.max(...inked.map(({ b, pen: p }) => p + b.x2 * pxPerUnit));
    const yMax = Math.max(...boxes.map((b) => b.y2)) * pxPerUnit;
    const yMin = Math.min(...boxes.map((b) => b.y1)) * pxPerUnit;

    const [ox, oy] = [20, 10];
    const bounds = inkBounds(drawAndDecode(text, scale, 240, 40, ox, oy));
    const baseline = oy + fontMetricsPx(scale).ascentPx;
    // Pixel column c covers [c, c + 1): ink from x = a to x = b touches columns floor(a) to ceil(b) − 1.
    expect(Math.abs(bounds.left - Math.floor(ox + expectedLeft))).toBeLessThanOrEqual(1);
    expect(Math.abs(bounds.right - (Math.ceil(ox + expectedRight) - 1))).toBeLessThanOrEqual(1);
    expect(Math.abs(bounds.top - Math.floor(baseline - yMax))).toBeLessThanOrEqual(1);
    expect(Math.abs(bounds.bottom - (Math.ceil(baseline - yMin) - 1))).toBeLessThanOrEqual(1);
    // No kerning is applied: the width is the advances' sum, rounded up.
    expect(textWidthPx(text, scale)).toBe(Math.ceil(advance));
  });

  it("text() is anti-aliased: edge pixels take intermediate values, stems reach full ink", () => {
    const drawn = drawAndDecode("Hg 164.975 MHz", 2, 240, 40, 20, 10);
    const values = [...drawn.ink].filter((v) => v > 0);
    const partial = values.filter((v) => v < 255).length;
    expect(partial / values.length).toBeGreaterThan(0.2);
    // At least a few distinct grey levels, not a two-level bitmap with a fringe.
    expect(new Set(values).size).toBeGreaterThan(16);
    // The font's stems are vertical; where one covers a whole pixel column the pixel is fully inked.
    expect(values.filter((v) => v >= 250).length).toBeGreaterThan(0);
  });

  it("the text box holds the font's printable ASCII ink: ascent and descent at least the tallest and deepest glyph", () => {
    let yMax = 0;
    let yMin = 0;
    for (const ch of PRINTABLE_ASCII) {
      const b = FONT.charToGlyph(ch).getBoundingBox();
      yMax = Math.max(yMax, b.y2);
      yMin = Math.min(yMin, b.y1);
    }
    for (const scale of [1, 2, 3]) {
      const m = fontMetricsPx(scale);
      const pxPerUnit = m.capHeightPx / FONT.tables.os2.sCapHeight;
      // font.ts lets ink spill up to 0.1 px past the box rather than add a row for it.
      expect(m.ascentPx).toBeGreaterThanOrEqual(yMax * pxPerUnit - 0.1);
      expect(m.descentPx).toBeGreaterThanOrEqual(-yMin * pxPerUnit - 0.1);
      expect(m.ascentPx + m.descentPx).toBeLessThanOrEqual(Math.ceil((yMax - yMin) * pxPerUnit) + 1);
      expect(textHeightPx(scale)).toBe(m.ascentPx + m.descentPx);
    }
  });

  it("text(c) inks every printable ASCII character but the space, each differently (legibility: common practice)", () => {
    const seen = new Map<string, string>();
    for (const ch of PRINTABLE_ASCII) {
      const cells: string[] = [];
      forEachInkPixel(ch, 2, (dx, dy, coverage) => {
        if (coverage >= 0.25) cells.push(`${dx},${dy}`);
      });
      if (ch === " ") {
        expect(cells).toHaveLength(0);
        continue;
      }
      expect(cells.length, JSON.stringify(ch)).toBeGreaterThan(0);
      const key = cells.join(";");
      expect(seen.get(key), `${JSON.stringify(ch)} looks like ${seen.get(key)}`).toBeUndefined();
      seen.set(key, ch);
    }
  });

  it("fitText(text, maxWidthPx) keeps the longest prefix that fits with an ellipsis, and the text itself when it fits", () => {
    const title = "Spectral mask: launch-channel_164.975MHz.wav";
    expect(fitText(title, textWidthPx(title, 2), 2)).toBe(title);
    for (const maxWidthPx of [40, 100, 300]) {
      const fitted = fitText(title, maxWidthPx, 2);
      expect(fitted.endsWith("…")).toBe(true);
      expect(textWidthPx(fitted, 2)).toBeLessThanOrEqual(maxWidthPx);
      const kept = [...fitted].length - 1;
      // One more character of the title would not fit.
      expect(textWidthPx(`${[...title].slice(0, kept + 1).join("")}…`, 2)).toBeGreaterThan(maxWidthPx);
    }
  });

  it("fontMetricsPx(scale) steps capitals 8, 10, 13 px at scales 1, 2, 3; an H's stem inks exactly that many rows", () => {
    for (const [scale, capPx] of [[1, 8], [2, 10], [3, 13]] as const) {
      expect(fontMetricsPx(scale).capHeightPx).toBe(capPx);
      const rows = new Set<number>();
      forEachInkPixel("H", scale, (_dx, dy, coverage) => {
        if (coverage >= 0.5) rows.add(dy);
      });
      // H stands on the baseline and its top is the cap height (OS/2 sCapHeight is the H's height by definition).
      expect(rows.size).toBe(capPx);
    }
    expect(() => fontMetricsPx(0)).toThrow(RangeError);
  });
});

describe("the font's licence", () => {
  it("ships with the font: OFL.txt and its attribution sit beside the TTF, and package.json ships assets/", () => {
    const ofl = readFileSync(new URL("../../assets/fonts/OFL.txt", import.meta.url), "utf8");
    // The licence text's own title line and the copyright holder's notice (SIL OFL 1.1, "How to apply").
    expect(ofl).toContain("SIL OPEN FONT LICENSE Version 1.1");
    expect(ofl).toContain('IBM Corp. with Reserved Font Name "Plex"');
    expect(readFileSync(new URL("../../assets/fonts/README.md", import.meta.url), "utf8")).toContain("IBM Plex Sans");
    const pkg = JSON.parse(readFileSync(new URL("../../package.json", import.meta.url), "utf8")) as { files: string[] };
    expect(pkg.files).toContain("assets");
  });
});
