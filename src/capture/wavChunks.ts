/**
 * A RIFF / RF64 chunk walker: finds where each chunk of a WAVE file lies, reading only the
 * 8-byte chunk headers (and the ds64 body), never the samples.
 *
 * RIFF (Microsoft RIFF docs): "RIFF" u32 size "WAVE", then chunks of id (4 ASCII) u32 size and
 * size bytes of body, each followed by a pad byte when size is odd. RF64 (EBU Tech 3306, 2009):
 * the form id is "RF64" and the first chunk is "ds64" with u64 riffSize, u64 dataSize, u64
 * sampleCount, u32 tableLength and tableLength entries of (id, u64 size); a 32-bit size field of
 * 0xFFFFFFFF means "see ds64". "BW64" (ITU-R BS.2088, from memory) has the same layout and is
 * read the same way. Unknown chunks are skipped.
 */
import type { FileHandle } from "node:fs/promises";
import { CaptureFormatError } from "../errors.js";

/** Where one chunk lies in the file. */
export interface WavChunk {
  /** Four-character chunk id, e.g. "fmt ", "data", "LIST". */
  readonly id: string;
  /** Byte offset of the chunk header in the file. */
  readonly headerOffsetBytes: number;
  /** Byte offset of the chunk body (header offset + 8). */
  readonly bodyOffsetBytes: number;
  /** Body size in bytes, from the header or, for 0xFFFFFFFF in RF64, from ds64. */
  readonly sizeBytes: number;
}

/** The chunk map of a WAVE file. */
export interface WavLayout {
  readonly form: "RIFF" | "RF64" | "BW64";
  /** Every chunk in file order (ds64 included). */
  readonly chunks: readonly WavChunk[];
  /** Oddities that do not stop reading, as plain sentences. */
  readonly warnings: readonly string[];
}

const UINT32_MAX = 0xffffffff;
/** A guard against walking a garbage file one 8-byte chunk at a time. */
const MAX_CHUNKS = 10000;

/** True when the first 12 bytes of a file are a RIFF, RF64 or BW64 WAVE header. */
export function isWavMagic(head: Uint8Array): boolean {
  if (head.byteLength < 12) return false;
  const form = ascii(head, 0);
  return (form === "RIFF" || form === "RF64" || form === "BW64") && ascii(head, 8) === "WAVE";
}

/**
 * Walks the chunks of the WAVE file open in `handle` (`fileBytes` long). Errors
 * (CaptureFormatError naming `path` and the byte offset): too short, bad magic, a missing or
 * short ds64 in RF64, a chunk id before the data that is not printable ASCII, a chunk header
 * cut off before any data chunk, a chunk before the data whose body runs past the end of the
 * file. A data chunk that runs past the end, or one of size 0 in a RIFF of a size that ends
 * there while bytes follow (sizes never written), is read to the end; a chunk after it that runs
 * past the end or bytes after it that are no chunk are ignored; each with a warning.
 */
export async function walkWavChunks(handle: FileHandle, fileBytes: number, path: string): Promise<WavLayout> {
  const riff = await readRiffHead(handle, fileBytes, path);
  const warnings: string[] = [];
  const chunks: WavChunk[] = [];
  let position = 12;
  let stoppedEarly = false;
  while (position < fileBytes) {
    if (chunks.length >= MAX_CHUNKS) {
      throw new CaptureFormatError(path, `has more than ${MAX_CHUNKS} chunks before byte ${position}; the header is corrupt`, position);
    }
    const step = await chunkAt(handle, position, riff, chunks.some((c) => c.id === "data"));
    if (step.chunk !== null) chunks.push(step.chunk);
    if (step.end !== null) {
      warnings.push(step.end.warning);
      stoppedEarly = step.end.early;
      break;
    }
    const { bodyOffsetBytes, sizeBytes } = step.chunk as WavChunk;
    position = bodyOffsetBytes + sizeBytes + (sizeBytes % 2);
  }
  const expected = riff.riffSize + 8;
  // A walk that stopped early at a cut or at junk has said so already; the RIFF size then disagrees too.
  if (!stoppedEarly && expected !== fileBytes && expected !== fileBytes + 1) {
    warnings.push(`The ${riff.form} size field of ${path} gives ${expected} bytes but the file has ${fileBytes}; the chunks are read as found.`);
  }
  return { form: riff.form, chunks, warnings };
}

