import { describe, expect, it } from "vitest";
import { noiseFloor, rootRaisedCosineTaps } from "../../src/dsp/index.js";
import { analogFeatures, classifyAnalog, classifyEmission, digitalFeatures, occupiedBandwidth, symbolRateBlind } from "../../src/measure/index.js";
import { complexNoise, ookFromBits, qpskSymbols, SeededRandom } from "../../src/scenario/index.js";
import { psdOf } from "./emissionStimuli.js";
import { link } from "./linkStimuli.js";

describe("symbolRateBlind(iq, fs, options)", () => {
  for (const sps of [8, 4.37]) {
    it(`recovers the rate within 0.1 % at ${sps} samples per symbol (squared envelope, α = 0.35)`, () => {
      const rs = 1234.5;
      const l = link({ kind: "16qam", samplesPerSymbol: sps, esN0Db: 20, symbolCount: 8000, symbolRateBd: rs });
      const r = symbolRateBlind(l.iq, l.sampleRateHz);
      expect(r.value).not.toBeNull();
      expect(Math.abs((r.value as number) / rs - 1)).toBeLessThan(1e-3);
      expect(r.unit).toBe("Bd");
    });
  }

  it("narrows to a hint and finds the same line; the stated uncertainty covers the error", () => {
    const l = link({ kind: "qpsk", samplesPerSymbol: 5, esN0Db: 15, symbolCount: 10000, symbolRateBd: 2000 });
    const r = symbolRateBlind(l.iq, l.sampleRateHz, { hintBd: 1950 });
    expect(Math.abs((r.value as number) - 2000)).toBeLessThan(2 * (r.uncertainty as number) + 1e-3);
  });

  it("with the envelope feature recovers the bit rate of on-off keying within 0.1 %, not a harmonic", () => {
    // Hard-keyed OOK: the transition feature is an impulse train with equal lines at k·Rb
    // (common practice: the spectrum of a randomly gated periodic impulse train).
    const fs = 48000;
    const rb = 1200;
    const rng = new SeededRandom(4);
    const bits = Array.from({ length: 2000 }, () => rng.integer(2));
    const n = Math.floor((2000 * fs) / rb);
    const iq = Float64Array.from(ookFromBits(bits, rb, fs, 0, n, 0.1 / rb));
    const noise = new Float64Array(iq.length);
    complexNoise(new SeededRandom(5), noise, 1e-3);
    for (let k = 0; k < iq.length; k++) iq[k] = (iq[k] as number) + (noise[k] as number);
    const r = symbolRateBlind(iq, fs, { feature: "envelope", maxBd: 5000 });
    expect(Math.abs((r.value as number) / rb - 1)).toBeLessThan(1e-3);
  });

  for (const seed of [4, 6, 7]) {
    it(`with the frequency feature recovers the rate of Gaussian-filtered 2-FSK (BT 0.5, h 0.6), not a sub-multiple (seed ${seed})`, () => {
      // GMSK-like frequency pulse: NRZ through a Gaussian filter of 3 dB bandwidth B = BT/T,
      // σ = sqrt(ln 2)/(2π·BT)·T (Murota & Hirade 1981, from memory). Its smooth transitions give
      // the transition feature a continuous spectrum that falls with frequency: a sub-multiple of
      // the rate must stand clear of the background at its own frequency, not at Rs's.
      const fs = 20_000;
      const rb = 1500;
      const sps = fs / rb;
      const n = 10_000; // 0.5 s, 750 symbols
      const rng = new SeededRandom(seed);
      const symbols = Array.from({ length: Math.ceil(n / sps) + 2 }, () => 2 * rng.integer(2) - 1);
      const nrz = Float64Array.from({ length: n }, (_, i) => symbols[Math.floor(i / sps)] as number);
      const sigma = (Math.sqrt(Math.LN2) / (2 * Math.PI * 0.5)) * sps;
      const half = Math.ceil(4 * sigma);
      const kernel = Float64Array.from({ length: 2 * half + 1 }, (_, k) => Math.exp(-((k - half) ** 2) / (2 * sigma * sigma)));
      const ksum = kernel.reduce((a, b) => a + b, 0);
      const deviationHz = (0.6 * rb) / 2; // h = 2D/Rb = 0.6
      const iq = new Float64Array(2 * n);
      let phase = rng.uniform() * 2 * Math.PI;
      for (let i = 0; i < n; i++) {
        let f = 0;
        for (let k = -half; k <= half; k++) f += (kernel[k + half] as number) * (nrz[Math.min(n - 1, Math.max(0, i - k))] as number);
        phase += (2 * Math.PI * deviationHz * (f / ksum)) / fs;
        iq[2 * i] = Math.cos(phase);
        iq[2 * i + 1] = Math.sin(phase);
      }
      const noise = new Float64Array(2 * n);
      complexNoise(new SeededRandom(seed + 1), noise, 1e-3 * (fs / (2 * rb))); // 30 dB in 2·Rb
      for (let k = 0; k < iq.length; k++) iq[k] = (iq[k] as number) + (noise[k] as number);
      // Through digitalFeatures, which band-limits the record to 1.2 × its 99 % band first (the
      // transition feature of the whole band is the noise's), and on to the class.
      const psd = psdOf(iq, 2048, fs);
      const rate = digitalFeatures(iq, fs, psd).frequency?.symbolRateBd ?? null;
      // Within 0.5 %: the Rife–Boorstyn refinement of a line over 750 symbols is far closer; a
      // sub-multiple would be 50 % or 67 % off.
      expect(rate).not.toBeNull();
      expect(Math.abs((rate as number) / rb - 1)).toBeLessThan(5e-3);
      const analog = classifyAnalog(analogFeatures(iq, fs, psd));
      const c = classifyEmission(iq, fs, psd, { snrDb: 30, analog });
      expect([c.class, c.order]).toEqual(["fsk", 2]);
    });
  }

  it("is null with a reason for white noise (no cyclostationary line)", () => {
    const iq = new Float64Array(2 * 65536);
    complexNoise(new SeededRandom(3), iq, 1);
    const r = symbolRateBlind(iq, 8000);
    expect(r.value).toBeNull();
    expect(r.warnings[0]).toMatch(/no line/);
  });

  it("throws RangeError for a bad rate or range", () => {
    const iq = new Float64Array(2048);
    expect(() => symbolRateBlind(iq, 0)).toThrow(RangeError);
    expect(() => symbolRateBlind(iq, 8000, { minBd: 3000, maxBd: 2000 })).toThrow(RangeError);
  });
});

