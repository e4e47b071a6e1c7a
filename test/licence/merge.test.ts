import { describe, expect, it } from "vitest";
import { LicenceFileError } from "../../src/errors.js";
import { findTemplate, mergeLicences } from "../../src/licence/index.js";

// The rule under test is docs/interface.md "Licence file": "a licence file given as well
// overrides it [the template] field by field". Template values are those of REFERENCES.md §4.
const PATH = "site-a/licence.json";

describe("mergeLicences(template, file)", () => {
  it("lets the file's fields win and records where each field came from", () => {
    const t = findTemplate("vhf-land-mobile-25k");
    const m = mergeLicences(t, { path: PATH, licence: { assignedFrequencyHz: 151.0125e6, maxDeviationHz: 4000 } });
    expect(m.licence.maxDeviationHz).toBe(4000); // the file's
    expect(m.licence.authorisedBandwidthHz).toBe(20000); // the template's, 47 CFR 90.209(b)(5)
    expect(m.licence.assignedFrequencyHz).toBe(151.0125e6);
    expect(m.origins.find((o) => o.field === "maxDeviationHz")).toEqual({ field: "maxDeviationHz", origin: "file", source: PATH, status: null, note: null });
    expect(m.origins.find((o) => o.field === "authorisedBandwidthHz")).toEqual({
      field: "authorisedBandwidthHz", origin: "template", source: t.values.authorisedBandwidthHz?.source, status: "V", note: null,
    });
    // One origin per field of the merged licence, no more.
    expect(m.origins.map((o) => o.field).sort()).toEqual(Object.keys(m.licence).sort());
    expect(m).toMatchObject({ template: "vhf-land-mobile-25k", file: PATH, dropped: [] });
  });

  it("gives the template's limits alone, or the file's fields alone", () => {
    const t = findTemplate("fm-broadcast");
    const onlyTemplate = mergeLicences(t, null);
    expect(onlyTemplate.licence.maxDeviationHz).toBe(75000); // 47 CFR 73.310(a)
    expect(onlyTemplate.origins.every((o) => o.origin === "template")).toBe(true);
    expect(onlyTemplate.file).toBeNull();
    const onlyFile = mergeLicences(null, { path: PATH, licence: { maxDeviationHz: 2500 } });
    expect(onlyFile).toEqual({
      licence: { maxDeviationHz: 2500 }, origins: [{ field: "maxDeviationHz", origin: "file", source: PATH, status: null, note: null }],
      template: null, file: PATH, dropped: [],
    });
  });

  it("replaces a tolerance in the other unit: a licence states one", () => {
    const m = mergeLicences(findTemplate("vhf-land-mobile-25k"), { path: PATH, licence: { frequencyToleranceHz: 500 } });
    expect(m.licence.frequencyToleranceHz).toBe(500);
    expect(m.licence.frequencyTolerancePpm).toBeUndefined();
    expect(m.dropped).toEqual([{ field: "frequencyTolerancePpm", reason: expect.stringMatching(/frequencyToleranceHz instead/) }]);
  });

  it("drops the template's mask settings with its mask when the file gives another mask, keeps them for the same mask", () => {
    const t = findTemplate("vhf-land-mobile-12k5");
    const other = mergeLicences(t, { path: PATH, licence: { mask: [[0, 0], [6250, -40]] } });
    expect(other.licence.maskReference).toBeUndefined();
    expect(other.licence.maskResolutionHz).toBeUndefined();
    expect(other.dropped.map((d) => d.field).sort()).toEqual(["maskDetector", "maskReference", "maskResolutionHz"]);
    const same = mergeLicences(t, { path: PATH, licence: { mask: "cfr-90.210-d", transmitterPowerW: 25 } });
    expect(same.licence).toMatchObject({ maskReference: "peak", maskResolutionHz: 100, transmitterPowerW: 25 }); // 47 CFR 90.210(d)
  });

  it("takes a dropped template value off the dropped list once the file gives it", () => {
    const t = findTemplate("maritime-vhf");
    expect(mergeLicences(t, null).dropped.map((d) => d.field)).toEqual(["frequencyTolerancePpm"]); // status M
    const m = mergeLicences(t, { path: PATH, licence: { frequencyTolerancePpm: 10, authorisedBandwidthHz: 16000 } });
    expect(m.dropped).toEqual([]);
    expect(m.origins.find((o) => o.field === "frequencyTolerancePpm")?.origin).toBe("file");
  });

  it("refuses, naming the file, a maskReference that contradicts the template's rule mask", () => {
    const merge = () => mergeLicences(findTemplate("vhf-land-mobile-12k5"), { path: PATH, licence: { maskReference: "carrier" } });
    expect(merge).toThrow(LicenceFileError);
    expect(merge).toThrow(/^site-a\/licence\.json: field maskReference: "carrier" contradicts mask cfr-90\.210-d/);
  });
});
