import { describe, expect, it } from "vitest";
import { ParameterError } from "../../src/errors.js";
import {
  RULE_MASK_NAMES, licenceMask, mask73317, mask80211F, mask90210B, mask90210C, mask90210D, mask90210E,
  mask90210G, mask90210H, mask90210I, pointMask,
} from "../../src/licence/index.js";

// Values below are the formulas of REFERENCES.md §4 (status V) evaluated by hand (a calculator,
// double precision) unless a comment names the reference table's own worked value. Attenuation
// A dB is an allowed level of −A dB. Tolerance 0.01 dB: the worked values are printed to 0.01 dB.
const DB = 2; // toBeCloseTo digits: |error| < 0.005 dB
const P100 = 100; // W: 43 + 10 log10(100) = 63 dB; 50 + 10 log10(100) = 70 dB; 55 + 20 = 75 dB

describe("mask90210D(powerW), 47 CFR 90.210(d)", () => {
  it("gives the reference table's worked values: 19.96 dB just past 5.625 kHz and 69.94 dB at 12.5 kHz", () => {
    const d = mask90210D(null);
    // REFERENCES.md §4 Mask D: 0–5.625 kHz 0 dB ("from f0 to 5.625 kHz" includes 5.625 kHz).
    expect(d.allowedDb(0)).toBe(0);
    expect(d.allowedDb(5625)).toBe(0);
    // 7.27(fd − 2.88 kHz): 19.96 dB at 5.625 kHz (worked value), 69.94 dB at 12.5 kHz (worked value).
    expect(d.allowedDb(5625.001)).toBeCloseTo(-19.96, DB);
    expect(d.allowedDb(12500)).toBeCloseTo(-69.94, DB);
    expect(d.allowedDb(-9000)).toBeCloseTo(-44.4924, 3); // 7.27 × 6.12, by hand; |offset|
    expect(d.reference).toBe("peak"); // relative to the highest emission in the authorised bandwidth
  });

  it("beyond 12.5 kHz applies the lesser of 50 + 10 log10(P) and 70 dB only when P is known", () => {
    expect(mask90210D(null).allowedDb(12500.5)).toBeNull();
    expect(mask90210D(null).notes.join(" ")).toMatch(/transmitterPowerW/);
    expect(mask90210D(P100).allowedDb(30000)).toBeCloseTo(-70, 9); // 50 + 20 = 70 = the 70 dB cap
    expect(mask90210D(10).allowedDb(30000)).toBeCloseTo(-60, 9); // 50 + 10 = 60 < 70, the lesser
    expect(mask90210D(1000).allowedDb(30000)).toBeCloseTo(-70, 9); // 50 + 30 = 80 > 70: the cap
  });
});

describe("mask90210C(authorisedBandwidthHz, powerW), 47 CFR 90.210(c)", () => {
  const c = mask90210C(20000, P100);
  it("is 83 log10(fd/5) from 5 to 10 kHz", () => {
    expect(c.allowedDb(7500)).toBeCloseTo(-14.6156, 3); // 83 log10(1.5)
    expect(c.allowedDb(10000)).toBeCloseTo(-24.9855, 3); // 83 log10(2)
    expect(c.allowedDb(5000)).toBeNull(); // within 5 kHz: not in the reference table, no limit applied
  });

  it("is 29 log10(fd²/11) beyond 10 kHz, capped at 50 dB near 24.14 kHz (REFERENCES.md §4)", () => {
    expect(c.allowedDb(10000.001)).toBeCloseTo(-27.7996, 3); // 29 log10(100/11)
    expect(c.allowedDb(20000)).toBeCloseTo(-45.2594, 3); // 29 log10(400/11)
    // 29 log10(fd²/11) = 50 → fd = sqrt(11 · 10^(50/29)) kHz = 24.1416 kHz (REFERENCES.md: "near 24.14 kHz").
    const crossHz = 1000 * Math.sqrt(11 * 10 ** (50 / 29));
    expect(crossHz).toBeCloseTo(24140, -1);
    expect(c.allowedDb(crossHz - 20) as number).toBeGreaterThan(-50);
    expect(c.allowedDb(crossHz + 20)).toBe(-50);
    expect(c.allowedDb(50000)).toBe(-50); // 250 % of 20 kHz, still the cap
  });

  it("beyond 250 % of the authorised bandwidth is 43 + 10 log10(P) = 63 dB at 100 W, none without P", () => {
    expect(c.allowedDb(50001)).toBeCloseTo(-63, 9);
    expect(mask90210C(20000, null).allowedDb(50001)).toBeNull();
    expect(c.offsetFrom).toBe("authorised-centre"); // fd from the centre of the authorised bandwidth
  });
});

