import { describe, expect, it } from "vitest";
import { besselJ, besselJZeros } from "../../src/measure/index.js";

// J0..J3 at x = 0.5, 1, 2, 5: Abramowitz & Stegun Table 9.1, as listed in REFERENCES.md §1 (the
// β = 0.5 row beyond J0 is marked C there: computed from the definition in double precision).
const AS_TABLE_9_1: readonly (readonly [number, readonly number[]])[] = [
  [0.5, [0.9384698072, 0.2422684577, 0.0306040235, 0.00256373]],
  [1, [0.7651976866, 0.4400505857, 0.1149034849, 0.019563354]],
  [2, [0.2238907791, 0.5767248078, 0.3528340286, 0.1289432495]],
  [5, [-0.1775967713, -0.3275791376, 0.0465651163, 0.3648312306]],
];

// Zeros of J0 and J1: A&S Table 9.5 (also DLMF §10.21), REFERENCES.md §1, status V.
const J0_ZEROS_AS_TABLE_9_5 = [2.404825558, 5.52007811, 8.653727913, 11.79153444];
const J1_ZEROS_AS_TABLE_9_5 = [3.83170597, 7.01558667, 10.17346814, 13.32369194];

describe("besselJ(n, x)", () => {
  it.each(AS_TABLE_9_1)("at x = %d matches A&S Table 9.1 for n = 0..3 within 1e-9", (x, row) => {
    // The table prints 10 decimals; 1e-9 is its last-digit rounding with margin.
    row.forEach((value, n) => expect(Math.abs(besselJ(n, x) - value)).toBeLessThan(1e-9));
  });

  it("is 0 at the tabulated first zero of J0 (A&S Table 9.5, 9 decimals: |J0| ≤ |J1|·5e-10)", () => {
    expect(Math.abs(besselJ(0, 2.404825558))).toBeLessThan(1e-9);
  });

  it("satisfies Σ J_n(x)² over n = −∞..∞ = 1 at x = 20 (A&S 9.1.76), with J_{−n}² = J_n²", () => {
    // An identity check at the top of the stated range, where the recurrence starts highest.
    let s = besselJ(0, 20) ** 2;
    for (let n = 1; n < 80; n++) s += 2 * besselJ(n, 20) ** 2;
    expect(Math.abs(s - 1)).toBeLessThan(1e-12);
  });

  it("agrees with the power series at x = 1 across the method switch (A&S 9.1.10 vs 9.1.27)", () => {
    // Just above 1 the Miller path runs, just below it the series; J is continuous.
    for (let n = 0; n <= 6; n++) {
      expect(Math.abs(besselJ(n, 1 - 1e-12) - besselJ(n, 1 + 1e-12))).toBeLessThan(1e-11);
    }
  });

  it("is odd/even in x by order: J_n(−x) = (−1)^n J_n(x) (A&S 9.1.5)", () => {
    expect(besselJ(1, -2)).toBeCloseTo(-0.5767248078, 9);
    expect(besselJ(2, -2)).toBeCloseTo(0.3528340286, 9);
  });

  it("throws RangeError for a non-integer or negative order", () => {
    expect(() => besselJ(1.5, 1)).toThrow(RangeError);
    expect(() => besselJ(-1, 1)).toThrow(RangeError);
  });
});

describe("besselJZeros(order, count)", () => {
  it("gives the first four zeros of J0 and J1 of A&S Table 9.5 within 1e-8", () => {
    // The table prints 9–10 significant digits; 1e-8 is the tolerance REFERENCES.md §1 gives.
    const z0 = besselJZeros(0, 4);
    const z1 = besselJZeros(1, 4);
    J0_ZEROS_AS_TABLE_9_5.forEach((z, k) => expect(Math.abs((z0[k] as number) - z)).toBeLessThan(1e-8));
    J1_ZEROS_AS_TABLE_9_5.forEach((z, k) => expect(Math.abs((z1[k] as number) - z)).toBeLessThan(1e-8));
  });
});
