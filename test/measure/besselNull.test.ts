import { describe, expect, it } from "vitest";
import { besselNullIndex, fmFigures, toneFmLineLevelsDb } from "../../src/measure/index.js";
import { fmFromAudio, frequencyShift, toneAudio } from "../../src/scenario/index.js";

const FS = 62_500;
const FM_HZ = 1000;

// J0..J3 at β = 0.5, 1, 2, 5: A&S Table 9.1 via REFERENCES.md §1.
const AS_TABLE_9_1: readonly (readonly [number, readonly number[]])[] = [
  [0.5, [0.9384698072, 0.2422684577, 0.0306040235, 0.00256373]],
  [1, [0.7651976866, 0.4400505857, 0.1149034849, 0.019563354]],
  [2, [0.2238907791, 0.5767248078, 0.3528340286, 0.1289432495]],
  [5, [-0.1775967713, -0.3275791376, 0.0465651163, 0.3648312306]],
];
// First zero of J0: A&S Table 9.5 (REFERENCES.md §1).
const J0_FIRST_ZERO_AS_TABLE_9_5 = 2.404825558;

function toneFm(beta: number, offsetHz = 0): Float32Array {
  const n = 2 * FS;
  return Float32Array.from(frequencyShift(fmFromAudio(toneAudio(0, n, FS, FM_HZ), FS, beta * FM_HZ).iq, FS, offsetHz));
}

describe("toneFmLineLevelsDb(iq, fs, fm, nMax)", () => {
  it.each(AS_TABLE_9_1)("of tone FM with β = %d gives 20·log10|J_n(β)| for |n| ≤ 3 within 0.2 dB", (beta, row) => {
    // Jacobi–Anger (A&S 9.1.41): line n has amplitude J_n(β), J_−n = (−1)^n J_n, Σ J_n² = 1, so
    // its level re the total is 20·log10|J_n|. ±0.2 dB is REFERENCES.md §1's tolerance; the
    // modulator's β is high by ω²/24 = 4e-4 (its contract), under 0.01 dB even for J3(0.5).
    const r = toneFmLineLevelsDb(toneFm(beta, 2500), FS, FM_HZ, 3);
    expect(Math.abs(r.carrierOffsetHz - 2500)).toBeLessThan(1);
    for (let n = -3; n <= 3; n++) {
      const expected = 20 * Math.log10(Math.abs(row[Math.abs(n)] as number));
      expect(Math.abs((r.levelsDb[n + 3] as number) - expected)).toBeLessThan(0.2);
    }
  });
});

describe("besselNullIndex(iq, fs, fm, measuredIndex)", () => {
  it("at β = 2.405 (carrier null) returns the first zero of J0, within 1 % of 2.405", () => {
    const iq = toneFm(J0_FIRST_ZERO_AS_TABLE_9_5);
    const measured = fmFigures(iq, FS).modulationIndex.value as number;
    const r = besselNullIndex(iq, FS, FM_HZ, measured);
    expect(Math.abs((r.value as number) - 2.405) / 2.405).toBeLessThan(0.01);
    // The residual carrier implies |Δβ| ≤ uncertainty, which must be small at a true null.
    expect(r.uncertainty as number).toBeLessThan(0.01);
  });

  it("picks the second zero (5.5201, A&S Table 9.5) when the measured index is near it", () => {
    const iq = toneFm(5.52007811);
    expect(besselNullIndex(iq, FS, FM_HZ, 5.4).value as number).toBeCloseTo(5.52007811, 6);
  });

  it("returns null with a reason away from a null (β = 2: carrier at 20·log10 J0(2) = −13 dB, A&S Table 9.1)", () => {
    const r = besselNullIndex(toneFm(2), FS, FM_HZ, 2);
    expect(r.value).toBeNull();
    expect(r.warnings[0]).toMatch(/not near a Bessel null/);
  });
});
