/**
 * A WAV writer for IQ (2 channels: I = channel 0, Q = channel 1) and real (1 channel) signals,
 * for the tests and the sample generator. Plain RIFF, WAVE_FORMAT_EXTENSIBLE and RF64.
 *
 * Layout written (Microsoft RIFF / WAVEFORMATEX(TENSIBLE) docs; EBU Tech 3306 for RF64):
 *   "RIFF" size "WAVE"                   size = file bytes − 8
 *   ["ds64" 28: riffSize u64, dataSize u64, sampleCount u64, tableLength u32 = 0]   RF64 only
 *   "fmt " 16 | 18 | 40                  16 for PCM, 18 (cbSize 0) for float, 40 for extensible
 *   ["fact" 4: frames u32]               float (non-PCM) files only
 *   [extra chunks, each padded to an even length]
 *   "data" size samples [pad byte if size is odd]
 * For RF64 the form is "RF64" and both the RIFF size and the data size fields are 0xFFFFFFFF;
 * the 64-bit sizes live in ds64.
 *
 * Scaling is that of `encodeSamples` (sampleFormat.ts): 8-bit PCM is unsigned with
 * x = (u − 127.5)/127.5, 16/24/32-bit PCM is x = s/2^(bits−1), float is stored as is.
 */
import { ParameterError } from "../errors.js";
import { encodeSamples, formatInfo } from "./sampleFormat.js";
import type { SampleFormat } from "./source.js";

/** Sample formats a WAV file can hold: WAV 8-bit PCM is unsigned, and WAV is little-endian. */
export type WavSampleFormat =
  | "cu8" | "ci16_le" | "ci24_le" | "ci32_le" | "cf32_le" | "cf64_le"
  | "ru8" | "ri16_le" | "ri24_le" | "ri32_le" | "rf32_le" | "rf64_le";

/** Every WavSampleFormat, complex first. */
export const WAV_SAMPLE_FORMATS: readonly WavSampleFormat[] = [
  "cu8", "ci16_le", "ci24_le", "ci32_le", "cf32_le", "cf64_le",
  "ru8", "ri16_le", "ri24_le", "ri32_le", "rf32_le", "rf64_le",
];

/** A chunk to place between `fmt ` and `data`, e.g. { id: "LIST", data }. `id` is 4 ASCII characters. */
export interface WavChunkSpec {
  readonly id: string;
  readonly data: Uint8Array;
}

/** What `encodeWav` writes: sample format, rate and container variant. */
export interface WavSpec {
  /** A complex format gives 2 channels (I, Q); a real one gives 1 channel. */
  readonly format: SampleFormat;
  /** Written to nSamplesPerSec: a positive integer, Hz. */
  readonly sampleRateHz: number;
  /** Write WAVE_FORMAT_EXTENSIBLE (tag 0xFFFE with a SubFormat GUID) instead of tag 1 / 3. */
  readonly extensible?: boolean | undefined;
  /** Write an RF64 file (EBU Tech 3306) with a ds64 chunk. */
  readonly rf64?: boolean | undefined;
  readonly extraChunks?: readonly WavChunkSpec[] | undefined;
}

const WAVE_FORMAT_PCM = 0x0001;
const WAVE_FORMAT_IEEE_FLOAT = 0x0003;
const WAVE_FORMAT_EXTENSIBLE = 0xfffe;
/** Tail of KSDATAFORMAT_SUBTYPE_PCM / _IEEE_FLOAT: {0000000X-0000-0010-8000-00AA00389B71}. */
const GUID_TAIL = [0x00, 0x00, 0x10, 0x00, 0x80, 0x00, 0x00, 0xaa, 0x00, 0x38, 0x9b, 0x71];
const UINT32_MAX = 0xffffffff;

/** True when `s` names a sample format a WAV file can hold. */
export function isWavSampleFormat(s: string): s is WavSampleFormat {
  return (WAV_SAMPLE_FORMATS as readonly string[]).includes(s);
}

/**
 * Encodes a whole WAV file. `iq` is interleaved I,Q at full scale 1.0 (for a real format only
 * the I values, at even indices, are written), so the file holds floor(iq.length / 2) frames.
 * Memory: the whole file; for long captures write `encodeWavHeader` and then blocks of
 * `encodeSamples`.
 */
export function encodeWav(spec: WavSpec, iq: ArrayLike<number>): Buffer {
  const samples = encodeSamples(checkWavFormat(spec.format), iq);
  const frames = samples.byteLength / formatInfo(spec.format).frameBytes;
  const header = encodeWavHeader(spec, frames);
  const pad = samples.byteLength % 2;
  return Buffer.concat([header, samples, Buffer.alloc(pad)]);
}

/**
 * The bytes of a WAV file up to and including the `data` chunk header, for `frames` sample
 * frames. The caller appends frames × frameBytes bytes of samples (from `encodeSamples`) and,
 * when that count is odd, one zero pad byte (RIFF chunks are padded to even length).
 * Plain RIFF sizes are 32-bit: more than 4 GiB of data needs `rf64: true`.
 */
