// StreamingFirPair against the convolution sum computed directly (independent computation).
import { describe, expect, it } from "vitest";
import { StreamingFirPair } from "../../src/dsp/index.js";
import { SeededRandom } from "../../src/scenario/index.js";
import { randomPartition } from "./blocks.js";

function direct(x: Float64Array, h: Float64Array, m: number): number {
  let s = 0;
  for (let k = 0; k < h.length; k++) if (m - k >= 0) s += (h[k] as number) * (x[m - k] as number);
  return s;
}

describe("StreamingFirPair(a, b)", () => {
  const rng = new SeededRandom(5);
  const x = new Float64Array(5000).map(() => rng.gaussian());
  const a = new Float64Array(37).map(() => rng.gaussian());
  const b = new Float64Array(20).map(() => rng.gaussian());

  it("gives y_a = a * x and y_b = b * x from a zero history, in order, whatever the blocks (convolution sum, Oppenheim & Schafer eq. 2.49)", () => {
    const fir = new StreamingFirPair(a, b);
    const ya: number[] = [];
    const yb: number[] = [];
    let next = 0;
    const sink = (oa: Float64Array, ob: Float64Array, count: number, first: number): void => {
      expect(first).toBe(next);
      for (let j = 0; j < count; j++) { ya.push(oa[j] as number); yb.push(ob[j] as number); }
      next += count;
    };
    for (const [start, stop] of randomPartition(x.length, 700, 9)) fir.push(x, sink, start, stop);
    // Outputs come in whole chunks of N − L + 1: all but the last partial chunk are out.
    const chunk = fir.fftSize - fir.tapCount + 1;
    expect(ya.length).toBe(Math.floor(x.length / chunk) * chunk);
    for (let m = 0; m < ya.length; m += 7) {
      // Float32 transforms (fastFft.ts): relative rms error about 2^−24·√(log2 N) ≈ 2e-7 of the
      // output's scale (√37 ≈ 6 for unit taps and input), so ~1e-6; 5e-5 is a wide margin
      // against the order-1 errors of a wrong overlap, order or sign.
      expect(ya[m]).toBeCloseTo(direct(x, a, m), 4);
      expect(yb[m]).toBeCloseTo(direct(x, b, m), 4);
    }
  });

  it("refuses empty or non-finite taps", () => {
    expect(() => new StreamingFirPair(new Float64Array(0))).toThrow(RangeError);
    expect(() => new StreamingFirPair(new Float64Array([1, NaN]))).toThrow(RangeError);
  });
});
