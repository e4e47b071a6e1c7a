import { describe, expect, it } from "vitest";
import {
  chiSquareQuantileOverNu, equivalentDegreesOfFreedom, fftPlan, noiseFloor, standardNormalQuantile, WelchAccumulator,
  type WelchPsd,
} from "../../src/dsp/index.js";
import { complexNoise, SeededRandom } from "../../src/scenario/index.js";

function welchOf(iq: Float32Array, fftLength: number, sampleRateHz: number, overlapLength?: number): WelchPsd {
  const acc = new WelchAccumulator(overlapLength === undefined ? { fftLength, sampleRateHz } : { fftLength, sampleRateHz, overlapLength });
  acc.push(iq, 0);
  return acc.finish();
}

/**
 * Stationary circular Gaussian noise of n = 2^m samples synthesised in the frequency domain:
 * DFT bin k gets variance σ²·n·gain(f_k), so the density is σ²·gain(f)/fs (Parseval), then one
 * inverse transform (scaled 1/n). `bands` are [lowFraction, highFraction) of fs, gain 10^(gainDb/10).
 */
function shapedNoise(n: number, variance: number, bands: Array<[number, number]>, gainDb: number, seed: number): Float32Array {
  const plan = fftPlan(n);
  const rng = new SeededRandom(seed);
  const spectrum = plan.createBuffer();
  for (let k = 0; k < n; k++) {
    const f = k < n / 2 ? k / n : k / n - 1;
    const inBand = bands.some(([lo, hi]) => f >= lo && f < hi);
    const s = Math.sqrt((variance * n * (inBand ? 10 ** (gainDb / 10) : 1)) / 2);
    spectrum[2 * k] = s * rng.gaussian();
    spectrum[2 * k + 1] = s * rng.gaussian();
  }
  const time = plan.createBuffer();
  plan.inverse(time, spectrum);
  return Float32Array.from(time);
}

describe("standardNormalQuantile(p) and chiSquareQuantileOverNu(ν, p)", () => {
  it("agree with scipy.stats norm.ppf / chi2.ppf within the stated approximation errors", () => {
    // scipy 1.17.1 norm.ppf (reference library); A&S 26.2.23 bounds the error by 4.5e-4.
    expect(Math.abs(standardNormalQuantile(0.2) - -0.8416212335729142)).toBeLessThan(4.5e-4);
    expect(Math.abs(standardNormalQuantile(0.975) - 1.959963984540054)).toBeLessThan(4.5e-4);
    expect(Math.abs(standardNormalQuantile(0.1) - -1.2815515655446004)).toBeLessThan(4.5e-4);
    // scipy chi2.ppf(p, ν)/ν. Wilson–Hilferty is within 1 % of these from ν = 2 up (ν = 2 is the
    // exponential case, −2·ln(1 − p)/2 in closed form), and far closer for large ν.
    expect(chiSquareQuantileOverNu(2, 0.2) / (0.4462871026284195 / 2)).toBeCloseTo(1, 1);
    expect(Math.abs(chiSquareQuantileOverNu(10, 0.1) / (4.865182051925328 / 10) - 1)).toBeLessThan(0.005);
    expect(Math.abs(chiSquareQuantileOverNu(100, 0.2) / (87.94533592275101 / 100) - 1)).toBeLessThan(0.001);
    expect(Math.abs(chiSquareQuantileOverNu(968, 0.2) / (930.7876380066938 / 968) - 1)).toBeLessThan(0.001);
  });
});

describe("equivalentDegreesOfFreedom(psd)", () => {
  it("is 2M without overlap and 2M/(1 + 2(1 − 1/M)/36) for Hann at 50 % (ρ(1) = 1/6 closed form; Harris 1978 Table 1: 16.7 %)", () => {
    const iq = new Float32Array(2 * 256 * 40);
    const rect = welchOf(iq, 256, 1, 0);
    expect(rect.segmentCount).toBe(40);
    expect(equivalentDegreesOfFreedom(rect)).toBe(80);
    const hann = welchOf(iq, 256, 1);
    const m = hann.segmentCount; // 79
    // Periodic Hann: Σ w[n]w[n + N/2] = Σ sin²cos² = N/16, Σ w² = 3N/8, so ρ(1) = 1/6.
    expect(equivalentDegreesOfFreedom(hann)).toBeCloseTo((2 * m) / (1 + (2 * (1 - 1 / m)) / 36), 9);
  });
});

describe("noiseFloor(psd)", () => {
  const fs = 1e6;
  const variance = 1e-4; // −40 dBFS of noise; density σ²/fs (REFERENCES §8)

  it("of complex white noise is σ²/fs", () => {
    const iq = new Float32Array(2 * (1 << 18));
    complexNoise(new SeededRandom(1), iq, variance);
    const floor = noiseFloor(welchOf(iq, 1024, fs));
    // 511 Hann/50 % segments → ν ≈ 968, bin spread √(2/ν) = 4.5 %; the 20th percentile of ~1000
    // bins has a spread of about 0.05 of that, and the total noise power of 2^18 samples ±0.2 %:
    // 0.1 dB (2.3 %) is well over 5σ.
    expect(Math.abs(floor.dbfsPerHz - 10 * Math.log10(variance / fs))).toBeLessThan(0.1);
    expect(floor.method).toMatch(/20th percentile/);
  });

  it("of white noise under emissions 40 dB up over 60 % of the band, plus a DC spike, is still σ²/fs", () => {
    const n = 1 << 18;
    const bands: Array<[number, number]> = [[-0.45, -0.2], [-0.1, 0], [0.15, 0.4]];
    const iq = shapedNoise(n, variance, bands, 40, 2);
    for (let j = 0; j < iq.length; j += 2) iq[j] = (iq[j] as number) + 0.05; // DC 26 dB above the noise power
    const floor = noiseFloor(welchOf(iq, 1024, fs));
    // Bias: the 20th percentile of all bins is the 50th of the noise bins, (z_0.5 − z_0.2)·4.5 %
    // = +3.8 % = +0.16 dB (module comment of noiseFloor.ts); Hann leakage over a few bins at each
    // of the six band edges raises the occupied share a little (≈ +0.02 dB), and the spreads above
    // add about ±0.03 dB. Accept 0.06..0.30 dB: an unbiased estimator or a median would fail.
    const errorDb = floor.dbfsPerHz - 10 * Math.log10(variance / fs);
    expect(errorDb).toBeGreaterThan(0.06);
    expect(errorDb).toBeLessThan(0.3);
    // The median of the same bins lies on an emission, 40 dB up: the case needs the low percentile.
    const sorted = welchOf(iq, 1024, fs).densityPerHz.slice().sort();
    expect(10 * Math.log10((sorted[512] as number) / (variance / fs))).toBeGreaterThan(30);
  });

  it("refuses a percentile outside (0, 1)", () => {
    const psd = welchOf(new Float32Array(2 * 512), 256, 1);
    expect(() => noiseFloor(psd, { percentile: 1 })).toThrow(/percentile 1/);
  });
});
