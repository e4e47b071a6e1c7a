/**
 * Many channels out of one stream in one pass: overlap-save fast convolution that shares each
 * block's forward transform among all channels (the fast-convolution filter bank: Oppenheim &
 * Schafer, Discrete-Time Signal Processing, §8.7.3, overlap-save; the decimation by selecting
 * bins, Crochiere & Rabiner 1983, Multirate Digital Signal Processing, §7.2, the DFT filter bank).
 *
 * Each channel c (centre f_c = offsetHz, width B = bandwidthHz) comes out as
 *
 *   y_c[m] = Σ_n h_c[n]·x[mD_c − n]·e^(−j2π·f_c·(mD_c − n)/fs)          (1)
 *
 * up to the error bounded below: the input mixed down by an exact exponential of the absolute
 * sample index, low-passed by the Kaiser-window taps h_c (designLowpass), decimated by D_c. That
 * is the single-channel ChannelExtractor's structure, with one filter instead of a cascade.
 *
 * Rate: D_c is the largest power of two with fs/D_c ≥ 2·B (so the output rate is in [2B, 4B)),
 * at most MAX_DECIMATION (a narrower channel comes out faster than 4B: the filter would not fit
 * the largest transform). A power of two because D_c must divide the transform length N.
 *
 * Filter: passband [0, B/2], stop edge fst = Fo/2 − Fo/128 (Fo = fs/D_c), designed at
 * A + DESIGN_MARGIN_DB. The small transform keeps only the N/D_c bins within ±Fo/2 of the
 * channel centre (off by at most half a bin, fs/2N ≤ Fo/128), so every bin it drops lies in the
 * filter's stopband. A frequency-domain mask was not used: a mask with a smooth transition has
 * no finite impulse response, so overlap-save would alias it in time; the FIR's response on the
 * N-point grid is exact for a filter shorter than the overlap.
 *
 * Error of dropping bins instead of folding them (theory, from the transform pair): the output
 * differs from (1) by (1/N)·Σ_{k dropped} X[k]·H_c[k]·e^(j2πk·i/N), with |H_c[k]| ≤ δ_d =
 * 10^(−(A + margin)/20) there. So
 * - for any block, |error| ≤ δ_d·(1/N)·Σ_k |X[k]|; for a tone of amplitude a that sum is a times
 *   the ℓ1 norm of the Dirichlet kernel, at most `toneLeakage(N)` (7.14 at N = 2^14, 8.46 at
 *   N = 2^17; it grows as (2/π)·ln N). Hence a tone in the passband leaves with gain within
 *   1 ± δ_d·(2 + leakage) (the Kaiser passband deviation is at most 2δ_d: firDesign) and a tone
 *   beyond fst with gain at most δ_d·(1 + leakage). The margin, 20·log10(2 + toneLeakage(MAX_FFT_SIZE)) = 20.4 dB, makes
 *   both at most δ = 10^(−A/20): the stated attenuation A and passband deviation ±δ are promises.
 * - for white noise of variance σ², the error's mean power is σ²·(1/N)·Σ_{dropped}|H_c[k]|²
 *   ≤ σ²·δ_d², against the output's σ²·Σ h²: relative rms at most δ_d/√(Σ h²).
 *
 * Overlap-save: N-point blocks (N the smallest power of two ≥ 4·(P − 1) for the longest filter,
 * ≥ 64·max D, ≥ 1024), of which the first V = N/4 samples repeat the end of the previous block
 * and the other L = 3N/4 are new; L and V are multiples of every D_c, and the geometry depends on
 * N alone, so a channel's output does not depend on which other channels share the stream.
 * Per block: one forward N-point FFT; per channel: the N/D_c bins around bin k_c = round(f_c·N/fs)
 * times the channel's response H_c (the DFT of h_c[n]·e^(j2π·f_c·n/fs) at those bins), one
 * N/D_c-point inverse FFT (this shifts bin k_c to 0 Hz and decimates), the first V/D_c outputs
 * dropped (the circular wrap) and the rest scaled by 1/D_c.
 *
 * Phase continuity. The small transform mixes by e^(−j2π·k_c·i/N), i counted from the block's
 * first sample s − V (s = the first new sample); (1) mixes by the absolute index and by f_c, not
 * k_c·fs/N. With f_c = k_c·fs/N + Δ (|Δ| ≤ fs/2N) the two differ by
 *   e^(−j2π·k_c·(s − V)/N)   a constant per block, from integers: (k_c·((s − V) mod N)) mod N, exact;
 *   e^(−j2π·Δ·m·D_c/fs)       an Nco at the output rate over the absolute output index m.
 * Both are applied, so the output is one continuous baseband signal across blocks, and any
 * partition of the input into pushes gives bit for bit the same output.
 *
 * Transforms: the fast engine (fastFft.ts, float32). The input block is written into the forward
 * engine's time buffer; the bins are read from its spectrum through its layout and written into
 * each small engine's spectrum through that one's layout, so neither transform needs its bins
 * in natural order. Float32 rounding (relative 2^−24 a value, the transforms' error about
 * 1e-7 relative rms) lies far below the promised attenuation's δ for any A under 120 dB.
 *
 * Memory: the forward engine's buffers (five of 2N floats: 40 bytes a point, 5 MiB at N = 2^17,
 * 640 KiB at the usual 2^14), and per channel its response (16 bytes a kept bin) and a small
 * engine (40 bytes a kept bin) plus the output of one push. Whatever keeps the outputs
 * caps them (the survey: 2^20 decimated samples a channel, 8 MiB, as pass 2).
 */
