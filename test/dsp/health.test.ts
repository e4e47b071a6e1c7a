import { describe, expect, it } from "vitest";
import {
  DB_CEILING, DB_FLOOR, HealthAccumulator, imageRejectionRatioDb, WelchAccumulator, type HealthFigures,
} from "../../src/dsp/index.js";
import { complexNoise, SeededRandom } from "../../src/scenario/index.js";
import { complexTone, pushBlocks, randomPartition } from "./blocks.js";

const DEG = Math.PI / 180;

function healthOf(iq: Float32Array): HealthFigures {
  const acc = new HealthAccumulator();
  acc.push(iq, 0);
  return acc.finish();
}

/** Applies the imbalance model I' = I, Q' = g·(Q·cos φ + I·sin φ) in place (health.ts). */
function imbalance(iq: Float32Array, g: number, phaseRad: number): void {
  for (let j = 0; j < iq.length; j += 2) {
    const i = iq[j] as number;
    const q = iq[j + 1] as number;
    iq[j + 1] = g * (q * Math.cos(phaseRad) + i * Math.sin(phaseRad));
  }
}

describe("imageRejectionRatioDb(g, φ)", () => {
  it("reduces to the closed-form special cases of (1 + 2g cos φ + g²)/(1 − 2g cos φ + g²) (Razavi, RF Microelectronics)", () => {
    // g = 1: IRR = (1 + cos φ)/(1 − cos φ) = cot²(φ/2); 1° → 20·log10(cot 0.5°) = 41.18 dB.
    expect(imageRejectionRatioDb(1, 1 * DEG)).toBeCloseTo(41.1828, 3);
    // φ = 0: IRR = ((1 + g)/(1 − g))²; 0.1 dB of gain error → 44.80 dB.
    expect(imageRejectionRatioDb(10 ** (0.1 / 20), 0)).toBeCloseTo(44.797, 3);
    // g = 1.1, φ = 3°: (1 + 2.2·cos 3° + 1.21)/(1 − 2.2·cos 3° + 1.21) = 25.297 dB (hand computation).
    expect(imageRejectionRatioDb(1.1, 3 * DEG)).toBeCloseTo(25.297, 3);
    // One branch dead (g = 0): wanted and image equal, 0 dB; perfect balance: capped, finite.
    expect(imageRejectionRatioDb(0, 0)).toBe(0);
    expect(imageRejectionRatioDb(1, 0)).toBe(DB_CEILING);
  });
});