export function encodeWavHeader(spec: WavSpec, frames: number): Buffer {
  const format = checkWavFormat(spec.format);
  if (!Number.isInteger(spec.sampleRateHz) || spec.sampleRateHz <= 0 || spec.sampleRateHz > UINT32_MAX) {
    throw new ParameterError("sampleRateHz", `${spec.sampleRateHz} is not a positive integer that fits a WAV header`);
  }
  if (!Number.isSafeInteger(frames) || frames < 0) {
    throw new ParameterError("frames", `${frames} is not a whole number of sample frames`);
  }
  const info = formatInfo(format);
  const channels = info.complex ? 2 : 1;
  const dataBytes = frames * info.frameBytes;
  const isFloat = info.kind === "float";
  const rf64 = spec.rf64 === true;
  const chunks: Buffer[] = [];
  if (rf64) chunks.push(Buffer.alloc(8 + 28)); // ds64, filled in below once the sizes are known
  chunks.push(chunk("fmt ", fmtBody(spec.sampleRateHz, channels, info.componentBytes, isFloat, spec.extensible === true)));
  if (isFloat) chunks.push(chunk("fact", u32(Math.min(frames, UINT32_MAX))));
  for (const extra of spec.extraChunks ?? []) chunks.push(chunk(extra.id, extra.data));
  const dataHeader = Buffer.alloc(8);
  dataHeader.write("data", 0, "latin1");
  const before = chunks.reduce((n, c) => n + c.byteLength, 0);
  const riffSize = 4 + before + 8 + dataBytes + (dataBytes % 2);
  if (!rf64 && (dataBytes > UINT32_MAX || riffSize > UINT32_MAX)) {
    throw new ParameterError("frames", `${dataBytes} bytes of samples do not fit a plain RIFF file (4 GiB); use rf64`);
  }
  dataHeader.writeUInt32LE(rf64 ? UINT32_MAX : dataBytes, 4);
  if (rf64) {
    const ds64 = chunks[0] as Buffer;
    ds64.write("ds64", 0, "latin1");
    ds64.writeUInt32LE(28, 4);
    ds64.writeBigUInt64LE(BigInt(riffSize), 8);
    ds64.writeBigUInt64LE(BigInt(dataBytes), 16);
    ds64.writeBigUInt64LE(BigInt(frames), 24);
    ds64.writeUInt32LE(0, 32); // no table entries
  }
  const riff = Buffer.alloc(12);
  riff.write(rf64 ? "RF64" : "RIFF", 0, "latin1");
  riff.writeUInt32LE(rf64 ? UINT32_MAX : riffSize, 4);
  riff.write("WAVE", 8, "latin1");
  return Buffer.concat([riff, ...chunks, dataHeader]);
}

function checkWavFormat(format: SampleFormat): WavSampleFormat {
  if (!isWavSampleFormat(format)) {
    throw new ParameterError("format", `${format} cannot be stored in a WAV file (8-bit WAV is unsigned, WAV is little-endian)`);
  }
  return format;
}

function fmtBody(rateHz: number, channels: number, componentBytes: number, isFloat: boolean, extensible: boolean): Buffer {
  const body = Buffer.alloc(extensible ? 40 : isFloat ? 18 : 16);
  const blockAlign = channels * componentBytes;
  const tag = extensible ? WAVE_FORMAT_EXTENSIBLE : isFloat ? WAVE_FORMAT_IEEE_FLOAT : WAVE_FORMAT_PCM;
  body.writeUInt16LE(tag, 0);
  body.writeUInt16LE(channels, 2);
  body.writeUInt32LE(rateHz, 4);
  body.writeUInt32LE((rateHz * blockAlign) % 2 ** 32, 8); // nAvgBytesPerSec, informative only
  body.writeUInt16LE(blockAlign, 12);
  body.writeUInt16LE(8 * componentBytes, 14);
  if (extensible) {
    body.writeUInt16LE(22, 16); // cbSize
    body.writeUInt16LE(8 * componentBytes, 18); // wValidBitsPerSample
    body.writeUInt32LE(0, 20); // dwChannelMask 0: no loudspeaker positions, I and Q are not speakers
    body.writeUInt32LE(isFloat ? WAVE_FORMAT_IEEE_FLOAT : WAVE_FORMAT_PCM, 24);
    Buffer.from(GUID_TAIL).copy(body, 28);
  }
  // cbSize = 0 for the 18-byte float fmt is already zero.
  return body;
}

function chunk(id: string, data: Uint8Array): Buffer {
  if (!/^[\x20-\x7e]{4}$/.test(id)) throw new ParameterError("chunk id", `"${id}" is not 4 printable ASCII characters`);
  const head = Buffer.alloc(8);
  head.write(id, 0, "latin1");
  head.writeUInt32LE(data.byteLength, 4);
  return Buffer.concat([head, data, Buffer.alloc(data.byteLength % 2)]);
}

function u32(n: number): Buffer {
  const b = Buffer.alloc(4);
  b.writeUInt32LE(n, 0);
  return b;
}
