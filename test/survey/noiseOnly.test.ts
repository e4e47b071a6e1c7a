// detectEmissions on noise alone, through the real pass 1: no emission at the default pfa, with a
// flat floor and with a sloped one (the expected count comes from the threshold's formula), and a
// weak emission on the slope found as it is.
import { describe, expect, it } from "vitest";
import { SeededRandom, complexNoise, frequencyShift, randomSymbols, rrcPsk } from "../../src/scenario/index.js";
import { DETECT_EMISSIONS_DEFAULTS, detectEmissions } from "../../src/survey/index.js";
import { addInto, pass1Of } from "./surveyCaptures.js";

const fs = 1e6;
const n = 1 << 16; // 256 KiB as ci16; 256-point frames in 16 rows of K = 16: 4096 cells a capture
const noiseVariance = 1e-5;
const SEEDS = Array.from({ length: 20 }, (_, i) => 7300 + i);

/** y[n] = x[n] + j·a·x[n−1]: |H(ω)|² = 1 + a² + 2a·sin ω, a floor tilted from (1 − a)² to (1 + a)² (theory). */
function tilted(x: Float64Array, a: number): Float64Array {
  const y = Float64Array.from(x);
  for (let k = 2; k < x.length; k += 2) {
    y[k] = (y[k] as number) - a * (x[k - 1] as number);
    y[k + 1] = (y[k + 1] as number) + a * (x[k - 2] as number);
  }
  return y;
}

describe("detectEmissions(pass 1) of noise only, 20 seeds", () => {
  for (const [name, a] of [["flat", 0], ["sloped (−3.1 … +2.3 dB)", 0.3]] as const) {
    it(`finds no emission in ${name} noise at the default pfa 1e-6 (the expected count cells·pfa = 0.08 over all 20 captures)`, async () => {
      let found = 0;
      let expected = 0;
      for (const seed of SEEDS) {
        const x = new Float64Array(2 * n);
        complexNoise(new SeededRandom(seed), x, noiseVariance);
        const pass1 = await pass1Of(`noise_${a}_${seed}`, a === 0 ? x : tilted(x, a), fs, 256, 16);
        const d = detectEmissions(pass1);
        found += d.emissions.length;
        expected += d.expectedFalseSeeds;
      }
      // rowThreshold.ts: E[false seed cells] = cells·pfa, an upper bound on false regions;
      // 20 × 16 rows × 256 bins × 1e-6 = 0.082, so P(none) ≥ e^(−0.082) = 92 % (Poisson).
      expect(expected).toBeCloseTo(20 * 16 * 256 * DETECT_EMISSIONS_DEFAULTS.pfa, 12);
      expect(found).toBe(0);
    });
  }

  it("finds a 10 dB SNR QPSK on the slope, and only it: centre within max(1 bin, 2 %), 99 % bandwidth within 10 % (issue 9; 1.1667·Rs, REFERENCES.md §3)", async () => {
    const m = 1 << 18;
    const x = new Float64Array(2 * m);
    complexNoise(new SeededRandom(7401), x, noiseVariance);
    const y = tilted(x, 0.3);
    // Local floor at +100 kHz: (σ²/fs)·(1 + a² + 2a·sin ω), ω = 2π·0.1; the QPSK's power is 10× the floor over its 99 % band.
    const obwHz = 1.1667 * 50_000;
    const localPerHz = (noiseVariance / fs) * (1.09 + 0.6 * Math.sin(2 * Math.PI * 0.1));
    const symbols = randomSymbols(new SeededRandom(7402), "qpsk", Math.ceil((m / fs) * 50_000) + 16);
    const amplitude = Math.sqrt(10 * localPerHz * obwHz);
    addInto(y, frequencyShift(rrcPsk(symbols, 0, m, { symbolRateBd: 50_000, sampleRateHz: fs, rollOff: 0.35, amplitude }), fs, 100_000));
    const pass1 = await pass1Of("tilt_qpsk", y, fs, 1024, 32);
    const d = detectEmissions(pass1);
    expect(d.emissions.length, d.emissions.map((e) => `${Math.round(e.offsetHz)} Hz`).join(", ")).toBe(1);
    const e = d.emissions[0];
    expect(Math.abs((e?.offsetHz ?? 0) - 100_000)).toBeLessThanOrEqual(Math.max(pass1.spectrogram.binWidthHz, 0.02 * obwHz));
    expect(Math.abs((e?.bandwidthHz ?? 0) - obwHz)).toBeLessThanOrEqual(0.1 * obwHz);
  });

  it("follows the sloped floor 1 + a² + 2a·sin ω within 3 standard errors plus the stated bias (theory)", async () => {
    const x = new Float64Array(2 * n);
    complexNoise(new SeededRandom(7400), x, noiseVariance);
    const d = detectEmissions(await pass1Of("tilt_shape", tilted(x, 0.3), fs, 256, 16));
    const { sdRel, biasRel } = d.floor.error;
    for (const b of [40, 100, 128, 160, 220]) {
      const w = (2 * Math.PI * (b - 128)) / 256;
      const truth = (noiseVariance / fs) * (1 + 0.09 + 0.6 * Math.sin(w));
      const rel = (d.floor.floorPerHz[b] as number) / truth - 1;
      expect(Math.abs(rel - biasRel)).toBeLessThan(3 * sdRel + Math.abs(biasRel));
    }
  });
});
