/**
 * The one interface behind every capture format (raw IQ, WAV/RF64, SigMF).
 *
 * Conventions (docs/formats.md): samples come out as interleaved I,Q float32 with full scale
 * = 1.0 per component; a real (1-channel, `--real`) capture comes out with Q = 0. Sample index 0
 * is the first sample of the data; t = 0 s at sample 0 of the file.
 */

/** Sample encodings, named as in the SigMF "Dataset Format" grammar (c = complex, r = real). */
export type SampleFormat =
  | "cu8"
  | "ci8"
  | "ci16_le"
  | "ci16_be"
  | "ci24_le"
  | "ci32_le"
  | "cf32_le"
  | "cf64_le"
  | "ru8"
  | "ri8"
  | "ri16_le"
  | "ri16_be"
  | "ri24_le"
  | "ri32_le"
  | "rf32_le"
  | "rf64_le";

/** Where a metadata value came from. */
export type Origin = "flag" | "sigmf" | "wav-header" | "file-name" | "default" | "unknown";

export type Container = "raw" | "wav" | "sigmf";

export interface CaptureMeta {
  /** The path the user gave (the .sigmf-meta or .sigmf-data for SigMF). */
  readonly path: string;
  /** The file that holds the samples, and the one whose SHA-256 is reported. */
  readonly dataPath: string;
  readonly container: Container;
  readonly format: SampleFormat;
  /** false for a real (1-channel) capture read with --real. */
  readonly complex: boolean;
  readonly sampleRateHz: number;
  /** RF centre frequency, Hz, or null when unknown. */
  readonly centerHz: number | null;
  /** Receiver clock correction in ppm (from --ppm), 0 when not given. */
  readonly ppm: number;
  /** RFC 3339 time of the first sample (SigMF core:datetime), or null. */
  readonly datetime: string | null;
  /** Whole samples (I,Q frames) in the data. */
  readonly fileSamples: number;
  /** Bytes of one sample frame (both components for a complex capture). */
  readonly frameBytes: number;
  /** Byte offset of sample 0 within dataPath. */
  readonly dataOffsetBytes: number;
  /** Size of dataPath in bytes (the whole file, headers included). */
  readonly fileBytes: number;
  /** Bytes after the last whole sample that are not a whole sample (0 for a well-formed file). */
  readonly trailingBytes: number;
  /** true when I and Q are swapped on reading (--swap-iq). */
  readonly swapIq: boolean;
  /** Where each value came from. */
  readonly origin: {
    readonly format: Origin;
    readonly sampleRateHz: Origin;
    readonly centerHz: Origin;
  };
  /** Things the reader noticed: a flag overriding metadata, trailing bytes, and so on. */
  readonly warnings: readonly string[];
  /** What a SigMF recording's metadata file is and says beyond how to read it; null for raw and WAV. */
  readonly sigmf: SigmfInfo | null;
}

/** The .sigmf-meta file of a recording: its hash (it sets the rate and centre) and its descriptive fields. */
export interface SigmfInfo {
  readonly metaPath: string;
  /** SHA-256 of the .sigmf-meta file as stored, lower-case hex. */
  readonly metaSha256: string;
  /** global core:description, or null. */
  readonly description: string | null;
  readonly annotations: readonly SigmfAnnotation[];
}

/** One SigMF annotation (core namespace). */
export interface SigmfAnnotation {
  /** core:sample_start less global core:offset: the sample index in the dataset. */
  readonly sampleStart: number;
  /** core:sample_count, or null (the annotation then runs to the end). */
  readonly sampleCount: number | null;
  /** core:freq_lower_edge and core:freq_upper_edge, absolute Hz, or null. */
  readonly lowerFrequencyHz: number | null;
  readonly upperFrequencyHz: number | null;
  readonly label: string | null;
  readonly comment: string | null;
}

/** A span of samples to analyse: [startSample, startSample + sampleCount). */
export interface SampleSpan {
  readonly startSample: number;
  readonly sampleCount: number;
}

/** How `blocks()` hands its blocks out. */
export interface BlockOptions {
  /**
   * true: every block is a view of one array of the iteration, overwritten by the next block, so
   * that a long read leaves no garbage behind (a consumer that keeps a block must copy it);
   * false (default): a fresh array every block, which the consumer may keep.
   */
  readonly reuse?: boolean | undefined;
}

export interface CaptureSource {
  readonly meta: CaptureMeta;
  /**
   * Reads samples [startSample, startSample + sampleCount) as interleaved I,Q float32, full
   * scale 1.0, in blocks of at most `blockSamples` samples. Memory: one block at a time.
   */
  blocks(span: SampleSpan, blockSamples?: number, options?: BlockOptions): AsyncIterable<Float32Array>;
  /** Releases the file handle. Safe to call twice. */
  close(): Promise<void>;
}
