import { describe, expect, it } from "vitest";
import { besselI0, designLowpass, firResponse, kaiserBeta, kaiserTapCount } from "../../src/dsp/index.js";

/** I0(x) = (1/π)∫₀^π e^(x·cosθ) dθ (Abramowitz & Stegun 9.6.19), midpoint rule: independent of the series. */
function besselI0ByIntegral(x: number): number {
  const n = 4000;
  let s = 0;
  for (let i = 0; i < n; i++) s += Math.exp(x * Math.cos((Math.PI * (i + 0.5)) / n));
  return s / n;
}

/** |Σ h[n]·e^(−j2πfn)| evaluated directly with cos/sin per tap (f in cycles/sample). */
function directResponse(h: Float64Array, f: number): number {
  let re = 0;
  let im = 0;
  for (let n = 0; n < h.length; n++) {
    re += (h[n] as number) * Math.cos(2 * Math.PI * f * n);
    im -= (h[n] as number) * Math.sin(2 * Math.PI * f * n);
  }
  return Math.hypot(re, im);
}

describe("besselI0(x)", () => {
  it("agrees with the integral representation (A&S 9.6.19) to 1e-12 relative", () => {
    // The midpoint rule on a smooth periodic integrand converges geometrically: 4000 points are exact to rounding.
    for (const x of [0, 0.5, 1, 3, 5.653, 7.857, 12]) {
      expect(Math.abs(besselI0(x) / besselI0ByIntegral(x) - 1)).toBeLessThan(1e-12);
    }
  });
  it("I0(1) = 1.266065878 (A&S Table 9.8, value from memory)", () => {
    expect(besselI0(1)).toBeCloseTo(1.266065878, 9);
  });
});

describe("kaiserBeta(A) and kaiserTapCount(A, Δf, fs)", () => {
  it("β follows Kaiser's three-piece formula (Kaiser 1974; Oppenheim & Schafer eq. 7.62)", () => {
    expect(kaiserBeta(80)).toBeCloseTo(0.1102 * (80 - 8.7), 12);
    expect(kaiserBeta(30)).toBeCloseTo(0.5842 * Math.pow(9, 0.4) + 0.07886 * 9, 12);
    expect(kaiserBeta(20)).toBe(0);
  });
  it("the worked example of Oppenheim & Schafer §7.6.1: δ = 0.001 (A = 60), Δω = 0.2π gives β = 5.653, M = 37 (from memory)", () => {
    expect(kaiserBeta(60)).toBeCloseTo(5.653, 3);
    // M = 37 rounded up to the even order 38: 39 taps.
    expect(kaiserTapCount(60, 0.1, 1)).toBe(39);
  });
});

describe("designLowpass(spec) meets its spec (Kaiser 1974 window design)", () => {
  const specs = [
    { cutoffHz: 12_500, transitionHz: 41_667, stopbandDb: 80, sampleRateHz: 400_000 },
    { cutoffHz: 12_500, transitionHz: 333_333, stopbandDb: 80, sampleRateHz: 2_400_000 },
    { cutoffHz: 1000, transitionHz: 500, stopbandDb: 60, sampleRateHz: 48_000 },
    { cutoffHz: 0.05, transitionHz: 0.01, stopbandDb: 30, sampleRateHz: 1 },
    { cutoffHz: 0.2, transitionHz: 0.1, stopbandDb: 100, sampleRateHz: 1 },
  ];
  for (const spec of specs) {
    it(`A = ${spec.stopbandDb} dB, Δf/fs = ${(spec.transitionHz / spec.sampleRateHz).toPrecision(3)}`, () => {
      const h = designLowpass(spec);
      const L = h.length;
      const fs = spec.sampleRateHz;
      const delta = Math.pow(10, -spec.stopbandDb / 20);
      // Odd, symmetric (linear phase), at least Kaiser's estimate long.
      expect(L % 2).toBe(1);
      for (let n = 0; n < L; n++) expect(h[n]).toBe(h[L - 1 - n]);
      expect(L).toBeGreaterThanOrEqual(kaiserTapCount(spec.stopbandDb, spec.transitionHz, fs));
      // Unity DC gain: Σh = 1 to rounding.
      expect(Math.abs(h.reduce((a, b) => a + b, 0) - 1)).toBeLessThan(1e-12);
      // Stopband: the spec's A, on a grid of 32 points per 1/L (twice the design's own grid), computed directly.
      const stopEdge = (spec.cutoffHz + spec.transitionHz) / fs;
      const points = Math.ceil((0.5 - stopEdge) * L * 32);
      let peak = 0;
      for (let i = 0; i <= points; i++) peak = Math.max(peak, directResponse(h, stopEdge + ((0.5 - stopEdge) * i) / points));
      expect(20 * Math.log10(peak)).toBeLessThanOrEqual(-spec.stopbandDb);
      // Passband: window designs have about the same deviation δ in both bands (Oppenheim & Schafer
      // §7.6.1); scaling to unity DC can move the whole band by up to δ, hence the bound 1 ± 2δ.
      let worst = 0;
      for (let i = 0; i <= 400; i++) worst = Math.max(worst, Math.abs(directResponse(h, (spec.cutoffHz / fs) * (i / 400)) - 1));
      expect(worst).toBeLessThanOrEqual(2 * delta);
    });
  }

  it("firResponse(taps, f, fs) equals the direct DTFT at any frequency, negative too", () => {
    const h = designLowpass({ cutoffHz: 1000, transitionHz: 500, stopbandDb: 60, sampleRateHz: 48_000 });
    for (const f of [0, 300, 1000, -1200, 1500, 7000, -23_999]) {
      expect(Math.abs(firResponse(h, f, 48_000) - directResponse(h, f / 48_000))).toBeLessThan(1e-12);
    }
  });

  it("rejects bad parameters with a RangeError naming the parameter", () => {
    const ok = { cutoffHz: 1000, transitionHz: 500, stopbandDb: 60, sampleRateHz: 48_000 };
    expect(() => designLowpass({ ...ok, cutoffHz: 0 })).toThrow(/cutoffHz 0/);
    expect(() => designLowpass({ ...ok, transitionHz: -1 })).toThrow(/transitionHz -1/);
    expect(() => designLowpass({ ...ok, stopbandDb: Number.NaN })).toThrow(RangeError);
    expect(() => designLowpass({ ...ok, cutoffHz: 23_800 })).toThrow(/exceeds half the sample rate/);
  });
});
