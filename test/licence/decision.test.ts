import { describe, expect, it } from "vitest";
import { ParameterError } from "../../src/errors.js";
import { decide, worstDecision } from "../../src/licence/index.js";

// ILAC-G8:09/2019 §4.2.3 (REFERENCES.md §4 "Decision rules", status V2), guard band w = U:
// upper limit TL: pass below TL − w; conditional pass in [TL − w, TL]; conditional fail in
// (TL, TL + w]; fail above TL + w. Mirrored for a lower limit. Values are binary fractions so
// that TL ± U is exact in double precision.
const TL = 5000; // e.g. a deviation limit, Hz
const U = 62.5; // its expanded uncertainty (k = 2), Hz

describe("decide(measured, limit, U, \"upper\") (ILAC-G8:09/2019 §4.2.3)", () => {
  it("gives each of the four states with values within U of the limit on each side", () => {
    expect(decide(TL - 100, TL, U, "upper").decision).toBe("pass"); // below TL − w
    expect(decide(TL - 31.25, TL, U, "upper").decision).toBe("conditional-pass"); // in [TL − w, TL]
    expect(decide(TL + 31.25, TL, U, "upper").decision).toBe("conditional-fail"); // in (TL, TL + w]
    expect(decide(TL + 100, TL, U, "upper").decision).toBe("fail"); // above TL + w
  });

  it("puts the exact boundaries where §4.2.3 puts them", () => {
    expect(decide(TL - U, TL, U, "upper").decision).toBe("conditional-pass"); // TL − w ∈ [TL − w, TL]
    const atLimit = decide(TL, TL, U, "upper");
    expect(atLimit.decision).toBe("conditional-pass"); // TL ∈ [TL − w, TL]
    expect(atLimit.pass).toBe(true); // simple acceptance: touching the limit passes (docs/interface.md)
    expect(decide(TL + U, TL, U, "upper").decision).toBe("conditional-fail"); // TL + w ∈ (TL, TL + w]
    expect(decide(TL + U + 0.5, TL, U, "upper").decision).toBe("fail");
    // A value on TL − w as the caller computes it, even where the subtraction is inexact (0.3 − 0.1).
    expect(decide(0.3 - 0.1, 0.3, 0.1, "upper").decision).toBe("conditional-pass");
  });

  it("gives margin = limit − measured (positive inside), marginPercent = 100·margin/|limit| and w = U", () => {
    const r = decide(4750, TL, U, "upper");
    expect(r.margin).toBe(250);
    expect(r.marginPercent).toBe(5); // 100 × 250 / 5000
    expect(r.guardBand).toBe(U);
    expect(r.uncertaintyKnown).toBe(true);
    // A mask level: −30 dBc measured under a −25 dBc limit is 5 dB inside, 20 % of |−25|.
    expect(decide(-30, -25, 1, "upper")).toMatchObject({ margin: 5, marginPercent: 20, decision: "pass" });
  });
});

describe("decide(measured, limit, U, \"lower\") (ILAC-G8:09/2019 §4.2.3, mirrored)", () => {
  const LL = 25; // e.g. an attenuation that must be at least 25 dB
  const W = 0.75;
  it("gives each of the four states with values within U of the limit on each side", () => {
    expect(decide(LL + 1, LL, W, "lower").decision).toBe("pass"); // above TL + w
    expect(decide(LL + 0.5, LL, W, "lower").decision).toBe("conditional-pass"); // in [TL, TL + w]
    expect(decide(LL - 0.5, LL, W, "lower").decision).toBe("conditional-fail"); // in [TL − w, TL)
    expect(decide(LL - 1, LL, W, "lower").decision).toBe("fail"); // below TL − w
  });

  it("puts the exact boundaries where the mirrored rule puts them", () => {
    expect(decide(LL + W, LL, W, "lower").decision).toBe("conditional-pass");
    expect(decide(LL, LL, W, "lower")).toMatchObject({ decision: "conditional-pass", pass: true, margin: 0 });
    expect(decide(LL - W, LL, W, "lower").decision).toBe("conditional-fail");
    expect(decide(LL - W - 0.25, LL, W, "lower").decision).toBe("fail");
    expect(decide(LL - 0.25, LL, W, "lower")).toMatchObject({ pass: false, margin: -0.25, marginPercent: -1 });
  });
});

describe("decide(...) without an uncertainty", () => {
  it("is simple acceptance (w = 0, ILAC-G8 §4.2.1): pass up to and including the limit, fail beyond", () => {
    for (const u of [null, 0]) {
      expect(decide(TL, TL, u, "upper")).toMatchObject({ decision: "pass", pass: true, guardBand: 0, uncertaintyKnown: false });
      expect(decide(TL + 0.5, TL, u, "upper")).toMatchObject({ decision: "fail", pass: false });
      expect(decide(TL - 0.5, TL, u, "lower")).toMatchObject({ decision: "fail", pass: false });
      expect(decide(TL, TL, u, "lower").decision).toBe("pass");
    }
  });

  it("gives marginPercent null for a limit of 0 and refuses non-finite values or a negative U", () => {
    expect(decide(-1, 0, null, "upper").marginPercent).toBeNull();
    expect(() => decide(Number.NaN, TL, U, "upper")).toThrow(ParameterError);
    expect(() => decide(TL, Infinity, U, "upper")).toThrow(ParameterError);
    expect(() => decide(TL, TL, -1, "upper")).toThrow(ParameterError);
  });
});

describe("worstDecision(ds)", () => {
  it("orders pass < conditional-pass < conditional-fail < fail; none is a pass", () => {
    expect(worstDecision([])).toBe("pass");
    expect(worstDecision(["pass", "conditional-pass", "pass"])).toBe("conditional-pass");
    expect(worstDecision(["conditional-fail", "conditional-pass"])).toBe("conditional-fail");
    expect(worstDecision(["fail", "conditional-fail", "pass"])).toBe("fail");
  });
});
