import { describe, expect, it } from "vitest";
import { fftPlan, isFftSize, naturalBinIndex, toCentredOrder, transformInPlace } from "../../src/dsp/index.js";
import { SeededRandom } from "../../src/scenario/index.js";

/** The DFT from its definition, X[k] = Σ x[n]·e^(−j2πkn/N) (Oppenheim & Schafer eq. 8.11), O(N²). */
function directDft(x: number[]): number[] {
  const n = x.length / 2;
  const out = new Array<number>(2 * n).fill(0);
  for (let k = 0; k < n; k++) {
    let re = 0;
    let im = 0;
    for (let t = 0; t < n; t++) {
      const a = (-2 * Math.PI * k * t) / n;
      const c = Math.cos(a);
      const s = Math.sin(a);
      re += (x[2 * t] as number) * c - (x[2 * t + 1] as number) * s;
      im += (x[2 * t] as number) * s + (x[2 * t + 1] as number) * c;
    }
    out[2 * k] = re;
    out[2 * k + 1] = im;
  }
  return out;
}

describe("fftPlan(size)", () => {
  it("forward agrees with the direct DFT definition (unscaled, e^(−j2πkn/N))", () => {
    const plan = fftPlan(64);
    const rng = new SeededRandom(1);
    const x = plan.createBuffer();
    for (let i = 0; i < x.length; i++) x[i] = rng.gaussian();
    const out = plan.createBuffer();
    plan.forward(out, x);
    const ref = directDft(x);
    for (let i = 0; i < out.length; i++) expect(out[i]).toBeCloseTo(ref[i] as number, 9);
  });

  it("a complex exponential at bin −3 lands in the upper half, at natural bin N − 3, with value N", () => {
    const n = 32;
    const plan = fftPlan(n);
    const x = plan.createBuffer();
    for (let t = 0; t < n; t++) {
      x[2 * t] = Math.cos((-2 * Math.PI * 3 * t) / n);
      x[2 * t + 1] = Math.sin((-2 * Math.PI * 3 * t) / n);
    }
    const out = plan.createBuffer();
    plan.forward(out, x);
    // DFT of e^(j2πk0 n/N) is N·δ[k − k0 mod N] (closed form).
    expect(out[2 * (n - 3)]).toBeCloseTo(n, 10);
    expect(out[2 * 3]).toBeCloseTo(0, 10);
  });

  it("inverse is scaled by 1/N, so inverse(forward(x)) = x", () => {
    const plan = fftPlan(128);
    const rng = new SeededRandom(2);
    const x = plan.createBuffer();
    for (let i = 0; i < x.length; i++) x[i] = rng.gaussian();
    const y = plan.createBuffer();
    const back = plan.createBuffer();
    plan.forward(y, x);
    plan.inverse(back, y);
    for (let i = 0; i < x.length; i++) expect(back[i]).toBeCloseTo(x[i] as number, 12);
  });

  it("caches one plan per size and refuses sizes that are not powers of two", () => {
    expect(fftPlan(256)).toBe(fftPlan(256));
    expect(isFftSize(1000)).toBe(false);
    expect(() => fftPlan(1000)).toThrow(/fftLength 1000 is not a power of two/);
    expect(() => fftPlan(1)).toThrow(RangeError);
  });
});

describe("transformInPlace(x, direction)", () => {
  it("forward agrees with the direct DFT definition at sizes below and above its short-stage span", () => {
    const rng = new SeededRandom(2);
    for (const n of [2, 8, 4096]) {
      const x = new Array<number>(2 * n);
      for (let i = 0; i < x.length; i++) x[i] = rng.gaussian();
      const ref = directDft(x);
      const y = Float64Array.from(x);
      transformInPlace(y);
      // Rounding of an N-point sum of unit-variance terms: far below 1e-9 of the √N scale.
      let worst = 0;
      for (let i = 0; i < y.length; i++) worst = Math.max(worst, Math.abs((y[i] as number) - (ref[i] as number)));
      expect(worst / Math.sqrt(n)).toBeLessThan(1e-9);
    }
  });

  it("a complex exponential at bin −5 of 2^17 points lands at natural bin N − 5 with value N, all else 0 (DFT orthogonality)", () => {
    const n = 1 << 17;
    const x = new Float64Array(2 * n);
    for (let t = 0; t < n; t++) {
      x[2 * t] = Math.cos((2 * Math.PI * -5 * t) / n);
      x[2 * t + 1] = Math.sin((2 * Math.PI * -5 * t) / n);
    }
    transformInPlace(x);
    expect(x[2 * (n - 5)]).toBeCloseTo(n, 6);
    expect(x[2 * (n - 5) + 1]).toBeCloseTo(0, 6);
    let rest = 0;
    for (let k = 0; k < n; k++) if (k !== n - 5) rest = Math.max(rest, Math.hypot(x[2 * k] as number, x[2 * k + 1] as number));
    expect(rest / n).toBeLessThan(1e-12);
  });

  it("inverse is scaled by 1/N, so inverse(forward(x)) = x; sizes that are not powers of two are refused", () => {
    const rng = new SeededRandom(3);
    const x = new Float64Array(2 * 2048);
    for (let i = 0; i < x.length; i++) x[i] = rng.gaussian();
    const y = x.slice();
    transformInPlace(y);
    transformInPlace(y, "inverse");
    for (let i = 0; i < x.length; i++) expect(y[i]).toBeCloseTo(x[i] as number, 12);
    expect(() => transformInPlace(new Float64Array(12))).toThrow(RangeError);
    expect(() => transformInPlace(new Float64Array(2))).toThrow(RangeError);
  });
});

describe("toCentredOrder(natural)", () => {
  it("puts the most negative frequency first and DC at index N/2", () => {
    // Natural order for N = 8: bins 0..7 are frequencies 0,1,2,3,−4,−3,−2,−1 (× fs/N).
    const natural = Float64Array.from([0, 1, 2, 3, -4, -3, -2, -1]);
    expect(Array.from(toCentredOrder(natural))).toEqual([-4, -3, -2, -1, 0, 1, 2, 3]);
    expect(Array.from(toCentredOrder(natural, 2))).toEqual([-8, -6, -4, -2, 0, 2, 4, 6]);
    for (let i = 0; i < 8; i++) expect(natural[naturalBinIndex(i, 8)]).toBe(i - 4);
  });
});
