import { describe, expect, it } from "vitest";
import { measureText, RgbaCanvas, type Rgb } from "../../src/render/index.js";

const WHITE: Rgb = [255, 255, 255];
const RED: Rgb = [200, 0, 0];

function inked(canvas: RgbaCanvas): [number, number][] {
  const out: [number, number][] = [];
  for (let y = 0; y < canvas.height; y++) for (let x = 0; x < canvas.width; x++) if (canvas.getPixel(x, y)[1] === 0) out.push([x, y]);
  return out;
}

describe("RgbaCanvas", () => {
  it("new RgbaCanvas(w, h, colour) fills every pixel, opaque", () => {
    const c = new RgbaCanvas(3, 2, [1, 2, 3]);
    expect(Array.from(c.data)).toEqual([1, 2, 3, 255, 1, 2, 3, 255, 1, 2, 3, 255, 1, 2, 3, 255, 1, 2, 3, 255, 1, 2, 3, 255]);
    expect(() => new RgbaCanvas(0, 5, WHITE)).toThrow(RangeError);
  });

  it("line(x0, y0, x1, y1) sets one pixel per step of the major axis, ends included (Bresenham 1965)", () => {
    const c = new RgbaCanvas(20, 20, WHITE);
    c.line(1, 2, 11, 6, RED);
    const px = inked(c);
    expect(px).toHaveLength(11);
    expect(new Set(px.map(([x]) => x)).size).toBe(11);
    expect(px).toContainEqual([1, 2]);
    expect(px).toContainEqual([11, 6]);
    // Every pixel lies within half a pixel of the ideal line y = 2 + 0.4 (x − 1).
    for (const [x, y] of px) expect(Math.abs(y - (2 + 0.4 * (x - 1)))).toBeLessThanOrEqual(0.5);
  });

  it("line() with dashPx [2, 2] draws every other pair of pixels", () => {
    const c = new RgbaCanvas(20, 3, WHITE);
    c.line(0, 1, 11, 1, RED, { dashPx: [2, 2] });
    expect(inked(c).map(([x]) => x)).toEqual([0, 1, 4, 5, 8, 9]);
  });

  it("setClip(rect) keeps fillRect, line and text inside the rectangle", () => {
    const c = new RgbaCanvas(30, 30, WHITE);
    c.setClip({ x: 10, y: 10, width: 5, height: 5 });
    c.fillRect({ x: 0, y: 0, width: 30, height: 30 }, RED);
    c.line(0, 29, 29, 0, RED);
    c.text("WWW", 8, 8, RED);
    for (const [x, y] of inked(c)) {
      expect(x >= 10 && x < 15 && y >= 10 && y < 15).toBe(true);
    }
    expect(inked(c)).toHaveLength(25);
    c.setClip(null);
    c.fillRect({ x: 0, y: 0, width: 1, height: 1 }, RED);
    expect(c.getPixel(0, 0)).toEqual(RED);
  });

  it("text(s, {rotationDeg: 90}) is the quarter turn anticlockwise of text(s): (dx, dy) → (dy, length − 1 − dx)", () => {
    const flat = new RgbaCanvas(40, 40, WHITE);
    const turned = new RgbaCanvas(40, 40, WHITE);
    flat.text("Ag", 0, 0, RED);
    turned.text("Ag", 0, 0, RED, { rotationDeg: 90 });
    const { widthPx } = measureText("Ag", 1);
    const expected = inked(flat)
      .map(([dx, dy]) => [dy, widthPx - 1 - dx] as [number, number])
      .sort((a, b) => a[1] - b[1] || a[0] - b[0]);
    expect(inked(turned)).toEqual(expected);
    // Reading bottom to top: the first character's ink is in the lower half of the box.
    const aOnly = new RgbaCanvas(40, 40, WHITE);
    aOnly.text("A", 0, widthPx - measureText("A", 1).widthPx, RED, { rotationDeg: 90 });
    for (const p of inked(aOnly)) expect(inked(turned)).toContainEqual(p);
  });
});
