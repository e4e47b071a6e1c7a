import { readdirSync, readFileSync } from "node:fs";
import { describe, expect, it } from "vitest";
import { LicenceFileError, ParameterError, UsageError } from "../../src/errors.js";
import {
  findTemplate, licenceMask, listTemplates, parseTemplate, ruleMaskReference, templateLimits, type Template,
} from "../../src/licence/index.js";

// The template files, read here directly (not through the loader) as the independent view.
const FOLDER = new URL("../../templates/licence/", import.meta.url);
const FILES = readdirSync(FOLDER).filter((f) => f.endsWith(".json")).sort();
type RawValue = { value: unknown; source: string; status: string; tradePractice?: boolean; note?: string };
const RAW = new Map(FILES.map((f) => [f.slice(0, -5), JSON.parse(readFileSync(new URL(f, FOLDER), "utf8")) as { values: Record<string, RawValue> }]));

describe("listTemplates()", () => {
  it("loads every file of templates/licence/, each named after its file", () => {
    expect(listTemplates().map((t) => t.name)).toEqual(FILES.map((f) => f.slice(0, -5)));
    for (const name of ["vhf-land-mobile-25k", "vhf-land-mobile-12k5", "uhf-land-mobile-12k5", "maritime-vhf", "fm-broadcast"]) {
      expect(RAW.has(name), name).toBe(true);
    }
  });

  it("gives every value a source and one of the REFERENCES.md statuses V, V2, C, CP, M", () => {
    for (const [name, raw] of RAW) {
      for (const [field, v] of Object.entries(raw.values)) {
        expect(["V", "V2", "C", "CP", "M"], `${name}.${field}`).toContain(v.status);
        expect(v.source.length, `${name}.${field}`).toBeGreaterThan(10);
      }
    }
  });

  it("is shipped: package.json lists templates in its files", () => {
    const pkg = JSON.parse(readFileSync(new URL("../../package.json", import.meta.url), "utf8")) as { files: string[] };
    expect(pkg.files).toContain("templates");
  });
});

