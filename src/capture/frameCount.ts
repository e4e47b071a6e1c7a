/**
 * Whole sample frames in a run of sample bytes, and what to say about the bytes left over.
 */
import { CaptureFormatError } from "../errors.js";
import { formatInfo } from "./sampleFormat.js";
import type { SampleFormat } from "./source.js";

/** Whole frames in a byte run, and the partial frame after them. */
export interface FrameCount {
  /** floor(dataBytes / frameBytes). */
  readonly fileSamples: number;
  readonly frameBytes: number;
  /** dataBytes mod frameBytes: the partial sample at the end, ignored. */
  readonly trailingBytes: number;
  /** One sentence naming the trailing bytes, when there are any. */
  readonly warnings: readonly string[];
}

/**
 * Counts the whole frames of `format` in `dataBytes` bytes of `path`. A file with no whole frame
 * is a CaptureFormatError; a partial frame at the end gives a warning and is not read.
 * `part` names the byte run inside the file when it is not the whole file, e.g. "the data chunk".
 */
export function countFrames(path: string, dataBytes: number, format: SampleFormat, part?: string): FrameCount {
  const frameBytes = formatInfo(format).frameBytes;
  const fileSamples = Math.floor(dataBytes / frameBytes);
  const trailingBytes = dataBytes - fileSamples * frameBytes;
  if (fileSamples === 0) {
    throw new CaptureFormatError(
      path,
      dataBytes === 0
        ? `holds no samples (${part ?? "the file"} is empty)`
        : `holds no whole sample: ${part ?? "the file"} has ${dataBytes} bytes and one ${format} sample takes ${frameBytes}`,
    );
  }
  const of = part === undefined ? "" : `${part} of `;
  const warnings =
    trailingBytes === 0
      ? []
      : [
          `The last ${trailingBytes} byte${trailingBytes === 1 ? "" : "s"} of ${of}${path} ${trailingBytes === 1 ? "is" : "are"} not a whole ` +
            `${format} sample (${frameBytes} bytes each) and ${trailingBytes === 1 ? "is" : "are"} ignored; ${fileSamples} whole samples are read.`,
        ];
  return { fileSamples, frameBytes, trailingBytes, warnings };
}