import { fastFft, type FastFft } from "./fft.js";
import { designLowpass } from "./firDesign.js";
import { Nco } from "./nco.js";

/** One channel: centre and width, Hz. */
export interface ChannelSpec {
  /** Channel centre, Hz from the capture centre (negative below it). */
  readonly offsetHz: number;
  /** Width of the channel kept, Hz: the passband is ±bandwidthHz/2 around offsetHz. */
  readonly bandwidthHz: number;
}

/** What MultiChannelizer needs. */
export interface MultiChannelizerOptions {
  /** Input sample rate, Hz. */
  readonly sampleRateHz: number;
  /** The channels, in the order of the outputs. */
  readonly channels: readonly ChannelSpec[];
  /** Stopband attenuation promised for every channel, dB (default 80): the passband deviation is ±10^(−A/20). */
  readonly stopbandDb?: number;
  /** Forward transform length (a power of two at least the one the channels need); default: the smallest that serves. */
  readonly fftSize?: number;
  /**
   * true: `push` and `flush` return views of one array a channel, overwritten by the next call
   * (for a caller that copies the samples at once: no garbage a block); false (default): new arrays.
   */
  readonly reuseOutput?: boolean;
  /**
   * Absolute index of the first new sample, a multiple of `blockSamples` (default 0): the stream is
   * resumed there, as if samples [0, resumeAt) had been pushed before. The first `overlapSamples`
   * samples pushed must then be samples [resumeAt − V, resumeAt) (the overlap prefix; they give no
   * output), and each channel's first output is output index resumeAt/D. A stream cut at a block
   * boundary into parts, each pushed through its own channelizer, gives the samples of the whole
   * (so the parts can run in parallel).
   */
  readonly resumeAt?: number;
}

/** Defaults of MultiChannelizerOptions. */
export const MULTI_CHANNELIZER_DEFAULTS = { stopbandDb: 80 } as const;

/** Smallest ratio of a channel's output rate to its bandwidth (Nyquist for a complex signal of width B is B; 2 leaves the filter a transition band). */
export const MIN_CHANNEL_RATE_OVER_BANDWIDTH = 2;

/** Largest decimation of a channel: its filter (some 21–23·D taps at 80 dB) must fit the largest transform. */
export const MAX_DECIMATION = 1024;

/** Largest forward transform, points (8 MiB of plan and buffers). */
export const MAX_FFT_SIZE = 1 << 17;

/** Smallest forward transform, points. */
const MIN_FFT_SIZE = 1024;

/** Kept bins at the least, N/D ≥ 64: the half-bin offset of the centre is at most Fo/128, inside the guard below the edge. */
const MIN_KEPT_BINS = 64;

/**
 * (1/N)·Σ_k |sin(πν)/sin(π(k − ν)/N)| at ν = 1/2, its largest value over ν: the ℓ1 norm of the
 * N-point DFT of a unit tone over N, i.e. how much of a tone's spectrum a block spreads over all
 * bins (the Dirichlet kernel, e.g. Oppenheim & Schafer §10.2; computed, not a table value).
 */
export function toneLeakage(fftSize: number): number {
  let sum = 0;
  for (let k = 0; k < fftSize; k++) sum += 1 / Math.abs(Math.sin((Math.PI * (k - 0.5)) / fftSize));
  return sum / fftSize;
}

/** Extra design attenuation, dB, covering the dropped bins: 20·log10(2 + toneLeakage(MAX_FFT_SIZE)). */
export const DESIGN_MARGIN_DB = 20 * Math.log10(2 + toneLeakage(MAX_FFT_SIZE));

