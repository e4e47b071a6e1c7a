import { PNG } from "pngjs";
import { describe, expect, it } from "vitest";
import { renderHistogram, type HistogramFigureInput, type Rgb } from "../../src/render/index.js";
import { blendedInkOf } from "../helpers/blendedInk.js";

const BAR: Rgb = [10, 120, 200];
const MARKER: Rgb = [220, 20, 20];

/** `bins` unit-wide bins centred on 0 … bins − 1, a triangle of counts peaking (at 100) in bin `peak`. */
function triangle(bins: number, peak: number): { binsCentre: Float64Array; counts: Float64Array } {
  const binsCentre = Float64Array.from({ length: bins }, (_, k) => k);
  const counts = Float64Array.from({ length: bins }, (_, k) => Math.max(0, 100 - 3 * Math.abs(k - peak)));
  return { binsCentre, counts };
}

function figure(overrides: Partial<HistogramFigureInput> = {}): HistogramFigureInput {
  return {
    title: "FSK instantaneous frequency",
    subtitle: "synthetic counts",
    ...triangle(80, 37),
    x: { name: "Instantaneous frequency offset", quantity: { kind: "linear", unit: "bin" } },
    y: { name: "Samples per bin", quantity: { kind: "linear", unit: "" } },
    markers: [{ orientation: "vertical", value: 60, label: "tone 1", colour: MARKER }],
    barColour: BAR,
    widthPx: 800,
    heightPx: 500,
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

/** Columns of the topmost row of bar pixels, and that row. */
function tallestBar(png: Buffer): { row: number; columns: number[] } {
  const bar = pixelsOf(png, BAR);
  const row = bar.reduce((m, [, y]) => Math.min(m, y), Infinity);
  return { row, columns: bar.filter(([, y]) => y === row).map(([x]) => x) };
}

describe("renderHistogram", () => {
  it("renderHistogram(input) returns a PNG that pngjs decodes at the stated size", () => {
    for (const [w, h] of [[480, 320], [1200, 800]] as const) {
      const image = PNG.sync.read(renderHistogram(figure({ widthPx: w, heightPx: h })).png);
      expect([image.width, image.height]).toEqual([w, h]);
    }
  });

  it("the tallest bar's pixel columns are centred on xOf(its bin centre) ± 1 px, its top on yOf(100) ± 1 px", () => {
    for (const [w, h] of [[480, 320], [800, 500], [1200, 800]] as const) {
      const { png, xOf, yOf } = renderHistogram(figure({ widthPx: w, heightPx: h }));
      const { row, columns } = tallestBar(png);
      const mid = (Math.min(...columns) + Math.max(...columns) + 1) / 2;
      expect(Math.abs(mid - xOf(37))).toBeLessThanOrEqual(1);
      expect(Math.abs(row - yOf(100))).toBeLessThanOrEqual(1);
      // A unit-wide bin is xOf(1) − xOf(0) px wide: the top row spans no more than that.
      expect(columns.length).toBeLessThanOrEqual(Math.ceil(xOf(1) - xOf(0)) + 1);
    }
  });

  it("with more bins than pixel columns (3000 bins) the tallest bar still stands at xOf(its centre) ± 1 px", () => {
    const { png, xOf } = renderHistogram(figure({ ...triangle(3000, 2222), markers: [] }));
    const { columns } = tallestBar(png);
    for (const x of columns) expect(Math.abs(x + 0.5 - xOf(2222))).toBeLessThanOrEqual(1);
  });

  it("default ranges: x from the first bin's low edge (−0.5) to the last's high edge (79.5), y from 0 (hand computation)", () => {
    const { layout, xOf, yOf } = renderHistogram(figure({ markers: [] }));
    const p = layout.plot;
    expect(xOf(-0.5)).toBeCloseTo(p.x, 9);
    expect(xOf(79.5)).toBeCloseTo(p.x + p.width, 9);
    expect(yOf(0)).toBeCloseTo(p.y + p.height, 9);
    // y top is the tallest bar plus 5 %: 105.
    expect(yOf(105)).toBeCloseTo(p.y, 9);
  });

  it("a vertical marker (the line figure's convention) is drawn dashed in column xOf(60) ± 1, its label beside it", () => {
    const { png, layout, xOf } = renderHistogram(figure());
    const column = Math.floor(xOf(60));
    const pixels = pixelsOf(png, MARKER);
    const onLine = pixels.filter(([x]) => Math.abs(x - column) <= 1);
    expect(onLine.length).toBeGreaterThan(layout.plot.height / 3);
    expect(onLine.length).toBeLessThan(layout.plot.height);
    // The label's text is anti-aliased: look for its ink at half coverage or more.
    expect(blendedInkOf(png, MARKER, 0.5).some(([x]) => Math.abs(x - column) > 3)).toBe(true);
  });

  it("renderHistogram throws RangeError below 480 × 320 px, for unequal lengths, unsorted centres or a negative count", () => {
    expect(() => renderHistogram(figure({ widthPx: 479 }))).toThrow(RangeError);
    expect(() => renderHistogram(figure({ binsCentre: [0, 1, 2], counts: [1, 2] }))).toThrow(RangeError);
    expect(() => renderHistogram(figure({ binsCentre: [0, 2, 1], counts: [1, 2, 3] }))).toThrow(RangeError);
    expect(() => renderHistogram(figure({ binsCentre: [0, 1, 2], counts: [1, -2, 3] }))).toThrow(RangeError);
  });
});
