import { PNG } from "pngjs";
import { describe, expect, it } from "vitest";
import { autoDbRange, rampColour, renderSpectrogram, spectrogramPlotRows, srgb8ToOklab, type SpectrogramFigureInput } from "../../src/render/index.js";

/** A flat −100 dB spectrogram with optional strong cells. */
function input(rows: number, bins: number, overrides: Partial<SpectrogramFigureInput> = {}): SpectrogramFigureInput {
  return {
    rows,
    bins,
    valuesDb: new Float32Array(rows * bins).fill(-100),
    frequencyStartHz: -1.2e6,
    frequencyStopHz: 1.2e6,
    centerHz: null,
    timeStartS: 0,
    timeStopS: 0.5,
    dbRange: { minDb: -110, maxDb: -20 },
    unitLabel: "dBFS/Hz",
    title: "test.cf32",
    subtitle: "2.4 MS/s · FFT 1024",
    widthPx: 800,
    heightPx: 500,
    ...overrides,
  };
}

/** Decoded with pngjs, the reference decoder; lightness (OKLab L) of each plot pixel. */
function plotLightness(png: Buffer, plot: { x: number; y: number; width: number; height: number }) {
  const image = PNG.sync.read(png);
  const at = (x: number, y: number): number => {
    const i = (y * image.width + x) * 4;
    return srgb8ToOklab([image.data[i]!, image.data[i + 1]!, image.data[i + 2]!])[0];
  };
  const column = (x: number): number => {
    let sum = 0;
    for (let y = plot.y; y < plot.y + plot.height; y++) sum += at(x, y);
    return sum / plot.height;
  };
  const row = (y: number): number => {
    let sum = 0;
    for (let x = plot.x; x < plot.x + plot.width; x++) sum += at(x, y);
    return sum / plot.width;
  };
  return { image, at, column, row };
}

function argmax(from: number, count: number, f: (i: number) => number): number {
  let best = from;
  for (let i = from; i < from + count; i++) if (f(i) > f(best)) best = i;
  return best;
}

describe("renderSpectrogram", () => {
  it("renderSpectrogram(input) returns a PNG that pngjs decodes at the stated size, plot inside it", () => {
    for (const [w, h] of [[480, 320], [1200, 800]] as const) {
      const { png, layout } = renderSpectrogram(input(50, 64, { widthPx: w, heightPx: h }));
      const image = PNG.sync.read(png);
      expect([image.width, image.height]).toEqual([w, h]);
      const p = layout.plot;
      expect(p.x).toBeGreaterThan(0);
      expect(p.y).toBeGreaterThan(0);
      expect(p.x + p.width).toBeLessThan(w);
      expect(p.y + p.height).toBeLessThan(h);
    }
  });

  it("one strong bin (fewer bins than columns): the brightest plot column is at xOfFrequencyHz(tone) ± 1 px", () => {
    const rows = 40;
    const bins = 256;
    const k = 181;
    const data = input(rows, bins);
    for (let r = 0; r < rows; r++) data.valuesDb[r * bins + k] = -30;
    const { png, layout, xOfFrequencyHz } = renderSpectrogram(data);
    // Centre of bin k: start + (k + 0.5) · binWidth (bin edges as the input contract defines them).
    const toneHz = -1.2e6 + ((k + 0.5) * 2.4e6) / bins;
    const { column } = plotLightness(png, layout.plot);
    const brightest = argmax(layout.plot.x, layout.plot.width, column);
    expect(Math.abs(brightest - Math.floor(xOfFrequencyHz(toneHz)))).toBeLessThanOrEqual(1);
  });

  it("one strong bin among 8192 (more bins than columns): max-combining keeps it at full colour at xOfFrequencyHz ± 1 px", () => {
    const rows = 30;
    const bins = 8192;
    const k = 5000;
    const data = input(rows, bins, { dbRange: { minDb: -110, maxDb: -30 } });
    for (let r = 0; r < rows; r++) data.valuesDb[r * bins + k] = -30;
    const { png, layout, xOfFrequencyHz } = renderSpectrogram(data);
    const toneHz = -1.2e6 + ((k + 0.5) * 2.4e6) / bins;
    const { column, image } = plotLightness(png, layout.plot);
    const brightest = argmax(layout.plot.x, layout.plot.width, column);
    expect(Math.abs(brightest - Math.floor(xOfFrequencyHz(toneHz)))).toBeLessThanOrEqual(1);
    // A mean over the ~12 bins per column would dim it by ~11 dB; the max keeps the top ramp colour.
    const i = ((layout.plot.y + 5) * image.width + brightest) * 4;
    expect([image.data[i], image.data[i + 1], image.data[i + 2]]).toEqual([...rampColour(255)]);
  });

  it("one strong row among 5000 (more rows than pixel rows): the brightest plot row is at yOfTimeS(burst) ± 1 px", () => {
    const rows = 5000;
    const bins = 32;
    const r = 3210;
    const data = input(rows, bins);
    for (let k = 0; k < bins; k++) data.valuesDb[r * bins + k] = -30;
    const { png, layout, yOfTimeS } = renderSpectrogram(data);
    const burstS = ((r + 0.5) * 0.5) / rows;
    const { row } = plotLightness(png, layout.plot);
    const brightest = argmax(layout.plot.y, layout.plot.height, row);
    expect(Math.abs(brightest - Math.floor(yOfTimeS(burstS)))).toBeLessThanOrEqual(1);
    // Time runs down: the start is at the top edge of the plot.
    expect(yOfTimeS(0)).toBe(layout.plot.y);
  });

  it("xOfFrequencyHz maps the band edges to the plot edges (linear map), with or without a centre frequency", () => {
    for (const centerHz of [null, 156.8e6]) {
      const { layout, xOfFrequencyHz } = renderSpectrogram(input(10, 100, { centerHz }));
      expect(xOfFrequencyHz(-1.2e6)).toBe(layout.plot.x);
      expect(xOfFrequencyHz(1.2e6)).toBeCloseTo(layout.plot.x + layout.plot.width, 9);
    }
  });

  it("renderSpectrogram throws RangeError below 480 × 320 px and for inconsistent input", () => {
    expect(() => renderSpectrogram(input(10, 10, { widthPx: 479 }))).toThrow(RangeError);
    expect(() => renderSpectrogram(input(10, 10, { heightPx: 319 }))).toThrow(RangeError);
    expect(() => renderSpectrogram({ ...input(10, 10), rows: 11 })).toThrow(RangeError);
    expect(() => renderSpectrogram(input(10, 10, { frequencyStopHz: -1.2e6 }))).toThrow(RangeError);
    expect(() => renderSpectrogram(input(10, 10, { dbRange: { minDb: -20, maxDb: -20 } }))).toThrow(RangeError);
  });
});

