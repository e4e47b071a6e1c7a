// SigMF recordings, checked against the SigMF specification v1.2.x (sigmf/SigMF repository:
// the "Dataset Format" ABNF and the JSON schema; REFERENCES.md §9).
import { describe, expect, it } from "vitest";
import { openCapture, parseSigmfDatatype, parseSigmfMeta } from "../../src/capture/index.js";
import { complexTone, int16le, maxAbsDiff, put, readAll } from "./fixtures.js";

const F32 = 2 ** -24; // float32 rounding, |x| ≤ 1 (IEEE 754 binary32)

function meta(global: object, captures: object[] = [{ "core:sample_start": 0 }], extra: object = {}): string {
  return JSON.stringify({ global: { "core:version": "1.2.0", ...global }, captures, annotations: [], ...extra });
}

function f32(iq: ArrayLike<number>): Buffer {
  return Buffer.from(new Float32Array(Array.from(iq)).buffer);
}

describe("parseSigmfDatatype(text) follows the SigMF Dataset Format grammar", () => {
  it("parseSigmfDatatype accepts (r|c)(f32|f64|i32|i16|u32|u16)(_le|_be) and (r|c)(i8|u8) (SigMF ABNF)", () => {
    for (const t of ["cf32_le", "cf64_be", "ci32_le", "ci16_be", "cu16_le", "cu32_be", "rf32_le", "ri16_le", "ci8", "cu8", "ri8", "ru8"]) {
      expect(parseSigmfDatatype(t), t).not.toBeNull();
    }
    expect(parseSigmfDatatype("cf32_le")).toMatchObject({ complex: true, kind: "f", bits: 32, endian: "le", format: "cf32_le" });
    expect(parseSigmfDatatype("ri16_be")).toMatchObject({ complex: false, kind: "i", bits: 16, endian: "be", format: "ri16_be" });
    expect(parseSigmfDatatype("cu8")).toMatchObject({ complex: true, kind: "u", bits: 8, endian: null, format: "cu8" });
  });

  it("parseSigmfDatatype rejects what the grammar does not produce: no endianness on a multi-byte type, other widths, case", () => {
    for (const t of ["cf32", "ci16", "cf16_le", "ci24_le", "ci64_le", "xi16_le", "ci16_LE", "CI16_le", "ci16le", "c_i8", ""]) {
      expect(parseSigmfDatatype(t), t).toBeNull();
    }
  });

  it("parseSigmfDatatype marks valid types iqaudit cannot decode (unsigned 16/32-bit, big-endian float and i32)", () => {
    for (const t of ["cu16_le", "cu16_be", "cu32_le", "cf32_be", "cf64_be", "ci32_be", "ru16_le"]) {
      expect(parseSigmfDatatype(t)?.format, t).toBeNull();
    }
  });

  it("parseSigmfDatatype reads an 8-bit type with a needless endianness suffix (allowed by the schema pattern) with a warning", () => {
    const d = parseSigmfDatatype("ci8_le");
    expect(d?.format).toBe("ci8");
    expect(d?.warning).toMatch(/ci8_le .* read as ci8/);
  });
});

describe("parseSigmfMeta(text, path) reads the description and annotations (SigMF v1.2 core namespace)", () => {
  it("takes core:description and each annotation's sample span (less global core:offset), edges, label and comment", () => {
    const r = parseSigmfMeta(
      meta({ "core:datatype": "cf32_le", "core:description": "a test", "core:offset": 1000 }, [{ "core:sample_start": 1000 }], {
        annotations: [
          { "core:sample_start": 1500, "core:sample_count": 250, "core:freq_lower_edge": 4.6e8, "core:freq_upper_edge": 4.6001e8, "core:label": "burst", "core:comment": "c" },
          { "core:sample_start": 1000 },
        ],
      }),
      "x.sigmf-meta",
    );
    expect(r.description).toBe("a test");
    // SigMF: "All sample indices in SigMF are absolute", counted from core:offset: 1500 − 1000 = 500.
    expect(r.annotations).toEqual([
      { sampleStart: 500, sampleCount: 250, lowerFrequencyHz: 4.6e8, upperFrequencyHz: 4.6001e8, label: "burst", comment: "c" },
      { sampleStart: 0, sampleCount: null, lowerFrequencyHz: null, upperFrequencyHz: null, label: null, comment: null },
    ]);
  });

  it("leaves out an annotation without core:sample_start (SigMF requires it), with a warning", () => {
    const r = parseSigmfMeta(meta({ "core:datatype": "cf32_le" }, undefined, { annotations: [{ "core:label": "x" }] }), "y.sigmf-meta");
    expect(r.annotations).toEqual([]);
    expect(r.warnings.join(" ")).toMatch(/annotations\[0\] .* no core:sample_start/);
  });
});

