/**
 * Pass 2: one emission out of the capture. Streams the analysed span through a channel
 * extractor (NCO to baseband, then polyphase decimation to a rate that suits the emission's
 * bandwidth), so that everything measured after it costs in proportion to the emission, not the
 * capture rate. The decimated channel is kept for the measurements, up to `maxSamples` (a fixed
 * bound on memory: 2^20 samples = 8 MiB by default, and the measurements after it allocate a
 * few times that); a longer span is measured over its first
 * `maxSamples` decimated samples, with a warning.
 *
 * Pass 1 can do the same in its own read when the channel is known before it (Pass1Options.channel:
 * its workers extract each block's channel, and a Pass2Collector here takes the samples in order);
 * runPass2 is the second read otherwise.
 *
 * With `wholeSpan`, the same read goes on to the end of the span and every channel block also
 * feeds the whole-span accumulators (wholeSpan.ts: carrier, peak deviations with their times,
 * Welch PSD, max-hold spectrum), which keep no record: the memory bound is unchanged.
 */
import type { CaptureSource, SampleSpan } from "../capture/index.js";
import { ChannelExtractor } from "../dsp/index.js";
import { WholeSpanAccumulator, type WholeSpanFigures, type WholeSpanOptions } from "./wholeSpan.js";

/** What the whole-span stage is asked for beside pass 2 (its channel is pass 2's). */
export type Pass2WholeSpan = Pick<WholeSpanOptions, "audioBandwidthHz" | "maskResolutionHz" | "welchResolutionHz" | "carrierOffsetHz" | "referenceBandHz" | "hold">;

export interface Pass2Options {
  /** Centre of the channel, Hz from the capture centre. */
  readonly offsetHz: number;
  /** Width of the channel to keep, Hz (the passband is ±bandwidthHz/2 around offsetHz). */
  readonly bandwidthHz: number;
  /** Most decimated samples to keep (default 2^20). */
  readonly maxSamples?: number | undefined;
  /** Input samples per block read (default 65 536, 512 KiB as cf32; the source reuses one block array, the extractor keeps none). */
  readonly blockSamples?: number | undefined;
  readonly onProgress?: ((doneSamples: number, totalSamples: number) => void) | undefined;
  /** Also stream the whole span through the whole-span accumulators (module comment). */
  readonly wholeSpan?: Pass2WholeSpan | undefined;
  /**
   * Called with every input block of the span, in order, before pass 2 uses it (the block is
   * reused after the call): another stage reading the same span in the same read, e.g. a check's
   * wide channel. Makes pass 2 read the whole span.
   */
  readonly onInputBlock?: ((block: Float32Array) => void) | undefined;
}

export interface Pass2Result {
  /** Channel baseband, interleaved I,Q, the channel centre at 0 Hz. */
  readonly iq: Float32Array;
  readonly sampleRateHz: number;
  readonly decimation: number;
  readonly offsetHz: number;
  readonly bandwidthHz: number;
  /** Time of the first kept sample, s from the start of the analysed span (the filters' settling skipped). */
  readonly startS: number;
  /** Input samples read. */
  readonly inputSamples: number;
  /** Whether `iq` holds every channel sample of the span (false: it was cut at maxSamples). */
  readonly complete: boolean;
  /** The whole-span figures, when asked for. */
  readonly wholeSpan: WholeSpanFigures | null;
  readonly warnings: readonly string[];
}

export const PASS2_DEFAULTS = { maxSamples: 1 << 20, blockSamples: 65_536 } as const;

/** What a channel read beside pass 1 is asked for (Pass1Options.channel): pass 2 without its own read. */
export type Pass2Request = Pick<Pass2Options, "offsetHz" | "bandwidthHz" | "maxSamples" | "wholeSpan">;

export async function runPass2(source: CaptureSource, span: SampleSpan, options: Pass2Options): Promise<Pass2Result> {
  const fs = source.meta.sampleRateHz;
  const collector = new Pass2Collector(fs, span, options, { readWhole: options.onInputBlock !== undefined });
  const inputNeeded = collector.inputNeeded;
  let read = 0;
  const blockSamples = options.blockSamples ?? PASS2_DEFAULTS.blockSamples;
  for await (const block of source.blocks({ startSample: span.startSample, sampleCount: inputNeeded }, blockSamples, { reuse: true })) {
    read += block.length / 2;
    options.onInputBlock?.(block);
    collector.push(collector.extractor.push(block));
    options.onProgress?.(read, inputNeeded);
    if (collector.done) break;
  }
  return collector.finish(read);
}

/**
 * The channel samples of pass 2, as they come (from its own read, or from pass 1's workers
 * block by block, in order): the filters' settling skipped, the record kept up to maxSamples,
 * the whole-span accumulators fed. Holds the extractor the samples are to come from (its
 * parameters; pass 1's workers run copies of it).
 */
