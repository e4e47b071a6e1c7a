// The WAV reader against wav-decoder (the reference decoder, a general-purpose library), and
// the WAV writer against the byte layout of the RIFF/WAVEFORMATEX docs and EBU Tech 3306
// (REFERENCES.md §9).
//
// wav-decoder 1.3.0 reads tags 1 (PCM) and 3 (float) at 8/16/24/32 and 32/64 bits from plain
// RIFF files only: no WAVE_FORMAT_EXTENSIBLE, no RF64, no pad bytes after odd-sized chunks.
// Its default scaling is asymmetric (negative codes / 2^(b−1), positive / (2^(b−1) − 1); 8-bit
// (u − 128)/128 or /127); with { symmetric: true } it divides by 2^(b−1) and uses (u − 127.5)/127.5
// for 8-bit, which is our convention (interface.md), so there the two must agree exactly. It
// also reads the 24-bit code 0x800000 (−1.0) as +1.0 (its test is `> 0x800000`), so the test
// tone stays at amplitude 0.9.
import { readFileSync } from "node:fs";
import WavDecoder from "wav-decoder";
import { describe, expect, it } from "vitest";
import { encodeWav, openCapture, type SampleFormat } from "../../src/capture/index.js";
import { complexTone, fmtBody, int16le, maxAbsDiff, put, readAll, riffChunk, riffFile } from "./fixtures.js";

const N = 997; // odd, so 8-bit and 24-bit mono data chunks need a pad byte
const TONE = complexTone(N);
const RATE = 48000;

const ENCODINGS: readonly { complex: SampleFormat; real: SampleFormat; bits: number; float: boolean }[] = [
  { complex: "cu8", real: "ru8", bits: 8, float: false },
  { complex: "ci16_le", real: "ri16_le", bits: 16, float: false },
  { complex: "ci24_le", real: "ri24_le", bits: 24, float: false },
  { complex: "ci32_le", real: "ri32_le", bits: 32, float: false },
  { complex: "cf32_le", real: "rf32_le", bits: 32, float: true },
  { complex: "cf64_le", real: "rf64_le", bits: 64, float: true },
];

function channel(iq: Float32Array, c: 0 | 1): Float32Array {
  return iq.filter((_, k) => k % 2 === c);
}

describe("openCapture(WAV) agrees with wav-decoder", () => {
  for (const e of ENCODINGS) {
    const name = `${e.float ? "float" : "PCM"} ${e.bits}-bit`;
    it(`openCapture(${name}, 2 channels) gives I = channel 0, Q = channel 1, as wav-decoder decodes them`, async () => {
      const bytes = encodeWav({ format: e.complex, sampleRateHz: RATE }, TONE);
      const source = await openCapture(put(`tone_${e.complex}.wav`, bytes));
      expect(source.meta).toMatchObject({ container: "wav", format: e.complex, complex: true, sampleRateHz: RATE, fileSamples: N });
      const ours = await readAll(source);
      await source.close();
      const ref = WavDecoder.decode.sync(bytes, { symmetric: true });
      expect(ref.sampleRate).toBe(RATE);
      expect(ref.channelData).toHaveLength(2);
      // Same codes, same divisor, both rounded once to float32: identical.
      expect(channel(ours, 0)).toEqual(ref.channelData[0]);
      expect(channel(ours, 1)).toEqual(ref.channelData[1]);
      // wav-decoder's default (asymmetric) scaling differs from ours by at most one code step,
      // plus one float32 rounding of each value (half an ulp, ≤ 2^-25 for |x| ≤ 1, IEEE 754).
      const asym = WavDecoder.decode.sync(bytes);
      const step = e.float ? 0 : 2 / 2 ** e.bits;
      expect(maxAbsDiff(channel(ours, 0), asym.channelData[0]!)).toBeLessThanOrEqual(step + 2 ** -24);
    });

    it(`openCapture(${name}, 1 channel, { real }) reads channel 0 as I with Q = 0`, async () => {
      const bytes = encodeWav({ format: e.real, sampleRateHz: RATE }, TONE);
      const source = await openCapture(put(`tone_${e.real}.wav`, bytes), { real: true });
      expect(source.meta).toMatchObject({ format: e.real, complex: false, fileSamples: N, frameBytes: e.bits / 8 });
      const ours = await readAll(source);
      await source.close();
      const ref = WavDecoder.decode.sync(bytes, { symmetric: true });
      expect(ref.channelData).toHaveLength(1);
      expect(channel(ours, 0)).toEqual(ref.channelData[0]);
      expect(channel(ours, 1).every((q) => q === 0)).toBe(true);
    });
  }

  it("openCapture(extensible and RF64 files) reads the same samples wav-decoder reads from the plain file", async () => {
    for (const format of ["ci16_le", "ci24_le", "cf32_le"] as const) {
      const plain = encodeWav({ format, sampleRateHz: RATE }, TONE);
      const ref = WavDecoder.decode.sync(plain, { symmetric: true });
      for (const spec of [{ extensible: true }, { rf64: true }, { rf64: true, extensible: true }]) {
        const source = await openCapture(put(`variant_${format}_${Object.keys(spec).join("_")}.wav`, encodeWav({ format, sampleRateHz: RATE, ...spec }, TONE)));
        expect(source.meta.format).toBe(format);
        const ours = await readAll(source);
        await source.close();
        expect(channel(ours, 0)).toEqual(ref.channelData[0]);
        expect(channel(ours, 1)).toEqual(ref.channelData[1]);
      }
    }
  });

  it("openCapture(WAV with an even-sized LIST chunk before data) skips it, as wav-decoder does", async () => {
    const list = new Uint8Array(Buffer.from("INFOISFT\x04\x00\x00\x00test", "latin1"));
    const bytes = encodeWav({ format: "ci16_le", sampleRateHz: RATE, extraChunks: [{ id: "LIST", data: list }] }, TONE);
    const source = await openCapture(put("list_even.wav", bytes));
    const ours = await readAll(source);
    await source.close();
    const ref = WavDecoder.decode.sync(bytes, { symmetric: true });
    expect(channel(ours, 0)).toEqual(ref.channelData[0]);
    expect(channel(ours, 1)).toEqual(ref.channelData[1]);
  });
});

