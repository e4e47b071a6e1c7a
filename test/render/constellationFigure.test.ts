import { PNG } from "pngjs";
import { describe, expect, it } from "vitest";
import {
  COLOUR_RAMP_OKLAB,
  COLOUR_RAMP_SIZE,
  IDEAL_POINT_COLOUR,
  rampColour,
  renderConstellation,
  srgb8ToOklab,
  type ConstellationFigureInput,
  type Rgb,
} from "../../src/render/index.js";

// QPSK at unit RMS: (±1/√2, ±1/√2).
const H = Math.SQRT1_2;
const QPSK = new Float64Array([H, H, -H, H, -H, -H, H, -H]);

// A dense spot away from the ideal points and from any cell edge of a 200-cell grid over ±1.
const SPOT = { i: 0.3037, q: -0.4962 } as const;

// Deterministic uniform numbers in [0, 1) (Park–Miller minimal standard generator, 1988).
function uniform(seed: number): () => number {
  let s = seed;
  return () => (s = (s * 16807) % 2147483647) / 2147483647;
}

/** `spotCount` symbols exactly at SPOT plus `spread` symbols uniform over the square ±0.95. */
function symbols(spotCount: number, spread: number): Float64Array {
  const r = uniform(12345);
  const out = new Float64Array(2 * (spotCount + spread));
  for (let k = 0; k < spotCount; k++) [out[2 * k], out[2 * k + 1]] = [SPOT.i, SPOT.q];
  for (let k = spotCount; k < spotCount + spread; k++) [out[2 * k], out[2 * k + 1]] = [1.9 * r() - 0.95, 1.9 * r() - 0.95];
  return out;
}

function input(overrides: Partial<ConstellationFigureInput> = {}): ConstellationFigureInput {
  return {
    title: "QPSK · EVM 3.0 % rms · MER 30.5 dB",
    subtitle: "synthetic symbols",
    symbols: symbols(500, 3000),
    ideal: QPSK,
    widthPx: 800,
    heightPx: 600,
    ...overrides,
  };
}

/** The image decoded by pngjs (the reference decoder) and a reader of its pixels. */
function decoded(png: Buffer) {
  const image = PNG.sync.read(png);
  const at = (x: number, y: number): Rgb => {
    const i = (y * image.width + x) * 4;
    return [image.data[i]!, image.data[i + 1]!, image.data[i + 2]!];
  };
  const pixelsOf = (colour: Rgb): [number, number][] => {
    const out: [number, number][] = [];
    for (let y = 0; y < image.height; y++)
      for (let x = 0; x < image.width; x++) {
        const c = at(x, y);
        if (c[0] === colour[0] && c[1] === colour[1] && c[2] === colour[2]) out.push([x, y]);
      }
    return out;
  };
  return { image, at, pixelsOf };
}

