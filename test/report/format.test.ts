import { describe, expect, it } from "vitest";
import { formatHzUncertainty, formatUncertainty, uncertaintyDecimals, uncertaintyUnit } from "../../src/report/format.js";

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