describe("openCapture(hand-built WAV files)", () => {
  // Built byte by byte here, so the reader is not only checked against our own writer.
  const iq = [0.5, -0.25, 0.125, 0.75, -1, 0.5];
  const data = int16le(iq);

  it("openCapture(RIFF with JUNK, an odd-sized LIST with its pad byte, and a chunk after data) finds the samples", async () => {
    const file = riffFile([
      riffChunk("JUNK", Buffer.alloc(28)), // room reserved for a ds64 (EBU Tech 3306)
      riffChunk("fmt ", fmtBody(1, 2, 8000, 16)),
      riffChunk("LIST", Buffer.from("INFOx", "latin1")), // 5 bytes + 1 pad byte (RIFF rule)
      riffChunk("data", data),
      riffChunk("cue ", Buffer.alloc(4)),
    ]);
    const source = await openCapture(put("hand_riff.wav", file));
    expect(source.meta).toMatchObject({ sampleRateHz: 8000, fileSamples: 3, dataOffsetBytes: 12 + 36 + 24 + 14 + 8, warnings: [] });
    expect(Array.from(await readAll(source))).toEqual(iq);
    await source.close();
  });

  it("openCapture(RF64 with ds64 sizes and data size 0xFFFFFFFF) reads the data size from ds64 (EBU Tech 3306)", async () => {
    const ds64 = Buffer.alloc(28);
    const fmt = riffChunk("fmt ", fmtBody(1, 2, 8000, 16));
    const dataChunk = riffChunk("data", data, 0xffffffff);
    ds64.writeBigUInt64LE(BigInt(4 + 36 + fmt.byteLength + dataChunk.byteLength), 0); // riffSize
    ds64.writeBigUInt64LE(BigInt(data.byteLength), 8); // dataSize
    ds64.writeBigUInt64LE(3n, 16); // sampleCount
    ds64.writeUInt32LE(0, 24); // table length
    const file = riffFile([riffChunk("ds64", ds64), fmt, dataChunk], "RF64");
    file.writeUInt32LE(0xffffffff, 4);
    const source = await openCapture(put("hand_rf64.wav", file));
    expect(source.meta).toMatchObject({ fileSamples: 3, trailingBytes: 0, warnings: [] });
    expect(Array.from(await readAll(source))).toEqual(iq);
    await source.close();
  });

  it("openCapture(WAV whose data chunk ends in a partial frame) reads the whole frames, with a warning", async () => {
    const file = riffFile([riffChunk("fmt ", fmtBody(1, 2, 8000, 16)), riffChunk("data", Buffer.concat([data, Buffer.from([1, 2, 3])]))]);
    const source = await openCapture(put("hand_partial.wav", file));
    expect(source.meta.fileSamples).toBe(3);
    expect(source.meta.trailingBytes).toBe(3);
    expect(source.meta.warnings.join(" ")).toMatch(/The last 3 bytes of the data chunk of .*hand_partial\.wav/);
    await source.close();
  });

  it("openCapture(WAV, { sampleRateHz }) lets --rate override the header rate, with a warning", async () => {
    const source = await openCapture(put("override.wav", encodeWav({ format: "ci16_le", sampleRateHz: 48000 }, iq)), { sampleRateHz: 96000 });
    expect(source.meta.sampleRateHz).toBe(96000);
    expect(source.meta.origin.sampleRateHz).toBe("flag");
    expect(source.meta.warnings).toEqual(["--rate 96000 overrides the WAV header rate 48000."]);
    await source.close();
  });

  it("openCapture(a WAV without the .wav extension) recognises the RIFF header", async () => {
    const source = await openCapture(put("noext_capture", encodeWav({ format: "ci16_le", sampleRateHz: 8000 }, iq)));
    expect(source.meta.container).toBe("wav");
    await source.close();
  });
});

