import { describe, expect, it } from "vitest";
import { rasteriseOutline, SUBSCANLINES, type CoverageBitmap, type OutlineCommand } from "../../src/render/index.js";

/** A closed rectangle from (x0, y0) to (x1, y1), clockwise on screen (y down) unless `reversed`. */
function rect(x0: number, y0: number, x1: number, y1: number, reversed = false): OutlineCommand[] {
  const corners: [number, number][] = [[x0, y0], [x1, y0], [x1, y1], [x0, y1]];
  if (reversed) corners.reverse();
  return [{ type: "M", x: corners[0]![0], y: corners[0]![1] }, ...corners.slice(1).map(([x, y]) => ({ type: "L" as const, x, y })), { type: "Z" }];
}

function at(b: CoverageBitmap, x: number, y: number): number {
  return b.coverage[(y - b.top) * b.width + (x - b.left)] ?? NaN;
}

function total(b: CoverageBitmap): number {
  return b.coverage.reduce((s, v) => s + v, 0);
}

describe("rasteriseOutline", () => {
  it("rasteriseOutline(rectangle 0.5…2.5 × 0.5…2.5) gives each pixel the area of the square inside it", () => {
    const b = rasteriseOutline(rect(0.5, 0.5, 2.5, 2.5));
    expect([b.left, b.top, b.width, b.height]).toEqual([0, 0, 3, 3]);
    // Areas by hand: corner pixels ¼, edge pixels ½, the middle 1; sample rows at (k + ½)/16 fall
    // exactly on the half-pixel edges' either side, so the vertical sampling is exact here too.
    const expected = [
      [0.25, 0.5, 0.25],
      [0.5, 1, 0.5],
      [0.25, 0.5, 0.25],
    ];
    for (let y = 0; y < 3; y++) for (let x = 0; x < 3; x++) expect(at(b, x, y)).toBeCloseTo(expected[y]![x]!, 6);
  });

  it("rasteriseOutline covers a triangle's area to within the vertical sampling step", () => {
    // Right triangle (0,0)–(8,0)–(0,6): area ½·8·6 = 24 px².
    const b = rasteriseOutline([{ type: "M", x: 0, y: 0 }, { type: "L", x: 8, y: 0 }, { type: "L", x: 0, y: 6 }, { type: "Z" }]);
    // Each sample row is exact across; rows stand for 1/SUBSCANLINES of a pixel, so the sum is a
    // midpoint rule on a linear width: exact for the triangle's straight edges.
    expect(total(b)).toBeCloseTo(24, 6);
  });

  it("rasteriseOutline follows the non-zero winding rule: overlap counts once, a reversed inner contour is a hole", () => {
    // Two overlapping squares of the same direction: the union, 4 + 4 − 1 = 7 px², never over 1 a pixel.
    const union = rasteriseOutline([...rect(0, 0, 2, 2), ...rect(1, 1, 3, 3)]);
    expect(total(union)).toBeCloseTo(7, 6);
    expect(Math.max(...union.coverage)).toBeLessThanOrEqual(1);
    // An outer 4 × 4 square and an inner 2 × 2 of the other direction: 16 − 4 = 12 px², hole empty.
    const ring = rasteriseOutline([...rect(0, 0, 4, 4), ...rect(1, 1, 3, 3, true)]);
    expect(total(ring)).toBeCloseTo(12, 6);
    expect(at(ring, 1, 1)).toBe(0);
    expect(at(ring, 2, 2)).toBe(0);
    // The same inner square in the same direction winds twice: non-zero fills it (even-odd would not).
    const doubled = rasteriseOutline([...rect(0, 0, 4, 4), ...rect(1, 1, 3, 3)]);
    expect(total(doubled)).toBeCloseTo(16, 6);
  });

  it("rasteriseOutline flattens a quadratic curve to within 0.05 px: a parabolic segment's area is 2/3 of its box", () => {
    // Region under y = 4 − x²/4 … the chord: the quadratic from (−4, 4) via control (0, −4) to (4, 4)
    // bounds with the chord y = 4 an area of (2/3)·8·4 = 21.33 px² (Archimedes' quadrature of the parabola).
    const b = rasteriseOutline([{ type: "M", x: -4, y: 4 }, { type: "Q", x1: 0, y1: -4, x: 4, y: 4 }, { type: "Z" }]);
    // Chord error ≤ 0.05 px along a curve about 12 px long, plus the sampling of 1/16 px rows.
    expect(Math.abs(total(b) - 64 / 3)).toBeLessThan(12 * 0.05 + 8 / SUBSCANLINES);
  });

  it("rasteriseOutline of nothing (a space) is an empty bitmap", () => {
    expect(rasteriseOutline([]).width).toBe(0);
  });
});
