/**
 * The one CaptureSource implementation: every container (raw, WAV, SigMF) comes down to whole
 * sample frames of one SampleFormat at a byte offset in one file, described by CaptureMeta.
 * Reads use FileHandle.read at explicit positions (never the whole file, never a shared file
 * position), so several `blocks()` iterations may run at once on one source.
 */
import type { FileHandle } from "node:fs/promises";
import { CaptureFormatError, ParameterError } from "../errors.js";
import { decodeSamples } from "./sampleFormat.js";
import type { BlockOptions, CaptureMeta, CaptureSource, SampleSpan } from "./source.js";

/** Default block length for `blocks()`, in samples (frames): 64 Ki samples, 512 KiB as float32 I,Q. */
export const DEFAULT_BLOCK_SAMPLES = 65536;

/**
 * A CaptureSource over an open file handle. The source owns `handle` and closes it in `close()`.
 * Memory per `blocks()` iteration: one byte buffer of blockSamples × frameBytes, plus the
 * Float32Array handed out for each block (2 × blockSamples values): a fresh one every block so a
 * consumer may keep it, or with `reuse` one for the whole iteration.
 */
export function fileSource(meta: CaptureMeta, handle: FileHandle): CaptureSource {
  let closed = false;
  return {
    meta,
    blocks(span: SampleSpan, blockSamples: number = DEFAULT_BLOCK_SAMPLES, options: BlockOptions = {}): AsyncIterable<Float32Array> {
      checkSpan(meta, span, blockSamples);
      return readBlocks(meta, handle, span, blockSamples, options.reuse === true);
    },
    async close(): Promise<void> {
      if (closed) return;
      closed = true;
      await handle.close();
    },
  };
}

function checkSpan(meta: CaptureMeta, span: SampleSpan, blockSamples: number): void {
  const { startSample, sampleCount } = span;
  if (!Number.isSafeInteger(startSample) || startSample < 0 || startSample > meta.fileSamples) {
    throw new ParameterError("startSample", `${startSample} is not a sample index in 0..${meta.fileSamples} of ${meta.path}`);
  }
  if (!Number.isSafeInteger(sampleCount) || sampleCount < 0 || startSample + sampleCount > meta.fileSamples) {
    throw new ParameterError(
      "sampleCount",
      `${sampleCount} samples from sample ${startSample} run past the ${meta.fileSamples} samples of ${meta.path}`,
    );
  }
  if (!Number.isSafeInteger(blockSamples) || blockSamples < 1) {
    throw new ParameterError("blockSamples", `${blockSamples} is not a positive whole number of samples`);
  }
}

async function* readBlocks(
  meta: CaptureMeta,
  handle: FileHandle,
  span: SampleSpan,
  blockSamples: number,
  reuse: boolean,
): AsyncGenerator<Float32Array> {
  const frameBytes = meta.frameBytes;
  // An owned buffer (byteOffset 0) keeps decodeSamples on its aligned fast path for float32.
  const bytes = new Uint8Array(Math.min(blockSamples, span.sampleCount) * frameBytes);
  const shared = reuse ? new Float32Array(2 * Math.min(blockSamples, span.sampleCount)) : null;
  let next = span.startSample;
  const end = span.startSample + span.sampleCount;
  while (next < end) {
    const n = Math.min(blockSamples, end - next);
    const want = n * frameBytes;
    const position = meta.dataOffsetBytes + next * frameBytes;
    let got = 0;
    while (got < want) {
      const { bytesRead } = await handle.read(bytes, got, want - got, position + got);
      if (bytesRead === 0) {
        throw new CaptureFormatError(
          meta.dataPath,
          `ended at byte ${position + got} while reading samples that should reach byte ${position + want} (was the file cut short after it was opened?)`,
          position + got,
        );
      }
      got += bytesRead;
    }
    const out = shared === null ? new Float32Array(2 * n) : shared.subarray(0, 2 * n);
    decodeSamples(meta.format, bytes.subarray(0, want), out, meta.swapIq);
    yield out;
    next += n;
  }
}