/** What the first 12 bytes (and ds64 for RF64) say about the whole file. */
interface RiffHead {
  readonly form: WavLayout["form"];
  /** The RIFF size field (from ds64 for RF64): the file's length less 8. */
  readonly riffSize: number;
  readonly ds64: Ds64 | null;
  readonly fileBytes: number;
  readonly path: string;
}

async function readRiffHead(handle: FileHandle, fileBytes: number, path: string): Promise<RiffHead> {
  const head = await readBytesAt(handle, 0, 12);
  if (head.byteLength < 12) {
    throw new CaptureFormatError(path, `is too short for a WAV header (${fileBytes} bytes; a RIFF header takes 12)`, 0);
  }
  const form = ascii(head, 0);
  if (form !== "RIFF" && form !== "RF64" && form !== "BW64") {
    const hint = form === "RIFX" ? " (big-endian RIFX WAV is not supported)" : "";
    throw new CaptureFormatError(path, `is not a WAV file: it starts with "${printable(form)}", not RIFF or RF64${hint}`, 0);
  }
  if (ascii(head, 8) !== "WAVE") {
    throw new CaptureFormatError(path, `is a RIFF file of form "${printable(ascii(head, 8))}", not WAVE`, 8);
  }
  const ds64 = form === "RIFF" ? null : await readDs64(handle, fileBytes, path);
  const riffSize = ds64?.riffSize ?? new DataView(head.buffer, head.byteOffset, 12).getUint32(4, true);
  return { form, riffSize, ds64, fileBytes, path };
}

/**
 * The chunk whose header is at `position`, and whether the walk ends there (with the warning
 * that says why, and whether it ended before the end of the file). `afterData`: a data chunk
 * was found before this one, so what cannot be read from here on can be ignored.
 */
async function chunkAt(
  handle: FileHandle,
  position: number,
  riff: RiffHead,
  afterData: boolean,
): Promise<{ chunk: WavChunk | null; end: { warning: string; early: boolean } | null }> {
  const { fileBytes, path, ds64 } = riff;
  const header = await readBytesAt(handle, position, 8);
  if (header.byteLength < 8) {
    const stray = fileBytes - position;
    if (!afterData) throw new CaptureFormatError(path, `ends inside a chunk header at byte ${position} (${stray} of 8 bytes)`, position);
    return { chunk: null, end: { warning: `The last ${stray} bytes of ${path} are not a whole RIFF chunk and are ignored.`, early: false } };
  }
  const id = ascii(header, 0);
  if (!/^[\x20-\x7e]{4}$/.test(id)) {
    if (!afterData) {
      throw new CaptureFormatError(path, `has a corrupt chunk header at byte ${position}: the id "${printable(id)}" is not 4 ASCII characters`, position);
    }
    // The samples are known; what follows them (junk a recorder appended) is not needed.
    const warning = `The ${fileBytes - position} bytes after byte ${position} of ${path} are not a RIFF chunk and are ignored.`;
    return { chunk: null, end: { warning, early: true } };
  }
  const declared = new DataView(header.buffer, header.byteOffset, 8).getUint32(4, true);
  const sizeBytes = declared === UINT32_MAX && ds64 !== null ? ds64Size(ds64, id, path, position) : declared;
  const chunk: WavChunk = { id, headerOffsetBytes: position, bodyOffsetBytes: position + 8, sizeBytes };
  if (id === "data" && !afterData && sizeBytes === 0 && riff.riffSize + 8 <= chunk.bodyOffsetBytes && chunk.bodyOffsetBytes < fileBytes) {
    // Both sizes say the file ends at the data chunk's header, yet bytes follow: a recorder
    // that writes its sizes on closing stopped before it could. Read on to the end.
    const follow = fileBytes - chunk.bodyOffsetBytes;
    const warning =
      `The data chunk of ${path} declares 0 bytes and the ${riff.form} size ends the file there, but ${follow} bytes ` +
      "follow (a recorder that stopped before writing its sizes); the samples are read to the end of the file.";
    return { chunk: { ...chunk, sizeBytes: follow }, end: { warning, early: true } };
  }
  if (chunk.bodyOffsetBytes + sizeBytes > fileBytes) {
    const placeholder = declared === UINT32_MAX && ds64 === null;
    const cut = cutShortChunk(chunk, placeholder, afterData, fileBytes, path);
    return { chunk: cut.chunk, end: { warning: cut.warning, early: true } };
  }
  return { chunk, end: null };
}

