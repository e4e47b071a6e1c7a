import { PNG } from "pngjs";
import { describe, expect, it } from "vitest";
import { renderLineFigure, type LineFigureInput, type Rgb } from "../../src/render/index.js";
import { blendedInkOf } from "../helpers/blendedInk.js";

const SERIES: Rgb = [10, 120, 200];
const MARKER: Rgb = [220, 20, 20];

function figure(overrides: Partial<LineFigureInput> = {}): LineFigureInput {
  return {
    title: "test",
    subtitle: "a flat line and one marker",
    x: { name: "Frequency offset", quantity: { kind: "hertz" }, min: 0, max: 10e3 },
    y: { name: "Level", quantity: { kind: "linear", unit: "dBFS" }, min: -100, max: 0 },
    series: [{ label: "flat", xValues: [0, 5e3, 10e3], yValues: [-30, -30, -30], colour: SERIES }],
    markers: [{ orientation: "vertical", value: 7e3, label: "edge", colour: MARKER }],
    widthPx: 640,
    heightPx: 420,
    ...overrides,
  };
}

/** Pixels of exactly `colour` in the image decoded by pngjs (the reference decoder). */
function pixelsOf(png: Buffer, colour: Rgb): [number, number][] {
  const image = PNG.sync.read(png);
  const out: [number, number][] = [];
  for (let y = 0; y < image.height; y++)
    for (let x = 0; x < image.width; x++) {
      const i = (y * image.width + x) * 4;
      if (image.data[i] === colour[0] && image.data[i + 1] === colour[1] && image.data[i + 2] === colour[2]) out.push([x, y]);
    }
  return out;
}

describe("renderLineFigure", () => {
  it("renderLineFigure(input) returns a PNG that pngjs decodes at the stated size", () => {
    const image = PNG.sync.read(renderLineFigure(figure({ widthPx: 1200, heightPx: 800 })).png);
    expect([image.width, image.height]).toEqual([1200, 800]);
  });

  it("a flat series at −30 dBFS is drawn on the row yOf(−30) ± 1 inside the plot; its legend swatch sits above the plot", () => {
    const { png, layout, yOf } = renderLineFigure(figure());
    const p = layout.plot;
    const pixels = pixelsOf(png, SERIES);
    const inPlot = pixels.filter(([x, y]) => x >= p.x && x < p.x + p.width && y >= p.y && y < p.y + p.height);
    // One pixel a column, less the one where the marker line (drawn later) may cross it.
    expect(inPlot.length).toBeGreaterThanOrEqual(p.width - 1);
    for (const [, y] of inPlot) expect(Math.abs(y - Math.floor(yOf(-30)))).toBeLessThanOrEqual(1);
    expect(pixels.some(([, y]) => y < p.y - 1)).toBe(true);
  });

  it("a vertical marker at 7 kHz is drawn in column xOf(7 kHz) ± 1 (dashed), and its label beside it", () => {
    const { png, layout, xOf } = renderLineFigure(figure());
    const column = Math.floor(xOf(7e3));
    const pixels = pixelsOf(png, MARKER);
    const onLine = pixels.filter(([x]) => Math.abs(x - column) <= 1);
    expect(onLine.length).toBeGreaterThan(layout.plot.height / 3);
    expect(onLine.length).toBeLessThan(layout.plot.height);
    // The label's text is anti-aliased: look for its ink at half coverage or more.
    expect(blendedInkOf(png, MARKER, 0.5).some(([x]) => Math.abs(x - column) > 3)).toBe(true);
  });

  it("a shaded span covers exactly its columns across the plot height; a note rings its point", () => {
    const SHADE: Rgb = [250, 215, 200];
    const NOTE: Rgb = [90, 10, 120];
    const { png, layout, xOf, yOf } = renderLineFigure(figure({ shaded: [{ fromX: 2e3, toX: 4e3, colour: SHADE }], notes: [{ x: 8e3, y: -50, text: "worst", colour: NOTE }] }));
    const p = layout.plot;
    const shaded = pixelsOf(png, SHADE);
    const xs = shaded.map(([x]) => x);
    // The span's pixel columns: xOf(2 kHz) to xOf(4 kHz) by the linear map, within the one column
    // that rounding a continuous coordinate to a pixel column may move an edge.
    expect(Math.abs(Math.min(...xs) - xOf(2e3))).toBeLessThanOrEqual(1);
    expect(Math.abs(Math.max(...xs) + 1 - xOf(4e3))).toBeLessThanOrEqual(1);
    const rows = new Set(shaded.map(([, y]) => y));
    expect(rows.size).toBeGreaterThan(0.9 * p.height);
    const ring = pixelsOf(png, NOTE).filter(([x, y]) => Math.hypot(x - xOf(8e3), y - yOf(-50)) < 8);
    expect(ring.length).toBeGreaterThan(10);
  });

  it("xOf / yOf are the linear maps of the axis ranges onto the plot, y minimum at the bottom", () => {
    const { layout, xOf, yOf } = renderLineFigure(figure());
    const p = layout.plot;
    expect(xOf(0)).toBe(p.x);
    expect(xOf(10e3)).toBeCloseTo(p.x + p.width, 9);
    expect(yOf(-100)).toBeCloseTo(p.y + p.height, 9);
    expect(yOf(0)).toBeCloseTo(p.y, 9);
    expect(yOf(-50)).toBeCloseTo(p.y + p.height / 2, 9);
  });

  it("without given ranges the axes cover the data and markers; NaN breaks a line without failing", () => {
    const { xOf, yOf, layout } = renderLineFigure({
      ...figure(),
      x: { name: "Time", quantity: { kind: "seconds" } },
      y: { name: "Envelope", quantity: { kind: "linear", unit: "FS" } },
      series: [{ label: "envelope", xValues: [0, 0.01, 0.02, 0.03], yValues: [0.1, NaN, 0.5, 0.3] }],
      markers: [{ orientation: "horizontal", value: 0.9, label: "limit" }],
    });
    expect(xOf(0)).toBe(layout.plot.x);
    expect(yOf(0.9)).toBeGreaterThanOrEqual(layout.plot.y);
    expect(yOf(0.1)).toBeLessThanOrEqual(layout.plot.y + layout.plot.height);
  });

  it("renderLineFigure throws RangeError below 480 × 320 px or for a series with unequal x and y lengths", () => {
    expect(() => renderLineFigure(figure({ widthPx: 400 }))).toThrow(RangeError);
    expect(() => renderLineFigure(figure({ series: [{ label: "bad", xValues: [0, 1], yValues: [0] }] }))).toThrow(RangeError);
  });
});