/** The figures of one channel of a MultiChannelizer. */
export interface ChannelInfo {
  readonly offsetHz: number;
  readonly bandwidthHz: number;
  /** Decimation D (a power of two). */
  readonly decimation: number;
  /** Output sample rate fs/D, Hz. */
  readonly outputRateHz: number;
  /** Passband edge B/2, Hz. */
  readonly passbandHz: number;
  /** Stopband edge fst = Fo/2 − Fo/128, Hz from the channel centre. */
  readonly stopbandEdgeHz: number;
  /** Attenuation the taps were designed for, dB: stopbandDb + DESIGN_MARGIN_DB. */
  readonly designStopbandDb: number;
  /** Tap count P of the channel's low-pass. */
  readonly tapCount: number;
  /** Delay of the filter, s: (P − 1)/2/fs. */
  readonly delayS: number;
}

interface ChannelState {
  readonly info: ChannelInfo;
  /** Bin k_c of the channel centre, in [0, N). */
  readonly centreBin: number;
  /** H_c at the kept bins, in the small transform's natural order (re, im). */
  readonly response: Float64Array;
  /** The N/D-point engine of the inverse transform. */
  readonly small: FastFft;
  readonly nco: Nco;
  /** With reuseOutput, the array this channel's outputs are written to (grown when a call needs more). */
  output: Float32Array | null;
}

/** Streams interleaved I,Q blocks to the decimated basebands of many channels at once. */
export class MultiChannelizer {
  /** Input sample rate, Hz. */
  readonly sampleRateHz: number;
  /** Attenuation promised, dB; passband deviation ±10^(−stopbandDb/20). */
  readonly stopbandDb: number;
  /** Forward transform length N. */
  readonly fftSize: number;
  /** Overlap V: samples each block repeats from the one before. */
  readonly overlapSamples: number;
  /** New samples a block, L = N − V. */
  readonly blockSamples: number;
  /** The channels' figures, in the order of the outputs. */
  readonly channels: readonly ChannelInfo[];
  private readonly engine: FastFft;
  private readonly states: readonly ChannelState[];
  /** New samples in `input` after the overlap. */
  private fill = 0;
  /** Samples of the overlap prefix still to be pushed (resumeAt > 0). */
  private prefixLeft = 0;
  /** Absolute index of the current block's first new sample, s. */
  private blockStart = 0;
  private flushed = false;

  /** Throws RangeError for a bad rate, channel, attenuation or fftSize. */
  constructor(options: MultiChannelizerOptions) {
    const fs = options.sampleRateHz;
    const stopbandDb = options.stopbandDb ?? MULTI_CHANNELIZER_DEFAULTS.stopbandDb;
    if (!(Number.isFinite(fs) && fs > 0)) throw new RangeError(`sampleRateHz ${fs} is not a positive finite number`);
    if (!(Number.isFinite(stopbandDb) && stopbandDb > 0)) throw new RangeError(`stopbandDb ${stopbandDb} is not a positive finite number`);
    if (options.channels.length === 0) throw new RangeError("channels is empty: give at least one");
    const designs = options.channels.map((c, i) => designChannel(c, i, fs, stopbandDb));
    const maxD = Math.max(...designs.map((d) => d.info.decimation));
    const longest = Math.max(...designs.map((d) => d.taps.length));
    const needed = Math.max(MIN_FFT_SIZE, nextPowerOfTwo(4 * (longest - 1)), MIN_KEPT_BINS * maxD);
    if (needed > MAX_FFT_SIZE) throw new RangeError(`the channels need a ${needed}-point transform, above ${MAX_FFT_SIZE}`);
    const N = options.fftSize ?? needed;
    if (!(Number.isInteger(N) && (N & (N - 1)) === 0 && N >= needed && N <= MAX_FFT_SIZE)) {
      throw new RangeError(`fftSize ${N} is not a power of two in [${needed}, ${MAX_FFT_SIZE}]`);
    }
    this.sampleRateHz = fs;
    this.stopbandDb = stopbandDb;
    this.fftSize = N;
    // V = N/4 ≥ P − 1 for every filter, a multiple of every D (D ≤ N/64): the block geometry
    // depends on N alone, so a channel gives the same samples whatever channels share its stream.
    this.overlapSamples = N / 4;
    this.blockSamples = N - N / 4;
    this.engine = fastFft(N);
    const resumeAt = options.resumeAt ?? 0;
    if (!(Number.isSafeInteger(resumeAt) && resumeAt >= 0 && resumeAt % this.blockSamples === 0)) {
      throw new RangeError(`resumeAt ${resumeAt} is not a non-negative multiple of the block length ${this.blockSamples}`);
    }
    this.blockStart = resumeAt;
    this.prefixLeft = resumeAt > 0 ? this.overlapSamples : 0;
    this.states = designs.map((d) => channelState(d.info, d.taps, this.engine, options.reuseOutput === true, resumeAt));
    this.engine.time().fill(0);
    this.channels = designs.map((d) => d.info);
  }