describe("parseSigmfMeta(text, path) reads the core fields", () => {
  it("parseSigmfMeta takes datatype, sample_rate, and captures[0] frequency, header_bytes and datetime", () => {
    const r = parseSigmfMeta(
      meta({ "core:datatype": "ci16_le", "core:sample_rate": 2.4e6 }, [
        { "core:sample_start": 0, "core:frequency": 1.568e8, "core:header_bytes": 32, "core:datetime": "1955-11-05T14:00:00.000Z" },
      ]),
      "x.sigmf-meta",
    );
    // The datetime is the example value of the SigMF schema for core:datetime.
    expect(r).toMatchObject({ sampleRateHz: 2.4e6, frequencyHz: 1.568e8, headerBytes: 32, datetime: "1955-11-05T14:00:00.000Z", warnings: [] });
    expect(r.datatype.format).toBe("ci16_le");
  });

  it("parseSigmfMeta drops a core:datetime that is not RFC 3339 with the Z offset (the only offset SigMF allows), with a warning", () => {
    for (const dt of ["2024-03-01T12:00:00+01:00", "2024-03-01 12:00:00Z", "2024-13-01T12:00:00Z", "2024-03-01T24:00:00Z", "yesterday"]) {
      const r = parseSigmfMeta(meta({ "core:datatype": "cf32_le" }, [{ "core:sample_start": 0, "core:datetime": dt }]), "x.sigmf-meta");
      expect(r.datetime, dt).toBeNull();
      expect(r.warnings.join(" "), dt).toMatch(/not an RFC 3339 time with the Z offset/);
    }
    const frac = parseSigmfMeta(meta({ "core:datatype": "cf32_le" }, [{ "core:sample_start": 0, "core:datetime": "2024-03-01T12:00:00.123456789Z" }]), "x");
    expect(frac.datetime).toBe("2024-03-01T12:00:00.123456789Z"); // any number of fraction digits (SigMF ABNF time-secfrac)
  });

  it("parseSigmfMeta warns for missing required-but-unneeded fields: core:version, captures, annotations (SigMF schema)", () => {
    const r = parseSigmfMeta(JSON.stringify({ global: { "core:datatype": "cf32_le", "core:sample_rate": 1e6 } }), "y.sigmf-meta");
    expect(r.warnings).toHaveLength(3);
    expect(r.frequencyHz).toBeNull();
  });

  it("parseSigmfMeta uses the first of several capture segments with different frequencies, and warns", () => {
    const r = parseSigmfMeta(
      meta({ "core:datatype": "cf32_le" }, [
        { "core:sample_start": 0, "core:frequency": 1.5e8 },
        { "core:sample_start": 1000, "core:frequency": 1.6e8 },
      ]),
      "z.sigmf-meta",
    );
    expect(r.frequencyHz).toBe(1.5e8);
    expect(r.captureCount).toBe(2);
    expect(r.warnings.join(" ")).toMatch(/2 capture segments with different core:frequency values; the first \(150000000 Hz\)/);
  });
});