describe("renderConstellation", () => {
  it("renderConstellation(input) returns a PNG that pngjs decodes at the stated size, with a square plot inside it", () => {
    for (const [w, h] of [[480, 320], [800, 600], [1200, 800], [1600, 500]] as const) {
      const { png, layout } = renderConstellation(input({ widthPx: w, heightPx: h }));
      const { image } = decoded(png);
      expect([image.width, image.height]).toEqual([w, h]);
      const p = layout.plot;
      expect(p.width).toBe(p.height);
      expect(p.x).toBeGreaterThan(0);
      expect(p.y).toBeGreaterThan(0);
      expect(p.x + p.width).toBeLessThan(w);
      expect(p.y + p.height).toBeLessThan(h);
    }
  });

  it("equal scales: xOf(1) − xOf(0) = yOf(0) − yOf(1), and ±extent map to the plot edges (linear map, Q up)", () => {
    for (const [w, h] of [[480, 320], [1200, 800]] as const) {
      const { layout, xOf, yOf } = renderConstellation(input({ widthPx: w, heightPx: h, extent: 1.5 }));
      const p = layout.plot;
      expect(xOf(1) - xOf(0)).toBeCloseTo(yOf(0) - yOf(1), 9);
      // Closed form: side / (2 · extent) pixels per unit.
      expect(xOf(1) - xOf(0)).toBeCloseTo(p.width / 3, 9);
      expect(xOf(-1.5)).toBeCloseTo(p.x, 9);
      expect(xOf(1.5)).toBeCloseTo(p.x + p.width, 9);
      expect(yOf(1.5)).toBeCloseTo(p.y, 9);
      expect(yOf(-1.5)).toBeCloseTo(p.y + p.height, 9);
    }
  });

  it("the default extent for QPSK is 1.0: 1.3 × 1/√2 = 0.919 rounded up to 0.1 (hand computation of the documented rule)", () => {
    const { layout, xOf, yOf } = renderConstellation(input());
    expect(xOf(-1)).toBeCloseTo(layout.plot.x, 9);
    expect(yOf(1)).toBeCloseTo(layout.plot.y, 9);
  });

  it("the densest cell is drawn in the top ramp colour at xOf/yOf of the spot where most symbols were put", () => {
    for (const [w, h] of [[640, 420], [1200, 800]] as const) {
      const { png, layout, xOf, yOf } = renderConstellation(input({ widthPx: w, heightPx: h, extent: 1 }));
      const p = layout.plot;
      // Inside the plot only: the colour bar's top rows share the colour.
      const densest = decoded(png)
        .pixelsOf(rampColour(COLOUR_RAMP_SIZE - 1))
        .filter(([x, y]) => x >= p.x && x < p.x + p.width && y >= p.y && y < p.y + p.height);
      // One cell of a grid of about 200 along the side: side / 200 px.
      const cellPx = layout.plot.width / 200;
      expect(densest.length).toBeGreaterThan(0);
      expect(densest.length).toBeLessThanOrEqual((Math.ceil(cellPx) + 1) ** 2);
      const cx = densest.reduce((a, [x]) => a + x + 0.5, 0) / densest.length;
      const cy = densest.reduce((a, [, y]) => a + y + 0.5, 0) / densest.length;
      // The spot lies somewhere in its cell: within half a cell of the cell's centre, plus 1 px.
      expect(Math.abs(cx - xOf(SPOT.i))).toBeLessThanOrEqual(1 + cellPx / 2);
      expect(Math.abs(cy - yOf(SPOT.q))).toBeLessThanOrEqual(1 + cellPx / 2);
    }
  });

  it("counts are coloured by log10(1 + count): a lone symbol beside a cell of 999 gets ramp entry round(255 · log10 2 / 3) = 26", () => {
    const lone = { i: -0.5037, q: 0.2041 };
    const data = new Float64Array(2 * 1000);
    for (let k = 0; k < 999; k++) [data[2 * k], data[2 * k + 1]] = [SPOT.i, SPOT.q];
    [data[1998], data[1999]] = [lone.i, lone.q];
    const { png, xOf, yOf } = renderConstellation(input({ symbols: data, ideal: new Float64Array(0), extent: 1 }));
    // Hand computation: log10(1 + 1) / log10(1 + 999) · 255 = 0.30103 / 3 · 255 = 25.59 → 26.
    expect(decoded(png).at(Math.floor(xOf(lone.i)), Math.floor(yOf(lone.q)))).toEqual(rampColour(26));
  });

  it("each ideal point is marked in IDEAL_POINT_COLOUR at the pixel under xOf/yOf(ideal)", () => {
    for (const [w, h] of [[480, 320], [800, 600], [1200, 800]] as const) {
      const { png, xOf, yOf } = renderConstellation(input({ widthPx: w, heightPx: h }));
      const { at } = decoded(png);
      for (let k = 0; k < QPSK.length; k += 2) expect(at(Math.floor(xOf(QPSK[k]!)), Math.floor(yOf(QPSK[k + 1]!)))).toEqual([...IDEAL_POINT_COLOUR]);
    }
  });

  it("IDEAL_POINT_COLOUR is at least 0.2 from every ramp colour in OKLab (Ottosson 2020), so it cannot pass for a count", () => {
    const lab = srgb8ToOklab(IDEAL_POINT_COLOUR);
    let nearest = Infinity;
    for (let i = 0; i < COLOUR_RAMP_SIZE; i++) {
      const d = Math.hypot(lab[0] - COLOUR_RAMP_OKLAB[3 * i]!, lab[1] - COLOUR_RAMP_OKLAB[3 * i + 1]!, lab[2] - COLOUR_RAMP_OKLAB[3 * i + 2]!);
      nearest = Math.min(nearest, d);
    }
    expect(nearest).toBeGreaterThanOrEqual(0.2);
  });

  it("no symbols at all still gives a figure; NaN pairs and symbols outside the square are skipped", () => {
    expect(() => renderConstellation(input({ symbols: new Float64Array(0) }))).not.toThrow();
    const { png, xOf, yOf } = renderConstellation(input({ symbols: new Float64Array([NaN, 0.1, 5, 5, SPOT.i, SPOT.q]), extent: 1 }));
    // The one symbol inside is then the densest (and only) cell.
    expect(decoded(png).at(Math.floor(xOf(SPOT.i)), Math.floor(yOf(SPOT.q)))).toEqual(rampColour(COLOUR_RAMP_SIZE - 1));
  });

  it("renderConstellation throws RangeError below 480 × 320 px, for an odd number of values and for an extent ≤ 0", () => {
    expect(() => renderConstellation(input({ widthPx: 479 }))).toThrow(RangeError);
    expect(() => renderConstellation(input({ heightPx: 319 }))).toThrow(RangeError);
    expect(() => renderConstellation(input({ symbols: new Float64Array(3) }))).toThrow(RangeError);
    expect(() => renderConstellation(input({ ideal: new Float64Array(1) }))).toThrow(RangeError);
    expect(() => renderConstellation(input({ extent: 0 }))).toThrow(RangeError);
  });
});
