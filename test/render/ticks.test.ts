import { describe, expect, it } from "vitest";
import {
  formatHz,
  formatSeconds,
  formatTickLabel,
  fractionDigitsForStep,
  nextNiceStep,
  niceNumber,
  niceTicks,
  siScaleForHz,
  siScaleForSeconds,
  ticksWithStep,
} from "../../src/render/index.js";

/** Mantissa of x in [1, 10). */
function mantissa(x: number): number {
  return Number((x / Math.pow(10, Math.floor(Math.log10(x) + 1e-9))).toPrecision(6));
}

describe("niceNumber / niceTicks (Heckbert 1990, 'Nice numbers for graph labels', Graphics Gems)", () => {
  it("niceNumber(x, true) rounds the mantissa with Heckbert's thresholds 1.5, 3 and 7", () => {
    expect(niceNumber(1.4, true)).toBe(1);
    expect(niceNumber(1.6, true)).toBe(2);
    expect(niceNumber(2.9, true)).toBe(2);
    expect(niceNumber(3.1, true)).toBe(5);
    expect(niceNumber(6.9, true)).toBe(5);
    expect(niceNumber(7.1, true)).toBe(10);
    expect(niceNumber(0.0042, true)).toBeCloseTo(0.005, 15);
  });

  it("niceNumber(x, false) takes the smallest of 1, 2, 5, 10 (× 10^k) not below x", () => {
    expect(niceNumber(1, false)).toBe(1);
    expect(niceNumber(1.01, false)).toBe(2);
    expect(niceNumber(2.01, false)).toBe(5);
    expect(niceNumber(5.5, false)).toBe(10);
    expect(niceNumber(4200, false)).toBe(5000);
    expect(() => niceNumber(0, true)).toThrow(RangeError);
  });

  it("niceTicks(105, 543, 5) steps by 100: range nice(438) = 500, step nice(500/4 = 125) = 100 (hand computation of Heckbert's loose labelling)", () => {
    const t = niceTicks(105, 543, 5);
    expect(t.step).toBe(100);
    expect(t.values).toEqual([200, 300, 400, 500]);
  });

  it("niceTicks over many ranges: steps are 1, 2 or 5 × 10^k, ticks evenly spaced multiples inside the range (common practice)", () => {
    let seed = 12345;
    const next = (): number => {
      seed = (seed * 1664525 + 1013904223) % 4294967296;
      return seed / 4294967296;
    };
    for (let trial = 0; trial < 300; trial++) {
      const min = (next() - 0.5) * Math.pow(10, Math.floor(next() * 14) - 4);
      const max = min + Math.pow(10, next() * 12 - 4);
      const target = 2 + Math.floor(next() * 10);
      const { step, values } = niceTicks(min, max, target);
      expect([1, 2, 5]).toContain(mantissa(step));
      expect(values.length).toBeGreaterThanOrEqual(2);
      for (const v of values) {
        expect(v).toBeGreaterThanOrEqual(min - step * 1e-6);
        expect(v).toBeLessThanOrEqual(max + step * 1e-6);
        expect(Math.abs(v / step - Math.round(v / step))).toBeLessThan(1e-3);
      }
      // Values up to 1e13 steps from zero: IEEE 754 doubles keep ~16 digits, so allow 1e-3 of a step.
      for (let i = 1; i < values.length; i++) expect(((values[i] ?? 0) - (values[i - 1] ?? 0)) / step).toBeCloseTo(1, 3);
    }
  });

  it("ticksWithStep rounds away floating-point residue (0.1 + 0.2 must read 0.3) and nextNiceStep walks 1 → 2 → 5 → 10", () => {
    expect(ticksWithStep(0, 0.5, 0.1).values).toEqual([0, 0.1, 0.2, 0.3, 0.4, 0.5]);
    expect(nextNiceStep(1)).toBe(2);
    expect(nextNiceStep(2e3)).toBe(5e3);
    expect(nextNiceStep(5e-3)).toBeCloseTo(1e-2, 15);
  });
});

describe("SI formatting (prefixes k, M, G, m, µ as in the BIPM SI Brochure, 9th ed., 2019)", () => {
  it("siScaleForHz picks Hz, kHz, MHz or GHz by the largest magnitude on the axis", () => {
    expect(siScaleForHz(999).symbol).toBe("Hz");
    expect(siScaleForHz(-1000).symbol).toBe("kHz");
    expect(siScaleForHz(1.2e6)).toEqual({ symbol: "MHz", factor: 1e6 });
    expect(siScaleForHz(2.4e9)).toEqual({ symbol: "GHz", factor: 1e9 });
  });

  it("siScaleForSeconds picks s, ms or µs", () => {
    expect(siScaleForSeconds(2.5).symbol).toBe("s");
    expect(siScaleForSeconds(0.04)).toEqual({ symbol: "ms", factor: 1e-3 });
    expect(siScaleForSeconds(5e-4).symbol).toBe("µs");
  });

  it("formatTickLabel gives absolute RF ticks enough digits to differ: 156.79 / 156.80 MHz for a 10 kHz step", () => {
    const mhz = siScaleForHz(156.8e6);
    expect(fractionDigitsForStep(1e4, 1e6)).toBe(2);
    expect(formatTickLabel(156.79e6, 1e4, mhz)).toBe("156.79");
    expect(formatTickLabel(156.8e6, 1e4, mhz)).toBe("156.80");
    expect(formatTickLabel(156.805e6, 5e3, mhz)).toBe("156.805");
    const labels = ticksWithStep(156.7812e6, 156.8188e6, 5e3).values.map((v) => formatTickLabel(v, 5e3, mhz));
    expect(new Set(labels).size).toBe(labels.length);
  });

  it("formatTickLabel writes offsets and times plainly, never '-0'", () => {
    const khz = siScaleForHz(600e3);
    expect(formatTickLabel(-200e3, 100e3, khz)).toBe("-200");
    expect(formatTickLabel(-1e-9, 100e3, khz)).toBe("0");
    expect(formatTickLabel(-0.5e6, 0.5e6, siScaleForHz(1.2e6))).toBe("-0.5");
    expect(formatTickLabel(0.025, 0.005, siScaleForSeconds(0.04))).toBe("25");
    expect(formatTickLabel(-1e-7, 0.2, siScaleForSeconds(2))).toBe("0.0");
  });

  it("formatHz / formatSeconds give three significant digits with the unit: 2.4e6 / 1024 Hz is '2.34 kHz'", () => {
    expect(formatHz(2.4e6 / 1024)).toBe("2.34 kHz");
    expect(formatHz(3515.625)).toBe("3.52 kHz");
    expect(formatHz(156.8e6, 6)).toBe("156.800 MHz");
    expect(formatSeconds(0.025)).toBe("25.0 ms");
    expect(formatSeconds(1.5)).toBe("1.50 s");
  });
});
