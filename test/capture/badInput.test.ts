// Bad input of every kind the capture readers meet: each throws the right IqauditError class
// with a one-line message that names the file (or the option and the file). The rules are
// those of the report contract (interface.md, "Exit codes"), of RIFF/WAVEFORMATEX and EBU Tech
// 3306 (REFERENCES.md §9) and of the SigMF v1.2.x schema.
import { basename, join } from "node:path";
import { describe, expect, it } from "vitest";
import { CaptureFormatError, UsageError } from "../../src/errors.js";
import { encodeWav, openCapture, resolveSpan, type CaptureOptions } from "../../src/capture/index.js";
import { dir, fmtBody, put, riffChunk, riffFile } from "./fixtures.js";

type ErrorClass = typeof CaptureFormatError | typeof UsageError;

async function expectError(path: string, options: CaptureOptions, kind: ErrorClass, pattern: RegExp, names = path): Promise<void> {
  let caught: unknown = null;
  try {
    const source = await openCapture(path, options);
    await source.close();
  } catch (e) {
    caught = e;
  }
  expect(caught, `${basename(path)} should fail`).toBeInstanceOf(kind);
  const message = (caught as Error).message;
  expect(message).not.toContain("\n");
  expect(message).toContain(basename(names));
  expect(message).toMatch(pattern);
}

const goodWav = encodeWav({ format: "ci16_le", sampleRateHz: 8000 }, [0.5, 0.5, -0.5, -0.5, 0.25, 0]);
const fmt16 = riffChunk("fmt ", fmtBody(1, 2, 8000, 16));
const data4 = riffChunk("data", Buffer.alloc(8));

describe("openCapture(bad raw input)", () => {
  it("openCapture(missing file) is a CaptureFormatError naming it", async () => {
    await expectError(join(dir, "nowhere.cf32"), { sampleRateHz: 1e6 }, CaptureFormatError, /no such file/);
  });
  it("openCapture(empty file) is a CaptureFormatError: 0 samples", async () => {
    await expectError(put("empty.cf32", ""), { sampleRateHz: 1e6 }, CaptureFormatError, /empty/);
  });
  it("openCapture(file shorter than one sample) is a CaptureFormatError", async () => {
    await expectError(put("short.cf32", Buffer.alloc(5)), { sampleRateHz: 1e6 }, CaptureFormatError, /no whole sample.*5 bytes.*8/);
  });
  it("openCapture(unknown extension, no --format) is a UsageError asking for --format", async () => {
    await expectError(put("mystery.iq", Buffer.alloc(64)), { sampleRateHz: 1e6 }, UsageError, /^--format: is required.*\.iq/);
    await expectError(put("noext", Buffer.alloc(64)), { sampleRateHz: 1e6 }, UsageError, /--format/);
  });
  it("openCapture(raw file without rate) is a UsageError for --rate naming the file", async () => {
    await expectError(put("norate.cu8", Buffer.alloc(64)), {}, UsageError, /^--rate: is required for a raw file without metadata/);
  });
  it("openCapture(zero, negative or non-finite --rate) is a UsageError", async () => {
    const path = put("rate.cu8", Buffer.alloc(64));
    for (const rate of [0, -48000, Number.NaN, Number.POSITIVE_INFINITY]) {
      await expectError(path, { sampleRateHz: rate }, UsageError, /^--rate: .* must be a positive, finite/, "--rate");
    }
  });
  it("openCapture(a zero rate token in the file name) is a CaptureFormatError", async () => {
    await expectError(put("bad_0sps.cu8", Buffer.alloc(64)), {}, CaptureFormatError, /0sps \(0 S\/s\) is not a sample rate: it must be a positive/);
  });
  it("openCapture(non-finite --center or --ppm) is a UsageError", async () => {
    const path = put("centre.cu8", Buffer.alloc(64));
    await expectError(path, { sampleRateHz: 1e6, centerHz: Number.NaN }, UsageError, /^--center:/, "--center");
    await expectError(path, { sampleRateHz: 1e6, ppm: Number.POSITIVE_INFINITY }, UsageError, /^--ppm:/, "--ppm");
  });
  it("openCapture(a directory) is a CaptureFormatError", async () => {
    await expectError(dir, { sampleRateHz: 1e6, format: "cu8" }, CaptureFormatError, /is a directory, not a capture file/);
  });
  it("openCapture(SigMF archive .sigmf) is a CaptureFormatError asking to extract it", async () => {
    await expectError(put("pack.sigmf", Buffer.alloc(512)), {}, CaptureFormatError, /SigMF archive/);
  });
});

