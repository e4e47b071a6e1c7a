import { describe, expect, it } from "vitest";
import { overDeviationEnvelope, overDeviationGain, speechLikeAudio } from "../../src/scenario/index.js";
import type { OverDeviation } from "../../src/scenario/index.js";

const fs = 32_000;
const word: OverDeviation = { startS: 12.5, durationS: 0.8, rampS: 0.02, peakDeviationHz: 3400 };
const first = word.startS * fs; // 400 000, a whole sample
const last = (word.startS + word.durationS) * fs; // 425 600
const rampSamples = word.rampS * fs; // 640

describe("overDeviationEnvelope(start, count, fs, word)", () => {
  const e = overDeviationEnvelope(first - 100, last - first + 201, fs, word);
  const at = (n: number) => e[n - first + 100] as number;

  it("is the raised cosine ½(1 − cos πu/r) on each ramp, 1 between them, 0 outside (its closed form)", () => {
    expect(at(first - 1)).toBe(0);
    expect(at(first)).toBe(0);
    // u = r/2: ½(1 − cos π/2) = ½; u = r/4: ½(1 − cos π/4) = (2 − √2)/4.
    expect(at(first + rampSamples / 2)).toBeCloseTo(0.5, 12);
    expect(at(first + rampSamples / 4)).toBeCloseTo((2 - Math.SQRT2) / 4, 12);
    expect(at(first + rampSamples)).toBeCloseTo(1, 12);
    expect(at((first + last) / 2)).toBe(1);
    expect(at(last - rampSamples)).toBeCloseTo(1, 12);
    expect(at(last - rampSamples / 2)).toBeCloseTo(0.5, 12);
    expect(at(last)).toBeCloseTo(0, 12);
    expect(at(last + 1)).toBe(0);
  });

  it("is smooth: no step between samples larger than the raised cosine's steepest slope π/(2r) allows", () => {
    // Mean value theorem: |e[n] − e[n−1]| ≤ max|e'|/fs = π/(2·r·fs) = 7.4e-5 here.
    const bound = Math.PI / (2 * word.rampS * fs);
    let steepest = 0;
    for (let k = 1; k < e.length; k++) steepest = Math.max(steepest, Math.abs((e[k] as number) - (e[k - 1] as number)));
    expect(steepest).toBeLessThanOrEqual(bound * (1 + 1e-12));
    expect(steepest).toBeGreaterThan(0.99 * bound); // the slope is reached at mid-ramp
  });

  it("rejects ramps longer than half the word (one clear ParameterError)", () => {
    expect(() => overDeviationEnvelope(0, 10, fs, { ...word, rampS: 0.5 })).toThrow(/rampS/);
  });
});

describe("overDeviationGain(fs, word, voicePeakDeviationHz)", () => {
  const gain = overDeviationGain(fs, word, 2200);

  it("is exactly 1 outside the word, so the rest of the speech keeps its ±2.2 kHz", () => {
    const notOne = (g: Float64Array) => g.filter((v) => v !== 1).length;
    expect(notOne(gain(0, first))).toBe(0);
    expect(notOne(gain(last + 1, 1000))).toBe(0);
  });

  it("makes the sampled peak of 2.2 kHz·|audio·gain| inside the word exactly 3.4 kHz (its contract, evaluated directly)", () => {
    const count = last - first + 1;
    const a = speechLikeAudio(first, count, fs);
    const g = gain(first, count);
    let peakHz = 0;
    for (let k = 0; k < count; k++) peakHz = Math.max(peakHz, 2200 * Math.abs((a[k] as number) * (g[k] as number)));
    expect(peakHz).toBeCloseTo(3400, 9);
    // A shout: a level rise above 1 on the plateau, the same for every sample of it.
    const plateau = g[count >> 1] as number;
    expect(plateau).toBeGreaterThan(1);
    expect(g[rampSamples + 10]).toBe(plateau);
  });

  it("joins across blocks (a pure function of the sample index)", () => {
    const whole = gain(first - 50, 2000);
    const tail = gain(first + 450, 1500);
    for (let k = 0; k < tail.length; k++) expect(tail[k]).toBe(whole[500 + k]);
  });

  it("rejects a word peak that is not above the voice peak", () => {
    expect(() => overDeviationGain(fs, { ...word, peakDeviationHz: 2000 }, 2200)).toThrow(/peakDeviationHz/);
  });
});
