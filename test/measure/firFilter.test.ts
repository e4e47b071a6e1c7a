// filterLinearPhase (FFT overlap-add) against the direct convolution of its definition, and its
// offset, which filters x − offset without a copy of it.
import { describe, expect, it } from "vitest";
import { designLowpass } from "../../src/dsp/index.js";
import { filterLinearPhase } from "../../src/measure/firFilter.js";
import { SeededRandom } from "../../src/scenario/index.js";

/** y[n] = Σ_k h[k]·(x[n + D − k] − c), zero outside the record (the definition, O(N·L)). */
function direct(x: Float64Array, h: Float64Array, c: number): Float64Array {
  const d = (h.length - 1) >> 1;
  const y = new Float64Array(x.length);
  for (let n = 0; n < x.length; n++) {
    let s = 0;
    for (let k = 0; k < h.length; k++) {
      const i = n + d - k;
      if (i >= 0 && i < x.length) s += (h[k] as number) * ((x[i] as number) - c);
    }
    y[n] = s;
  }
  return y;
}

describe("filterLinearPhase(x, taps, offset)", () => {
  const rng = new SeededRandom(11);
  const x = new Float64Array(5000);
  for (let i = 0; i < x.length; i++) x[i] = 1234.5 + 100 * rng.gaussian();
  const taps = designLowpass({ cutoffHz: 3000, transitionHz: 750, stopbandDb: 60, sampleRateHz: 37_500 });

  it("equals the direct convolution of x − offset, every output including the transients (definition; rounding of an O(L) sum)", () => {
    for (const c of [0, 1234.5]) {
      const y = filterLinearPhase(x, taps, c);
      const ref = direct(x, taps, c);
      let worst = 0;
      for (let n = 0; n < y.length; n++) worst = Math.max(worst, Math.abs((y[n] as number) - (ref[n] as number)));
      expect(worst).toBeLessThan(1e-9 * (c + 1000));
    }
  });

  it("with an offset gives exactly what filtering the subtracted copy gives (the same inputs to the same transforms)", () => {
    const shifted = x.map((v) => v - 1234.5);
    expect(filterLinearPhase(x, taps, 1234.5)).toEqual(filterLinearPhase(shifted, taps));
  });
});
