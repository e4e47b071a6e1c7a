// spectrogramFigure(a, { frequencyWindowHz }): a measured channel's part of the pass-1
// spectrogram. Bin k of an N-point spectrogram at fs is centred at −fs/2 + k·fs/N (centred
// order, docs/methods.md "Conventions"); the window keeps the bins whose centres lie in the band,
// so the axis spans the band to within half a bin at each end.
import { describe, expect, it } from "vitest";
import type { AnalysedCapture } from "../../src/commands/analyseCapture.js";
import { spectrogramFigure } from "../../src/report/spectrogramFigure.js";

const FS = 48_000;
const N = 1024;
const ROWS = 8;

/** The parts of an analysed capture the figure reads: a flat spectrogram at 1e-10 FS²/Hz. */
const A = {
  meta: { sampleRateHz: FS, centerHz: 164.975e6 },
  span: { startSample: 0, sampleCount: FS },
  pass1: {
    noiseFloor: { dbfsPerHz: -100 },
    spectrogram: {
      rowCount: ROWS, fftLength: N, sampleRateHz: FS, binWidthHz: FS / N, window: "hann",
      meanPerHz: new Float32Array(ROWS * N).fill(1e-10), maxPerHz: new Float32Array(ROWS * N).fill(1e-10),
      framesPerRow: new Uint32Array(ROWS).fill(5),
      rowStartS: Float64Array.from({ length: ROWS }, (_, r) => r / ROWS), rowStopS: Float64Array.from({ length: ROWS }, (_, r) => (r + 1) / ROWS),
    },
  },
  warnings: [],
} as unknown as AnalysedCapture;

describe("spectrogramFigure(a, { frequencyWindowHz })", () => {
  it("limits the frequency axis to the band, within half a bin at each end", () => {
    const df = FS / N;
    const band = { lowerHz: 5000, upperHz: 17_500 };
    const { frequencySpanHz: [lo, hi] } = spectrogramFigure(A, { title: "t", widthPx: 800, heightPx: 500, reduce: "mean", frequencyWindowHz: band });
    expect(lo).toBeGreaterThanOrEqual(band.lowerHz - df / 2);
    expect(lo).toBeLessThan(band.lowerHz + df / 2);
    expect(hi).toBeLessThanOrEqual(band.upperHz + df / 2);
    expect(hi).toBeGreaterThan(band.upperHz - df / 2);
  });
  it("spans the whole capture, −fs/2 − Δf/2 to fs/2 − Δf/2, without a window", () => {
    const df = FS / N;
    const { frequencySpanHz } = spectrogramFigure(A, { title: "t", widthPx: 800, heightPx: 500, reduce: "mean" });
    expect(frequencySpanHz).toEqual([-FS / 2 - df / 2, FS / 2 - df / 2]);
  });
});