describe("openCapture(SigMF recording)", () => {
  const tone = complexTone(500);

  it("openCapture(.sigmf-meta or .sigmf-data) reads the dataset with the metadata's rate, centre and datetime", async () => {
    put("rec.sigmf-data", f32(tone));
    const metaPath = put(
      "rec.sigmf-meta",
      meta({ "core:datatype": "cf32_le", "core:sample_rate": 1e6 }, [{ "core:sample_start": 0, "core:frequency": 4.6e8, "core:datetime": "2031-06-01T08:30:00Z" }]),
    );
    for (const path of [metaPath, metaPath.replace(/meta$/, "data")]) {
      const source = await openCapture(path);
      expect(source.meta).toMatchObject({
        path,
        container: "sigmf",
        format: "cf32_le",
        sampleRateHz: 1e6,
        centerHz: 4.6e8,
        datetime: "2031-06-01T08:30:00Z",
        fileSamples: 500,
        dataOffsetBytes: 0,
        fileBytes: 4000,
        origin: { format: "sigmf", sampleRateHz: "sigmf", centerHz: "sigmf" },
        warnings: [],
      });
      expect(source.meta.dataPath).toMatch(/rec\.sigmf-data$/);
      expect(maxAbsDiff(await readAll(source), tone)).toBeLessThanOrEqual(F32);
      await source.close();
    }
  });

  it("openCapture(SigMF, flags) lets --center, --rate and --format override the metadata, each with a warning", async () => {
    put("over.sigmf-data", int16le(tone));
    const path = put("over.sigmf-meta", meta({ "core:datatype": "cf32_le", "core:sample_rate": 2e6 }, [{ "core:sample_start": 0, "core:frequency": 1.5e8 }]));
    const source = await openCapture(path, { centerHz: 1e8, sampleRateHz: 1e6, format: "ci16_le" });
    expect(source.meta).toMatchObject({ format: "ci16_le", sampleRateHz: 1e6, centerHz: 1e8, origin: { format: "flag", sampleRateHz: "flag", centerHz: "flag" } });
    expect(source.meta.warnings).toEqual([
      "--format ci16_le overrides the SigMF core:datatype cf32_le.",
      "--rate 1e6 overrides the SigMF core:sample_rate 2e6.",
      "--center 1e8 overrides the SigMF core:frequency 1.5e8.",
    ]);
    expect(maxAbsDiff(await readAll(source), tone)).toBeLessThanOrEqual(0.5 / 32768 + F32);
    await source.close();
  });

  it("openCapture(non-conforming dataset) honours core:dataset, core:header_bytes and core:trailing_bytes (SigMF schema)", async () => {
    const header = Buffer.alloc(24, 0xee);
    const footer = Buffer.alloc(10, 0xdd);
    put("ncd_capture.dat", Buffer.concat([header, int16le(tone), footer]));
    const path = put(
      "ncd.sigmf-meta",
      meta({ "core:datatype": "ci16_le", "core:sample_rate": 48000, "core:dataset": "ncd_capture.dat", "core:trailing_bytes": 10 }, [
        { "core:sample_start": 0, "core:header_bytes": 24 },
      ]),
    );
    const source = await openCapture(path);
    expect(source.meta).toMatchObject({ dataOffsetBytes: 24, fileSamples: 500, trailingBytes: 0, fileBytes: 24 + 2000 + 10 });
    expect(source.meta.dataPath).toMatch(/ncd_capture\.dat$/);
    expect(maxAbsDiff(await readAll(source), tone)).toBeLessThanOrEqual(0.5 / 32768 + F32);
    await source.close();
  });

  it("openCapture(big-endian ci16_be dataset) decodes it", async () => {
    const be = Buffer.alloc(4);
    be.writeInt16BE(-16384, 0);
    be.writeInt16BE(8192, 2);
    put("be.sigmf-data", be);
    const source = await openCapture(put("be.sigmf-meta", meta({ "core:datatype": "ci16_be", "core:sample_rate": 1000 })));
    expect(Array.from(await readAll(source))).toEqual([-0.5, 0.25]);
    await source.close();
  });

  it("openCapture(real SigMF datatype, { real }) reads it with Q = 0", async () => {
    put("real.sigmf-data", f32([0.5, -0.25, 0.125]));
    const source = await openCapture(put("real.sigmf-meta", meta({ "core:datatype": "rf32_le", "core:sample_rate": 8000 })), { real: true });
    expect(source.meta).toMatchObject({ complex: false, fileSamples: 3, frameBytes: 4 });
    expect(Array.from(await readAll(source))).toEqual([0.5, 0, -0.25, 0, 0.125, 0]);
    await source.close();
  });
});
