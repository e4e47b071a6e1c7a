import { describe, expect, it } from "vitest";
import { DB_CEILING, DB_FLOOR, dbToPower, powerToDb } from "../../src/dsp/index.js";

describe("powerToDb(power)", () => {
  it("is 10·log10 for ordinary powers (definition of the decibel)", () => {
    expect(powerToDb(1)).toBe(0);
    expect(powerToDb(2)).toBeCloseTo(3.0103, 4); // 10·log10(2), common practice "3 dB"
    expect(powerToDb(1e-6)).toBeCloseTo(-60, 12);
    expect(dbToPower(-30)).toBeCloseTo(1e-3, 15);
  });

  it("stays finite for 0, negative, NaN and infinite input, so JSON never receives null", () => {
    for (const p of [0, -1, Number.NaN, Number.NEGATIVE_INFINITY]) expect(powerToDb(p)).toBe(DB_FLOOR);
    expect(powerToDb(Number.POSITIVE_INFINITY)).toBe(DB_CEILING);
    const json = JSON.parse(JSON.stringify({ v: powerToDb(0), w: powerToDb(1 / 0) })) as { v: number; w: number };
    expect(json).toEqual({ v: -300, w: 300 });
  });
});
