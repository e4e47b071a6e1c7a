// movingAverage and its in-place form (digitalFeatures.ts) against the definition: the mean of
// x[max(0, i − h) … min(n − 1, i + h)], h = floor(length/2).
import { describe, expect, it } from "vitest";
import { movingAverage, movingAverageInPlace } from "../../src/measure/digitalFeatures.js";
import { SeededRandom } from "../../src/scenario/index.js";

function definition(x: Float64Array, length: number): Float64Array {
  const h = Math.floor(length / 2);
  return x.map((_, i) => {
    let s = 0;
    const a = Math.max(0, i - h);
    const b = Math.min(x.length - 1, i + h);
    for (let j = a; j <= b; j++) s += x[j] as number;
    return s / (b - a + 1);
  });
}

describe("movingAverage / movingAverageInPlace", () => {
  const rng = new SeededRandom(8);
  const x = Float64Array.from({ length: 500 }, () => rng.gaussian());

  it("the in-place form gives exactly the values of the copying one, for windows from 1 to longer than the record", () => {
    for (const length of [1, 2, 3, 8, 41, 999, 1200]) {
      const copy = movingAverage(x, length);
      const own = x.slice();
      expect(movingAverageInPlace(own, length)).toBe(own);
      expect(own, `length ${length}`).toEqual(copy);
    }
  });

  it("equals the mean of the window by its definition (running sums: rounding only)", () => {
    for (const length of [1, 5, 64]) {
      const y = movingAverage(x, length);
      const ref = definition(x, length);
      for (let i = 0; i < x.length; i++) expect(y[i]).toBeCloseTo(ref[i] as number, 12);
    }
  });
});