describe("mask90210B(authorisedBandwidthHz, powerW), 47 CFR 90.210(b)", () => {
  it("with 20 kHz authorised bandwidth: 25 dB at 10–20 kHz, 35 dB at 20–50 kHz (REFERENCES.md §4 worked values)", () => {
    const b = mask90210B(20000, P100);
    expect(b.allowedDb(10000)).toBeNull(); // up to 50 %: the rule sets no limit
    expect(b.allowedDb(10001)).toBe(-25);
    expect(b.allowedDb(20000)).toBe(-25);
    expect(b.allowedDb(20001)).toBe(-35);
    expect(b.allowedDb(50000)).toBe(-35);
    expect(b.allowedDb(50001)).toBeCloseTo(-63, 9); // > 250 %: 43 + 10 log10(100)
    expect(mask90210B(20000, null).allowedDb(50001)).toBeNull();
    expect(b.reference).toBe("carrier");
    expect(b.edgesHz).toEqual([10000, 20000, 50000]);
  });
});

describe("mask80211F(authorisedBandwidthHz, powerW), 47 CFR 80.211(f)", () => {
  it("steps 25 dB (> 50–100 %), 35 dB (> 100–250 %), 43 + 10 log10(P) (> 250 %) below the mean power", () => {
    const f = mask80211F(16000, P100);
    expect(f.allowedDb(8000)).toBeNull();
    expect(f.allowedDb(12000)).toBe(-25);
    expect(f.allowedDb(30000)).toBe(-35);
    expect(f.allowedDb(40001)).toBeCloseTo(-63, 9);
    expect(f.source).toBe("47 CFR 80.211(f)");
  });
});

describe("mask90210G(authorisedBandwidthHz, powerW), 47 CFR 90.210(g)", () => {
  it("is 24.9 dB just past 10 kHz (REFERENCES.md §4 worked value) and 43 + 10 log10(P) beyond 250 %", () => {
    const g = mask90210G(20000, P100);
    expect(g.allowedDb(10000.001)).toBeCloseTo(-24.9, 1); // 116 log10(10/6.1) = 24.90
    expect(g.allowedDb(15000)).toBeCloseTo(-45.3283, 3); // 116 log10(15/6.1)
    expect(g.allowedDb(40000)).toBe(-70); // 116 log10 exceeds 70 past ~25 kHz: the lesser, with 50 + 20 = 70
    expect(g.allowedDb(50001)).toBeCloseTo(-63, 9);
    expect(g.allowedDb(10000)).toBeNull(); // within 10 kHz: not in the reference table
  });

  it("without P applies nothing beyond 10 kHz, since every term there is a lesser-of with P", () => {
    const g = mask90210G(20000, null);
    expect(g.allowedDb(15000)).toBeNull();
    expect(g.allowedDb(60000)).toBeNull();
    expect(g.notes.join(" ")).toMatch(/no transmitterPowerW/);
  });
});

describe("mask90210H(powerW), 47 CFR 90.210(h)", () => {
  it("follows its four curves from 4 to 25 kHz, then 43 + 10 log10(P)", () => {
    const h = mask90210H(P100);
    expect(h.allowedDb(4000)).toBe(0); // ≤ 4 kHz: 0 dB
    expect(h.allowedDb(6000)).toBeCloseTo(-18.8418, 3); // 107 log10(6/4)
    expect(h.allowedDb(12000)).toBeCloseTo(-41.0963, 3); // 40.5 log10(12/1.16)
    expect(h.allowedDb(20000)).toBeCloseTo(-59.8212, 3); // 116 log10(20/6.1)
    expect(h.allowedDb(25001)).toBeCloseTo(-63, 9);
    expect(mask90210H(null).allowedDb(25001)).toBeNull();
  });
});

describe("mask90210I(powerW), 47 CFR 90.210(i)", () => {
  it("is 25 dB at 6.8–9 kHz, 35 dB at 9–15 kHz, then the lesser of 43 + 10 log10(P) and 70 dB", () => {
    const i = mask90210I(P100);
    expect(i.allowedDb(6800)).toBeNull(); // below 6.8 kHz: no limit applied
    expect(i.allowedDb(8000)).toBe(-25);
    expect(i.allowedDb(12000)).toBe(-35);
    expect(i.allowedDb(20000)).toBeCloseTo(-63, 9); // 63 < 70
    expect(mask90210I(1e4).allowedDb(20000)).toBe(-70); // 43 + 40 = 83 > 70: the cap
  });
});

