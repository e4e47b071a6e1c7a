// detectEmissions on noise alone, through the real pass 1: no emission at the default pfa, with a
// flat floor and with a sloped one. The expected count comes from the threshold's formula.
import { describe, expect, it } from "vitest";
import { SeededRandom, complexNoise } from "../../src/scenario/index.js";
import { DETECT_EMISSIONS_DEFAULTS, detectEmissions } from "../../src/survey/index.js";
import { pass1Of } from "./surveyCaptures.js";

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
