import { PNG } from "pngjs";
import { describe, expect, it } from "vitest";
import { renderLineFigure, type LineFigureInput, type Rgb } from "../../src/render/index.js";

// Images are decoded with pngjs, the reference decoder, and read back by colour.
const POINT: Rgb = [200, 40, 160];
const OTHER: Rgb = [20, 150, 60];
const DAY_S = 86_400;

interface Decoded {
  readonly width: number;
  readonly height: number;
  /** Whether pixel (x, y) has exactly `colour`. */
  is(x: number, y: number, colour: Rgb): boolean;
}

function decode(png: Buffer): Decoded {
  const image = PNG.sync.read(png);
  return {
    width: image.width,
    height: image.height,
    is: (x, y, c) => {
      const i = (y * image.width + x) * 4;
      return image.data[i] === c[0] && image.data[i + 1] === c[1] && image.data[i + 2] === c[2];
    },
  };
}

/** Rows of `colour` in column `x` between rows y0 and y1 (inclusive), ascending. */
function rowsIn(image: Decoded, x: number, y0: number, y1: number, colour: Rgb): number[] {
  const rows: number[] = [];
  for (let y = y0; y <= y1; y++) if (image.is(x, y, colour)) rows.push(y);
  return rows;
}

/** Columns of `colour` in row `y` between columns x0 and x1 (inclusive), ascending. */
function columnsIn(image: Decoded, y: number, x0: number, x1: number, colour: Rgb): number[] {
  const columns: number[] = [];
  for (let x = x0; x <= x1; x++) if (image.is(x, y, colour)) columns.push(x);
  return columns;
}

function figure(overrides: Partial<LineFigureInput>): LineFigureInput {
  return {
    title: "points",
    subtitle: "one measured value with its uncertainty",
    x: { name: "Run", quantity: { kind: "linear", unit: "count" }, min: 0, max: 10 },
    y: { name: "Level", quantity: { kind: "linear", unit: "dB" }, min: 0, max: 100 },
    series: [],
    points: [{ label: "level", xValues: [5], yValues: [40], yErrors: [20], colour: POINT }],
    widthPx: 640,
    heightPx: 420,
    ...overrides,
  };
}