describe("encodeWav(spec, iq) header layout", () => {
  it("encodeWav(16-bit mono 44.1 kHz) writes the worked WAVEFORMAT header (REFERENCES.md §9)", () => {
    const b = encodeWav({ format: "ri16_le", sampleRateHz: 44100 }, [0.5, 0]);
    expect(b.toString("latin1", 0, 4)).toBe("RIFF");
    expect(b.readUInt32LE(4)).toBe(b.byteLength - 8);
    expect(b.toString("latin1", 8, 16)).toBe("WAVEfmt ");
    // fmt size 0x10, tag 1, 1 channel, 0xAC44 = 44100 Hz, 0x15888 = 88200 B/s, align 2, 16 bits.
    expect(b.subarray(16, 36).toString("hex")).toBe("10000000" + "0100" + "0100" + "44ac0000" + "88580100" + "0200" + "1000");
    expect(b.toString("latin1", 36, 40)).toBe("data");
    expect(b.readUInt32LE(40)).toBe(2);
    expect(b.readInt16LE(44)).toBe(16384);
  });

  it("encodeWav({ extensible }) writes tag 0xFFFE, cbSize 22 and the PCM / float SubFormat GUIDs (Microsoft WAVEFORMATEXTENSIBLE)", () => {
    const pcm = encodeWav({ format: "ci24_le", sampleRateHz: 8000, extensible: true }, [0, 0]);
    expect(pcm.readUInt32LE(16)).toBe(40);
    expect(pcm.readUInt16LE(20)).toBe(0xfffe);
    expect(pcm.readUInt16LE(36)).toBe(22);
    expect(pcm.readUInt16LE(38)).toBe(24);
    // KSDATAFORMAT_SUBTYPE_PCM {00000001-0000-0010-8000-00AA00389B71}, first three fields little-endian.
    expect(pcm.subarray(44, 60).toString("hex")).toBe("0100000000001000800000aa00389b71");
    const float = encodeWav({ format: "cf32_le", sampleRateHz: 8000, extensible: true }, [0, 0]);
    expect(float.subarray(44, 60).toString("hex")).toBe("0300000000001000800000aa00389b71");
  });

  it("encodeWav({ rf64 }) writes RF64, size fields 0xFFFFFFFF and a 28-byte ds64 first (EBU Tech 3306)", () => {
    const b = encodeWav({ format: "ci16_le", sampleRateHz: 8000, rf64: true }, [0.5, 0.5, 0.25, 0.25, 0, 0]);
    expect(b.toString("latin1", 0, 4)).toBe("RF64");
    expect(b.readUInt32LE(4)).toBe(0xffffffff);
    expect(b.toString("latin1", 12, 16)).toBe("ds64");
    expect(b.readUInt32LE(16)).toBe(28);
    expect(Number(b.readBigUInt64LE(20))).toBe(b.byteLength - 8); // riffSize
    expect(Number(b.readBigUInt64LE(28))).toBe(12); // dataSize: 3 frames × 4 bytes
    expect(Number(b.readBigUInt64LE(36))).toBe(3); // sampleCount
    const dataAt = b.indexOf("data", 0, "latin1");
    expect(b.readUInt32LE(dataAt + 4)).toBe(0xffffffff);
  });

  it("encodeWav(odd-sized data) adds the RIFF pad byte and counts it in the RIFF size", () => {
    const b = encodeWav({ format: "ru8", sampleRateHz: 8000 }, [0, 0, 0.5, 0, -0.5, 0]);
    expect(b.byteLength).toBe(44 + 3 + 1);
    expect(b.readUInt32LE(4)).toBe(b.byteLength - 8);
    // And the file reads back as written, in a temp file, with wav-decoder too.
    expect(WavDecoder.decode.sync(readFileSync(put("odd.wav", b)), { symmetric: true }).channelData[0]).toHaveLength(3);
  });
});
