// The threshold of survey detection: the chi-square law of a row mean of K periodograms of noise
// (2K degrees of freedom), checked against closed forms, a handbook table and a simulation that
// shares nothing with the pass-1 fixtures.
import { describe, expect, it } from "vitest";
import type { Spectrogram } from "../../src/dsp/index.js";
import { SeededRandom } from "../../src/scenario/index.js";
import {
  falseAlarmProbability, noiseFloorPerBin, rowMeanQuantile, rowMeanTail, rowThresholdFactor,
} from "../../src/survey/index.js";

/** A row mean of k unit-mean exponentials: what one noise cell of a spectrogram row is over S. */
function rowMean(rng: SeededRandom, k: number): number {
  let sum = 0;
  for (let j = 0; j < k; j++) sum -= Math.log(1 - rng.uniform());
  return sum / k;
}

/** A spectrogram of rows × n cells, each density(b) times a row mean of k exponentials. */
function chiSquareSpectrogram(rng: SeededRandom, rows: number, n: number, k: number, density: (b: number) => number): Spectrogram {
  const mean = new Float32Array(rows * n);
  for (let i = 0; i < mean.length; i++) mean[i] = density(i % n) * rowMean(rng, k);
  return {
    rowCount: rows, fftLength: n, sampleRateHz: 1e6, binWidthHz: 1e6 / n, window: "hann",
    meanPerHz: mean, maxPerHz: mean, framesPerRow: new Uint32Array(rows).fill(k),
    rowStartS: new Float64Array(rows), rowStopS: new Float64Array(rows),
  };
}

describe("rowMeanTail(K, t): P(χ²_2K/2K > t)", () => {
  it("is e^(−t) for K = 1 and e^(−2t)(1 + 2t) for K = 2 (exponential and Erlang-2 laws; theory)", () => {
    for (const t of [0.1, 1, 5, 13.8155]) {
      expect(rowMeanTail(1, t)).toBeCloseTo(Math.exp(-t), 14);
      expect(rowMeanTail(2, t) / (Math.exp(-2 * t) * (1 + 2 * t))).toBeCloseTo(1, 12);
    }
  });

  it("meets the chi-square table: χ²_16 upper 5 % point 26.296, χ²_10 upper 1 % point 23.209, χ²_2 upper 0.1 % point 13.816 (A&S Table 26.8, from memory)", () => {
    // Table values have 5 significant figures: the tail there is met to about 1e-4 relative of p.
    expect(rowMeanTail(8, 26.296 / 16)).toBeCloseTo(0.05, 4);
    expect(rowMeanTail(5, 23.209 / 10)).toBeCloseTo(0.01, 4);
    expect(rowMeanTail(1, 13.816 / 2)).toBeCloseTo(0.001, 5);
  });

  it("stays finite for long rows: K = 2000 at its median (Wilson–Hilferty: the median of χ²_ν/ν is about 1 − 2/(9ν))", () => {
    const m = rowMeanQuantile(2000, 0.5);
    expect(Math.abs(m - (1 - 2 / (9 * 4000)) ** 3)).toBeLessThan(1e-4);
  });
});

describe("rowThresholdFactor(K, pfa)", () => {
  it("inverts the tail: for K = 1 the factor is −ln(pfa) (exponential law; theory)", () => {
    expect(rowThresholdFactor(1, 1e-6)).toBeCloseTo(-Math.log(1e-6), 8);
    expect(rowMeanTail(8, rowThresholdFactor(8, 1e-6)) / 1e-6).toBeCloseTo(1, 6);
  });

  it("gives the stated false-alarm rate on simulated row means of 4 frames (Monte Carlo, 400 000 cells at pfa 1e-3)", () => {
    const rng = new SeededRandom(9001);
    const k = 4;
    const t = rowThresholdFactor(k, 1e-3);
    let count = 0;
    const cells = 400_000;
    for (let i = 0; i < cells; i++) if (rowMean(rng, k) > t) count++;
    // Binomial: mean 400, sd √400 = 20; 4 sd either side (common practice).
    expect(Math.abs(count - 400)).toBeLessThan(80);
  });

  it("allows for the floor's error: the averaged tail at the raised factor is pfa, and the factor is above the known-floor one", () => {
    const error = { biasRel: -0.02, sdRel: 0.02 };
    const t = rowThresholdFactor(8, 1e-6, error);
    expect(falseAlarmProbability(8, t, error) / 1e-6).toBeCloseTo(1, 5);
    expect(t).toBeGreaterThan(rowThresholdFactor(8, 1e-6));
  });
});

