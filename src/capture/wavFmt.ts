/**
 * Reads a WAVE `fmt ` chunk body into the sample format it describes.
 *
 * WAVEFORMATEX (Microsoft RIFF / mmreg.h docs; REFERENCES.md §9): wFormatTag u16, nChannels u16,
 * nSamplesPerSec u32, nAvgBytesPerSec u32, nBlockAlign u16, wBitsPerSample u16, [cbSize u16].
 * WAVE_FORMAT_EXTENSIBLE (tag 0xFFFE, cbSize ≥ 22) adds wValidBitsPerSample u16, dwChannelMask
 * u32 and a 16-byte SubFormat GUID {0000000X-0000-0010-8000-00AA00389B71}, X = 1 PCM, 3 float.
 * Readable: PCM 8-bit (unsigned, offset binary), 16/24/32-bit (signed), IEEE float 32/64-bit.
 */
import { CaptureFormatError } from "../errors.js";

/** The fields of a fmt chunk that decide how samples are decoded. */
export interface WavFmt {
  /** The tag after resolving WAVE_FORMAT_EXTENSIBLE: 1 PCM or 3 IEEE float. */
  readonly encoding: "pcm" | "float";
  readonly extensible: boolean;
  readonly channels: number;
  /** nSamplesPerSec, Hz (may be 0 in a broken file; the reader decides). */
  readonly sampleRateHz: number;
  /** Container bits per sample (wBitsPerSample). */
  readonly bitsPerSample: 8 | 16 | 24 | 32 | 64;
  /** wValidBitsPerSample for extensible files, else bitsPerSample. */
  readonly validBits: number;
  readonly blockAlign: number;
}

/** Names of a few other WAVE tags, for the error message (from memory of mmreg.h). */
const OTHER_TAGS: Readonly<Record<number, string>> = {
  0x0002: "Microsoft ADPCM",
  0x0006: "A-law",
  0x0007: "µ-law",
  0x0011: "IMA ADPCM",
  0x0031: "GSM 6.10",
  0x0055: "MPEG layer 3",
};
const GUID_TAIL = [0x00, 0x00, 0x10, 0x00, 0x80, 0x00, 0x00, 0xaa, 0x00, 0x38, 0x9b, 0x71];
const READABLE = "iqaudit reads PCM 8, 16, 24 and 32-bit and IEEE float 32 and 64-bit";

/**
 * Parses `body` (the fmt chunk body, which starts at byte `offset` of `path`). Errors are
 * CaptureFormatError: a chunk too short, an encoding or bit depth we cannot read, a block
 * alignment that disagrees with channels × bytes per sample.
 */
export function parseWavFmt(body: Uint8Array, path: string, offset: number): WavFmt {
  if (body.byteLength < 16) {
    throw new CaptureFormatError(path, `has a fmt chunk of ${body.byteLength} bytes; WAVEFORMATEX needs at least 16`, offset);
  }
  const v = new DataView(body.buffer, body.byteOffset, body.byteLength);
  const tag = v.getUint16(0, true);
  const channels = v.getUint16(2, true);
  const sampleRateHz = v.getUint32(4, true);
  const blockAlign = v.getUint16(12, true);
  const bits = v.getUint16(14, true);
  let encoding: "pcm" | "float";
  let validBits = bits;
  const extensible = tag === 0xfffe;
  if (tag === 0x0001) encoding = "pcm";
  else if (tag === 0x0003) encoding = "float";
  else if (extensible) {
    if (body.byteLength < 40 || v.getUint16(16, true) < 22) {
      throw new CaptureFormatError(path, "has a WAVE_FORMAT_EXTENSIBLE fmt chunk shorter than 40 bytes (cbSize must be at least 22)", offset);
    }
    validBits = v.getUint16(18, true);
    const sub = v.getUint32(24, true);
    const tailOk = GUID_TAIL.every((b, k) => body[28 + k] === b);
    if (!tailOk || (sub !== 1 && sub !== 3)) {
      throw new CaptureFormatError(path, `has the WAV SubFormat GUID {${guidText(body.subarray(24, 40))}}, which is not PCM or IEEE float; ${READABLE}`, offset + 24);
    }
    encoding = sub === 1 ? "pcm" : "float";
    if (validBits === 0) validBits = bits;
    if (validBits > bits) {
      throw new CaptureFormatError(path, `has ${validBits} valid bits in a ${bits}-bit sample container`, offset + 18);
    }
  } else {
    const name = OTHER_TAGS[tag];
    throw new CaptureFormatError(
      path,
      `uses WAV encoding 0x${tag.toString(16).padStart(4, "0")}${name === undefined ? "" : ` (${name})`}, which is not supported; ${READABLE}`,
      offset,
    );
  }
  const okBits = encoding === "pcm" ? [8, 16, 24, 32] : [32, 64];
  if (!okBits.includes(bits)) {
    throw new CaptureFormatError(path, `holds ${bits}-bit ${encoding === "pcm" ? "PCM" : "float"} samples, which are not supported; ${READABLE}`, offset + 14);
  }
  if (channels === 0) throw new CaptureFormatError(path, "declares 0 channels in its fmt chunk", offset + 2);
  if (blockAlign !== (channels * bits) / 8) {
    throw new CaptureFormatError(
      path,
      `has nBlockAlign ${blockAlign} in its fmt chunk, but ${channels} channel(s) of ${bits}-bit samples take ${(channels * bits) / 8} bytes`,
      offset + 12,
    );
  }
  return { encoding, extensible, channels, sampleRateHz, bitsPerSample: bits as WavFmt["bitsPerSample"], validBits, blockAlign };
}

function guidText(b: Uint8Array): string {
  const hex = (from: number, to: number, reverse: boolean): string => {
    const bytes = Array.from(b.subarray(from, to));
    if (reverse) bytes.reverse();
    return bytes.map((x) => x.toString(16).padStart(2, "0")).join("");
  };
  return `${hex(0, 4, true)}-${hex(4, 6, true)}-${hex(6, 8, true)}-${hex(8, 10, false)}-${hex(10, 16, false)}`.toUpperCase();
}
