/**
 * Opens a capture of any supported container and returns its CaptureSource.
 *
 * How the container is chosen (docs/formats.md):
 *   1. a path ending .sigmf-meta or .sigmf-data        → SigMF (both files must exist)
 *   2. --format wav                                     → WAV
 *   3. --format <sample type>                           → raw file of that type
 *   4. the extension (.cu8, .cs16, .cf32, .wav, …)      → raw of that type, or WAV
 *   5. a RIFF/RF64 WAVE header in the first 12 bytes    → WAV
 *   otherwise a UsageError asking for --format.
 */
import type { FileHandle } from "node:fs/promises";
import { CaptureFormatError, UsageError } from "../errors.js";
import { checkCaptureOptions, type CaptureOptions } from "./captureOptions.js";
import { extensionKind, fileExtension } from "./fileName.js";
import { fileSource } from "./fileSource.js";
import { readRawMeta } from "./rawReader.js";
import { openRegularFile } from "./regularFile.js";
import { readSigmfRecording, sigmfCaptureMeta, sigmfDataPath, sigmfPaths } from "./sigmfReader.js";
import type { CaptureMeta, CaptureSource } from "./source.js";
import { isWavMagic, readBytesAt } from "./wavChunks.js";
import { readWavMeta } from "./wavReader.js";

const RAW_FORMATS_HINT = "cu8, ci8, ci16_le, ci16_be, cf32_le, cf64_le or wav";

/**
 * Opens `path` for reading with the user's `options` (CLI flags). The returned source holds one
 * open file handle until `close()`. Errors: UsageError for a bad option value, a missing rate or
 * an unknown format; CaptureFormatError naming the file for a missing, empty or unreadable file.
 * Nothing but a few header bytes (and a .sigmf-meta file) is read here.
 */
export async function openCapture(path: string, options: CaptureOptions = {}): Promise<CaptureSource> {
  checkCaptureOptions(options);
  const kind = extensionKind(path);
  if (kind === "sigmf-archive") {
    throw new CaptureFormatError(path, "is a SigMF archive (a tar file); extract it and give the .sigmf-meta file");
  }
  if (kind === "sigmf-meta" || kind === "sigmf-data") return openSigmf(path, options);

  const { handle, fileBytes } = await openRegularFile(path);
  try {
    const meta = await dataFileMeta(path, handle, fileBytes, options);
    return fileSource(meta, handle);
  } catch (e) {
    await handle.close();
    throw e;
  }
}

async function dataFileMeta(path: string, handle: FileHandle, fileBytes: number, options: CaptureOptions): Promise<CaptureMeta> {
  if (fileBytes === 0) throw new CaptureFormatError(path, "is empty (0 bytes): there are no samples to read");
  const kind = extensionKind(path);
  const looksWav = isWavMagic(await readBytesAt(handle, 0, 12));
  if (options.format === "wav") return readWavMeta(path, handle, fileBytes, options);
  if (options.format !== undefined) {
    const meta = readRawMeta(path, fileBytes, options.format, "flag", options);
    if (!looksWav) return meta;
    const note = `${path} starts with a WAV header, but --format ${options.format} reads it as raw samples, header included.`;
    return { ...meta, warnings: [note, ...meta.warnings] };
  }
  if (kind === "wav" || (kind === null && looksWav)) return readWavMeta(path, handle, fileBytes, options);
  if (kind !== null && kind !== "sigmf-meta" && kind !== "sigmf-data" && kind !== "sigmf-archive") {
    return readRawMeta(path, fileBytes, kind, "file-name", options);
  }
  const ext = fileExtension(path);
  throw new UsageError(
    "--format",
    `is required: the sample format of ${path} cannot be told from ${ext === "" ? "a name without an extension" : `the extension .${ext}`} ` +
      `or from a header; give one of ${RAW_FORMATS_HINT}`,
  );
}

async function openSigmf(path: string, options: CaptureOptions): Promise<CaptureSource> {
  const paths = sigmfPaths(path);
  const recording = await readSigmfRecording(paths.metaPath);
  const dataPath = sigmfDataPath(recording, paths.metaPath, paths.dataPath);
  const { handle, fileBytes } = await openRegularFile(dataPath, ` (the dataset of ${paths.metaPath})`);
  try {
    const meta = sigmfCaptureMeta(recording, { path, metaPath: paths.metaPath, dataPath, metaSha256: recording.metaSha256 }, fileBytes, options);
    return fileSource(meta, handle);
  } catch (e) {
    await handle.close();
    throw e;
  }
}
