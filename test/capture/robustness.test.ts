// Inputs that once slipped through or stopped the readers (absurd rates and centres, a byte-order
// mark, a named pipe, a WAV cut short, a file-name exponent): each is either read, with a
// warning where something was repaired, or refused with one CaptureFormatError / UsageError line
// naming the file or the option and the field. The accepted ranges are ours (docs/formats.md,
// "Accepted ranges"); the file layouts are those of RIFF/WAVEFORMATEX, EBU Tech 3306 and the
// SigMF v1.2.x schema (REFERENCES.md §9).
import { spawnSync } from "node:child_process";
import { basename, join } from "node:path";
import { describe, expect, it } from "vitest";
import { CaptureFormatError, UsageError } from "../../src/errors.js";
import { encodeSamples, encodeWav, openCapture, type CaptureMeta, type CaptureOptions } from "../../src/capture/index.js";
import { dir, fmtBody, int16le, put, readAll, riffChunk, riffFile } from "./fixtures.js";

type ErrorClass = typeof CaptureFormatError | typeof UsageError;

async function failure(path: string, options: CaptureOptions): Promise<unknown> {
  try {
    const source = await openCapture(path, options);
    await source.close();
  } catch (e) {
    return e;
  }
  return null;
}

async function expectRefused(path: string, options: CaptureOptions, kind: ErrorClass, pattern: RegExp, names: string): Promise<void> {
  const caught = await failure(path, options);
  expect(caught, `${basename(path)} should be refused`).toBeInstanceOf(kind);
  const message = (caught as Error).message;
  expect(message).not.toContain("\n");
  expect(message).toContain(names);
  expect(message).toMatch(pattern);
}

async function metaOf(path: string, options: CaptureOptions = {}): Promise<CaptureMeta> {
  const source = await openCapture(path, options);
  await source.close();
  return source.meta;
}

const cf32 = encodeSamples("cf32_le", new Float64Array(64).fill(0.25));

function sigmfMeta(global: object, capture: object = {}): string {
  return JSON.stringify({
    global: { "core:datatype": "cf32_le", "core:version": "1.2.0", ...global },
    captures: [{ "core:sample_start": 0, ...capture }],
    annotations: [],
  });
}

