import { describe, expect, it } from "vitest";
import { speechLikeAudio, toneAudio } from "../../src/scenario/index.js";
import { maxOf, minOf } from "./lines.js";

/** Energy of the DFT bins of `x` (length N, rate fs) whose frequency lies in [loHz, hiHz]. */
function bandEnergy(x: Float64Array, fs: number, loHz: number, hiHz: number): number {
  const n = x.length;
  let e = 0;
  for (let b = Math.ceil((loHz * n) / fs); b <= Math.floor((hiHz * n) / fs); b++) {
    let re = 0;
    let im = 0;
    for (let k = 0; k < n; k++) {
      const ph = (-2 * Math.PI * ((b * k) % n)) / n;
      re += (x[k] as number) * Math.cos(ph);
      im += (x[k] as number) * Math.sin(ph);
    }
    e += re * re + im * im;
  }
  return e;
}

describe("speechLikeAudio(start, count, fs)", () => {
  const fs = 8000;

  it("stays within ±1 and reaches +1 at 0.5 s and −1 at 1.0 s (its stated contract)", () => {
    const a = speechLikeAudio(0, 2 * fs, fs);
    expect(maxOf(a)).toBeLessThanOrEqual(1);
    expect(minOf(a)).toBeGreaterThanOrEqual(-1);
    expect(a[0.5 * fs]).toBeCloseTo(1, 12);
    expect(a[1.0 * fs]).toBeCloseTo(-1, 12);
  });

  it("keeps > 99.9 % of its energy in the 300–3000 Hz speech band (land-mobile FM speech band, common practice)", () => {
    // 2 s from 0.375 s: the record starts and ends in a pause between syllables, so its periodic
    // extension is smooth and the rectangular DFT does not leak. Parseval: Σ|X_b|² = N·Σx².
    const start = 0.375 * fs;
    const x = speechLikeAudio(start, 2 * fs, fs);
    const n = x.length;
    let total = 0;
    for (const v of x) total += v * v;
    const below = bandEnergy(x, fs, 0, 300) * 2; // positive and negative frequencies
    const above = bandEnergy(x, fs, 3000, fs / 2) * 2;
    expect(total).toBeGreaterThan(0);
    expect((below + above) / (n * total)).toBeLessThan(1e-3);
    // Nothing falls into the CTCSS band (67–254 Hz, REFERENCES.md §10) that a tone decoder would hear.
    expect(bandEnergy(x, fs, 67, 254) * 2 / (n * total)).toBeLessThan(1e-4);
  });

  it("joins across blocks (a pure function of the sample index)", () => {
    const whole = speechLikeAudio(0, 5000, fs);
    const tail = speechLikeAudio(2000, 3000, fs);
    for (let k = 0; k < tail.length; k++) expect(tail[k]).toBe(whole[2000 + k]);
  });
});

describe("toneAudio(start, count, fs, f, referenceS)", () => {
  it("of 123.0 Hz referenced to 0.5 s is +1 at 0.5 s and −1 at 1.0 s (61.5 periods: cos(123π) = −1)", () => {
    const a = toneAudio(0, 50_000, 50_000, 123.0, 0.5);
    expect(a[25_000]).toBeCloseTo(1, 12);
    expect(a[50_000 - 1]).toBeCloseTo(Math.cos(2 * Math.PI * 123 * (49_999 / 50_000 - 0.5)), 9);
    expect(toneAudio(50_000, 1, 50_000, 123.0, 0.5)[0]).toBeCloseTo(-1, 9);
  });
});
