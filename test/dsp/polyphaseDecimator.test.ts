import { describe, expect, it } from "vitest";
import { designLowpass, PolyphaseDecimator } from "../../src/dsp/index.js";
import { KernelArena } from "../../src/dsp/chainKernels.js";
import { SeededRandom } from "../../src/scenario/index.js";
import { randomPartition } from "./blocks.js";

/** Independent reference: full convolution y[n] = Σ h[k]·x[n−k] (x = 0 before 0), then keep every D-th. */
function convolveThenDownsample(h: Float64Array, x: Float32Array, D: number): Float64Array {
  const n = x.length / 2;
  const out: number[] = [];
  for (let i = 0; i < n; i++) {
    let re = 0;
    let im = 0;
    for (let k = 0; k < h.length && k <= i; k++) {
      re += (h[k] as number) * (x[2 * (i - k)] as number);
      im += (h[k] as number) * (x[2 * (i - k) + 1] as number);
    }
    if (i % D === 0) out.push(re, im);
  }
  return Float64Array.from(out);
}

describe("PolyphaseDecimator(taps, D).push(iq)", () => {
  const rng = new SeededRandom(11);
  const x = new Float32Array(2 * 3001).map(() => rng.gaussian());
  const random = new Float64Array(37).map(() => rng.gaussian() / 6);
  const symmetric = designLowpass({ cutoffHz: 0.05, transitionHz: 0.1, stopbandDb: 70, sampleRateHz: 1 });
  // An even symmetric length (the Kaiser designs are odd): the kernel's pairs without a middle tap.
  const evenSymmetric = new Float64Array(36).map((_, k) => (random[Math.min(k, 35 - k)] as number));
  const cases: Array<[string, Float64Array]> = [
    ["random taps", random], ["symmetric taps", symmetric], ["even symmetric taps", evenSymmetric], ["one tap", new Float64Array([0.75])],
  ];

  for (const [name, h] of cases) {
    for (const [D, arena] of [[1, false], [3, false], [8, false], [3, true], [8, true]] as const) {
      it(`${name}, D = ${D}${arena ? ", SIMD kernel" : ""}: equals convolution then downsampling for random block partitions`, () => {
        const ref = convolveThenDownsample(h, x, D);
        let scale = 0;
        for (let k = 0; k < h.length; k++) scale += Math.abs(h[k] as number);
        for (const seed of [1, 2, 3]) {
          const dec = new PolyphaseDecimator(h, D, false, arena ? new KernelArena() : null);
          const parts: Float32Array[] = [];
          for (const [a, b] of randomPartition(3001, seed === 3 ? 5 : 400, seed)) parts.push(dec.push(x.subarray(2 * a, 2 * b)));
          parts.push(dec.push(new Float32Array(0)));
          const y = Float32Array.from(parts.flatMap((p) => Array.from(p)));
          // ⌈N/D⌉ outputs after N inputs.
          expect(y.length / 2).toBe(Math.ceil(3001 / D));
          // Output rounding to float32: |error| ≤ 2^-24·Σ|h|·max|x| (max|x| < 6 for these Gaussians), plus double sums.
          for (let i = 0; i < ref.length; i++) expect(Math.abs((y[i] as number) - (ref[i] as number))).toBeLessThan(6e-8 * scale * 6 + 1e-12);
        }
      });
    }
  }

  it("in the SIMD kernel gives the JavaScript loop's outputs to the bit (the same operations in the same order)", () => {
    for (const h of [symmetric, evenSymmetric]) {
      const plain = new PolyphaseDecimator(h, 3);
      const simd = new PolyphaseDecimator(h, 3, true, new KernelArena());
      for (const [a, b] of randomPartition(3001, 700, 4)) {
        expect(simd.push(x.subarray(2 * a, 2 * b))).toEqual(plain.push(x.subarray(2 * a, 2 * b)));
      }
    }
  });

  it("delaySamples is (L − 1)/2: a symmetric filter delays an impulse's peak by that many input samples", () => {
    const h = designLowpass({ cutoffHz: 0.1, transitionHz: 0.1, stopbandDb: 60, sampleRateHz: 1 });
    const dec = new PolyphaseDecimator(h, 1);
    const impulse = new Float32Array(2 * h.length);
    impulse[0] = 1;
    const y = dec.push(impulse);
    let best = 0;
    for (let i = 0; i < y.length / 2; i++) if ((y[2 * i] as number) > (y[2 * best] as number)) best = i;
    expect(best).toBe(dec.delaySamples);
  });

  it("rejects bad parameters", () => {
    expect(() => new PolyphaseDecimator(new Float64Array(0), 2)).toThrow(/taps length 0/);
    expect(() => new PolyphaseDecimator(new Float64Array([1]), 0)).toThrow(/factor 0/);
    expect(() => new PolyphaseDecimator(new Float64Array([Number.NaN]), 2)).toThrow(/taps\[0\] NaN/);
  });
});