export class Pass2Collector {
  /** Extractor of the channel: `push` its outputs here. */
  readonly extractor: ChannelExtractor;
  /** Input samples the channel needs read: the span, or enough for the record alone. */
  readonly inputNeeded: number;
  private readonly whole: WholeSpanAccumulator | null;
  private readonly skip: number;
  private readonly keep: number;
  private readonly expected: number;
  private readonly maxSamples: number;
  private readonly out: Float32Array;
  private readonly readsWhole: boolean;
  private kept = 0;
  private skipped = 0;

  /**
   * `how.readWhole`: the span is read to its end even without the whole-span stage (another stage
   * reads beside). `how.extracts`: false when the samples come from elsewhere (pass 1's workers),
   * so that the extractor, kept for its parameters, sets up no kernels.
   */
  constructor(
    private readonly sampleRateHz: number,
    private readonly span: SampleSpan,
    private readonly options: Pass2Request,
    how: { readonly readWhole?: boolean; readonly extracts?: boolean } = {},
  ) {
    // Blocks and the extractor's outputs are reused arrays (copied into `out` at once): no garbage a block.
    const extractor = new ChannelExtractor({
      sampleRateHz, offsetHz: options.offsetHz, bandwidthHz: options.bandwidthHz, reuseOutput: true, kernels: how.extracts === false ? false : undefined,
    });
    this.extractor = extractor;
    const maxSamples = options.maxSamples ?? PASS2_DEFAULTS.maxSamples;
    this.maxSamples = maxSamples;
    const fsOut = extractor.outputRateHz;
    // The first outputs hold the filters' start-up transient: skip one filter delay.
    this.skip = Math.ceil(extractor.delayS * fsOut);
    this.expected = Math.max(0, Math.floor(span.sampleCount / extractor.decimation) - this.skip);
    this.keep = Math.min(this.expected, maxSamples);
    this.whole = options.wholeSpan === undefined ? null : new WholeSpanAccumulator(extractor, span.sampleCount, {
      ...options.wholeSpan,
      // Without a mask's RBW, 300 Hz or what a 32 768-sample frame allows at the channel rate (used only with `hold`).
      maskResolutionHz: options.wholeSpan.maskResolutionHz ?? Math.max(300, (1.5 * fsOut) / 32_768),
      offsetHz: options.offsetHz,
      bandwidthHz: options.bandwidthHz,
    });
    this.readsWhole = this.whole !== null || how.readWhole === true;
    this.inputNeeded = this.readsWhole ? span.sampleCount : Math.min(span.sampleCount, (this.keep + this.skip + 2) * extractor.decimation + 64 * extractor.decimation);
    this.out = new Float32Array(2 * this.keep);
  }

  /** True once nothing more is needed (the record is full and nothing reads the whole span). */
  get done(): boolean {
    return this.kept >= this.keep && !this.readsWhole;
  }

  /** The next channel samples (interleaved I,Q), in order from the span's first output on. */
  push(y: Float32Array): void {
    this.whole?.push(y);
    let from = 0;
    const n = y.length / 2;
    if (this.skipped < this.skip) {
      const s = Math.min(this.skip - this.skipped, n);
      this.skipped += s;
      from = s;
    }
    const take = Math.min(n - from, this.keep - this.kept);
    if (take > 0) {
      this.out.set(y.subarray(2 * from, 2 * (from + take)), 2 * this.kept);
      this.kept += take;
    }
  }

  /** The result, after `inputSamples` input samples were read. */
  finish(inputSamples: number): Pass2Result {
    const { extractor, span, options, maxSamples } = this;
    const fsOut = extractor.outputRateHz;
    const warnings: string[] = [];
    const complete = this.expected <= maxSamples;
    const wholeSpan = this.whole === null ? null : this.whole.finish();
    if (wholeSpan !== null) warnings.push(...wholeSpan.warnings);
    if (!complete) {
      const measuredS = (maxSamples / fsOut).toFixed(2);
      const analysedS = (span.sampleCount / this.sampleRateHz).toFixed(2);
      warnings.push(
        wholeSpan === null
          ? `the emission was measured over the first ${measuredS} s of the ${analysedS} s analysed (the decimated channel is kept up to ${maxSamples} samples)`
          : `the carrier, peak deviation, occupied bandwidth and spectra cover the whole ${analysedS} s analysed; the class and the other figures its first ${measuredS} s (the decimated channel is kept up to ${maxSamples} samples)`,
      );
    }
    return {
      iq: this.kept === this.keep ? this.out : this.out.subarray(0, 2 * this.kept),
      sampleRateHz: fsOut,
      decimation: extractor.decimation,
      offsetHz: options.offsetHz,
      bandwidthHz: options.bandwidthHz,
      startS: this.skip / fsOut,
      inputSamples,
      complete,
      wholeSpan,
      warnings,
    };
  }
}
