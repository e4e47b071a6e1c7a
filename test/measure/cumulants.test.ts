import { describe, expect, it } from "vitest";
import { complexAbs, normalisedCumulants } from "../../src/measure/index.js";
import { constellation, randomSymbols, SeededRandom, type ConstellationKind } from "../../src/scenario/index.js";
import { addNoise } from "./emissionStimuli.js";

// Swami & Sadler 2000, IEEE Trans. Commun. 48(3), Table I (values as published, 2–3 digits):
// normalised C40 and C42. 32QAM (cross) is not in that table; its values are computed by hand
// from the grid (closed form below).
const SWAMI_SADLER_TABLE_I: Record<ConstellationKind, { c40: number; c42: number }> = {
  bpsk: { c40: -2, c42: -2 },
  qpsk: { c40: 1, c42: -1 },
  "8psk": { c40: 0, c42: -1 },
  "16qam": { c40: -0.68, c42: -0.68 },
  "32qam": { c40: -0.19, c42: -0.69 },
  "64qam": { c40: -0.619, c42: -0.619 },
};

// Closed-form moments of the ideal constellations (uniform over the points), hand-computed:
// odd-integer square grid of side L: E|s|² = 2(L² − 1)/3 (REFERENCES.md §6: 10 for 16QAM, 42 for
// 64QAM); E[x⁴] over one axis (1/L)Σx⁴, E|s|⁴ = 2E[x⁴] + 2E[x²]², Re E[s⁴] = 2E[x⁴] − 6E[x²]².
// 16QAM: E[x²] = 5, E[x⁴] = 41 → E|s|⁴ = 132, E s⁴ = −68, so C42 = 132/100 − 2 = −0.68, C40 = −0.68.
// 64QAM: E[x²] = 21, E[x⁴] = 777 → E|s|⁴ = 2436, E s⁴ = −1092; C42 = 2436/1764 − 2 = −0.6190,
// C40 = −1092/1764 = −0.6190 (= −13/21).
// 32QAM cross (6×6 grid less the corners ±5±5): E|s|² = 20, E|s|⁴ = 524, E s⁴ = −76 →
// C42 = 524/400 − 2 = −0.69, C40 = −0.19.
const CLOSED_FORM: Record<ConstellationKind, { c40: number; c42: number }> = {
  bpsk: { c40: -2, c42: -2 }, // s = ±1: E s⁴ = 1, E s² = 1 → C40 = 1 − 3 = −2, C42 = 1 − 1 − 2 = −2
  qpsk: { c40: -1, c42: -1 }, // points e^(jπ(2k+1)/4): s⁴ = −1 → C40 = −1 (|C40| = 1), C42 = 1 − 2
  "8psk": { c40: 0, c42: -1 },
  "16qam": { c40: -0.68, c42: -0.68 },
  "32qam": { c40: -0.19, c42: -0.69 },
  "64qam": { c40: -13 / 21, c42: 2436 / 1764 - 2 },
};

describe("normalisedCumulants(iq)", () => {
  it("of each ideal constellation (all points once) equals the closed-form moments and Swami & Sadler Table I", () => {
    for (const kind of Object.keys(CLOSED_FORM) as ConstellationKind[]) {
      const c = normalisedCumulants(constellation(kind));
      expect(c.c42, kind).toBeCloseTo(CLOSED_FORM[kind].c42, 10);
      expect(c.c40.re, kind).toBeCloseTo(CLOSED_FORM[kind].c40, 10);
      expect(c.c40.im, kind).toBeCloseTo(0, 10);
      expect(c.c21, kind).toBeCloseTo(1, 10); // unit mean energy
      // Table I quotes magnitudes to 2–3 digits (QPSK's sign depends on the axes chosen).
      expect(Math.abs(complexAbs(c.c40) - Math.abs(SWAMI_SADLER_TABLE_I[kind].c40)), kind).toBeLessThan(0.0015);
      expect(Math.abs(c.c42 - SWAMI_SADLER_TABLE_I[kind].c42), kind).toBeLessThan(0.0015);
    }
    // C20: 1 for BPSK (real), 0 for the circular sets (Swami & Sadler Table I).
    expect(complexAbs(normalisedCumulants(constellation("bpsk")).c20)).toBeCloseTo(1, 12);
    expect(complexAbs(normalisedCumulants(constellation("16qam")).c20)).toBeCloseTo(0, 12);
  });

  it("is invariant in |C40| and C42 under a carrier phase rotation (C40 turns by 4θ)", () => {
    const pts = constellation("16qam");
    const th = 0.3;
    const r = new Float64Array(pts.length);
    for (let k = 0; k < pts.length; k += 2) {
      r[k] = (pts[k] as number) * Math.cos(th) - (pts[k + 1] as number) * Math.sin(th);
      r[k + 1] = (pts[k] as number) * Math.sin(th) + (pts[k + 1] as number) * Math.cos(th);
    }
    const c = normalisedCumulants(r);
    expect(c.c42).toBeCloseTo(-0.68, 10);
    // C40 = E[y⁴]/C21² picks up e^(j4θ): −0.68·(cos 4θ + j sin 4θ) (closed form above).
    expect(c.c40.re).toBeCloseTo(-0.68 * Math.cos(4 * th), 10);
    expect(c.c40.im).toBeCloseTo(-0.68 * Math.sin(4 * th), 10);
  });

  it("removes circular Gaussian noise of known power from C21 only (fourth-order cumulants of Gaussian noise are 0)", () => {
    const rng = new SeededRandom(7);
    const n = 1 << 17;
    const noise = 0.1; // SNR 10 dB
    const y = addNoise(randomSymbols(rng, "qpsk", n), noise, 8);
    const corrected = normalisedCumulants(y, { noisePower: noise });
    const raw = normalisedCumulants(y);
    // Tolerance 0.03: the sample C42 of 2^17 QPSK symbols with noise has a standard error of
    // about √(E|y|⁸)/√n ≈ 0.005 (common practice: 5σ).
    expect(Math.abs(corrected.c42 + 1)).toBeLessThan(0.03);
    expect(Math.abs(complexAbs(corrected.c40) - 1)).toBeLessThan(0.03);
    // Without the correction the normalisation is (S + N)²: C42 = −1·S²/(S + N)² = −1/1.21 (closed form).
    expect(Math.abs(raw.c42 + 1 / 1.21)).toBeLessThan(0.03);
  });

  it("rejects odd-length input and a negative noise power", () => {
    expect(() => normalisedCumulants(new Float64Array(3))).toThrow(RangeError);
    expect(() => normalisedCumulants(new Float64Array(4), { noisePower: -1 })).toThrow(RangeError);
  });
});
