// Property tests of every reader (raw of each format, WAV, WAVE_FORMAT_EXTENSIBLE, RF64, SigMF)
// over random and mutated input: openCapture either returns a source whose metadata keeps the
// contract and whose every block reads, or throws a CaptureFormatError / UsageError of one line
// (interface.md, "Exit codes"); never a TypeError, RangeError or any other error from inside.
// Random cases come from fast-check with a fixed seed, so a run is repeatable and a failure
// prints its shrunk counterexample; each run is bounded by fast-check's per-run timeout (a hang
// detector, not a speed measurement) and each test by its own vitest timeout.
import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { CaptureFormatError, UsageError } from "../../src/errors.js";
import { encodeSamples, encodeWav, openCapture, resolveSpan, type CaptureMeta, type CaptureOptions } from "../../src/capture/index.js";
import { put } from "./fixtures.js";

/** Far above the milliseconds one case takes; only a hang reaches it. */
const RUN_TIMEOUT_MS = 5_000;
const TEST_TIMEOUT_MS = 120_000;
const SEED = 20261202;

let fileCount = 0;
function fresh(name: string, bytes: Uint8Array | string): string {
  fileCount += 1;
  return put(`fz${fileCount}_${name}`, bytes);
}

/**
 * Opens `path`, checks the metadata, reads every block of the whole file; or accepts a one-line
 * CaptureFormatError / UsageError. Anything else is rethrown and fails the property.
 */
async function readsOrRefuses(path: string, options: CaptureOptions): Promise<"read" | "refused"> {
  let source;
  try {
    source = await openCapture(path, options);
  } catch (e) {
    expectCleanRefusal(e);
    return "refused";
  }
  try {
    checkMeta(source.meta);
    const { span } = resolveSpan(source.meta);
    let samples = 0;
    for await (const block of source.blocks(span, 37)) {
      for (const x of block) if (!Number.isFinite(x)) throw new Error(`a decoded value is ${x}`);
      samples += block.length / 2;
    }
    expect(samples).toBe(source.meta.fileSamples);
    return "read";
  } finally {
    await source.close();
  }
}

function expectCleanRefusal(e: unknown): void {
  if (!(e instanceof CaptureFormatError || e instanceof UsageError)) throw e;
  expect(e.message).not.toContain("\n");
}

/** What any CaptureMeta must say (docs/formats.md: accepted ranges; source.ts field docs). */
function checkMeta(meta: CaptureMeta): void {
  expect(meta.sampleRateHz).toBeGreaterThanOrEqual(1e3);
  expect(meta.sampleRateHz).toBeLessThanOrEqual(1e12);
  if (meta.centerHz !== null) {
    expect(meta.centerHz).toBeGreaterThanOrEqual(0);
    expect(meta.centerHz).toBeLessThanOrEqual(3e12);
  }
  expect(Number.isSafeInteger(meta.fileSamples) && meta.fileSamples >= 1).toBe(true);
  expect(meta.trailingBytes).toBeLessThan(meta.frameBytes);
  expect(meta.dataOffsetBytes + meta.fileSamples * meta.frameBytes + meta.trailingBytes).toBeLessThanOrEqual(meta.fileBytes);
  for (const w of meta.warnings) expect(w).not.toContain("\n");
}

// Values a user or a file might give, absurd ones included, and any double at all.
const rateValue = fc.oneof(fc.constantFrom(1, 300, 500, 999, 1e3, 8e3, 48e3, 2.4e6, 1e12, 1e300, 1e-300, 0, -1, Infinity, NaN), fc.double());
const centreValue = fc.oneof(fc.constantFrom(0, 1.5e8, 3e12, 1e300, -1, Infinity), fc.double());
const options: fc.Arbitrary<CaptureOptions> = fc.record(
  {
    sampleRateHz: rateValue,
    centerHz: centreValue,
    format: fc.constantFrom("cu8", "ci8", "ci16_le", "ci16_be", "cf32_le", "cf64_le", "wav"),
    swapIq: fc.boolean(),
    real: fc.boolean(),
  },
  { requiredKeys: [] },
);

