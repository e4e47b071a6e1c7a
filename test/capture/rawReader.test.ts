// Raw IQ files: every raw format round-trips a closed-form complex tone, and the scaling is
// the one of the report contract (interface.md "Conventions"; REFERENCES.md §9, common
// practice): cu8 x = (u − 127.5)/127.5, ci8 s/128, ci16 s/32768, floats as stored. The files
// are encoded here with Node's Buffer writers, independently of the project's encoder.
import { describe, expect, it } from "vitest";
import { openCapture, type SampleFormat } from "../../src/capture/index.js";
import { complexTone, maxAbsDiff, put, readAll } from "./fixtures.js";

const N = 1000;
const TONE = complexTone(N);
/** Float32 rounding of the decoded value: at most 2^-24 relative, |x| ≤ 1 (IEEE 754 binary32). */
const F32 = 2 ** -24;

interface RawCase {
  readonly format: SampleFormat;
  readonly ext: string;
  /** Half a quantisation step, full scale 1.0: the largest rounding error of a nearest-code encoder. */
  readonly halfStep: number;
  readonly encode: (iq: ArrayLike<number>) => Buffer;
}

function writer(bytes: number, write: (b: Buffer, x: number, offset: number) => void): (iq: ArrayLike<number>) => Buffer {
  return (iq) => {
    const b = Buffer.alloc(bytes * iq.length);
    for (let k = 0; k < iq.length; k++) write(b, iq[k] as number, bytes * k);
    return b;
  };
}

const CASES: readonly RawCase[] = [
  { format: "cu8", ext: "cu8", halfStep: 0.5 / 127.5, encode: writer(1, (b, x, o) => b.writeUInt8(Math.round(x * 127.5 + 127.5), o)) },
  { format: "ci8", ext: "cs8", halfStep: 0.5 / 128, encode: writer(1, (b, x, o) => b.writeInt8(Math.min(127, Math.round(x * 128)), o)) },
  { format: "ci16_le", ext: "cs16", halfStep: 0.5 / 32768, encode: writer(2, (b, x, o) => b.writeInt16LE(Math.round(x * 32768), o)) },
  { format: "ci16_be", ext: "bin", halfStep: 0.5 / 32768, encode: writer(2, (b, x, o) => b.writeInt16BE(Math.round(x * 32768), o)) },
  { format: "cf32_le", ext: "cf32", halfStep: 0, encode: writer(4, (b, x, o) => b.writeFloatLE(x, o)) },
  { format: "cf64_le", ext: "cf64", halfStep: 0, encode: writer(8, (b, x, o) => b.writeDoubleLE(x, o)) },
];