describe("noiseFloorPerBin(spectrogram) with the threshold on simulated chi-square cells (no pass 1)", () => {
  it("keeps the false-alarm count at or below cells·pfa under a floor sloped by 10 dB across the band", () => {
    const rng = new SeededRandom(9002);
    const n = 256;
    const rows = 400;
    const k = 8;
    const slope = (b: number): number => 10 ** ((10 * (b / n - 0.5)) / 10) * 1e-9;
    const s = chiSquareSpectrogram(rng, rows, n, k, slope);
    const mean = s.meanPerHz;
    const floor = noiseFloorPerBin(s);
    const pfa = 1e-3;
    const t = rowThresholdFactor(k, pfa, floor.error);
    let count = 0;
    for (let r = 0; r < rows; r++) for (let b = 0; b < n; b++) if ((mean[r * n + b] as number) > t * (floor.floorPerHz[b] as number)) count++;
    const expected = rows * n * pfa; // 102.4
    // The floor's bias allowance is an upper bound (noiseFloorPerBin.ts), so the count may fall
    // below the expectation, but not above it by more than 4 binomial sd (common practice).
    expect(count).toBeLessThan(expected + 4 * Math.sqrt(expected));
    // At 400 rows the allowance raises t by about 2 %; with d ln P/d ln t ≈ −15 here (Gamma(8) tail
    // at P = 1e-3) that lowers P by about a factor 1.4, so a factor 3 is a loose bound (theory).
    expect(count).toBeGreaterThan(expected / 3);
    // Unbiased for a slope: within 3 % (three times the stated standard error) in the middle of the band.
    for (const b of [64, 128, 192]) expect(Math.abs((floor.floorPerHz[b] as number) / slope(b) - 1)).toBeLessThan(Math.max(0.03, 3 * floor.error.sdRel));
  });
});

describe("the floor's error allowance, on few rows (16 rows of K = 2: a 13 % floor error)", () => {
  it("is needed (the known-floor factor gives more than cells·pfa + 4 sd false cells) and suffices (the allowed factor gives fewer than cells·pfa)", () => {
    const rng = new SeededRandom(9118);
    const n = 256;
    const rows = 16;
    const k = 2;
    const pfa = 1e-3;
    let allowed = 0;
    let known = 0;
    let cells = 0;
    for (let trial = 0; trial < 100; trial++) {
      const s = chiSquareSpectrogram(rng, rows, n, k, () => 1e-9);
      const mean = s.meanPerHz;
      const floor = noiseFloorPerBin(s);
      const t = rowThresholdFactor(k, pfa, floor.error);
      const t0 = rowThresholdFactor(k, pfa);
      for (let i = 0; i < mean.length; i++) {
        const f = floor.floorPerHz[i % n] as number;
        if ((mean[i] as number) > t * f) allowed++;
        if ((mean[i] as number) > t0 * f) known++;
        cells++;
      }
    }
    const expected = cells * pfa; // 409.6, binomial sd 20
    expect(known).toBeGreaterThan(expected + 4 * Math.sqrt(expected));
    // The bias bound is conservative (noiseFloorPerBin.ts), so with it the count falls below the expectation.
    expect(allowed).toBeLessThan(expected);
  });
});