describe("raw readers over random bytes, names and options", () => {
  it("openCapture(raw of every extension, random bytes) reads or refuses cleanly", { timeout: TEST_TIMEOUT_MS }, async () => {
    const ext = fc.constantFrom("cu8", "u8", "cs8", "ci8", "s8", "cs16", "ci16", "s16", "cf32", "fc32", "cfile", "cf64", "fc64", "iq", "");
    const token = fc.constantFrom("", "_2.4Msps", "_48ksps_156.8MHz", "_1e-300sps", "_0sps", "_300sps", "_1e400Hz", "_1e400sps", "_2Msps_3Msps", "-2.4e+6sps");
    await fc.assert(
      fc.asyncProperty(ext, token, fc.uint8Array({ maxLength: 300 }), options, async (e, t, bytes, opts) => {
        await readsOrRefuses(fresh(`raw${t}${e === "" ? "" : `.${e}`}`, bytes), opts);
      }),
      { seed: SEED, numRuns: 400, timeout: RUN_TIMEOUT_MS },
    );
  });

  it("openCapture(cf32 / cf64 full of NaN and Inf) reads every sample and counts nothing as a crash", { timeout: TEST_TIMEOUT_MS }, async () => {
    const value = fc.oneof(fc.constantFrom(Number.NaN, Infinity, -Infinity, 0, 1e300, -1e-300), fc.double());
    await fc.assert(
      fc.asyncProperty(fc.constantFrom("cf32_le" as const, "cf64_le" as const), fc.array(fc.tuple(value, value), { minLength: 1, maxLength: 100 }), async (format, pairs) => {
        const iq = pairs.flat();
        const path = fresh(`nonfinite_1Msps.${format === "cf32_le" ? "cf32" : "cf64"}`, encodeSamples(format, iq));
        expect(await readsOrRefuses(path, {})).toBe("read");
      }),
      { seed: SEED, numRuns: 150, timeout: RUN_TIMEOUT_MS },
    );
  });
});

// Valid WAV files of each layout the reader knows, to be cut and overwritten.
const tone = Array.from({ length: 64 }, (_, k) => 0.5 * Math.cos(0.7 * k));
const WAV_SEEDS: readonly [string, Buffer][] = [
  ["pcm16", encodeWav({ format: "ci16_le", sampleRateHz: 48000 }, tone)],
  ["pcm8 with LIST", encodeWav({ format: "cu8", sampleRateHz: 8000, extraChunks: [{ id: "LIST", data: Buffer.from("INFOISFTx\0\0\0") }] }, tone)],
  ["float32", encodeWav({ format: "cf32_le", sampleRateHz: 250000 }, tone)],
  ["extensible 24-bit", encodeWav({ format: "ci24_le", sampleRateHz: 96000, extensible: true }, tone)],
  ["rf64 float64", encodeWav({ format: "cf64_le", sampleRateHz: 1e6, rf64: true }, tone)],
  ["mono pcm16", encodeWav({ format: "ri16_le", sampleRateHz: 8000 }, tone)],
];
/** Bytes before the samples: up to and including the data chunk header. */
function headerBytes(wav: Buffer): number {
  return wav.indexOf("data", 12, "latin1") + 8;
}

describe("WAV / RF64 reader over cut and overwritten headers", () => {
  it("openCapture(every WAV layout cut at every byte of its header) reads or refuses cleanly", { timeout: TEST_TIMEOUT_MS }, async () => {
    for (const [name, wav] of WAV_SEEDS) {
      for (let length = 0; length <= headerBytes(wav) + 8; length++) {
        const path = fresh(`cut_${name.replace(/\W/g, "_")}_${length}.wav`, wav.subarray(0, length));
        await readsOrRefuses(path, name.startsWith("mono") ? { real: true } : {});
      }
    }
  });

  it("openCapture(WAV with random chunk sizes, fields and bytes) reads or refuses cleanly", { timeout: TEST_TIMEOUT_MS }, async () => {
    const u32 = fc.oneof(fc.constantFrom(0, 1, 2, 3, 4, 8, 16, 28, 0x7fffffff, 0xfffffffe, 0xffffffff), fc.nat({ max: 0xffffffff }));
    const edit = fc.oneof(
      fc.record({ kind: fc.constant("u32" as const), at: fc.nat(), value: u32 }),
      fc.record({ kind: fc.constant("byte" as const), at: fc.nat(), value: fc.nat({ max: 255 }) }),
    );
    const wavCase = fc.record({
      seed: fc.nat({ max: WAV_SEEDS.length - 1 }),
      edits: fc.array(edit, { minLength: 1, maxLength: 5 }),
      cut: fc.option(fc.nat(), { nil: undefined }),
      opts: options,
    });
    await fc.assert(
      fc.asyncProperty(wavCase, async ({ seed, edits, cut, opts }) => {
        const [name, wav] = WAV_SEEDS[seed] as [string, Buffer];
        const bytes = Buffer.from(wav);
        const head = headerBytes(wav);
        for (const e of edits) {
          if (e.kind === "u32") bytes.writeUInt32LE(e.value, e.at % (head - 3));
          else bytes[e.at % head] = e.value;
        }
        const body = cut === undefined ? bytes : bytes.subarray(0, cut % (bytes.byteLength + 1));
        await readsOrRefuses(fresh(`${name.replace(/\W/g, "_")}.wav`, body), opts);
      }),
      { seed: SEED, numRuns: 500, timeout: RUN_TIMEOUT_MS },
    );
  });
});

