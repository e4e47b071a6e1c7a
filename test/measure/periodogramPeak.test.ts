// The periodogram maximum of periodogramPeak.ts on a record given as real values: the same
// sums as the record with a zero Q (so symbolRate.ts need not copy its feature into one).
import { describe, expect, it } from "vitest";
import { dtftAt, refinePeak, refinePeakStep } from "../../src/measure/periodogramPeak.js";
import { SeededRandom } from "../../src/scenario/index.js";

function realTone(n: number, nu: number, amplitude: number, noise: number): Float64Array {
  const rng = new SeededRandom(5);
  const x = new Float64Array(n);
  for (let k = 0; k < n; k++) x[k] = amplitude * Math.cos(2 * Math.PI * nu * k + 0.3) + noise * rng.gaussian();
  return x;
}

function withZeroQ(x: Float64Array): Float64Array {
  const z = new Float64Array(2 * x.length);
  for (let k = 0; k < x.length; k++) z[2 * k] = x[k] as number;
  return z;
}

describe("refinePeak / dtftAt on a real record (layout \"real\")", () => {
  const n = 4000;
  const nu = 0.123456;
  const x = realTone(n, nu, 1, 0.5);
  const z = withZeroQ(x);

  it("gives exactly what the record with Q = 0 gives (the Q terms are products with 0)", () => {
    const start = Math.round(nu * 2 * n) / (2 * n);
    expect(refinePeak(x, start, 6, "real")).toBe(refinePeak(z, start));
    expect(refinePeakStep(x, start, 3, "real")).toEqual(refinePeakStep(z, start, 3));
    expect(dtftAt(x, nu, "real")).toEqual(dtftAt(z, nu));
  });

  it("finds the tone's frequency within 4σ of the Cramér–Rao bound and |X| ≈ A·N/2 (Rife & Boorstyn 1974)", () => {
    const found = refinePeak(x, Math.round(nu * 2 * n) / (2 * n), 6, "real");
    // CRB of the frequency of a real sinusoid A·cos in white noise σ²: var(ω) = 12σ²/(A²·N(N² − 1))
    // (S. M. Kay, Fundamentals of Statistical Signal Processing I, 1993, eq. 3.41; from memory), ν = ω/2π.
    const sigma = Math.sqrt((12 * 0.5 ** 2) / ((2 * Math.PI) ** 2 * n * (n * n - 1)));
    expect(Math.abs(found - nu)).toBeLessThan(4 * sigma);
    const [re, im] = dtftAt(x, found, "real");
    // A·N/2 = 2000; the noise adds σ·√N ≈ 32 at most a few times, the image at −ν a sidelobe of ~N/(2π·2ν·N) ≈ 0.6.
    expect(Math.abs(Math.hypot(re, im) - n / 2)).toBeLessThan(150);
  });
});