  /**
   * Takes the next samples (interleaved I,Q, any even length; pushes are consecutive) and returns,
   * for each channel in order, the outputs the completed blocks give (interleaved; a new array, or
   * with reuseOutput the channel's, valid until the next call).
   */
  push(iq: Float32Array): Float32Array[] {
    if (this.flushed) throw new RangeError("push after flush: the stream has ended");
    if (iq.length % 2 !== 0) throw new RangeError(`iq length ${iq.length} is not even (interleaved I,Q)`);
    const n = iq.length / 2;
    let done = Math.min(n, this.prefixLeft);
    if (done > 0) {
      this.engine.time().set(iq.subarray(0, 2 * done), 2 * (this.overlapSamples - this.prefixLeft));
      this.prefixLeft -= done;
    }
    const blocks = Math.floor((this.fill + n - done) / this.blockSamples);
    const outs = this.states.map((s) => outputArray(s, 2 * blocks * (this.blockSamples / s.info.decimation)));
    let written = 0;
    while (done < n) {
      const take = Math.min(n - done, this.blockSamples - this.fill);
      this.engine.time().set(iq.subarray(2 * done, 2 * (done + take)), 2 * (this.overlapSamples + this.fill));
      this.fill += take;
      done += take;
      if (this.fill === this.blockSamples) {
        this.processBlock(outs, written, this.blockSamples);
        written += this.blockSamples;
      }
    }
    return outs;
  }

  /**
   * Ends the stream: the samples of an unfinished block are completed with zeros and their outputs
   * returned, so that after T input samples in all each channel has given ⌈T/D⌉ outputs.
   */
  flush(): Float32Array[] {
    if (this.flushed) throw new RangeError("flush twice: the stream has ended");
    this.flushed = true;
    const rest = this.fill;
    const outs = this.states.map((s) => outputArray(s, 2 * Math.ceil(rest / s.info.decimation)));
    if (rest === 0) return outs;
    this.engine.time().fill(0, 2 * (this.overlapSamples + rest));
    this.processBlock(outs, 0, rest);
    return outs;
  }

  /** One full input buffer: forward transform, every channel, then the overlap moved to the front. */
  private processBlock(outs: Float32Array[], writtenSamples: number, newSamples: number): void {
    this.engine.forward();
    const N = this.fftSize;
    const first = (((this.blockStart - this.overlapSamples) % N) + N) % N;
    this.states.forEach((s, i) => {
      const D = s.info.decimation;
      selectBins(this.engine, s.centreBin, s.response, s.small);
      s.small.inverse();
      // e^(−j2π·k_c·(s − V)/N) / D, from integers (exact below 2^53); and 1/(N/D) of the
      // unscaled small inverse: together 1/N.
      const a = (-2 * Math.PI * ((s.centreBin * first) % N)) / N;
      const count = Math.ceil(newSamples / D);
      const out = (outs[i] as Float32Array).subarray(2 * (writtenSamples / D), 2 * (writtenSamples / D + count));
      rotateOut(s.small.output(), this.overlapSamples / D, count, Math.cos(a) / N, Math.sin(a) / N, out);
      s.nco.mix(out, out);
    });
    this.engine.time().copyWithin(0, 2 * this.blockSamples, 2 * (this.blockSamples + this.overlapSamples));
    this.fill = 0;
    this.blockStart += this.blockSamples;
  }
}

/** Rate, edges and taps of one channel (see the file comment). */
function designChannel(c: ChannelSpec, index: number, fs: number, stopbandDb: number): { info: ChannelInfo; taps: Float64Array } {
  const { offsetHz, bandwidthHz: B } = c;
  if (!Number.isFinite(offsetHz)) throw new RangeError(`channels[${index}].offsetHz ${offsetHz} is not finite`);
  if (!(Number.isFinite(B) && B > 0 && B <= fs / MIN_CHANNEL_RATE_OVER_BANDWIDTH)) {
    throw new RangeError(`channels[${index}].bandwidthHz ${B} is not in (0, sampleRateHz/${MIN_CHANNEL_RATE_OVER_BANDWIDTH} = ${fs / MIN_CHANNEL_RATE_OVER_BANDWIDTH}]`);
  }
  let D = 1;
  while (2 * D <= MAX_DECIMATION && fs / (2 * D) >= MIN_CHANNEL_RATE_OVER_BANDWIDTH * B) D *= 2;
  const Fo = fs / D;
  const fp = B / 2;
  const fst = Fo / 2 - Fo / (2 * MIN_KEPT_BINS);
  const designStopbandDb = stopbandDb + DESIGN_MARGIN_DB;
  const taps = designLowpass({ cutoffHz: fp, transitionHz: fst - fp, stopbandDb: designStopbandDb, sampleRateHz: fs });
  const info: ChannelInfo = {
    offsetHz, bandwidthHz: B, decimation: D, outputRateHz: Fo, passbandHz: fp, stopbandEdgeHz: fst,
    designStopbandDb, tapCount: taps.length, delayS: (taps.length - 1) / 2 / fs,
  };
  return { info, taps };
}

