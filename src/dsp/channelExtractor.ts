/**
 * One channel out of a capture: mix the channel centre to 0 Hz (Nco), then low-pass and
 * decimate in a cascade of stages (PolyphaseDecimator, Kaiser-window taps from designLowpass).
 *
 * Rate: the total factor D is the largest 7-smooth integer (a product of factors 2..8) with
 * fs/D ≥ 2.5·B, B = bandwidthHz; D = 1 when fs < 5·B. The output rate is fs/D.
 *
 * Stages: D is split into factors of at most 8, largest first. With passband edge fp = B/2 and
 * overall stopband edge fst = fs/D − B/2 (anything beyond it would fold into the passband at the
 * output rate), stage i, decimating to rate Fi, has passband [0, fp] and stopband edge Fi − fst
 * (the last stage: fst), so what its transition band lets through aliases to at least fst, where
 * a later stage removes it (Crochiere & Rabiner 1983, Multirate Digital Signal Processing,
 * §5.3, the multistage decimator's stage edges). Each stage has the full stopband attenuation
 * A (default 80 dB); the passband ripples add, at most about ±(stages)·10^(−A/20).
 *
 * Response of the whole chain (used by the tests): a tone at offsetHz + δ with |δ| ≤ fp leaves at
 * δ with gain ∏ Hi(δ) ≈ 1; a tone with |δ| ≥ fst is attenuated by at least A dB before it reaches
 * the output. White noise of density N0 (FS²/Hz) leaves with the same density over the passband.
 */
import { chainKernelsByDefault, KernelArena } from "./chainKernels.js";
import { designLowpass } from "./firDesign.js";
import { Nco } from "./nco.js";
import { PolyphaseDecimator } from "./polyphaseDecimator.js";

/** What ChannelExtractor needs: rates and frequencies in Hz, attenuation in dB. */
export interface ChannelExtractorOptions {
  /** Input sample rate, Hz. */
  readonly sampleRateHz: number;
  /** Channel centre, Hz from the capture centre (negative below it). */
  readonly offsetHz: number;
  /** Width of the channel kept, Hz: the passband is ±bandwidthHz/2 around offsetHz. */
  readonly bandwidthHz: number;
  /** Stopband attenuation of every stage, dB (default 80). */
  readonly stopbandDb?: number;
  /**
   * true: `push` returns a view of one array, overwritten by the next push (for a caller that
   * copies the channel samples at once: no garbage a block); false (default): a new array.
   */
  readonly reuseOutput?: boolean;
  /**
   * Run the mixer and the decimators' dot products in the SIMD kernels (chainKernels.ts; the
   * same values as the JavaScript loops). Default: on the SIMD path (chainKernelsByDefault).
   */
  readonly kernels?: boolean | undefined;
}

/** Defaults of ChannelExtractorOptions. */
export const CHANNEL_EXTRACTOR_DEFAULTS = { stopbandDb: 80 } as const;

/** Smallest ratio of output rate to bandwidth the extractor decimates to (common practice). */
export const MIN_RATE_OVER_BANDWIDTH = 2.5;

/** Largest factor of one decimating stage. */
const MAX_STAGE_FACTOR = 8;

/** Streams interleaved I,Q blocks of a capture to the decimated baseband of one channel. */
export class ChannelExtractor {
  /** Output sample rate fs/D, Hz. */
  readonly outputRateHz: number;
  /** Total decimation D (product of the stage factors). */
  readonly decimation: number;
  /** Passband edge fp = bandwidthHz/2, Hz: the passband is [−fp, +fp] at the output. */
  readonly passbandHz: number;
  /** Stopband edge fst = outputRateHz − fp, Hz from the channel centre (A dB or more beyond). */
  readonly stopbandEdgeHz: number;
  /** Delay of the filters, s: Σ (Li − 1)/2 / (input rate of stage i). */
  readonly delayS: number;
  /** The factor of each stage, in order. */
  readonly stageFactors: readonly number[];
  /** The tap count of each stage, in order. */
  readonly stageTapCounts: readonly number[];
  /**
   * The chain's memory M, input samples: an output at input time t depends on the inputs
   * t − M … t alone. The cascade is one filter of Σ (Li − 1)·∏_{j<i} Dj + 1 taps at the input
   * rate followed by ↓D (the noble identities; Crochiere & Rabiner 1983, §3.1.3).
   */
  readonly memorySamples: number;
  private readonly nco: Nco;
  private readonly stages: readonly PolyphaseDecimator[];
  // pushOwned's outputs, reused.
  private owned = new Float32Array(0);

