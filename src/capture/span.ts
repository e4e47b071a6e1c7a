/**
 * Turns --start / --duration (seconds) into a span of whole samples of a capture.
 */
import { UsageError } from "../errors.js";
import { shortNumber } from "./captureOptions.js";
import type { CaptureMeta, SampleSpan } from "./source.js";

/**
 * The samples to analyse: startSample = round(startS × fs), sampleCount = max(1, round(durationS
 * × fs)), with fs = meta.sampleRateHz and t = 0 at sample 0 of the file. Without `startS` the
 * span starts at sample 0; without `durationS` it runs to the end of the file.
 * Errors (UsageError): a negative or non-finite start, a start at or past the last sample, a
 * duration that is not positive and finite. A duration that runs past the end is cut at the end
 * of the file, with a warning.
 */
export function resolveSpan(
  meta: CaptureMeta,
  startS?: number,
  durationS?: number,
): { span: SampleSpan; warnings: string[] } {
  const fs = meta.sampleRateHz;
  const fileDurationS = meta.fileSamples / fs;
  const warnings: string[] = [];
  let startSample = 0;
  if (startS !== undefined) {
    if (!Number.isFinite(startS) || startS < 0) {
      throw new UsageError("--start", `${startS} s is not a time in the capture: it must be zero or positive`);
    }
    startSample = Math.round(startS * fs);
    if (startSample >= meta.fileSamples) {
      throw new UsageError(
        "--start",
        `${shortNumber(startS)} s is past the end of ${meta.path}, which lasts ${shortNumber(fileDurationS, 6)} s (${meta.fileSamples} samples)`,
      );
    }
  }
  let sampleCount = meta.fileSamples - startSample;
  if (durationS !== undefined) {
    if (!Number.isFinite(durationS) || durationS <= 0) {
      throw new UsageError("--duration", `${durationS} s is not a duration: it must be positive and finite`);
    }
    const wanted = Math.max(1, Math.round(durationS * fs));
    if (wanted > sampleCount) {
      warnings.push(
        `--duration ${shortNumber(durationS)} s runs past the end of ${meta.path}; ` +
          `the ${shortNumber(sampleCount / fs, 6)} s (${sampleCount} samples) up to the end are used.`,
      );
    } else {
      sampleCount = wanted;
    }
  }
  return { span: { startSample, sampleCount }, warnings };
}