/**
 * A chunk whose body runs past the end of the file. The first data chunk is what a recorder
 * that crashed (or one that streams and writes 0xFFFFFFFF as its size) leaves: it is read to the
 * end of the file, as a raw file is, with a warning. Any chunk after a data chunk is ignored with
 * a warning. A chunk before the data cannot be skipped (the data's position is unknown): an error.
 */
function cutShortChunk(
  chunk: WavChunk,
  placeholder: boolean,
  afterData: boolean,
  fileBytes: number,
  path: string,
): { chunk: WavChunk | null; warning: string } {
  const remaining = fileBytes - chunk.bodyOffsetBytes;
  const at = `chunk "${chunk.id}" at byte ${chunk.headerOffsetBytes}`;
  if (afterData) {
    return { chunk: null, warning: `The ${at} of ${path} declares ${chunk.sizeBytes} bytes but only ${remaining} remain; it is ignored.` };
  }
  if (chunk.id !== "data") {
    throw new CaptureFormatError(
      path,
      `${at} declares ${chunk.sizeBytes} bytes but only ${remaining} remain (the file is truncated or the header corrupt)`,
      chunk.headerOffsetBytes,
    );
  }
  const why = placeholder
    ? "0xFFFFFFFF bytes, the size a recorder that streams writes before it knows the length"
    : `${chunk.sizeBytes} bytes but the file holds only ${remaining} after its header (the recording was cut short)`;
  return {
    chunk: { ...chunk, sizeBytes: remaining },
    warning: `The data chunk of ${path} declares ${why}; the samples are read to the end of the file.`,
  };
}

interface Ds64 {
  readonly riffSize: number;
  readonly dataSize: number;
  readonly table: ReadonlyMap<string, number>;
}

async function readDs64(handle: FileHandle, fileBytes: number, path: string): Promise<Ds64> {
  const header = await readBytesAt(handle, 12, 8);
  if (header.byteLength < 8 || ascii(header, 0) !== "ds64") {
    throw new CaptureFormatError(path, "is an RF64 file without the ds64 chunk that must come first after WAVE (EBU Tech 3306)", 12);
  }
  const size = new DataView(header.buffer, header.byteOffset, 8).getUint32(4, true);
  if (size < 28 || 20 + size > fileBytes) {
    throw new CaptureFormatError(path, `has a ds64 chunk of ${size} bytes; it needs at least 28 and must fit the file`, 12);
  }
  const body = await readBytesAt(handle, 20, size);
  const v = new DataView(body.buffer, body.byteOffset, body.byteLength);
  const riffSize = u64(v, 0, path);
  const dataSize = u64(v, 8, path);
  const tableLength = v.getUint32(24, true);
  if (28 + 12 * tableLength > size) {
    throw new CaptureFormatError(path, `has a ds64 table of ${tableLength} entries that does not fit its ${size}-byte chunk`, 12);
  }
  const table = new Map<string, number>();
  for (let k = 0; k < tableLength; k++) table.set(ascii(body, 28 + 12 * k), u64(v, 32 + 12 * k, path));
  return { riffSize, dataSize, table };
}

function ds64Size(ds64: Ds64, id: string, path: string, position: number): number {
  if (id === "data") return ds64.dataSize;
  const size = ds64.table.get(id);
  if (size === undefined) {
    throw new CaptureFormatError(path, `chunk "${id}" at byte ${position} has size 0xFFFFFFFF but ds64 gives no size for it`, position);
  }
  return size;
}

function u64(v: DataView, offset: number, path: string): number {
  const n = v.getBigUint64(offset, true);
  if (n > BigInt(Number.MAX_SAFE_INTEGER)) {
    throw new CaptureFormatError(path, `has a ds64 size of ${n} bytes, beyond what can be addressed`, 20 + offset);
  }
  return Number(n);
}

/** Reads up to `length` bytes at byte `position` of `handle`; fewer at the end of the file. */
export async function readBytesAt(handle: FileHandle, position: number, length: number): Promise<Uint8Array> {
  const out = new Uint8Array(length);
  let got = 0;
  while (got < length) {
    const { bytesRead } = await handle.read(out, got, length - got, position + got);
    if (bytesRead === 0) break;
    got += bytesRead;
  }
  return out.subarray(0, got);
}

function ascii(b: Uint8Array, offset: number): string {
  return String.fromCharCode(...b.subarray(offset, offset + 4));
}

function printable(s: string): string {
  return s.replace(/[^\x20-\x7e]/g, "?");
}
