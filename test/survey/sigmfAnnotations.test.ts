// The survey's SigMF annotations against the field rules of the SigMF specification v1.2.2
// (sigmf-schema.json of the specification's repository): required fields, types, ranges,
// ordering, and the both-or-neither rule of the frequency edges. The validator below is written
// from those rules, not from the writer.
import { describe, expect, it } from "vitest";
import { annotatedSigmfMeta, surveySigmfMetaPath, SIGMF_LABEL_MAX, type AnnotatedSigmfInput } from "../../src/survey/index.js";

const U64_MAX = 18446744073709552000;

/** Problems of `meta` under the SigMF v1.2.2 schema rules that apply to what the survey writes. */
function schemaProblems(meta: Record<string, unknown>): string[] {
  const p: string[] = [];
  const isUInt = (v: unknown): boolean => typeof v === "number" && Number.isInteger(v) && v >= 0 && v <= U64_MAX;
  const inHz = (v: unknown): boolean => typeof v === "number" && v >= -1e12 && v <= 1e12;
  for (const key of Object.keys(meta)) if (!["global", "captures", "annotations"].includes(key)) p.push(`top-level ${key} (additionalProperties false)`);
  const g = meta["global"] as Record<string, unknown> | undefined;
  if (typeof g !== "object" || g === null) return [...p, "global missing"];
  if (typeof g["core:datatype"] !== "string" || !/^(c|r)(f32|f64|i32|i16|u32|u16|i8|u8)(_le|_be)?/.test(g["core:datatype"] as string)) p.push("core:datatype");
  if (typeof g["core:version"] !== "string" || !/^\d+\.\d+\.\d/.test(g["core:version"] as string)) p.push("core:version");
  const rate = g["core:sample_rate"];
  if (rate !== undefined && !(typeof rate === "number" && rate >= 1 && rate <= 1e12)) p.push("core:sample_rate");
  const ds = g["core:dataset"];
  if (ds !== undefined && !(typeof ds === "string" && /^[^\/\\:*?"<>|]+(\.[^\/\\:*?"<>|]+)*$/.test(ds))) p.push("core:dataset");
  for (const [name, list] of [["captures", meta["captures"]], ["annotations", meta["annotations"]]] as const) {
    if (!Array.isArray(list)) { p.push(`${name} missing`); continue; }
    let last = -1;
    for (const item of list as Record<string, unknown>[]) {
      const start = item["core:sample_start"];
      if (!isUInt(start)) p.push(`${name}: core:sample_start ${String(start)}`);
      else if ((start as number) < last) p.push(`${name} not sorted by core:sample_start`);
      else last = start as number;
      if (name === "captures" && item["core:frequency"] !== undefined && !inHz(item["core:frequency"])) p.push("core:frequency");
      if (name === "annotations") {
        if (item["core:sample_count"] !== undefined && !isUInt(item["core:sample_count"])) p.push("core:sample_count");
        const lo = item["core:freq_lower_edge"];
        const hi = item["core:freq_upper_edge"];
        if ((lo === undefined) !== (hi === undefined)) p.push("one frequency edge without the other");
        if (lo !== undefined && !(inHz(lo) && inHz(hi))) p.push("frequency edge out of range");
        for (const k of ["core:label", "core:comment", "core:generator"]) if (item[k] !== undefined && typeof item[k] !== "string") p.push(k);
      }
    }
  }
  return p;
}

const raw: AnnotatedSigmfInput = {
  base: null, datatype: "cu8", sampleRateHz: 1e6, centerHz: 165.2e6, dataFileName: "site_165.2MHz_1Msps.cu8", headerBytes: 0,
  generator: "iqaudit 0.1.0",
  annotations: [
    { startSample: 500_000, sampleCount: 250_000, lowerOffsetHz: 40_000, upperOffsetHz: 52_500, label: "2 fsk 2 4800 Bd burst telemetry" },
    { startSample: 0, sampleCount: 1_500_000, lowerOffsetHz: -230_000, upperOffsetHz: -219_000, label: "1 fm 15K0F3E" },
  ],
};