describe("rootRaisedCosineTaps as the transmit filter", () => {
  it("RRC-shaped QPSK (α = 0.35, 8 samples/symbol) has 99 % bandwidth 1.1667·Rs (REFERENCES §3, from the RC spectrum)", () => {
    const rs = 1000;
    const sps = 8;
    const fs = rs * sps;
    const count = 100_000;
    const syms = qpskSymbols(new SeededRandom(9), count);
    const h = rootRaisedCosineTaps(sps, 0.35, 24);
    const half = (h.length - 1) / 2;
    const n = count * sps;
    const iq = new Float64Array(2 * n);
    // x[n] = Σ_k s_k·h[n − k·sps + half]: impulses every sps samples through the filter.
    for (let k = 0; k < count; k++) {
      const c = k * sps;
      for (let m = 0; m < h.length; m++) {
        const j = c + m - half;
        if (j < 0 || j >= n) continue;
        iq[2 * j] = (iq[2 * j] as number) + (syms[2 * k] as number) * (h[m] as number);
        iq[2 * j + 1] = (iq[2 * j + 1] as number) + (syms[2 * k + 1] as number) * (h[m] as number);
      }
    }
    const noise = new Float64Array(iq.length);
    complexNoise(new SeededRandom(10), noise, 1e-5);
    for (let k = 0; k < iq.length; k++) iq[k] = (iq[k] as number) + (noise[k] as number);
    const psd = psdOf(iq, 2048, fs);
    const r = occupiedBandwidth(psd, { lowerHz: -fs / 2, upperHz: fs / 2, noiseFloorPerHz: noiseFloor(psd).densityPerHz });
    // REFERENCES §3: ±1 % with ≥ 1e5 symbols, plus one RBW for the window's smearing.
    expect(Math.abs((r.occupiedHz.value as number) - 1.1667 * rs)).toBeLessThan(0.01 * 1.1667 * rs + psd.enbwHz);
  });
});