describe("accepted sample rates and centres (docs/formats.md, accepted ranges: ours)", () => {
  const raw = put("ranges.cf32", cf32);

  for (const rate of [1, 300, 500, 999, 1e-300]) {
    it(`openCapture(--rate ${rate}) is a UsageError: below 1 kS/s`, async () => {
      await expectRefused(raw, { sampleRateHz: rate }, UsageError, /^--rate: \S+ is below 1 kS\/s.*k or M left off/, "--rate");
    });
  }
  for (const rate of [1e300, 1.1e12]) {
    it(`openCapture(--rate ${rate}) is a UsageError: above 1 TS/s`, async () => {
      await expectRefused(raw, { sampleRateHz: rate }, UsageError, /^--rate: \S+ is above 1 TS\/s/, "--rate");
    });
  }
  it("openCapture(--rate at the ends of the range, and the 8 kS/s of audio-rate IQ) reads the file", async () => {
    for (const rate of [1e3, 8e3, 1e12]) expect((await metaOf(raw, { sampleRateHz: rate })).sampleRateHz).toBe(rate);
  });
  it("openCapture(--center beyond 3 THz or negative) is a UsageError; 0 Hz and 3 THz are read", async () => {
    for (const centerHz of [1e300, 3.1e12, -1]) {
      await expectRefused(raw, { sampleRateHz: 1e6, centerHz }, UsageError, /^--center: \S+ is outside 0 Hz to 3 THz/, "--center");
    }
    for (const centerHz of [0, 3e12]) expect((await metaOf(raw, { sampleRateHz: 1e6, centerHz })).centerHz).toBe(centerHz);
  });

  // The JSON text 1e400 is a valid number that JSON.parse reads as Infinity (ECMA-262 Number
  // parsing rounds past the largest double to Infinity).
  const sigmfRates: readonly [string, string, RegExp][] = [
    ["1e400", "Infinity", /is not a sample rate/],
    ["1e-300", "1e-300", /is below 1 kS\/s/],
    ["1e300", "1e+300", /is above 1 TS\/s/],
    ["500", "500", /is below 1 kS\/s/],
  ];
  for (const [text, shown, pattern] of sigmfRates) {
    it(`openCapture(SigMF core:sample_rate ${text}) is a CaptureFormatError naming the field`, async () => {
      const stem = `rate_${text.replace(/\W/g, "_")}`;
      put(`${stem}.sigmf-data`, cf32);
      const path = put(`${stem}.sigmf-meta`, sigmfMeta({ "core:sample_rate": "RATE" }).replace('"RATE"', text));
      await expectRefused(path, {}, CaptureFormatError, new RegExp(`global core:sample_rate ${shown.replace("+", "\\+")}.*, which ${pattern.source}`), path);
    });
  }
  it("openCapture(SigMF core:frequency 1e400) is a CaptureFormatError naming the field", async () => {
    put("freq_inf.sigmf-data", cf32);
    const path = put("freq_inf.sigmf-meta", sigmfMeta({ "core:sample_rate": 1e6 }, { "core:frequency": "F" }).replace('"F"', "1e400"));
    await expectRefused(path, {}, CaptureFormatError, /captures\[0\] core:frequency Infinity .*which is not a finite frequency/, path);
  });
  it("openCapture(SigMF core:frequency 1e300) is a CaptureFormatError; 8 kS/s with a 1.5e8 Hz centre is read", async () => {
    put("freq_big.sigmf-data", cf32);
    const path = put("freq_big.sigmf-meta", sigmfMeta({ "core:sample_rate": 1e6 }, { "core:frequency": 1e300 }));
    await expectRefused(path, {}, CaptureFormatError, /core:frequency 1e\+300, which is outside 0 Hz to 3 THz/, path);
    put("audio_rate.sigmf-data", cf32);
    const ok = put("audio_rate.sigmf-meta", sigmfMeta({ "core:sample_rate": 8000 }, { "core:frequency": 1.5e8 }));
    expect(await metaOf(ok)).toMatchObject({ sampleRateHz: 8000, centerHz: 1.5e8 });
  });

  it("openCapture(WAV with a 500 S/s fmt rate) is a CaptureFormatError naming the fmt chunk; --rate repairs it", async () => {
    const wav = put("slow.wav", riffFile([riffChunk("fmt ", fmtBody(1, 2, 500, 16)), riffChunk("data", Buffer.alloc(16))]));
    await expectRefused(wav, {}, CaptureFormatError, /sample rate of 500 in its fmt chunk, which is below 1 kS\/s.*--rate/, wav);
    const meta = await metaOf(wav, { sampleRateHz: 48000 });
    expect(meta.sampleRateHz).toBe(48000);
    expect(meta.warnings.join(" ")).toMatch(/--rate 48000 overrides the WAV header rate 500/);
  });
  it("openCapture(WAV IQ at 8 kS/s, the telephony rate) is read", async () => {
    const wav = put("audio_iq.wav", encodeWav({ format: "ci16_le", sampleRateHz: 8000 }, [0.5, -0.5, 0.25, 0]));
    expect((await metaOf(wav)).sampleRateHz).toBe(8000);
  });
  it("openCapture(a file-name rate token of 1e400sps or 300sps) is a CaptureFormatError naming the token", async () => {
    await expectRefused(put("huge_1e400sps.cf32", cf32), {}, CaptureFormatError, /rate token 1e400sps \(Infinity S\/s\) is not a sample rate/, "huge_1e400sps");
    await expectRefused(put("slow_300sps.cf32", cf32), {}, CaptureFormatError, /rate token 300sps \(300 S\/s\) is below 1 kS\/s/, "slow_300sps");
  });
});

describe("SigMF metadata with a UTF-8 byte-order mark (RFC 8259 §8.1: a parser may ignore it; from memory)", () => {
  it("openCapture(.sigmf-meta starting with EF BB BF) reads the recording", async () => {
    put("bom.sigmf-data", cf32);
    // EF BB BF is U+FEFF in UTF-8 (Unicode Standard, ch. 2 "Byte Order Mark"; from memory).
    const text = sigmfMeta({ "core:sample_rate": 48000 }, { "core:frequency": 1.5e8 });
    const path = put("bom.sigmf-meta", Buffer.concat([Buffer.from([0xef, 0xbb, 0xbf]), Buffer.from(text, "utf8")]));
    expect(await metaOf(path)).toMatchObject({ sampleRateHz: 48000, centerHz: 1.5e8, fileSamples: 32 });
  });
});