describe("mask90210E(powerW), 47 CFR 90.210(e)", () => {
  it("is 0 dB to 3 kHz, then the lesser of 30 + 16.67(fd − 3), 55 + 10 log10(P) and 65 dB", () => {
    const e = mask90210E(P100);
    expect(e.allowedDb(3000)).toBe(0);
    expect(e.allowedDb(4000)).toBeCloseTo(-46.67, 9); // 30 + 16.67 × 1
    expect(e.allowedDb(10000)).toBe(-65); // 55 + 20 = 75 > 65: the cap
    expect(mask90210E(1).allowedDb(10000)).toBeCloseTo(-55, 9); // 55 + 0 < 65
    expect(mask90210E(null).allowedDb(4000)).toBeNull();
  });
});

describe("mask73317(powerW), 47 CFR 73.317(b)–(d)", () => {
  it("is 25 dB at 120–240 kHz (inclusive), 35 dB at 240–600 kHz (REFERENCES.md §4)", () => {
    const m = mask73317(P100);
    expect(m.allowedDb(119999)).toBeNull();
    expect(m.allowedDb(120000)).toBe(-25); // "between 120 kHz and 240 kHz inclusive"
    expect(m.allowedDb(240000)).toBe(-25);
    expect(m.allowedDb(240001)).toBe(-35);
    expect(m.allowedDb(600000)).toBe(-35);
  });

  it("beyond 600 kHz is the lesser of 43 + 10 log10(P) and 80 dB", () => {
    expect(mask73317(P100).allowedDb(700e3)).toBeCloseTo(-63, 9); // 63 < 80
    expect(mask73317(1e5).allowedDb(700e3)).toBe(-80); // 43 + 50 = 93 > 80: the 80 dB cap
    expect(mask73317(null).allowedDb(700e3)).toBeNull();
  });
});

describe("pointMask(points)", () => {
  const m = pointMask([[0, 0], [10000, -25], [12500, -35], [25000, -60]]);
  it("interpolates linearly in dB between points and holds the last level beyond (docs/interface.md)", () => {
    expect(m.allowedDb(10000)).toBe(-25);
    expect(m.allowedDb(11250)).toBeCloseTo(-30, 12); // halfway between −25 and −35
    expect(m.allowedDb(5000)).toBeCloseTo(-12.5, 12);
    expect(m.allowedDb(-5000)).toBeCloseTo(-12.5, 12); // |offset|
    expect(m.allowedDb(1e6)).toBe(-60);
  });

  it("gives the first level below the first point", () => {
    expect(pointMask([[5000, -20], [10000, -40]]).allowedDb(1000)).toBe(-20);
  });

  it("refuses points that are not increasing [offset >= 0, level <= 0] pairs", () => {
    expect(() => pointMask([[0, 0], [0, -10]])).toThrow(ParameterError);
    expect(() => pointMask([[0, 3]])).toThrow(/<= 0/);
    expect(() => pointMask([])).toThrow(/no points/);
  });
});

describe("licenceMask(licence)", () => {
  it("is null without a mask, a point mask for points, and the named rule otherwise", () => {
    expect(licenceMask({})).toBeNull();
    expect(licenceMask({ mask: [[0, -10]], maskReference: "peak" })?.reference).toBe("peak");
    expect(licenceMask({ mask: "cfr-90.210-d" })?.name).toBe("cfr-90.210-d");
    for (const name of RULE_MASK_NAMES) {
      expect(licenceMask({ mask: name, authorisedBandwidthHz: 20000 })?.name).toBe(name);
    }
  });

  it("passes transmitterPowerW to the rule (63 dB at 100 W beyond 250 % of mask B)", () => {
    expect(licenceMask({ mask: "cfr-90.210-b", authorisedBandwidthHz: 20000, transmitterPowerW: 100 })?.allowedDb(60000)).toBeCloseTo(-63, 9);
  });

  it("throws ParameterError naming authorisedBandwidthHz when a rule set in percent of it lacks it", () => {
    for (const name of ["cfr-90.210-b", "cfr-90.210-c", "cfr-90.210-g", "cfr-80.211-f"]) {
      expect(() => licenceMask({ mask: name })).toThrow(ParameterError);
      expect(() => licenceMask({ mask: name })).toThrow(/authorisedBandwidthHz/);
    }
  });

  it("notes a maskReference the rule does not use (90.210(d) is relative to the highest emission)", () => {
    const m = licenceMask({ mask: "cfr-90.210-d", maskReference: "carrier" });
    expect(m?.reference).toBe("peak");
    expect(m?.notes.join(" ")).toMatch(/maskReference "carrier" is not used/);
  });
});
