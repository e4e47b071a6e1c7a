/**
 * WAV (RIFF, RF64, WAVE_FORMAT_EXTENSIBLE) captures: 2 channels are I (channel 0) and Q
 * (channel 1); 1 channel is a real signal, read only with `real` (--real). Samples are read in
 * place from the data chunk by the common file source; the header is walked with our own chunk
 * walker (wavChunks.ts) and its fmt chunk parsed by wavFmt.ts.
 */
import type { FileHandle } from "node:fs/promises";
import { CaptureFormatError } from "../errors.js";
import { sampleRateProblem } from "./acceptedRanges.js";
import type { CaptureOptions } from "./captureOptions.js";
import { flagOrFound } from "./captureOptions.js";
import { fileNameTokens } from "./fileName.js";
import { countFrames } from "./frameCount.js";
import { parseWavFmt, type WavFmt } from "./wavFmt.js";
import { readBytesAt, walkWavChunks } from "./wavChunks.js";
import type { CaptureMeta, SampleFormat } from "./source.js";

/**
 * The CaptureMeta of the WAV file `path`, open in `handle` and `fileBytes` long.
 * Rate from the fmt chunk (origin "wav-header"); `options.sampleRateHz` overrides it with a
 * warning when they differ. Centre from --center, else a file-name token (fileName.ts), else
 * unknown. Errors: CaptureFormatError for a corrupt or truncated header, a missing fmt or data
 * chunk, an unsupported encoding, a 1-channel file without `real`, more than 2 channels, a
 * header rate outside the accepted range (acceptedRanges.ts) without --rate, a data chunk with
 * no whole sample.
 */
export async function readWavMeta(
  path: string,
  handle: FileHandle,
  fileBytes: number,
  options: CaptureOptions,
): Promise<CaptureMeta> {
  const layout = await walkWavChunks(handle, fileBytes, path);
  const warnings: string[] = [...layout.warnings];
  const fmtChunk = layout.chunks.find((c) => c.id === "fmt ");
  if (fmtChunk === undefined) throw new CaptureFormatError(path, "is a WAVE file without a fmt chunk");
  const dataChunks = layout.chunks.filter((c) => c.id === "data");
  const data = dataChunks[0];
  if (data === undefined) throw new CaptureFormatError(path, "is a WAVE file without a data chunk");
  if (dataChunks.length > 1) {
    warnings.push(`${path} has ${dataChunks.length} data chunks; only the first (at byte ${data.headerOffsetBytes}) is read.`);
  }
  const fmtBody = await readBytesAt(handle, fmtChunk.bodyOffsetBytes, Math.min(fmtChunk.sizeBytes, 64));
  const fmt = parseWavFmt(fmtBody, path, fmtChunk.bodyOffsetBytes);
  const complex = channelsToComplex(fmt, path, options, warnings);
  const format = wavSampleFormat(fmt, complex);

  const rate = flagOrFound("--rate", options.sampleRateHz, fmt.sampleRateHz, "wav-header", "WAV header rate", warnings);
  const rateProblem = rate.origin === "wav-header" ? sampleRateProblem(fmt.sampleRateHz) : null;
  if (rateProblem !== null) {
    throw new CaptureFormatError(
      path,
      `has a sample rate of ${fmt.sampleRateHz} in its fmt chunk, which ${rateProblem}; give the rate with --rate`,
      fmtChunk.bodyOffsetBytes + 4,
    );
  }
  const tokens = fileNameTokens(path);
  warnings.push(...tokens.warnings);
  const centre = flagOrFound("--center", options.centerHz, tokens.centerHz, "file-name", "file-name centre frequency", warnings);

  const frames = countFrames(path, data.sizeBytes, format, "the data chunk");
  warnings.push(...frames.warnings);
  const swapIq = options.swapIq === true && complex;
  if (options.swapIq === true && !complex) warnings.push("--swap-iq has no effect on a real (1-channel) signal.");
  return {
    path,
    dataPath: path,
    container: "wav",
    format,
    complex,
    sampleRateHz: rate.value as number,
    centerHz: centre.value,
    ppm: options.ppm ?? 0,
    datetime: null,
    fileSamples: frames.fileSamples,
    frameBytes: frames.frameBytes,
    dataOffsetBytes: data.bodyOffsetBytes,
    fileBytes,
    trailingBytes: frames.trailingBytes,
    swapIq,
    origin: { format: "wav-header", sampleRateHz: rate.origin, centerHz: centre.origin },
    sigmf: null,
    warnings,
  };
}

function channelsToComplex(fmt: WavFmt, path: string, options: CaptureOptions, warnings: string[]): boolean {
  if (fmt.channels === 2) {
    if (options.real === true) warnings.push(`--real is ignored: ${path} has 2 channels, read as I and Q.`);
    return true;
  }
  if (fmt.channels === 1) {
    if (options.real === true) return false;
    throw new CaptureFormatError(
      path,
      "has 1 channel, so it is not an IQ recording (IQ WAV files have 2 channels, I and Q); give --real to read it as a real signal",
    );
  }
  throw new CaptureFormatError(path, `has ${fmt.channels} channels; an IQ WAV file has 2 (I, Q), a real one 1`);
}

function wavSampleFormat(fmt: WavFmt, complex: boolean): SampleFormat {
  const c = complex ? "c" : "r";
  const bits = fmt.bitsPerSample;
  if (fmt.encoding === "float") return `${c}f${bits as 32 | 64}_le`;
  if (bits === 8) return `${c}u8`; // 8-bit WAV PCM is unsigned (offset binary)
  return `${c}i${bits as 16 | 24 | 32}_le`;
}
