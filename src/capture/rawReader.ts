/**
 * Raw interleaved IQ files: nothing but samples, I then Q, from byte 0 to the end. The format
 * comes from --format or the extension (fileName.ts), the rate from --rate or a file-name token.
 */
import { UsageError } from "../errors.js";
import type { CaptureOptions } from "./captureOptions.js";
import { flagOrFound } from "./captureOptions.js";
import { fileNameTokens } from "./fileName.js";
import { countFrames } from "./frameCount.js";
import type { CaptureMeta, Origin, SampleFormat } from "./source.js";

/**
 * The CaptureMeta of the raw file `path` (`fileBytes` long) read as `format`, which came from
 * `formatOrigin` ("flag" for --format, "file-name" for the extension). The rate is
 * `options.sampleRateHz`, else the file-name rate token; without either it is a UsageError for
 * --rate. A flag that differs from a file-name token overrides it with a warning. An empty file
 * or one shorter than one sample is a CaptureFormatError; a partial last sample is a warning.
 */
export function readRawMeta(
  path: string,
  fileBytes: number,
  format: SampleFormat,
  formatOrigin: Origin,
  options: CaptureOptions,
): CaptureMeta {
  const warnings: string[] = [];
  const tokens = fileNameTokens(path);
  warnings.push(...tokens.warnings);

  const rate = flagOrFound("--rate", options.sampleRateHz, tokens.sampleRateHz, "file-name", "file-name rate", warnings);
  if (rate.value === null) {
    throw new UsageError(
      "--rate",
      `is required for a raw file without metadata: ${path} has no rate in its name (a token such as _2.4Msps)`,
    );
  }
  const centre = flagOrFound("--center", options.centerHz, tokens.centerHz, "file-name", "file-name centre frequency", warnings);

  const frames = countFrames(path, fileBytes, format);
  warnings.push(...frames.warnings);
  const complex = format.startsWith("c");
  if (options.swapIq === true && !complex) warnings.push("--swap-iq has no effect on a real signal.");
  return {
    path,
    dataPath: path,
    container: "raw",
    format,
    complex,
    sampleRateHz: rate.value,
    centerHz: centre.value,
    ppm: options.ppm ?? 0,
    datetime: null,
    fileSamples: frames.fileSamples,
    frameBytes: frames.frameBytes,
    dataOffsetBytes: 0,
    fileBytes,
    trailingBytes: frames.trailingBytes,
    swapIq: options.swapIq === true && complex,
    origin: { format: formatOrigin, sampleRateHz: rate.origin, centerHz: centre.origin },
    sigmf: null,
    warnings,
  };
}