describe("a named pipe as input (docs/formats.md: only a regular file is read)", () => {
  /** A FIFO made with mkfifo(1) (POSIX); null where there is none. Nothing ever writes to it. */
  function fifo(name: string): string | null {
    const path = join(dir, name);
    return spawnSync("mkfifo", [path]).status === 0 ? path : null;
  }
  // Opening a FIFO for reading blocks until a writer comes, so a reader that opens before it
  // checks would never return: the test's timeout (10 s) bounds the case.
  it("openCapture(a FIFO named .cf32) is a CaptureFormatError at once, naming the pipe", { timeout: 10_000 }, async (ctx) => {
    const path = fifo("stream.cf32");
    if (path === null) return ctx.skip();
    await expectRefused(path, { sampleRateHz: 1e6 }, CaptureFormatError, /is a named pipe \(FIFO\), not a regular file: .*save it to a file first/, path);
  });
  it("openCapture(a FIFO as the .sigmf-meta or as the .sigmf-data) is a CaptureFormatError naming it", { timeout: 10_000 }, async (ctx) => {
    const meta = fifo("piped_meta.sigmf-meta");
    if (meta === null) return ctx.skip();
    put("piped_meta.sigmf-data", cf32);
    await expectRefused(meta, {}, CaptureFormatError, /is a named pipe/, meta);
    put("piped_data.sigmf-meta", sigmfMeta({ "core:sample_rate": 1e6 }));
    const data = fifo("piped_data.sigmf-data") as string;
    await expectRefused(data, {}, CaptureFormatError, /is a named pipe \(FIFO\), not a regular file \(the dataset of/, data);
  });
  it("openCapture(a character device, /dev/zero) is a CaptureFormatError", { timeout: 10_000 }, async (ctx) => {
    if (spawnSync("test", ["-c", "/dev/zero"]).status !== 0) return ctx.skip();
    await expectRefused("/dev/zero", { sampleRateHz: 1e6, format: "cu8" }, CaptureFormatError, /is a device, not a regular file/, "/dev/zero");
  });
});

describe("a WAV whose data chunk declares more than the file holds (read to the last whole sample, as a raw file is)", () => {
  // Hand-built PCM16 stereo WAV (RIFF/WAVEFORMATEX layout): 12 bytes RIFF header, 8 + 16 fmt,
  // 8 data header, so the samples start at byte 44; one I,Q frame is 4 bytes. The sample values
  // are multiples of 1/8, exact in int16 (s = x·32768) and in float32.
  const FRAMES = 64;
  const iq = Array.from({ length: 2 * FRAMES }, (_, k) => ((k % 15) - 7) / 8);
  const full = riffFile([riffChunk("fmt ", fmtBody(1, 2, 48000, 16)), riffChunk("data", int16le(iq))]);

  async function readWav(name: string, bytes: Buffer): Promise<{ meta: CaptureMeta; samples: Float32Array }> {
    const source = await openCapture(put(name, bytes));
    try {
      return { meta: source.meta, samples: await readAll(source) };
    } finally {
      await source.close();
    }
  }

  for (const cutBytes of [1, 2, 3, 4, 5, 100, 4 * FRAMES - 5]) {
    it(`openCapture(WAV cut ${cutBytes} bytes short) reads floor((size − 44) / 4) whole samples, with a warning`, async () => {
      const { meta, samples } = await readWav(`cut_${cutBytes}.wav`, full.subarray(0, full.byteLength - cutBytes));
      const bodyBytes = 4 * FRAMES - cutBytes;
      const whole = Math.floor(bodyBytes / 4);
      expect(meta.fileSamples).toBe(whole);
      expect(meta.trailingBytes).toBe(bodyBytes % 4);
      expect(Array.from(samples)).toEqual(iq.slice(0, 2 * whole));
      expect(meta.warnings[0]).toBe(
        `The data chunk of ${meta.path} declares ${4 * FRAMES} bytes but the file holds only ${bodyBytes} after its header ` +
          "(the recording was cut short); the samples are read to the end of the file.",
      );
      // The RIFF size disagrees too, but that is the same fact: one warning for it, plus one for a partial sample.
      expect(meta.warnings).toHaveLength(bodyBytes % 4 === 0 ? 1 : 2);
    });
  }

  it("openCapture(WAV with data size 0xFFFFFFFF, as a streaming recorder writes) reads to the end of the file", async () => {
    const streamed = Buffer.from(full);
    streamed.writeUInt32LE(0xffffffff, 4); // the RIFF size is unknown too
    streamed.writeUInt32LE(0xffffffff, 40);
    const { meta, samples } = await readWav("streamed.wav", streamed);
    expect(meta.fileSamples).toBe(FRAMES);
    expect(Array.from(samples)).toEqual(iq);
    expect(meta.warnings).toEqual([
      `The data chunk of ${meta.path} declares 0xFFFFFFFF bytes, the size a recorder that streams writes before it knows the length; the samples are read to the end of the file.`,
    ]);
  });

  it("openCapture(RF64 whose ds64 data size exceeds the file, EBU Tech 3306) reads to the end of the file", async () => {
    // ds64 body: riffSize u64, dataSize u64, sampleCount u64, tableLength u32 (EBU Tech 3306 §3).
    const ds64 = Buffer.alloc(28);
    ds64.writeBigUInt64LE(10_000n, 0);
    ds64.writeBigUInt64LE(BigInt(8 * FRAMES), 8); // twice the bytes present
    ds64.writeBigUInt64LE(BigInt(2 * FRAMES), 16);
    const body = Buffer.concat([riffChunk("ds64", ds64), riffChunk("fmt ", fmtBody(1, 2, 48000, 16)), riffChunk("data", int16le(iq), 0xffffffff)]);
    const head = Buffer.alloc(12);
    head.write("RF64", 0, "latin1");
    head.writeUInt32LE(0xffffffff, 4);
    head.write("WAVE", 8, "latin1");
    const { meta, samples } = await readWav("rf64_cut.wav", Buffer.concat([head, body]));
    expect(meta.fileSamples).toBe(FRAMES);
    expect(Array.from(samples)).toEqual(iq);
    expect(meta.warnings).toHaveLength(1);
    expect(meta.warnings[0]).toMatch(/declares 512 bytes but the file holds only 256 after its header/);
  });

  it("openCapture(WAV with a chunk after the data that runs past the end) reads the samples and ignores that chunk", async () => {
    const withTail = Buffer.concat([full, riffChunk("LIST", Buffer.alloc(6), 4000)]);
    const { meta, samples } = await readWav("tail_cut.wav", withTail);
    expect(meta.fileSamples).toBe(FRAMES);
    expect(Array.from(samples)).toEqual(iq);
    expect(meta.warnings).toEqual([`The chunk "LIST" at byte ${full.byteLength} of ${meta.path} declares 4000 bytes but only 6 remain; it is ignored.`]);
  });

  it("openCapture(WAV whose RIFF and data sizes were never written, 36 and 0) reads to the end of the file", async () => {
    // A writer that fills in its sizes on closing starts with RIFF size 36 (the header alone) and data size 0.
    const unwritten = Buffer.from(full);
    unwritten.writeUInt32LE(36, 4);
    unwritten.writeUInt32LE(0, 40);
    const { meta, samples } = await readWav("unwritten.wav", unwritten);
    expect(meta.fileSamples).toBe(FRAMES);
    expect(Array.from(samples)).toEqual(iq);
    expect(meta.warnings).toHaveLength(1);
    expect(meta.warnings[0]).toMatch(/declares 0 bytes and the RIFF size ends the file there, but 256 bytes follow/);
    // A data chunk of size 0 in a RIFF whose size goes on past it is an empty data chunk: refused.
    const empty = riffFile([riffChunk("fmt ", fmtBody(1, 2, 48000, 16)), riffChunk("data", Buffer.alloc(0)), riffChunk("LIST", Buffer.alloc(4))]);
    expect(((await failure(put("empty_data.wav", empty), {})) as Error).message).toMatch(/holds no samples \(the data chunk is empty\)/);
  });

  it("openCapture(WAV with bytes after the data that are no RIFF chunk) reads the samples and ignores them", async () => {
    const junk = Buffer.from([0x00, 0xff, 0x13, 0x07, 0x42, 0x42, 0x42, 0x42, 0x01, 0x02]); // id "\0\xff\x13\x07": not 4 ASCII characters
    const { meta, samples } = await readWav("junk_tail.wav", Buffer.concat([full, junk]));
    expect(meta.fileSamples).toBe(FRAMES);
    expect(Array.from(samples)).toEqual(iq);
    expect(meta.warnings).toEqual([`The 10 bytes after byte ${full.byteLength} of ${meta.path} are not a RIFF chunk and are ignored.`]);
  });

  it("openCapture(WAV cut inside the header, before the samples) is still refused", async () => {
    for (const length of [8, 20, 40]) {
      const caught = await failure(put(`cut_header_${length}.wav`, full.subarray(0, length)), {});
      expect(caught, `${length} bytes`).toBeInstanceOf(CaptureFormatError);
    }
    // A data chunk header with no byte after it: no whole sample.
    const caught = await failure(put("cut_header_44.wav", full.subarray(0, 44)), {});
    expect((caught as Error).message).toMatch(/holds no samples/);
  });
});