describe("annotatedSigmfMeta (SigMF v1.2.2 field rules)", () => {
  it("for a raw capture: new metadata naming the data file, annotations sorted, edges at RF", () => {
    const m = annotatedSigmfMeta(raw);
    expect(schemaProblems(m)).toEqual([]);
    const a = m["annotations"] as Record<string, unknown>[];
    expect(a.map((x) => x["core:sample_start"])).toEqual([0, 500_000]);
    // Edges at RF: centre + offset (the specification: at RF when the centre is known).
    expect(a[0]?.["core:freq_lower_edge"]).toBe(165.2e6 - 230_000);
    expect(a[0]?.["core:freq_upper_edge"]).toBe(165.2e6 - 219_000);
    // A label longer than the recommended 20 characters is cut, the whole text kept as a comment.
    expect((a[1]?.["core:label"] as string).length).toBeLessThanOrEqual(SIGMF_LABEL_MAX);
    expect(a[1]?.["core:comment"]).toBe("2 fsk 2 4800 Bd burst telemetry");
    expect((m["global"] as Record<string, unknown>)["core:dataset"]).toBe("site_165.2MHz_1Msps.cu8");
  });

  it("for a SigMF capture: a copy of its metadata, its own annotations kept, edges relative to baseband without a centre", () => {
    const base = {
      global: { "core:datatype": "ci16_le", "core:version": "1.2.0", "core:sample_rate": 250_000, "core:description": "quay links" },
      captures: [{ "core:sample_start": 0 }],
      annotations: [{ "core:sample_start": 100, "core:sample_count": 10, "core:label": "user note" }],
    };
    const m = annotatedSigmfMeta({ ...raw, base, centerHz: null, dataFileName: "quay-links.sigmf-data" });
    expect(schemaProblems(m)).toEqual([]);
    const a = m["annotations"] as Record<string, unknown>[];
    expect(a.map((x) => x["core:label"])).toEqual(["1 fm 15K0F3E", "user note", "2 fsk 2 4800 Bd burs"]);
    expect(a[0]?.["core:freq_lower_edge"]).toBe(-230_000);
    expect((m["global"] as Record<string, unknown>)["core:description"]).toBe("quay links");
    expect(base.annotations).toHaveLength(1); // the user's object is not changed
  });

  it("a WAV capture's header is declared as header bytes of a non-conforming dataset", () => {
    const m = annotatedSigmfMeta({ ...raw, datatype: "ci16_le", dataFileName: "launch.wav", headerBytes: 44 });
    expect(schemaProblems(m)).toEqual([]);
    expect((m["captures"] as Record<string, unknown>[])[0]?.["core:header_bytes"]).toBe(44);
  });

  it("the validator catches what the rules forbid (so the checks above can fail)", () => {
    expect(schemaProblems({ global: { "core:version": "1.2.2" }, captures: [], annotations: [] })).toContain("core:datatype");
    expect(schemaProblems({ global: { "core:datatype": "cu8", "core:version": "1.2.2" }, captures: [], annotations: [{ "core:sample_start": 5 }, { "core:sample_start": 1 }] }))
      .toContain("annotations not sorted by core:sample_start");
    expect(schemaProblems({ global: { "core:datatype": "cu8", "core:version": "1.2.2" }, captures: [], annotations: [{ "core:sample_start": 0, "core:freq_lower_edge": 1 }] }))
      .toContain("one frequency edge without the other");
  });

  it("names the file <capture>.survey.sigmf-meta beside the capture, never the capture's own metadata", () => {
    expect(surveySigmfMetaPath("/data/quay-links.sigmf-meta")).toBe("/data/quay-links.survey.sigmf-meta");
    expect(surveySigmfMetaPath("/data/quay-links.sigmf-data")).toBe("/data/quay-links.survey.sigmf-meta");
    expect(surveySigmfMetaPath("/data/site_1Msps.cu8")).toBe("/data/site_1Msps.cu8.survey.sigmf-meta");
  });
});
