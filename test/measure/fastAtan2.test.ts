import { describe, expect, it } from "vitest";
import { fastAtan2, instantaneousFrequencyHz } from "../../src/measure/index.js";
import { tone } from "../../src/scenario/index.js";

describe("fastAtan2(y, x)", () => {
  it("stays within 2e-6 rad of Math.atan2 on a dense grid of angles and radii (the module's bound)", () => {
    // Reference: the platform's Math.atan2 (IEEE double, correctly rounded to ~1 ulp), an
    // implementation independent of the polynomial under test.
    let worst = 0;
    for (const r of [1e-30, 1e-3, 1, 7.5, 1e12]) {
      for (let i = 0; i <= 200_000; i++) {
        const th = -Math.PI + (2 * Math.PI * i) / 200_000;
        const y = r * Math.sin(th);
        const x = r * Math.cos(th);
        const e = Math.abs(fastAtan2(y, x) - Math.atan2(y, x));
        // At ±π the two sides of the branch cut are the same angle.
        worst = Math.max(worst, Math.min(e, Math.abs(e - 2 * Math.PI)));
      }
    }
    expect(worst).toBeLessThan(2e-6);
  });

  it("gives the exact axis and diagonal angles (0, ±π/2, π, ±π/4, ±3π/4 by definition of arg)", () => {
    expect(fastAtan2(0, 1)).toBe(0);
    expect(fastAtan2(0, 0)).toBe(0);
    expect(fastAtan2(1, 0)).toBeCloseTo(Math.PI / 2, 12);
    expect(fastAtan2(-1, 0)).toBeCloseTo(-Math.PI / 2, 12);
    expect(fastAtan2(0, -1)).toBeCloseTo(Math.PI, 12);
    expect(fastAtan2(1, 1)).toBeCloseTo(Math.PI / 4, 6);
    expect(fastAtan2(-1, -1)).toBeCloseTo((-3 * Math.PI) / 4, 6);
  });
});

describe("instantaneousFrequencyHz(iq, fs)", () => {
  it("of a complex tone at f0 is f0 at every step, n − 1 values (closed form: phase step 2π f0/fs)", () => {
    const fs = 62_500;
    const f0 = -4321.5;
    const iq = Float32Array.from(tone(5000, fs, f0));
    const f = instantaneousFrequencyHz(iq, fs);
    expect(f.length).toBe(4999);
    // float32 samples carry ~6e-8 relative rounding, a phase error of ~1e-7 rad per step, i.e.
    // ~1e-3 Hz at 62.5 kHz; 0.01 Hz allows for that and the 2e-6 rad of fastAtan2 (0.02 Hz).
    let worst = 0;
    for (const v of f) worst = Math.max(worst, Math.abs(v - f0));
    expect(worst).toBeLessThan(0.03);
  });

  it("throws RangeError for a bad rate or an odd-length input", () => {
    expect(() => instantaneousFrequencyHz(new Float32Array(4), 0)).toThrow(RangeError);
    expect(() => instantaneousFrequencyHz(new Float32Array(3), 1000)).toThrow(RangeError);
  });
});
