/**
 * The per-block work of pass 1, the same in the main thread and in a worker: decode a block of
 * raw bytes (with its overlap prefix), and feed the Welch, spectrogram and health accumulators.
 * Engines are mergeable, so two of them can take alternate blocks and be summed at the end.
 */
import { decodeSamples, formatInfo } from "../capture/sampleFormat.js";
import type { SampleFormat } from "../capture/source.js";
import {
  ChannelExtractor,
  HealthAccumulator,
  sampleStore,
  SpectrogramAccumulator,
  type FloatStore,
  WelchAccumulator,
  type HealthFigures,
  type Spectrogram,
  type WelchPsd,
} from "../dsp/index.js";

/** Everything an engine needs to know; structured-cloneable so a worker can be given it. */
export interface Pass1Config {
  readonly format: SampleFormat;
  readonly swapIq: boolean;
  readonly sampleRateHz: number;
  /** Samples in the analysed span. */
  readonly totalSamples: number;
  /** Welch segment length (nperseg = nfft) and overlap (noverlap), in samples. */
  readonly welchFftLength: number;
  readonly welchOverlapLength: number;
  /** Spectrogram frame length (frames do not overlap) and the number of rows wanted. */
  readonly spectrogramFftLength: number;
  readonly spectrogramRows: number;
  /** Largest block, in samples, not counting the prefix. */
  readonly maxBlockSamples: number;
  /** A channel extracted from every block beside the pass-1 work (pass 2 in the same read), or null. */
  readonly channel: ChannelPlan | null;
}

/** The channel an engine extracts: ChannelExtractor's options, and the warm-up a block needs for it. */
export interface ChannelPlan {
  readonly offsetHz: number;
  readonly bandwidthHz: number;
  /** ChannelExtractor.warmupSamples of this channel. */
  readonly warmupSamples: number;
}

/** One block's channel samples: interleaved I,Q, the first at output index `firstOutput`. */
export interface ChannelChunk {
  readonly firstOutput: number;
  readonly iq: Float32Array;
}

/** The overlap prefix every block carries: the longest frame of any accumulator. */
export function prefixSamples(config: Pass1Config): number {
  return Math.max(config.welchFftLength, config.spectrogramFftLength, config.channel?.warmupSamples ?? 0);
}

export interface Pass1EngineState {
  readonly welch: ReturnType<WelchAccumulator["snapshot"]>;
  readonly spectrogram: ReturnType<SpectrogramAccumulator["snapshot"]>;
  readonly health: ReturnType<HealthAccumulator["snapshot"]>;
}

export class Pass1Engine {
  private readonly welch: WelchAccumulator;
  private readonly spectrogram: SpectrogramAccumulator;
  private readonly health: HealthAccumulator;
  /** Decoded samples, in the fast engine's memory (dsp sampleStore): windowed and measured there. */
  private readonly decoded: FloatStore;
  private readonly frameBytes: number;
  private readonly channel: ChannelExtractor | null;

  constructor(private readonly config: Pass1Config) {
    this.welch = new WelchAccumulator({
      fftLength: config.welchFftLength,
      overlapLength: config.welchOverlapLength,
      sampleRateHz: config.sampleRateHz,
    });
    this.spectrogram = new SpectrogramAccumulator({
      fftLength: config.spectrogramFftLength,
      rowCount: config.spectrogramRows,
      totalSamples: config.totalSamples,
      sampleRateHz: config.sampleRateHz,
    });
    this.health = new HealthAccumulator();
    this.frameBytes = formatInfo(config.format).frameBytes;
    this.decoded = sampleStore(2 * (config.maxBlockSamples + prefixSamples(config)));
    const c = config.channel;
    this.channel = c === null ? null : new ChannelExtractor({ sampleRateHz: config.sampleRateHz, offsetHz: c.offsetHz, bandwidthHz: c.bandwidthHz, reuseOutput: true });
  }

  /**
   * Processes one block: `raw` holds `prefixFrames` frames that precede the block's own samples
   * (already counted by the previous block) and then the block's own frames, whose first sample
   * has span index `ownedStart`. Returns the block's channel samples (a view of the extractor's
   * array, valid until the next block), or null without a channel.
   */
  processBlock(raw: Uint8Array, prefixFrames: number, ownedStart: number): ChannelChunk | null {
    const prefixBytes = prefixFrames * this.frameBytes;
    const { format, swapIq } = this.config;
    const decoded = this.decoded.view();
    const head = decodeSamples(format, raw.subarray(0, prefixBytes), decoded, swapIq);
    const own = decodeSamples(format, raw.subarray(prefixBytes), decoded.subarray(2 * head.frames), swapIq);
    const iq = decoded.subarray(0, 2 * (head.frames + own.frames));
    const dataStart = ownedStart - head.frames;
    const channel = this.channel?.pushOwned(iq, dataStart, ownedStart) ?? null;
    this.health.addDecodeCounts(own);
    this.health.push(iq, dataStart, ownedStart);
    this.welch.push(iq, dataStart, ownedStart);
    this.spectrogram.push(iq, dataStart, ownedStart);
    return channel;
  }

  snapshot(): Pass1EngineState {
    return {
      welch: this.welch.snapshot(),
      spectrogram: this.spectrogram.snapshot(),
      health: this.health.snapshot(),
    };
  }

  /** Adds another engine's state (SpectrogramAccumulator.merge puts its rows in slot order one row at a time). */
  merge(state: Pass1EngineState): void {
    this.welch.merge(state.welch);
    this.spectrogram.merge(state.spectrogram);
    this.health.merge(state.health);
  }

  finish(): { psd: WelchPsd; spectrogram: Spectrogram; health: HealthFigures } {
    return { psd: this.welch.finish(), spectrogram: this.spectrogram.finish(), health: this.health.finish() };
  }
}
