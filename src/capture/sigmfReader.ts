/**
 * SigMF recordings: `NAME.sigmf-meta` beside `NAME.sigmf-data` (or the file named by
 * core:dataset for a non-conforming dataset). Either path may be given. The metadata is checked
 * by sigmf.ts; this turns it and the data file's size into CaptureMeta.
 */
import { createHash } from "node:crypto";
import { readFile } from "node:fs/promises";
import { dirname, join } from "node:path";
import { CaptureFormatError, UsageError } from "../errors.js";
import { flagOrFound, overrideWarning, type CaptureOptions } from "./captureOptions.js";
import { formatInfo } from "./sampleFormat.js";
import { countFrames } from "./frameCount.js";
import { parseSigmfMeta, type SigmfRecording } from "./sigmf.js";
import { statRegularFile } from "./regularFile.js";
import type { CaptureMeta, Origin, SampleFormat } from "./source.js";

/** Largest .sigmf-meta read (it is read whole): 64 MiB of JSON is far beyond any real one. */
const MAX_META_BYTES = 64 * 1024 * 1024;

/** The two files of a SigMF recording given either of them. */
export function sigmfPaths(path: string): { metaPath: string; dataPath: string } {
  const stem = path.replace(/\.sigmf-(meta|data)$/i, "");
  return { metaPath: `${stem}.sigmf-meta`, dataPath: `${stem}.sigmf-data` };
}

/**
 * Reads and checks the .sigmf-meta file, with the SHA-256 of its bytes as stored; a missing,
 * unreadable or non-regular file is a CaptureFormatError.
 */
export async function readSigmfRecording(metaPath: string): Promise<SigmfRecording & { readonly metaSha256: string }> {
  const bytes = await statRegularFile(metaPath, "", "no such file: a SigMF recording needs its .sigmf-meta beside the .sigmf-data");
  if (bytes > MAX_META_BYTES) throw new CaptureFormatError(metaPath, `is ${bytes} bytes, too large for SigMF metadata (limit ${MAX_META_BYTES})`);
  let data: Buffer;
  try {
    data = await readFile(metaPath);
  } catch (e) {
    throw new CaptureFormatError(metaPath, `cannot be read (${(e as NodeJS.ErrnoException).code ?? "unknown error"})`);
  }
  const metaSha256 = createHash("sha256").update(data).digest("hex");
  return { ...parseSigmfMeta(data.toString("utf8"), metaPath), metaSha256 };
}

/** The data file of a recording: core:dataset in the meta file's folder, else NAME.sigmf-data. */
export function sigmfDataPath(recording: SigmfRecording, metaPath: string, defaultDataPath: string): string {
  return recording.dataset === null ? defaultDataPath : join(dirname(metaPath), recording.dataset);
}

/**
 * CaptureMeta of a checked recording whose data file `dataPath` is `fileBytes` long. Samples
 * run from core:header_bytes to fileBytes − core:trailing_bytes. Flags override the metadata
 * with a warning (`--format` over core:datatype, `--rate` over core:sample_rate, `--center` over
 * core:frequency). Errors: a real datatype without --real, a datatype iqaudit cannot decode, no
 * rate at all (UsageError for --rate), header and trailing bytes larger than the file.
 */
export function sigmfCaptureMeta(
  recording: SigmfRecording,
  paths: { path: string; metaPath: string; dataPath: string; metaSha256: string },
  fileBytes: number,
  options: CaptureOptions,
): CaptureMeta {
  const { path, metaPath, dataPath, metaSha256 } = paths;
  const warnings: string[] = [...recording.warnings];
  const dt = recording.datatype;
  let format: SampleFormat;
  let formatOrigin: Origin = "sigmf";
  if (options.format === "wav") throw new UsageError("--format", `wav does not apply to the SigMF recording ${path}`);
  if (options.format !== undefined) {
    if (options.format !== dt.format) warnings.push(overrideWarning("--format", options.format, "SigMF core:datatype", dt.text));
    format = options.format;
    formatOrigin = "flag";
  } else if (dt.format === null) {
    throw new CaptureFormatError(
      metaPath,
      `has core:datatype ${dt.text}, a valid SigMF datatype that iqaudit cannot decode (it reads cu8, ci8, ci16_le, ci16_be, ci32_le, cf32_le, cf64_le and their real r forms)`,
    );
  } else format = dt.format;
  const complex = formatInfo(format).complex;
  if (!complex && options.real !== true) {
    throw new CaptureFormatError(metaPath, `has the real datatype ${format}, not IQ; give --real to read it as a real signal`);
  }
  if (complex && options.real === true) warnings.push(`--real is ignored: ${path} holds complex (IQ) samples.`);

  const rate = flagOrFound("--rate", options.sampleRateHz, recording.sampleRateHz, "sigmf", "SigMF core:sample_rate", warnings);
  if (rate.value === null) throw new UsageError("--rate", `is required: ${metaPath} has no global core:sample_rate`);
  const centre = flagOrFound("--center", options.centerHz, recording.frequencyHz, "sigmf", "SigMF core:frequency", warnings);

  const sampleBytes = fileBytes - recording.headerBytes - recording.trailingBytes;
  if (sampleBytes < 0) {
    throw new CaptureFormatError(
      dataPath,
      `is ${fileBytes} bytes, fewer than the ${recording.headerBytes} header and ${recording.trailingBytes} trailing bytes that ${metaPath} declares`,
    );
  }
  const frames = countFrames(dataPath, sampleBytes, format, recording.headerBytes + recording.trailingBytes > 0 ? "the samples" : undefined);
  warnings.push(...frames.warnings);
  if (options.swapIq === true && !complex) warnings.push("--swap-iq has no effect on a real signal.");
  return {
    path,
    dataPath,
    container: "sigmf",
    format,
    complex,
    sampleRateHz: rate.value,
    centerHz: centre.value,
    ppm: options.ppm ?? 0,
    datetime: recording.datetime,
    fileSamples: frames.fileSamples,
    frameBytes: frames.frameBytes,
    dataOffsetBytes: recording.headerBytes,
    fileBytes,
    trailingBytes: frames.trailingBytes,
    swapIq: options.swapIq === true && complex,
    origin: { format: formatOrigin, sampleRateHz: rate.origin, centerHz: centre.origin },
    warnings,
    sigmf: { metaPath, metaSha256, description: recording.description, annotations: recording.annotations },
  };
}