describe("openCapture(raw file)", () => {
  for (const c of CASES) {
    it(`openCapture(${c.format}) round-trips a complex tone within half a quantisation step`, async () => {
      const path = put(`tone_${c.format}_2.4Msps.${c.ext}`, c.encode(TONE));
      // .bin names no format: the flag is needed there.
      const source = await openCapture(path, c.ext === "bin" ? { format: c.format } : {});
      expect(source.meta.format).toBe(c.format);
      expect(source.meta.fileSamples).toBe(N);
      expect(source.meta.sampleRateHz).toBe(2.4e6);
      const got = await readAll(source);
      await source.close();
      expect(maxAbsDiff(got, TONE)).toBeLessThanOrEqual(c.halfStep + F32);
    });
  }

  it("openCapture(cu8 / ci8 / ci16) maps the extreme codes as the contract says (interface.md conventions)", async () => {
    // cu8: u = 0 → −1, 255 → +1, 127 → −0.5/127.5, 128 → +0.5/127.5 (offset binary, centre 127.5).
    const cu8 = await openCapture(put("codes.cu8", Buffer.from([0, 255, 127, 128])), { sampleRateHz: 1e6 });
    expect(Array.from(await readAll(cu8))).toEqual([-1, 1, Math.fround(-0.5 / 127.5), Math.fround(0.5 / 127.5)]);
    // ci8: two's complement 0x80 = −128 → −1, 0x7F = 127 → 127/128.
    const ci8 = await openCapture(put("codes.cs8", Buffer.from([0x80, 0x7f])), { sampleRateHz: 1e6 });
    expect(Array.from(await readAll(ci8))).toEqual([-1, 127 / 128]);
    // ci16_be: 0x8000 = −32768 → −1, 0x4000 = 16384 → 0.5; the same codes little-endian.
    const be = await openCapture(put("codes_be.bin", Buffer.from([0x80, 0x00, 0x40, 0x00])), { sampleRateHz: 1e6, format: "ci16_be" });
    const le = await openCapture(put("codes_le.cs16", Buffer.from([0x00, 0x80, 0x00, 0x40])), { sampleRateHz: 1e6 });
    expect(Array.from(await readAll(be))).toEqual([-1, 0.5]);
    expect(Array.from(await readAll(le))).toEqual([-1, 0.5]);
    await Promise.all([cu8.close(), ci8.close(), be.close(), le.close()]);
  });

  it("openCapture(raw, { swapIq }) exchanges I and Q", async () => {
    const path = put("swap.cf32", CASES[4]!.encode([0.25, -0.5, 0.125, 0.75]));
    const source = await openCapture(path, { sampleRateHz: 1000, swapIq: true });
    expect(source.meta.swapIq).toBe(true);
    expect(Array.from(await readAll(source))).toEqual([-0.5, 0.25, 0.75, 0.125]);
    await source.close();
  });

  it("openCapture(raw) takes the extension's format and the file name's rate and centre, with their origins", async () => {
    const path = put("harbour_250ksps_156.8MHz.cu8", Buffer.alloc(200, 128));
    const source = await openCapture(path, { ppm: 1.5 });
    expect(source.meta).toMatchObject({
      container: "raw",
      format: "cu8",
      complex: true,
      sampleRateHz: 250e3,
      centerHz: 156.8e6,
      ppm: 1.5,
      fileSamples: 100,
      frameBytes: 2,
      dataOffsetBytes: 0,
      fileBytes: 200,
      trailingBytes: 0,
      origin: { format: "file-name", sampleRateHz: "file-name", centerHz: "file-name" },
      warnings: [],
    });
    await source.close();
  });

  it("openCapture(raw, { sampleRateHz, centerHz }) lets flags override file-name tokens, with a warning", async () => {
    const path = put("site_2.4Msps_433.92MHz.cf32", Buffer.alloc(80));
    const source = await openCapture(path, { sampleRateHz: 1e6, centerHz: 4.339e8 });
    expect(source.meta.sampleRateHz).toBe(1e6);
    expect(source.meta.centerHz).toBe(4.339e8);
    expect(source.meta.origin).toEqual({ format: "file-name", sampleRateHz: "flag", centerHz: "flag" });
    expect(source.meta.warnings).toEqual([
      "--rate 1e6 overrides the file-name rate 2.4e6.",
      "--center 4.339e8 overrides the file-name centre frequency 4.3392e8.",
    ]);
    await source.close();
  });

  it("openCapture(raw) reads a file ending in a partial sample to its last whole sample, with a warning", async () => {
    // 1003 bytes of cf32_le = 125 whole 8-byte frames and 3 bytes (interface.md, "Exit codes").
    const path = put("partial.cf32", Buffer.alloc(1003));
    const source = await openCapture(path, { sampleRateHz: 8000 });
    expect(source.meta.fileSamples).toBe(125);
    expect(source.meta.trailingBytes).toBe(3);
    expect(source.meta.warnings).toHaveLength(1);
    expect(source.meta.warnings[0]).toMatch(/^The last 3 bytes of .*partial\.cf32 are not a whole cf32_le sample/);
    expect((await readAll(source)).length).toBe(250);
    await source.close();
  });
});