describe("renderLineFigure with points", () => {
  // Text scale 1 below 900 × 600 px and 2 from there (figureFrame textScaleFor); markers are ~5 px at scale 1.
  for (const [widthPx, heightPx, scale] of [
    [640, 420, 1],
    [1200, 800, 2],
  ] as const) {
    it(`a point at (5, 40 ± 20) on ${widthPx} × ${heightPx}: bar in column xOf(5) from row yOf(60) to yOf(20) ± 2 px, a ~${5 * scale} px square at yOf(40)`, () => {
      const { png, layout, xOf, yOf } = renderLineFigure(figure({ widthPx, heightPx }));
      const image = decode(png);
      const p = layout.plot;
      const column = Math.floor(xOf(5));
      const rows = rowsIn(image, column, p.y, p.y + p.height - 1, POINT);
      expect(Math.abs((rows[0] ?? -99) - yOf(60))).toBeLessThanOrEqual(2);
      expect(Math.abs((rows[rows.length - 1] ?? -99) - yOf(20))).toBeLessThanOrEqual(2);
      // The bar is unbroken from cap to cap.
      expect(rows.length).toBe((rows[rows.length - 1] ?? 0) - (rows[0] ?? 0) + 1);
      // The square: about 5 px per unit of text scale, centred on the column.
      const square = columnsIn(image, Math.floor(yOf(40)), p.x, p.x + p.width - 1, POINT);
      expect(square.length).toBeGreaterThanOrEqual(4 * scale);
      expect(square.length).toBeLessThanOrEqual(6 * scale);
      expect(Math.abs(((square[0] ?? 0) + (square[square.length - 1] ?? 0)) / 2 - column)).toBeLessThanOrEqual(scale);
      // Caps: short horizontal strokes at both bar ends, wider than the bar itself.
      for (const end of [rows[0] ?? 0, rows[rows.length - 1] ?? 0]) {
        const cap = columnsIn(image, end, p.x, p.x + p.width - 1, POINT);
        expect(cap.length).toBeGreaterThanOrEqual(3 * scale);
        expect(cap.length).toBeLessThanOrEqual(10 * scale);
      }
      // The legend shows the series above the plot.
      let legendPixels = 0;
      for (let y = 0; y < p.y - 1; y++) legendPixels += columnsIn(image, y, 0, image.width - 1, POINT).length;
      expect(legendPixels).toBeGreaterThan(0);
    });
  }

  it("a NaN error draws the square alone: the column holds the point colour only within the square's rows", () => {
    const { png, layout, xOf, yOf } = renderLineFigure(figure({ points: [{ label: "no bar", xValues: [5], yValues: [40], yErrors: [NaN], colour: POINT }] }));
    const p = layout.plot;
    const rows = rowsIn(decode(png), Math.floor(xOf(5)), p.y, p.y + p.height - 1, POINT);
    expect(rows.length).toBeGreaterThan(0);
    for (const y of rows) expect(Math.abs(y - yOf(40))).toBeLessThanOrEqual(4);
  });

  it("without a y range the axis holds every bar: y ± e from 2 to 18 lies inside the plot, the bar ends where yOf says", () => {
    const { png, layout, xOf, yOf } = renderLineFigure(
      figure({
        y: { name: "Level", quantity: { kind: "linear", unit: "dB" } },
        points: [{ label: "level", xValues: [3, 7], yValues: [10, 12], yErrors: [8, 1], colour: POINT }],
      }),
    );
    const p = layout.plot;
    expect(yOf(18)).toBeGreaterThanOrEqual(p.y);
    expect(yOf(2)).toBeLessThanOrEqual(p.y + p.height);
    const rows = rowsIn(decode(png), Math.floor(xOf(3)), p.y, p.y + p.height - 1, POINT);
    expect(Math.abs((rows[0] ?? -99) - yOf(18))).toBeLessThanOrEqual(2);
    expect(Math.abs((rows[rows.length - 1] ?? -99) - yOf(2))).toBeLessThanOrEqual(2);
  });

  it("a bar running off a fixed y range (10 ± 30 on 0–100) reaches the plot's bottom row without a cap there, and keeps its cap at yOf(40)", () => {
    const { png, layout, xOf, yOf } = renderLineFigure(figure({ points: [{ label: "low", xValues: [5], yValues: [10], yErrors: [30], colour: POINT }] }));
    const image = decode(png);
    const p = layout.plot;
    const bottom = p.y + p.height - 1;
    const rows = rowsIn(image, Math.floor(xOf(5)), p.y, bottom, POINT);
    expect(Math.abs((rows[0] ?? -99) - yOf(40))).toBeLessThanOrEqual(2);
    expect(rows[rows.length - 1]).toBe(bottom);
    expect(columnsIn(image, rows[0] ?? 0, p.x, p.x + p.width - 1, POINT).length).toBeGreaterThan(1);
    expect(columnsIn(image, bottom, p.x, p.x + p.width - 1, POINT).length).toBe(1);
  });

  it("joined points are linked by a line through the midpoint (xOf(5), yOf(50)) ± 2 px; unjoined ones are not", () => {
    const pair = { label: "pair", xValues: [2, 8], yValues: [20, 80], colour: POINT };
    for (const joined of [true, false]) {
      const { png, layout, xOf, yOf } = renderLineFigure(figure({ points: [{ ...pair, joined }] }));
      const p = layout.plot;
      const rows = rowsIn(decode(png), Math.floor(xOf(5)), p.y, p.y + p.height - 1, POINT);
      if (joined) {
        expect(rows.length).toBeGreaterThan(0);
        for (const y of rows) expect(Math.abs(y - yOf(50))).toBeLessThanOrEqual(2);
      } else expect(rows).toEqual([]);
    }
  });

  it("a point series takes the next default colour after the line series and is drawn with a given one as given", () => {
    const { png, layout, xOf, yOf } = renderLineFigure(
      figure({
        series: [{ label: "trend", xValues: [0, 10], yValues: [90, 90], colour: OTHER }],
        points: [{ label: "level", xValues: [5], yValues: [40], colour: POINT }],
      }),
    );
    const image = decode(png);
    expect(image.is(Math.floor(xOf(5)), Math.floor(yOf(40)), POINT)).toBe(true);
    expect(image.is(Math.floor(xOf(5)), Math.floor(yOf(90)), OTHER)).toBe(true);
    expect(layout.plot.width).toBeGreaterThan(0);
  });

  it("renderLineFigure throws RangeError for a point series with unequal lengths or an error that is negative, zero or infinite", () => {
    const bad = (points: LineFigureInput["points"]): (() => unknown) => () => renderLineFigure(figure({ points: points ?? [] }));
    expect(bad([{ label: "short", xValues: [1, 2], yValues: [1] }])).toThrow(RangeError);
    expect(bad([{ label: "errors", xValues: [1, 2], yValues: [1, 2], yErrors: [1] }])).toThrow(RangeError);
    expect(bad([{ label: "negative", xValues: [1], yValues: [1], yErrors: [-0.5] }])).toThrow(RangeError);
    expect(bad([{ label: "infinite", xValues: [1], yValues: [1], yErrors: [Infinity] }])).toThrow(RangeError);
    // An uncertainty is never shown as zero (project rule): NaN stands for none.
    expect(bad([{ label: "zero", xValues: [1], yValues: [1], yErrors: [0] }])).toThrow(RangeError);
  });
});

describe("renderLineFigure on a time-utc axis", () => {
  const T = Date.UTC(2024, 8, 17, 7, 5) / 1000;

  it("a single point (zero span) renders: the range opens a day each side, the point in the middle of the plot", () => {
    const { png, layout, xOf, yOf } = renderLineFigure(
      figure({
        x: { name: "Measured", quantity: { kind: "time-utc" } },
        y: { name: "Level", quantity: { kind: "linear", unit: "dB" } },
        points: [{ label: "one record", xValues: [T], yValues: [-20], yErrors: [1.5], colour: POINT }],
      }),
    );
    const p = layout.plot;
    expect(xOf(T - DAY_S)).toBeCloseTo(p.x, 6);
    expect(xOf(T + DAY_S)).toBeCloseTo(p.x + p.width, 6);
    expect(Math.abs(xOf(T) - (p.x + p.width / 2))).toBeLessThanOrEqual(1);
    expect(decode(png).is(Math.floor(xOf(T)), Math.floor(yOf(-20)), POINT)).toBe(true);
  });

  it("points over five months are drawn whole: the end squares and caps lie inside the plot", () => {
    const xs = [0, 40, 95, 150].map((d) => T + d * DAY_S);
    const { layout, xOf } = renderLineFigure(
      figure({
        x: { name: "Measured", quantity: { kind: "time-utc" } },
        points: [{ label: "level", xValues: xs, yValues: [30, 45, 50, 60], yErrors: [5, 5, 5, 5], colour: POINT }],
      }),
    );
    const p = layout.plot;
    // Caps reach 3 px either side at text scale 1 (an implementation choice); allow them all.
    expect(xOf(xs[0] ?? 0) - 4).toBeGreaterThanOrEqual(p.x);
    expect(xOf(xs[3] ?? 0) + 4).toBeLessThanOrEqual(p.x + p.width);
  });
});