describe("templateLimits(t)", () => {
  it("keeps only V, V2 and trade-practice CP values as limits and lists every other value as dropped", () => {
    for (const t of listTemplates()) {
      const { licence, dropped } = templateLimits(t);
      const raw = RAW.get(t.name)?.values ?? {};
      for (const [field, v] of Object.entries(raw)) {
        const isLimit = v.status === "V" || v.status === "V2" || (v.status === "CP" && v.tradePractice === true);
        expect(field in licence, `${t.name}.${field}`).toBe(isLimit);
        expect(dropped.some((d) => d.field === field), `${t.name}.${field}`).toBe(!isLimit);
        if (isLimit) expect((licence as Record<string, unknown>)[field]).toEqual(v.value);
      }
    }
  });

  it("drops the maritime 10 ppm tolerance: it is from memory (REFERENCES.md §4, status M)", () => {
    const { licence, dropped } = templateLimits(findTemplate("maritime-vhf"));
    expect(licence.frequencyTolerancePpm).toBeUndefined();
    expect(dropped).toEqual([{ field: "frequencyTolerancePpm", reason: expect.stringMatching(/from memory.*\(M, /) }]);
  });
});

describe("the templates' values (REFERENCES.md §4)", () => {
  const limits = (name: string) => templateLimits(findTemplate(name)).licence;
  it("25 kHz VHF land mobile", () => {
    expect(limits("vhf-land-mobile-25k")).toMatchObject({
      authorisedBandwidthHz: 20000, // 47 CFR 90.209(b)(5) Table 1, 25 kHz equipment (V)
      frequencyTolerancePpm: 5, // 47 CFR 90.213 Table 1, 150–174 MHz fixed/base (V)
      maxDeviationHz: 5000, // 47 CFR 2.202(g), derived from 16K0F3E (V derived)
      emissionDesignator: "16K0F3E", // 47 CFR 2.202(g) worked example (V)
      mask: "cfr-90.210-b", // 47 CFR 90.210 Table 1: 25 kHz equipment B or C (V)
      maskReference: "carrier", // 47 CFR 90.210 introduction (V)
    });
  });

  it("12.5 kHz VHF and UHF land mobile", () => {
    const common = {
      authorisedBandwidthHz: 11250, // 47 CFR 90.209(b)(5) Table 1, 12.5 kHz equipment (V)
      mask: "cfr-90.210-d", // 47 CFR 90.210 Table 1: 12.5 kHz equipment mask D (V)
      maskReference: "peak", // 47 CFR 90.210(d): the highest emission in the authorised bandwidth (V)
      maxDeviationHz: 2500, // trade practice (CP)
    };
    expect(limits("vhf-land-mobile-12k5")).toMatchObject({ ...common, frequencyTolerancePpm: 2.5 }); // 90.213, 150–174 MHz fixed/base 12.5 kHz (V)
    expect(limits("uhf-land-mobile-12k5")).toMatchObject({ ...common, frequencyTolerancePpm: 1.5 }); // 90.213, 421–512 MHz fixed/base 12.5 kHz (V)
  });

  it("maritime VHF and FM broadcast", () => {
    expect(limits("maritime-vhf")).toEqual({
      maxDeviationHz: 5000, // 47 CFR 80.213(a)(2) (V)
      mask: "cfr-80.211-f", // 47 CFR 80.211(f) (V)
      maskReference: "carrier", // 80.211(f): below the mean output power (V)
    });
    expect(limits("fm-broadcast")).toEqual({
      maxDeviationHz: 75000, // 47 CFR 73.310(a) (V)
      frequencyToleranceHz: 2000, // 47 CFR 73.1545(b), above 10 W (V2)
      mask: "cfr-73.317", // 47 CFR 73.317(b)–(d) (V)
      maskReference: "carrier", // 73.317: below the unmodulated carrier (V)
      emissionDesignator: "180KF3E", // 47 CFR 2.202(g) worked example (V)
    });
  });

  it("every template's maskReference is its rule mask's own reference", () => {
    for (const t of listTemplates()) {
      const mask = t.values.mask?.value;
      if (typeof mask === "string") expect(t.values.maskReference?.value, t.name).toBe(ruleMaskReference(mask)?.reference);
    }
  });

  it("maritime: the mask needs the licence file's authorisedBandwidthHz (ParameterError naming it)", () => {
    const licence = limits("maritime-vhf");
    expect(() => licenceMask(licence)).toThrow(ParameterError);
    expect(() => licenceMask(licence)).toThrow(/authorisedBandwidthHz/);
    // With 16 kHz given: 25 dB beyond 50 % (8 kHz), 47 CFR 80.211(f).
    expect(licenceMask({ ...licence, authorisedBandwidthHz: 16000 })?.allowedDb(10000)).toBe(-25);
  });
});

describe("findTemplate(name)", () => {
  it("throws UsageError on --template listing the known names", () => {
    try {
      findTemplate("uhf-25k");
      expect.unreachable();
    } catch (e) {
      expect(e).toBeInstanceOf(UsageError);
      expect((e as UsageError).option).toBe("--template");
      expect((e as Error).message).toMatch(/^--template: unknown template uhf-25k; known: fm-broadcast, .* \(iqaudit check --list-templates\)$/);
    }
  });
});

describe("parseTemplate(text, filePath, name) refuses a broken template file", () => {
  const good = (values: Record<string, unknown>) => JSON.stringify({ name: "t", description: "d", values });
  const refusal = (text: string, name = "t"): LicenceFileError => {
    try {
      parseTemplate(text, "t.json", name);
    } catch (e) {
      if (e instanceof LicenceFileError) return e;
      throw e;
    }
    throw new Error("accepted");
  };
  const v = (value: unknown, status = "V", more: Record<string, unknown> = {}) => ({ value, source: "47 CFR 1.1", status, ...more });

  it("accepts a good one", () => {
    const t: Template = parseTemplate(good({ maxDeviationHz: v(5000) }), "t.json", "t");
    expect(t.values.maxDeviationHz).toEqual({ value: 5000, source: "47 CFR 1.1", status: "V" });
  });

  it("naming the field for each broken rule", () => {
    expect(refusal(good({}), "other").field).toBe("name");
    expect(refusal(JSON.stringify({ name: "t", description: "d", values: {}, extra: 1 })).field).toBe("extra");
    expect(refusal(good({ maxDeviationHz: v(-1) })).field).toBe("values.maxDeviationHz.value");
    expect(refusal(good({ maxDeviation: v(5000) })).field).toBe("values.maxDeviation.value");
    expect(refusal(good({ maxDeviationHz: v(5000, "V3") })).field).toBe("values.maxDeviationHz.status");
    expect(refusal(good({ maxDeviationHz: v(5000, "V", { tradePractice: true }) })).field).toBe("values.maxDeviationHz.tradePractice");
    expect(refusal(good({ maxDeviationHz: { value: 5000, status: "V" } })).field).toBe("values.maxDeviationHz.source");
    expect(refusal(good({ maxDeviationHz: v(5000, "V", { url: "x" }) })).field).toBe("values.maxDeviationHz.url");
    expect(refusal(good({ mask: v("cfr-90.210-d"), maskReference: v("carrier") })).field).toBe("maskReference");
  });
});