  /** Throws RangeError for a non-positive rate or bandwidth, a bandwidth above the rate, or a non-finite offset. */
  constructor(options: ChannelExtractorOptions) {
    const { sampleRateHz: fs, offsetHz, bandwidthHz: B } = options;
    const stopbandDb = options.stopbandDb ?? CHANNEL_EXTRACTOR_DEFAULTS.stopbandDb;
    if (!(Number.isFinite(fs) && fs > 0)) throw new RangeError(`sampleRateHz ${fs} is not a positive finite number`);
    if (!(Number.isFinite(B) && B > 0 && B <= fs)) {
      throw new RangeError(`bandwidthHz ${B} is not in (0, sampleRateHz ${fs}]`);
    }
    if (!Number.isFinite(offsetHz)) throw new RangeError(`offsetHz ${offsetHz} is not finite`);
    if (!(Number.isFinite(stopbandDb) && stopbandDb > 0)) {
      throw new RangeError(`stopbandDb ${stopbandDb} is not a positive finite number`);
    }
    const D = largestSmoothAtMost(Math.floor(fs / (MIN_RATE_OVER_BANDWIDTH * B)));
    const factors = splitFactor(D);
    const fp = B / 2;
    const fst = fs / D - fp;
    const stages: PolyphaseDecimator[] = [];
    const arena = options.kernels ?? chainKernelsByDefault() ? new KernelArena() : null;
    let rateHz = fs;
    let delayS = 0;
    factors.forEach((f, i) => {
      const outRateHz = rateHz / f;
      const stopHz = i === factors.length - 1 ? fst : outRateHz - fst;
      const taps = designLowpass({ cutoffHz: fp, transitionHz: stopHz - fp, stopbandDb, sampleRateHz: rateHz });
      // Between stages the next one copies its input at once: only the last may hand out a new array.
      const stage = new PolyphaseDecimator(taps, f, i < factors.length - 1 || options.reuseOutput === true, arena);
      delayS += stage.delaySamples / rateHz;
      stages.push(stage);
      rateHz = outRateHz;
    });
    if (factors.length === 0 && fp < 0.45 * fs) {
      // No decimation: still low-pass to the channel, stopband from fs/2 on.
      const taps = designLowpass({ cutoffHz: fp, transitionHz: fs / 2 - fp, stopbandDb, sampleRateHz: fs });
      const stage = new PolyphaseDecimator(taps, 1, options.reuseOutput === true, arena);
      delayS += stage.delaySamples / fs;
      stages.push(stage);
    }
    this.decimation = D;
    this.outputRateHz = fs / D;
    this.passbandHz = fp;
    this.stopbandEdgeHz = factors.length === 0 ? fs / 2 : fst;
    this.delayS = delayS;
    this.stageFactors = factors;
    this.stageTapCounts = stages.map((s) => s.tapCount);
    let rate = 1;
    let memory = 0;
    stages.forEach((s, i) => {
      memory += (s.tapCount - 1) * rate;
      rate *= factors[i] ?? 1;
    });
    this.memorySamples = memory;
    this.nco = new Nco(offsetHz, fs, 0, arena);
    this.stages = stages;
  }

  /**
   * Mixes, filters and decimates the next block (interleaved I,Q, any even length; blocks are
   * consecutive) and returns the channel samples it completes, interleaved, in a new array (with
   * reuseOutput, the extractor's, valid until the next push).
   */
  push(iq: Float32Array): Float32Array {
    if (iq.length % 2 !== 0) throw new RangeError(`iq length ${iq.length} is not even (interleaved I,Q)`);
    const first = this.stages[0];
    if (first === undefined) return this.nco.mix(iq);
    // The mixer writes straight into the first stage's buffer: one pass over the input.
    this.nco.mix(iq, first.beginBlock(iq.length / 2));
    let y = first.endBlock();
    for (let i = 1; i < this.stages.length; i++) y = (this.stages[i] as PolyphaseDecimator).push(y);
    return y;
  }

