import { describe, expect, it } from "vitest";
import { coherentGain, enbwBins, windowCoefficients, windowPowerSum, WINDOW_NAMES } from "../../src/dsp/index.js";

// REFERENCES.md §8: coherent gain and ENBW (bins) of DFT-even windows, N = 1024, computed from
// the defining formulas; Harris 1978 (Proc. IEEE 66(1)) Table 1 prints the same to 2–3 digits.
const HARRIS_TABLE_1_COMPUTED = {
  rectangular: { coherentGain: 1.0, enbwBins: 1.0, scallopLossDb: 3.92 },
  hann: { coherentGain: 0.5, enbwBins: 1.5, scallopLossDb: 1.42 },
  "blackman-harris": { coherentGain: 0.359, enbwBins: 2.004, scallopLossDb: 0.83 },
} as const;

/** Loss of a tone half a bin off centre, from the DTFT of w at 0.5 bin: |Σw e^(−jπn/N)| / Σw. */
function scallopLossDb(w: Float64Array): number {
  let re = 0;
  let im = 0;
  let s = 0;
  for (let n = 0; n < w.length; n++) {
    const a = (-Math.PI * n) / w.length;
    re += (w[n] as number) * Math.cos(a);
    im += (w[n] as number) * Math.sin(a);
    s += w[n] as number;
  }
  return -20 * Math.log10(Math.hypot(re, im) / s);
}

describe("windowCoefficients(name, 1024)", () => {
  for (const name of WINDOW_NAMES) {
    it(`${name}: coherent gain, ENBW and scallop loss match REFERENCES.md §8 (Harris 1978 Table 1)`, () => {
      const w = windowCoefficients(name, 1024);
      const ref = HARRIS_TABLE_1_COMPUTED[name];
      // REFERENCES.md §8 tolerances: ENBW ±0.002 bins, scallop ±0.02 dB; gain printed to 3 digits.
      expect(coherentGain(w)).toBeCloseTo(ref.coherentGain, 3);
      expect(Math.abs(enbwBins(w) - ref.enbwBins)).toBeLessThanOrEqual(0.002);
      expect(Math.abs(scallopLossDb(w) - ref.scallopLossDb)).toBeLessThanOrEqual(0.02);
    });
  }

  it("hann is the periodic (DFT-even) form: w[0] = 0, w[N/2] = 1, no second zero (Harris 1978 §II)", () => {
    const w = windowCoefficients("hann", 1024);
    expect(w[0]).toBe(0);
    expect(w[512]).toBeCloseTo(1, 15);
    expect(w[1023]).toBeGreaterThan(0);
  });

  it("hann: closed forms Σw = N/2 and Σw² = 3N/8, hence ENBW = 1.5 bins exactly (Harris 1978 Table 1)", () => {
    const w = windowCoefficients("hann", 4096);
    expect(coherentGain(w) * 4096).toBeCloseTo(2048, 9);
    expect(windowPowerSum(w)).toBeCloseTo((3 * 4096) / 8, 9);
    expect(enbwBins(w)).toBeCloseTo(1.5, 12);
  });

  it("rejects a length that is not a positive integer", () => {
    expect(() => windowCoefficients("hann", 0)).toThrow(RangeError);
    expect(() => windowCoefficients("hann", 2.5)).toThrow(/window length 2.5/);
  });
});