/**
 * The channel's state: k_c, Δ, and H_c at its kept bins, the forward transform (in `engine`,
 * whose time buffer the caller clears) of h[n]·e^(j2π·Δ·n/fs): its bin q is Σ h[n]·e^(−j2π(q/N − Δ/fs)n),
 * the response of h_c at bin k_c + q.
 */
function channelState(info: ChannelInfo, taps: Float64Array, engine: FastFft, reuse: boolean, resumeAt: number): ChannelState {
  const N = engine.size;
  const fs = info.outputRateHz * info.decimation;
  const nearest = Math.round((info.offsetHz * N) / fs);
  const residualHz = info.offsetHz - (nearest * fs) / N;
  const scratch = engine.time();
  scratch.fill(0);
  for (let n = 0; n < taps.length; n++) {
    const a = (2 * Math.PI * residualHz * n) / fs;
    scratch[2 * n] = (taps[n] as number) * Math.cos(a);
    scratch[2 * n + 1] = (taps[n] as number) * Math.sin(a);
  }
  engine.forward();
  const full = engine.spectrum();
  const { realIndex, imagOffset } = engine.layout;
  const kept = N / info.decimation;
  const response = new Float64Array(2 * kept);
  for (let q = 0; q < kept; q++) {
    const k = realIndex[q < kept / 2 ? q : N - kept + q] as number;
    response[2 * q] = full[k] as number;
    response[2 * q + 1] = full[k + imagOffset] as number;
  }
  return {
    info, centreBin: ((nearest % N) + N) % N, response, small: fastFft(kept), nco: new Nco(residualHz, info.outputRateHz, resumeAt / info.decimation),
    output: reuse ? new Float32Array(0) : null,
  };
}

/** A new array of `length` values, or with reuseOutput a view of the channel's own. */
function outputArray(s: ChannelState, length: number): Float32Array {
  if (s.output === null) return new Float32Array(length);
  if (s.output.length < length) s.output = new Float32Array(length + (length >> 1));
  return s.output.subarray(0, length);
}

/**
 * Bin q of the small engine's spectrum ← X[(k_c + q') mod N]·H[q], q' = q for q < K/2, q − K
 * above (K kept bins), each spectrum read and written through its engine's layout.
 */
function selectBins(full: FastFft, centre: number, response: Float64Array, small: FastFft): void {
  const N = full.size;
  const K = response.length >> 1;
  const x = full.spectrum();
  const from = full.layout.realIndex;
  const fromImag = full.layout.imagOffset;
  const y = small.spectrum();
  const to = small.layout.realIndex;
  const toImag = small.layout.imagOffset;
  for (let q = 0; q < K; q++) {
    let k = centre + (q < K >> 1 ? q : q - K);
    if (k < 0) k += N;
    else if (k >= N) k -= N;
    const i = from[k] as number;
    const xr = x[i] as number;
    const xi = x[i + fromImag] as number;
    const hr = response[2 * q] as number;
    const hi = response[2 * q + 1] as number;
    const o = to[q] as number;
    y[o] = xr * hr - xi * hi;
    y[o + toImag] = xr * hi + xi * hr;
  }
}

/** out[j] = small[from + j]·(c + js), j < count (interleaved). */
function rotateOut(small: Float32Array, from: number, count: number, c: number, s: number, out: Float32Array): void {
  for (let j = 0; j < count; j++) {
    const re = small[2 * (from + j)] as number;
    const im = small[2 * (from + j) + 1] as number;
    out[2 * j] = re * c - im * s;
    out[2 * j + 1] = re * s + im * c;
  }
}

/** The smallest power of two ≥ n (n ≥ 1). */
function nextPowerOfTwo(n: number): number {
  let p = 1;
  while (p < n) p *= 2;
  return p;
}