  /**
   * Samples a block must hold before its own first sample for `pushOwned`: M + D − 1.
   */
  get warmupSamples(): number {
    return this.memorySamples + this.decimation - 1;
  }

  /**
   * The outputs of a block taken on its own, equal to what one continuous stream from input 0
   * gives at the same indices: for a block holding the inputs from index `dataStart` on, and
   * owning those from `ownedStart` on, the outputs at input times m·D ≥ ownedStart up to the
   * block's end, their first index m = ⌈ownedStart/D⌉ as `firstOutput`. The chain restarts at
   * s0 = max(0, ⌊(ownedStart − M)/D⌋·D), a multiple of D (so every stage keeps the stream's
   * grid), and the outputs before ownedStart, which saw the restart's zeros, are dropped; from
   * then on each output depends only on inputs the block holds (memorySamples), and the mixer's
   * phase on the index alone (Nco), so the values are the stream's to the bit. Blocks can so be
   * extracted apart (in worker threads) and put end to end. Needs s0 ≥ dataStart:
   * ownedStart − dataStart ≥ min(ownedStart, warmupSamples). `iq` interleaved I,Q; the result
   * is a view of an array of the extractor's, valid until the next pushOwned.
   */
  pushOwned(iq: Float32Array, dataStart: number, ownedStart: number): { firstOutput: number; iq: Float32Array } {
    const D = this.decimation;
    const s0 = Math.max(0, Math.floor((ownedStart - this.memorySamples) / D) * D);
    if (s0 < dataStart) {
      throw new RangeError(`the block starts at ${dataStart}, after ${s0}, where extracting the outputs from ${ownedStart} on must start`);
    }
    this.nco.seek(s0);
    for (const stage of this.stages) stage.reset();
    // In pieces, so that the filters' buffers stay the size of a piece whatever the block's.
    const end = iq.length / 2;
    let count = 0;
    for (let p = s0 - dataStart; p < end; p += OWNED_PIECE_SAMPLES) {
      const y = this.push(iq.subarray(2 * p, 2 * Math.min(p + OWNED_PIECE_SAMPLES, end)));
      if (this.owned.length < 2 * count + y.length) {
        const grown = new Float32Array(2 * (2 * count + y.length));
        grown.set(this.owned.subarray(0, 2 * count));
        this.owned = grown;
      }
      this.owned.set(y, 2 * count);
      count += y.length / 2;
    }
    const firstOutput = Math.ceil(ownedStart / D);
    return { firstOutput, iq: this.owned.subarray(2 * (firstOutput - s0 / D), 2 * count) };
  }
}

/** Input samples pushOwned pushes at a time. */
const OWNED_PIECE_SAMPLES = 65_536;

/** True when n has no prime factor above 7. */
function isSevenSmooth(n: number): boolean {
  for (const p of [2, 3, 5, 7]) while (n % p === 0) n /= p;
  return n === 1;
}

/** The largest 7-smooth integer ≤ n, or 1 for n < 2. */
function largestSmoothAtMost(n: number): number {
  for (let d = n; d >= 2; d--) if (isSevenSmooth(d)) return d;
  return 1;
}

/**
 * D (7-smooth) as stage factors of at most 8, few stages, largest first: prime factors taken
 * largest first, each into the first stage it fits (first-fit decreasing). [] for D = 1.
 */
function splitFactor(D: number): number[] {
  const primes: number[] = [];
  let n = D;
  for (const p of [7, 5, 3, 2]) while (n % p === 0) { primes.push(p); n /= p; }
  const stages: number[] = [];
  for (const p of primes) {
    const i = stages.findIndex((s) => s * p <= MAX_STAGE_FACTOR);
    if (i >= 0) stages[i] = (stages[i] as number) * p;
    else stages.push(p);
  }
  return stages.sort((a, b) => b - a);
}