describe("SigMF reader over random and mutated metadata", () => {
  const valid = {
    global: { "core:datatype": "cf32_le", "core:sample_rate": 1e6, "core:version": "1.2.0" },
    captures: [{ "core:sample_start": 0, "core:frequency": 1.5e8, "core:datetime": "2026-01-02T03:04:05Z" }],
    annotations: [{ "core:sample_start": 0, "core:sample_count": 10 }],
  };
  const data = encodeSamples("cf32_le", tone);

  function recording(metaText: string | Uint8Array, dataBytes: Uint8Array): string {
    const stem = `fz${++fileCount}_rec`;
    put(`${stem}.sigmf-data`, dataBytes);
    return put(`${stem}.sigmf-meta`, metaText);
  }

  it("openCapture(.sigmf-meta cut at every character) reads or refuses cleanly", { timeout: TEST_TIMEOUT_MS }, async () => {
    const text = JSON.stringify(valid);
    for (let length = 0; length <= text.length; length++) await readsOrRefuses(recording(text.slice(0, length), data), {});
  });

  it("openCapture(.sigmf-meta of random JSON, any text or bytes) refuses cleanly", { timeout: TEST_TIMEOUT_MS }, async () => {
    const text = fc.oneof(fc.json(), fc.string({ unit: "grapheme" }), fc.uint8Array({ maxLength: 200 }));
    await fc.assert(
      fc.asyncProperty(text, fc.uint8Array({ maxLength: 100 }), async (t, bytes) => {
        await readsOrRefuses(recording(t, bytes), {});
      }),
      { seed: SEED, numRuns: 300, timeout: RUN_TIMEOUT_MS },
    );
  });

  it("openCapture(SigMF with random values in its fields, a BOM, random data sizes) reads or refuses cleanly", { timeout: TEST_TIMEOUT_MS }, async () => {
    // 1e400 and -1e400 are valid JSON numbers that JSON.parse reads as ±Infinity; they are put in as text.
    const value = fc.oneof(fc.jsonValue(), fc.constantFrom("@1e400", "@-1e400", "@1e-300", 0, -1, 1.5, 2 ** 53, "cf64_le", "ri16_le", "cu16_le", null));
    const globalKey = fc.constantFrom("core:datatype", "core:sample_rate", "core:version", "core:num_channels", "core:offset", "core:dataset", "core:trailing_bytes", "core:metadata_only", "core:extensions");
    const captureKey = fc.constantFrom("core:sample_start", "core:frequency", "core:header_bytes", "core:datetime");
    const edit = fc.oneof(
      fc.record({ where: fc.constant("global" as const), key: globalKey, value: fc.option(value, { nil: undefined }) }),
      fc.record({ where: fc.constant("capture" as const), key: captureKey, value: fc.option(value, { nil: undefined }) }),
      fc.record({ where: fc.constant("top" as const), key: fc.constantFrom("global", "captures", "annotations"), value: fc.option(value, { nil: undefined }) }),
    );
    const sigmfCase = fc.record({
      edits: fc.array(edit, { maxLength: 4 }),
      bom: fc.boolean(),
      dataBytes: fc.nat({ max: 600 }),
      opts: options,
    });
    await fc.assert(
      fc.asyncProperty(sigmfCase, async ({ edits, bom, dataBytes, opts }) => {
        const doc = structuredClone(valid) as Record<string, unknown>;
        for (const e of edits) {
          const captures = doc["captures"];
          const target = e.where === "global" ? doc["global"] : e.where === "capture" ? (Array.isArray(captures) ? captures[0] : null) : doc;
          if (typeof target !== "object" || target === null || Array.isArray(target)) continue; // an earlier edit replaced it
          const object = target as Record<string, unknown>;
          if (e.value === undefined) delete object[e.key];
          else object[e.key] = e.value;
        }
        const text = (JSON.stringify(doc) ?? "null").replace(/"@(-?1e-?\d+)"/g, "$1");
        const data = Buffer.alloc(dataBytes, 0x3e); // 0x3e3e3e3e is the float32 0.186: finite
        await readsOrRefuses(recording(bom ? `\uFEFF${text}` : text, data), opts);
      }),
      { seed: SEED, numRuns: 500, timeout: RUN_TIMEOUT_MS },
    );
  });
});