describe("openCapture(bad WAV input)", () => {
  const cases: readonly [string, Buffer, RegExp, CaptureOptions?][] = [
    ["bad magic", Buffer.concat([Buffer.from("RIFX"), goodWav.subarray(4)]), /not a WAV file.*RIFX/],
    ["not WAVE", Buffer.concat([goodWav.subarray(0, 8), Buffer.from("AVI "), goodWav.subarray(12)]), /form "AVI ", not WAVE/],
    ["too short", goodWav.subarray(0, 10), /too short for a WAV header/],
    ["header cut inside a chunk header", goodWav.subarray(0, 16), /ends inside a chunk header at byte 12/],
    ["fmt missing", riffFile([data4]), /without a fmt chunk/],
    ["data missing", riffFile([fmt16]), /without a data chunk/],
    ["chunk past EOF before data", riffFile([fmt16, riffChunk("LIST", Buffer.alloc(4), 4000)]), /chunk "LIST" .* declares 4000 bytes/],
    ["garbage chunk id", riffFile([fmt16, Buffer.from([0, 1, 2, 3, 4, 0, 0, 0]), data4]), /corrupt chunk header/],
    ["A-law", riffFile([riffChunk("fmt ", fmtBody(6, 2, 8000, 8)), data4]), /encoding 0x0006 \(A-law\), which is not supported/],
    ["12-bit PCM", riffFile([riffChunk("fmt ", fmtBody(1, 2, 8000, 12)), data4]), /12-bit PCM samples, which are not supported/],
    ["16-bit float", riffFile([riffChunk("fmt ", fmtBody(3, 2, 8000, 16)), data4]), /16-bit float samples, which are not supported/],
    ["short fmt", riffFile([riffChunk("fmt ", Buffer.alloc(12)), data4]), /fmt chunk of 12 bytes/],
    ["bad block align", riffFile([riffChunk("fmt ", Buffer.from(fmtBody(1, 2, 8000, 16)).fill(8, 12, 13)), data4]), /nBlockAlign 8/],
    ["1 channel without --real", encodeWav({ format: "ri16_le", sampleRateHz: 8000 }, [0.5, 0]), /1 channel, so it is not an IQ recording.*--real/],
    ["3 channels", riffFile([riffChunk("fmt ", fmtBody(1, 3, 8000, 16)), riffChunk("data", Buffer.alloc(12))]), /has 3 channels/],
    ["rate 0", riffFile([riffChunk("fmt ", fmtBody(1, 2, 0, 16)), data4]), /sample rate of 0/],
    ["empty data chunk", riffFile([fmt16, riffChunk("data", Buffer.alloc(0))]), /no samples \(the data chunk is empty\)/],
    ["RF64 without ds64", Buffer.concat([Buffer.from("RF64"), goodWav.subarray(4)]), /RF64 file without the ds64 chunk/],
  ];
  for (const [what, bytes, pattern, options] of cases) {
    it(`openCapture(WAV: ${what}) is a CaptureFormatError naming the file`, async () => {
      await expectError(put(`bad_${what.replace(/\W+/g, "_")}.wav`, bytes), options ?? {}, CaptureFormatError, pattern);
    });
  }

  it("openCapture(WAV with an unknown extensible SubFormat GUID) is a CaptureFormatError", async () => {
    const b = encodeWav({ format: "ci16_le", sampleRateHz: 8000, extensible: true }, [0, 0]);
    b.writeUInt32LE(0x55, 44); // SubFormat first field: MPEG layer 3, not PCM or float
    await expectError(put("bad_guid.wav", b), {}, CaptureFormatError, /SubFormat GUID \{00000055-0000-0010-8000-00AA00389B71\}/);
  });

  it("openCapture(non-WAV bytes, --format wav) is a CaptureFormatError", async () => {
    await expectError(put("fake.cu8", Buffer.alloc(64)), { format: "wav" }, CaptureFormatError, /not a WAV file/);
  });
});