describe("autoDbRange", () => {
  it("autoDbRange(values) spans from 3 dB under the 10th percentile to the peak, rounded out to 5 dB (hand computation)", () => {
    const v = new Float32Array(1000).fill(-100);
    v.fill(-31.5, 0, 10);
    // Floor −100 − 3 = −103 → −105; peak −31.5 → −30.
    expect(autoDbRange(v)).toEqual({ minDb: -105, maxDb: -30 });
  });

  it("autoDbRange(values, noiseFloorDb) uses the floor it is given", () => {
    const v = new Float32Array([-100, -98, -40]);
    expect(autoDbRange(v, -90)).toEqual({ minDb: -95, maxDb: -40 });
  });

  it("autoDbRange keeps at least 20 dB, ignores NaN and ±Infinity, and falls back to −100 … 0 with nothing finite", () => {
    expect(autoDbRange(new Float32Array(50).fill(-50))).toEqual({ minDb: -55, maxDb: -35 });
    expect(autoDbRange(new Float32Array([NaN, -Infinity, -60, Infinity, -60]))).toEqual({ minDb: -65, maxDb: -45 });
    expect(autoDbRange(new Float32Array([NaN, NaN]))).toEqual({ minDb: -100, maxDb: 0 });
  });
});

describe("renderSpectrogram regions (a survey's boxes)", () => {
  // Decoded with pngjs (the reference decoder): the box is drawn where the axes' mapping puts the
  // region, solid for an emission, dashed for an artefact, each with a white tag holding its label.
  const regions = [
    { lowerHz: -600e3, upperHz: -300e3, startS: 0.1, endS: 0.3, label: "1", kind: "emission" as const },
    { lowerHz: 200e3, upperHz: 500e3, startS: 0.1, endS: 0.3, label: "DC", kind: "artefact" as const },
  ];
  const figure = renderSpectrogram(input(200, 512, { regions }));
  const image = PNG.sync.read(figure.png);
  const white = (x: number, y: number): boolean => {
    const i = (Math.round(y) * image.width + Math.round(x)) * 4;
    return image.data[i] === 255 && image.data[i + 1] === 255 && image.data[i + 2] === 255;
  };
  const edgeRun = (r: (typeof regions)[number]): boolean[] => {
    const x0 = Math.ceil(figure.xOfFrequencyHz(r.lowerHz)) + 6;
    const x1 = Math.floor(figure.xOfFrequencyHz(r.upperHz)) - 1;
    const y = Math.ceil(figure.yOfTimeS(r.endS));
    return Array.from({ length: x1 - x0 }, (_, k) => white(x0 + k, y));
  };

  it("draws an emission's box as a solid white line along its bottom edge", () => {
    expect(edgeRun(regions[0]!).every((w) => w)).toBe(true);
  });

  it("draws an artefact's box dashed (white and dark cells alternate along the edge)", () => {
    const run = edgeRun(regions[1]!);
    const share = run.filter((w) => w).length / run.length;
    // Dash 5 on, 4 off: 5/9 of the edge white (within a pixel of rounding at each dash).
    expect(share).toBeGreaterThan(0.4);
    expect(share).toBeLessThan(0.7);
  });

  it("without regions the plot holds no white pixel (the ramp's lightest colour is not white)", () => {
    const plain = renderSpectrogram(input(200, 512));
    const img = PNG.sync.read(plain.png);
    const p = plain.layout.plot;
    let whites = 0;
    for (let y = p.y + 1; y < p.y + p.height - 1; y++) {
      for (let x = p.x + 1; x < p.x + p.width - 1; x++) {
        const i = (y * img.width + x) * 4;
        if (img.data[i] === 255 && img.data[i + 1] === 255 && img.data[i + 2] === 255) whites++;
      }
    }
    expect(whites).toBe(0);
  });
});

describe("spectrogramPlotRows(widthPx, heightPx)", () => {
  it("is the plot height renderSpectrogram lays out for a one-line title and subtitle (one row per pixel row)", () => {
    for (const [w, h] of [[1200, 800], [800, 480], [480, 320]] as const) {
      const figure = renderSpectrogram(input(10, 10, { widthPx: w, heightPx: h }));
      expect(spectrogramPlotRows(w, h)).toBe(figure.layout.plot.height);
    }
  });
});