describe("HealthAccumulator", () => {
  it("DC offset 0.1 + 0.05j over noise of variance 0.01: −19.03 dBFS DC, −16.48 dBFS mean power (definitions)", () => {
    const n = 100_000;
    const iq = new Float32Array(2 * n);
    complexNoise(new SeededRandom(1), iq, 0.01);
    for (let j = 0; j < iq.length; j += 2) {
      iq[j] = (iq[j] as number) + 0.1;
      iq[j + 1] = (iq[j + 1] as number) + 0.05;
    }
    const h = healthOf(iq);
    expect(h.samples).toBe(n);
    // 10·log10(0.1² + 0.05²) and 10·log10(0.0125 + 0.01). The sample mean of each component has
    // σ = √(0.005/n) = 2.2e-4, i.e. ≤ 0.02 dB on the DC power; 0.05 dB allows 2.5σ.
    expect(Math.abs(h.dcOffsetDbfs - -19.0309)).toBeLessThan(0.05);
    expect(Math.abs(h.meanPowerDbfs - -16.4782)).toBeLessThan(0.05);
    // Circular noise: no imbalance beyond sampling spread (σ ≈ 2/√n in ratio, 0.03 dB; 1/√n in sin φ, 0.18°).
    expect(Math.abs(h.iqGainImbalanceDb)).toBeLessThan(0.1);
    expect(Math.abs(h.iqPhaseImbalanceDeg)).toBeLessThan(0.6);
  });

  it("a full-scale complex tone is 0 dBFS mean power (interface.md convention) with no DC", () => {
    const h = healthOf(complexTone(4096, 1, 100, 4096));
    expect(h.meanPowerDbfs).toBeCloseTo(0, 6);
    expect(h.dcOffsetDbfs).toBeLessThan(-100);
  });

  it("recovers a gain imbalance of 1.1 (0.828 dB, Q over I) and a phase imbalance of 3° injected into circular noise", () => {
    const n = 1 << 18;
    const iq = new Float32Array(2 * n);
    complexNoise(new SeededRandom(2), iq, 0.1);
    imbalance(iq, 1.1, 3 * DEG);
    const h = healthOf(iq);
    // Sampling spread for n = 2^18 Gaussian samples: var-ratio σ = 2/√n = 0.004 → 0.017 dB;
    // correlation σ = (1 − ρ²)/√n = 0.002 → 0.11°. Tolerances are 5σ.
    expect(Math.abs(h.iqGainImbalanceDb - 20 * Math.log10(1.1))).toBeLessThan(0.09);
    expect(Math.abs(h.iqPhaseImbalanceDeg - 3)).toBeLessThan(0.6);
    // IRR of g = 1.1, φ = 3° is 25.30 dB (hand computation above); the spread of g and φ moves it
    // by σ ≈ 0.3 dB at this point (d(denominator) from δg, δφ), so 1.5 dB is 5σ.
    expect(Math.abs(h.imageRejectionDb - 25.297)).toBeLessThan(1.5);
  });

  it("the image rejection of an imbalanced tone equals the image measured in the PSD (independent check)", () => {
    // Tone cos ωt + j·g·sin(ωt + φ) with g = 0.95, φ = −2°, on bin +100 of 4096: the wanted line
    // is ½(1 + g e^(jφ)), the image at bin −100 is ½(1 − g e^(−jφ)); the Blackman-Harris PSD
    // of an on-bin line is exact, so the two power ratios must agree to float32 rounding.
    const fs = 4096;
    const iq = complexTone(4096 * 16, 1, 100, fs);
    imbalance(iq, 0.95, -2 * DEG);
    const h = healthOf(iq);
    expect(h.iqGainImbalanceDb).toBeCloseTo(20 * Math.log10(0.95), 4);
    expect(h.iqPhaseImbalanceDeg).toBeCloseTo(-2, 3);
    const welch = new WelchAccumulator({ fftLength: 4096, window: "blackman-harris", sampleRateHz: fs });
    welch.push(iq, 0);
    const psd = welch.finish();
    const measuredDb = 10 * Math.log10((psd.densityPerHz[2048 + 100] as number) / (psd.densityPerHz[2048 - 100] as number));
    expect(Math.abs(h.imageRejectionDb - measuredDb)).toBeLessThan(0.001);
    expect(measuredDb).toBeCloseTo(30.1676, 2); // formula value for g = 0.95, φ = −2°
  });

  it("clipping percent counts components over 2 per complex sample; non-finite samples are summed", () => {
    const acc = new HealthAccumulator();
    acc.push(new Float32Array(2 * 1000), 0);
    acc.addDecodeCounts({ clippedComponents: 20, nonFiniteSamples: 1 });
    acc.addDecodeCounts({ clippedComponents: 10, nonFiniteSamples: 2 });
    const h = acc.finish();
    expect(h.clippingPercent).toBeCloseTo(1.5, 12); // 30 / 2000 components
    expect(h.nonFiniteSamples).toBe(3);
  });

  it("a real capture (Q = 0) and an empty one give finite figures", () => {
    const iq = new Float32Array(2 * 1000);
    complexNoise(new SeededRandom(3), iq, 1);
    for (let j = 1; j < iq.length; j += 2) iq[j] = 0;
    const real = healthOf(iq);
    expect(real.iqGainImbalanceDb).toBe(DB_FLOOR);
    expect(real.imageRejectionDb).toBe(0); // a real signal has its image at equal power
    const empty = new HealthAccumulator().finish();
    expect(Object.values(empty).every(Number.isFinite)).toBe(true);
    expect(empty.meanPowerDbfs).toBe(DB_FLOOR);
  });

  it("one block, random blocks with prefixes (prefix samples not counted), and two merged accumulators agree", () => {
    const total = 50_000;
    const iq = new Float32Array(2 * total);
    complexNoise(new SeededRandom(4), iq, 0.02);
    for (let j = 0; j < iq.length; j += 2) iq[j] = (iq[j] as number) + 0.3; // large DC
    imbalance(iq, 0.9, 5 * DEG);
    const ref = healthOf(iq);
    const parts = randomPartition(total, 4000, 5);
    const many = new HealthAccumulator();
    pushBlocks([many], iq, parts, 4096);
    const a = new HealthAccumulator();
    const b = new HealthAccumulator();
    pushBlocks([a, b], iq, parts, 4096);
    a.merge(structuredClone(b.snapshot()));
    for (const h of [many.finish(), a.finish()]) {
      expect(h.samples).toBe(total);
      expect(h.dcOffsetDbfs).toBeCloseTo(ref.dcOffsetDbfs, 9);
      expect(h.meanPowerDbfs).toBeCloseTo(ref.meanPowerDbfs, 9);
      expect(h.iqGainImbalanceDb).toBeCloseTo(ref.iqGainImbalanceDb, 9);
      expect(h.iqPhaseImbalanceDeg).toBeCloseTo(ref.iqPhaseImbalanceDeg, 9);
      expect(h.imageRejectionDb).toBeCloseTo(ref.imageRejectionDb, 9);
    }
  });
});