describe("openCapture(bad SigMF metadata)", () => {
  const good = { "core:datatype": "cf32_le", "core:sample_rate": 1e6, "core:version": "1.2.0" };
  const doc = (global: object, rest: object = { captures: [{ "core:sample_start": 0 }], annotations: [] }): string =>
    JSON.stringify({ global, ...rest });
  // [what, .sigmf-meta text, message pattern, the file the message names ("data" = the .sigmf-data)]
  const cases: readonly [string, string, RegExp, ("meta" | "data")?][] = [
    ["not JSON", "{ global: ", /is not valid JSON/],
    ["top level an array", "[]", /top level is an array, not an object/],
    ["no global", JSON.stringify({ captures: [], annotations: [] }), /no "global" object/],
    ["global not an object", JSON.stringify({ global: 3 }), /"global" that is the number 3/],
    ["no datatype", doc({ "core:sample_rate": 1e6 }), /no global core:datatype/],
    ["datatype a number", doc({ ...good, "core:datatype": 32 }), /core:datatype = the number 32; SigMF requires a string/],
    ["datatype off grammar", doc({ ...good, "core:datatype": "cf32" }), /"cf32", which is not a SigMF datatype/],
    ["datatype undecodable", doc({ ...good, "core:datatype": "cu16_le" }), /cu16_le, a valid SigMF datatype that iqaudit cannot decode/],
    ["datatype big-endian float", doc({ ...good, "core:datatype": "cf32_be" }), /cf32_be, a valid SigMF datatype that iqaudit cannot decode/],
    ["real without --real", doc({ ...good, "core:datatype": "rf32_le" }), /real datatype rf32_le.*--real/],
    ["sample_rate a string", doc({ ...good, "core:sample_rate": "1M" }), /core:sample_rate = the string "1M"; SigMF requires a number/],
    ["sample_rate zero", doc({ ...good, "core:sample_rate": 0 }), /core:sample_rate 0, which is not a sample rate: it must be a positive/],
    ["two channels", doc({ ...good, "core:num_channels": 2 }), /core:num_channels 2/],
    ["num_channels fractional", doc({ ...good, "core:num_channels": 1.5 }), /non-negative integer/],
    ["version a number", doc({ ...good, "core:version": 1 }), /core:version = the number 1/],
    ["captures not an array", doc(good, { captures: {}, annotations: [] }), /"captures" that is an object, not an array/],
    ["capture without sample_start", doc(good, { captures: [{ "core:frequency": 1e8 }], annotations: [] }), /no core:sample_start in captures\[0\]/],
    ["frequency a string", doc(good, { captures: [{ "core:sample_start": 0, "core:frequency": "100M" }], annotations: [] }), /captures\[0\] core:frequency/],
    ["header_bytes negative", doc(good, { captures: [{ "core:sample_start": 0, "core:header_bytes": -4 }], annotations: [] }), /core:header_bytes = the number -4/],
    ["datetime a number", doc(good, { captures: [{ "core:sample_start": 0, "core:datetime": 0 }], annotations: [] }), /core:datetime = the number 0/],
    ["annotations not an array", doc(good, { captures: [], annotations: "none" }), /"annotations" that is the string/],
    ["metadata only", doc({ ...good, "core:metadata_only": true }), /metadata only/],
    ["no rate anywhere", doc({ "core:datatype": "cf32_le", "core:version": "1.2.0" }), /^--rate: is required.*no global core:sample_rate/],
    ["header bytes beyond the file", doc(good, { captures: [{ "core:sample_start": 0, "core:header_bytes": 4096 }], annotations: [] }), /fewer than the 4096 header/, "data"],
  ];
  for (const [what, text, pattern, names] of cases) {
    it(`openCapture(SigMF: ${what}) fails naming the file`, async () => {
      const stem = `badmeta_${what.replace(/\W+/g, "_")}`;
      const data = put(`${stem}.sigmf-data`, Buffer.alloc(64));
      const path = put(`${stem}.sigmf-meta`, text);
      // A missing rate is fixed with an option, so it is a usage error (it still names the file).
      const kind = what === "no rate anywhere" ? UsageError : CaptureFormatError;
      await expectError(path, {}, kind, pattern, names === "data" ? data : path);
    });
  }

  it("openCapture(.sigmf-data without its .sigmf-meta) is a CaptureFormatError naming the .sigmf-meta", async () => {
    const data = put("lonely.sigmf-data", Buffer.alloc(64));
    await expectError(data, {}, CaptureFormatError, /no such file/, data.replace(/data$/, "meta"));
  });

  it("openCapture(.sigmf-meta without its dataset) is a CaptureFormatError naming the .sigmf-data", async () => {
    const path = put("nodata.sigmf-meta", doc(good));
    await expectError(path, {}, CaptureFormatError, /no such file \(the dataset of .*nodata\.sigmf-meta\)/, path.replace(/meta$/, "data"));
  });

  it("openCapture(SigMF, --format wav) is a UsageError", async () => {
    put("fmtwav.sigmf-data", Buffer.alloc(64));
    await expectError(put("fmtwav.sigmf-meta", doc(good)), { format: "wav" }, UsageError, /^--format: wav does not apply/);
  });
});

describe("resolveSpan(meta, startS, durationS) bad spans", () => {
  it("resolveSpan: --start past the end, negative --start, non-positive --duration are UsageErrors naming the file", async () => {
    const source = await openCapture(put("span_1ksps.cu8", Buffer.alloc(2000)));
    const meta = source.meta; // 1000 samples at 1000 samples/s: 1 s
    await source.close();
    const fails = (startS: number | undefined, durationS: number | undefined, option: string, pattern: RegExp): void => {
      let caught: unknown = null;
      try {
        resolveSpan(meta, startS, durationS);
      } catch (e) {
        caught = e;
      }
      expect(caught).toBeInstanceOf(UsageError);
      expect((caught as UsageError).option).toBe(option);
      expect((caught as Error).message).toMatch(pattern);
    };
    fails(1, undefined, "--start", /1 s is past the end of .*span_1ksps\.cu8, which lasts 1 s \(1000 samples\)/);
    fails(5, 1, "--start", /past the end/);
    fails(-0.1, undefined, "--start", /must be zero or positive/);
    fails(Number.NaN, undefined, "--start", /must be zero or positive/);
    fails(0, -1, "--duration", /must be positive and finite/);
    fails(0, 0, "--duration", /must be positive and finite/);
  });
});
