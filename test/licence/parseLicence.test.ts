import { describe, expect, it } from "vitest";
import { LicenceFileError } from "../../src/errors.js";
import { LICENCE_FIELDS, parseLicence } from "../../src/licence/index.js";

const FILE = "site-a.json";

/** The LicenceFileError that parsing `text` throws (fails the test when nothing is thrown). */
function refusal(text: string): LicenceFileError {
  try {
    parseLicence(text, FILE);
  } catch (e) {
    if (e instanceof LicenceFileError) return e;
    throw e;
  }
  throw new Error(`accepted: ${text}`);
}

/** Expects `licence` (one field or several) to be refused, naming `field` and matching `rule`. */
function expectRefused(licence: unknown, field: string, rule: RegExp): void {
  const e = refusal(typeof licence === "string" ? licence : JSON.stringify(licence));
  expect(e.field).toBe(field);
  expect(e.file).toBe(FILE);
  expect(e.code).toBe("licence_file");
  expect(e.message.startsWith(`${FILE}: field ${field}: `)).toBe(true);
  expect(e.message).toMatch(rule);
  expect(e.message).not.toMatch(/\n/); // one line (RULES: bad input is one clear line)
}

describe("parseLicence(text, fileName) accepts", () => {
  it("the example licence of docs/interface.md, every field as given", () => {
    const text = JSON.stringify({
      assignedFrequencyHz: 156800000, frequencyTolerancePpm: 5, emissionDesignator: "16K0F3E",
      maxDeviationHz: 5000, channelSpacingHz: 25000, maskResolutionHz: 300,
      mask: [[0, 0], [10000, -25], [12500, -35], [25000, -60]], authorisedBandwidthHz: 20000,
      maskReference: "carrier", maskDetector: "peak-hold",
    });
    expect(parseLicence(text, FILE)).toEqual(JSON.parse(text));
  });

  it("an empty object (every field is optional), a rule mask by name, a byte-order mark", () => {
    expect(parseLicence("{}", FILE)).toEqual({});
    expect(parseLicence('{"mask": "cfr-90.210-d", "transmitterPowerW": 25, "frequencyToleranceHz": 2000}', FILE)).toEqual({
      mask: "cfr-90.210-d", transmitterPowerW: 25, frequencyToleranceHz: 2000,
    });
    expect(parseLicence('\uFEFF{"maxDeviationHz": 2500}', FILE)).toEqual({ maxDeviationHz: 2500 });
  });

  it("knows every field the interface lists (docs/interface.md, plus transmitterPowerW)", () => {
    expect([...LICENCE_FIELDS].sort()).toEqual([
      "assignedFrequencyHz", "authorisedBandwidthHz", "channelSpacingHz", "emissionDesignator", "frequencyToleranceHz",
      "frequencyTolerancePpm", "mask", "maskDetector", "maskReference", "maskResolutionHz", "maxDeviationHz", "transmitterPowerW",
    ]);
  });
});

