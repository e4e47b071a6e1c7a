import { describe, expect, it } from "vitest";
import { rootRaisedCosine, rootRaisedCosineTaps } from "../../src/dsp/index.js";

// Closed forms (Proakis, Digital Communications, square-root raised cosine; REFERENCES.md §7):
//   g(0) = 1 − α + 4α/π; α = 0.35 → 0.65 + 1.4/π, a hand evaluation.
const RRC_G0_ALPHA035_CLOSED_FORM = 0.65 + 1.4 / Math.PI;
// Raised cosine (REFERENCES §7, Nyquist criterion): h(x) = sinc(x)·cos(παx)/(1 − (2αx)²),
// zero at every x = k ≠ 0; at x = 1/2, α = 0.35: (2/π)·cos(0.175π)/(1 − 0.1225).
const RC_HALF_ALPHA035_CLOSED_FORM = ((2 / Math.PI) * Math.cos(0.175 * Math.PI)) / (1 - 0.1225);

/** (g ⋆ g)(x) = ∫ g(u)·g(x − u) du by the midpoint rule, h = 1/512, over ±40 symbols. */
function autocorrelation(x: number, alpha: number): number {
  const h = 1 / 512;
  let s = 0;
  for (let u = -40 + h / 2; u < 40; u += h) s += rootRaisedCosine(u, alpha) * rootRaisedCosine(x - u, alpha);
  return s * h;
}

describe("rootRaisedCosine(x, rollOff)", () => {
  it("has g(0) = 1 − α + 4α/π (closed form)", () => {
    expect(rootRaisedCosine(0, 0.35)).toBeCloseTo(RRC_G0_ALPHA035_CLOSED_FORM, 12);
  });

  it("g ⋆ g is the raised cosine: 1 at 0, 0 at x = 1, 2, the RC value at x = ½ (Proakis)", () => {
    // The tails decay as 1/x², so truncation at ±40 leaves ~1e-4.
    expect(autocorrelation(0, 0.35)).toBeCloseTo(1, 3);
    expect(Math.abs(autocorrelation(1, 0.35))).toBeLessThan(1e-3);
    expect(Math.abs(autocorrelation(2, 0.35))).toBeLessThan(1e-3);
    expect(autocorrelation(0.5, 0.35)).toBeCloseTo(RC_HALF_ALPHA035_CLOSED_FORM, 3);
  });
});

describe("rootRaisedCosineTaps(samplesPerSymbol, rollOff, spanSymbols)", () => {
  it("are unit-energy, symmetric, odd in length, for integer and non-integer samples per symbol", () => {
    for (const sps of [4, 8, 4.37]) {
      const h = rootRaisedCosineTaps(sps, 0.35, 12);
      expect(h.length % 2).toBe(1);
      expect(h.length).toBe(2 * Math.floor((12 * sps) / 2) + 1);
      let e = 0;
      for (const v of h) e += v * v;
      expect(e).toBeCloseTo(1, 12);
      for (let n = 0; n < h.length; n++) expect(h[n]).toBeCloseTo(h[h.length - 1 - n] as number, 14);
    }
  });

  it("cascaded with itself at 8 samples per symbol gives zero ISI at symbol spacing (Nyquist)", () => {
    const h = rootRaisedCosineTaps(8, 0.35, 16);
    const c = (m: number): number => {
      let s = 0;
      for (let n = 0; n < h.length; n++) {
        const k = n - m;
        if (k >= 0 && k < h.length) s += (h[n] as number) * (h[k] as number);
      }
      return s;
    };
    // Peak 1 (unit energy); symbol-spaced lags ±8, ±16 carry only the truncation residue.
    expect(c(0)).toBeCloseTo(1, 12);
    for (const m of [8, 16, 24]) expect(Math.abs(c(m))).toBeLessThan(3e-3);
  });

  it("throws RangeError for bad parameters", () => {
    expect(() => rootRaisedCosineTaps(1, 0.35, 8)).toThrow(RangeError);
    expect(() => rootRaisedCosineTaps(4, 0, 8)).toThrow(RangeError);
    expect(() => rootRaisedCosineTaps(4, 0.35, 1)).toThrow(RangeError);
  });
});
