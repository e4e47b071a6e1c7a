import { describe, expect, it } from "vitest";
import { formatHz, formatHzUncertainty, formatUncertainty, groupDigits, uncertaintyDecimals, uncertaintyUnit } from "../../src/report/format.js";

describe("uncertainty printing", () => {
  it("never rounds a non-zero uncertainty to zero (GUM §7.2.6: one or two significant digits)", () => {
    // The cases of the issue: 0.0027 Hz, 1.6e-5 ppm, 0.04 dB must not print as 0.
    for (const [u, digits] of [[0.0027, 1], [1.6e-5, 3], [0.04, 1], [2.1e-4, 1], [7e-9, 2]] as const) {
      const text = u.toFixed(uncertaintyDecimals(u, digits));
      expect(Number(text)).toBeGreaterThan(0);
      // at least 3 units of the last digit: rounding (± ½ unit) moves it by at most ½/3 of itself.
      expect(Math.abs(Number(text) - u) / u).toBeLessThanOrEqual(0.5 / 3 + 1e-12);
    }
  });

  it("keeps the row's decimals when they already show the uncertainty", () => {
    // 85 Hz at 0 decimals and 0.21 at 2 decimals are shown as they are (common practice).
    expect(uncertaintyDecimals(85, 0)).toBe(0);
    expect(uncertaintyDecimals(0.21, 2)).toBe(2);
    expect(formatUncertainty(0.0027, 1, "Hz")).toBe("± 0.003 Hz");
  });

  it("states a level's or ratio's uncertainty in dB", () => {
    // A difference of two levels in dBFS, or a ratio in dBc, is a ratio: dB (IEC 60027-3).
    expect(uncertaintyUnit("dBFS")).toBe("dB");
    expect(uncertaintyUnit("dBc")).toBe("dB");
    expect(formatUncertainty(0.12, 2, "dBc")).toBe("± 0.12 dB");
    expect(formatHzUncertainty(0.00021)).toBe("0.00021 Hz");
  });
});

describe("formatHz(hz) and groupDigits(numeral)", () => {
  // SI Brochure, 9th edition (2019), §5.4.4: digits may be divided into groups of three by a
  // space on either side of the decimal marker; four digits may stand ungrouped.
  it("groups the digits in threes either side of the decimal point", () => {
    expect(groupDigits("164.849787")).toBe("164.849 787");
    expect(groupDigits("-2400.000000000")).toBe("-2400.000 000 000");
    expect(groupDigits("12345678.5")).toBe("12 345 678.5");
    expect(groupDigits("0.1234")).toBe("0.1234");
  });
  it("gives absolute frequencies in MHz with six decimals, grouped", () => {
    expect(formatHz(164_849_787)).toBe("164.849 787 MHz");
    expect(formatHz(165.1375e6)).toBe("165.137 500 MHz");
    // 2.4 GHz stays in MHz, as every absolute frequency does.
    expect(formatHz(2.4e9)).toBe("2400.000 000 MHz");
    expect(formatHz(12_500)).toBe("12.500 kHz");
    expect(formatHz(-463.94)).toBe("-463.9 Hz");
  });
});