describe("parseLicence(text, fileName) refuses, naming the field and the rule", () => {
  it("text that is not JSON, with line and column", () => {
    expectRefused('{\n  "maxDeviationHz": 5000,\n}', "(file)", /line 3, column 1: expected a property name in double quotes/);
    expectRefused('{"maxDeviationHz": }', "(file)", /line 1, column 20: expected a value/);
    expectRefused('{"maxDeviationHz": 5000', "(file)", /the file ends here/);
    expectRefused("", "(file)", /is empty/);
    expectRefused(" \n", "(file)", /is empty/);
    expectRefused('{"a": 1} x', "(file)", /column 10: expected the end of the file/);
    expectRefused('{"maxDeviationHz": 5e}', "(file)", /expected a digit/);
  });

  it("a top level that is not an object", () => {
    expectRefused("[1, 2]", "(top level)", /must be a JSON object.*not an array/);
    expectRefused("5000", "(top level)", /not 5000/);
    expectRefused("null", "(top level)", /not null/);
  });

  it("an unknown field, listing the known ones and a near name", () => {
    expectRefused({ maxDeviation: 5000 }, "maxDeviation", /not a licence field \(did you mean maxDeviationHz\?\); known: assignedFrequencyHz, /);
    expectRefused({ colour: "red" }, "colour", /known: .*transmitterPowerW/);
    expectRefused('{"__proto__": {"maxDeviationHz": 1}}', "__proto__", /not a licence field/);
  });

  it("a value of the wrong type", () => {
    expectRefused({ maxDeviationHz: "5k" }, "maxDeviationHz", /must be a number > 0 \(Hz\), not "5k"/);
    expectRefused({ assignedFrequencyHz: null }, "assignedFrequencyHz", /not null/);
    expectRefused({ transmitterPowerW: true }, "transmitterPowerW", /must be a number > 0 \(W\), not true/);
    expectRefused({ emissionDesignator: 16 }, "emissionDesignator", /must be an emission designator string/);
    expectRefused({ maskReference: 1 }, "maskReference", /must be "carrier" or "peak", not 1/);
  });

  it("a number too large for a double (1e999 reads as Infinity)", () => {
    expectRefused('{"assignedFrequencyHz": 1e999}', "assignedFrequencyHz", /finite/);
  });

  it("assignedFrequencyHz <= 0", () => {
    expectRefused({ assignedFrequencyHz: 0 }, "assignedFrequencyHz", /must be > 0 \(Hz\), not 0/);
    expectRefused({ assignedFrequencyHz: -156e6 }, "assignedFrequencyHz", /must be > 0/);
  });

  it("a tolerance <= 0 (a tolerance of zero cannot be met by any measurement)", () => {
    expectRefused({ frequencyTolerancePpm: 0 }, "frequencyTolerancePpm", /must be > 0 \(ppm\)/);
    expectRefused({ frequencyToleranceHz: -2000 }, "frequencyToleranceHz", /must be > 0 \(Hz\)/);
  });

  it("both tolerances: pick one", () => {
    expectRefused({ frequencyTolerancePpm: 5, frequencyToleranceHz: 750 }, "frequencyToleranceHz", /pick one/);
  });

  for (const field of ["maxDeviationHz", "channelSpacingHz", "authorisedBandwidthHz", "maskResolutionHz", "transmitterPowerW"]) {
    it(`${field} <= 0`, () => {
      expectRefused({ [field]: 0 }, field, /must be > 0/);
      expectRefused({ [field]: -1 }, field, /must be > 0/);
    });
  }

  it("a designator that does not parse, saying why (RR Appendix 1)", () => {
    expectRefused({ emissionDesignator: "16KF3E" }, "emissionDesignator", /not an emission designator.*"16K" has 3 characters/);
    expectRefused({ emissionDesignator: "16K0Z3E" }, "emissionDesignator", /"Z" is not a first symbol/);
  });

  it("a mask that is not an array of [offsetHz, levelDbc] pairs", () => {
    expectRefused({ mask: { "0": 0 } }, "mask", /must be an array of \[offsetHz, levelDbc\] pairs or the name of a rule mask/);
    expectRefused({ mask: [] }, "mask", /has no points/);
    expectRefused({ mask: [[0, 0], [1000]] }, "mask", /point 1 \(\[1000\]\) is not an \[offsetHz, levelDbc\] pair/);
    expectRefused({ mask: [[0, 0], [1000, "-20"]] }, "mask", /point 1 .* is not an \[offsetHz, levelDbc\] pair/);
    expectRefused({ mask: [5000, -20] }, "mask", /point 0 \(5000\)/);
  });

  it("a mask whose offsets do not strictly increase", () => {
    expectRefused({ mask: [[0, 0], [10000, -25], [10000, -35]] }, "mask", /point 2 has offset 10000 Hz, not above the previous point's 10000 Hz/);
    expectRefused({ mask: [[0, 0], [10000, -25], [5000, -35]] }, "mask", /strictly increase/);
  });

  it("a mask offset < 0", () => {
    expectRefused({ mask: [[-5000, 0], [10000, -25]] }, "mask", /point 0 has offset -5000 Hz; .*>= 0/);
  });

  it("a mask level > 0", () => {
    expectRefused({ mask: [[0, 0], [10000, 3]] }, "mask", /point 1 has level 3 dB; .*<= 0/);
  });

  it("an unknown rule-mask name, listing the names", () => {
    expectRefused({ mask: "cfr-90.210-z" }, "mask", /"cfr-90.210-z" is not a rule mask; known: cfr-90.210-b, cfr-90.210-c, .*cfr-73.317/);
  });

  it("bad enum values", () => {
    expectRefused({ maskReference: "average" }, "maskReference", /must be "carrier" or "peak", not "average"/);
    expectRefused({ maskDetector: "peak" }, "maskDetector", /must be "peak-hold" or "average", not "peak"/);
  });

  it("a maskReference that contradicts the named rule's own reference", () => {
    // 47 CFR 90.210(d): mask D is relative to the highest emission within the authorised bandwidth.
    expectRefused({ mask: "cfr-90.210-d", maskReference: "carrier" }, "maskReference", /contradicts mask cfr-90.210-d.*"peak"/);
  });
});
