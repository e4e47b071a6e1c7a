/**
 * Whole-span figures of one channel for a licence check, where the worst moment decides: the
 * analysed span is read once through the channel extractor (NCO, polyphase decimation), block
 * by block, and every channel sample goes through accumulators that keep no record:
 *
 * - carrier: the power-weighted mean instantaneous frequency, f_c = arg(Σ x[n]·conj(x[n−1]))·fs/2π
 *   (the single-lag autocorrelation estimator, e.g. Lank, Reed & Pollon 1973, from memory; for
 *   constant-envelope FM with a symmetric deviation it equals the mean instantaneous frequency).
 *   Uncertainty (k = 2): 2·s/√M from the spread s of the same estimate over M consecutive
 *   segments (16 or more, at most 1 s each; what the segments' ends see of the modulation makes
 *   this conservative for tone FM), plus the float32 rounding of the channel samples
 *   (2^−24·√2 rad a sample, ≤ 2.7e-8·fs).
 * - FM peak deviation over every sample: the discriminator f[k] = arg(x[k+1]·conj(x[k]))·fs/2π
 *   (fmDiscriminator.ts), then the audio low-pass of fmFigures (Kaiser 0–W, 60 dB from 1.25·W),
 *   run as a streaming FFT filter (dsp/streamingFir.ts). The per-span maximum and minimum of the
 *   filtered frequency a are kept with their times, and the carrier subtracted at the end:
 *   positive = max a − f_ref, negative = f_ref − min a. The filter has unity DC gain, so
 *   subtracting the reference after filtering is exact; f_ref is `carrierOffsetHz` when given,
 *   else the whole-span f_c above (known only at the end, which is why max and min are kept raw).
 *   Uncertainty as fmFigures without a noise density: ripple (1e-3 of the value) + the noise
 *   peak σ·max(2, √(2 ln M)), M = 2W·T independent values (Cramér's extreme-value law), σ from
 *   the residual f − a scaled by the f² law of discriminator noise (the complementary filter
 *   δ[n − D] − h runs beside the low-pass in the same transform), + the carrier's uncertainty
 *   when the carrier is measured. Discriminator clicks are not counted (fmFigures counts them
 *   only from a known noise density, which this stage is not given).
 * - a Welch PSD of the channel (Hann, 50 % overlap, density scaling; dsp/welch.ts) for the
 *   ITU-R SM.328 occupied bandwidth (measure/occupiedBandwidth.ts);
 * - a max-hold and an average spectrum at the mask's resolution bandwidth (Hann frames whose
 *   ENBW is the RBW, spectrum scaling; dsp/spectrumHold.ts), with the time of each bin's maximum.
 *
 * Times are s from the start of the analysed span, corrected for the extractor's and the audio
 * filter's delays (linear phase). The extractor's and the audio filter's start-up transients are
 * left out, and the last (L − 1)/2 discriminator values (the audio filter's delay, 2.4 ms at the
 * defaults and 48 kS/s) are not filtered.
 *
 * Memory bound, independent of the span's length: one input block (65 536 samples), the
 * extractor's histories and output block, the discriminator's block, the audio filter pair
 * (four buffers of 2N numbers, N ≥ 4 × taps, e.g. 1024 for 233 taps at 48 kS/s), a carry of the
 * last frame of channel samples for the spectra, the Welch accumulator (2 × its FFT length,
 * ≤ 65 536, doubles) and the hold accumulator (4 × its FFT length doubles); the figures are a
 * few dozen numbers. `WholeSpanAccumulator.stateLengths()` lists the arrays.
 */
import type { CaptureSource, SampleSpan } from "../capture/index.js";
import {
  ChannelExtractor, SpectrumHoldAccumulator, StreamingFirPair, WelchAccumulator, holdFrameLength, powerToDb,
  type SpectrumHold, type WelchPsd,
} from "../dsp/index.js";
import {
  FM_AUDIO_RIPPLE, FM_FIGURES_DEFAULTS, StreamingDiscriminator, audioLowpassTaps, audioNoiseIntegrals,
  measurement, notAvailable, type Measurement,
} from "../measure/index.js";

export interface WholeSpanOptions {
  /** Channel centre, Hz from the capture centre. */
  readonly offsetHz: number;
  /** Channel width, Hz (passband ±bandwidthHz/2). */
  readonly bandwidthHz: number;
  /** The carrier, Hz from the capture centre (as recorded, before any --ppm correction), to measure the deviation from; default the whole-span mean. */
  readonly carrierOffsetHz?: number | undefined;
  /** Audio low-pass W before the peak deviation, Hz (default 3000, as fmFigures). */
  readonly audioBandwidthHz?: number | undefined;
  /** Resolution bandwidth (ENBW) of the max-hold and average spectra, Hz (default 300). */
  readonly maskResolutionHz?: number | undefined;
  /** Keep the max-hold and average spectra (default true); `measure` needs none, and leaving them out saves their transforms over the whole span. */
  readonly hold?: boolean | undefined;
  /** Run the discriminator and the audio filter for the peak deviation (default true); a check's wide channel needs only its spectra. */
  readonly deviation?: boolean | undefined;
  /** Width of the band, centred on the channel, whose highest per-frame power is kept (`hold.bandPeakDbfs`: a mask's "peak" reference), Hz. */
  readonly referenceBandHz?: number | undefined;
  /** Upper bound on the Welch PSD's resolution bandwidth (ENBW), Hz; default bins of at most bandwidthHz/400 (as `measure`). */
  readonly welchResolutionHz?: number | undefined;
  /** Input samples per read block (default 65 536). */
  readonly blockSamples?: number | undefined;
  readonly onProgress?: ((doneSamples: number, totalSamples: number) => void) | undefined;
}

export const WHOLE_SPAN_DEFAULTS = { audioBandwidthHz: FM_FIGURES_DEFAULTS.audioBandwidthHz, maskResolutionHz: 300, blockSamples: 65_536 } as const;

/** A peak of the filtered deviation and when it happened. */
export interface DeviationPeak {
  /** Magnitude ≥ 0, Hz from the reference carrier. */
  readonly deviationHz: Measurement<"Hz">;
  /** s from the start of the span; null when there is no value. */
  readonly timeS: number | null;
}

/** Max-hold and average spectra on one grid, power in the RBW relative to full scale. */
export interface HoldSpectra {
  /** Bin centres, Hz from the channel centre (centred order). */
  readonly frequencyHz: Float64Array;
  readonly maxHoldDbfs: Float64Array;
  readonly averageDbfs: Float64Array;
  /** Time of each bin's maximum, s from the span start (frame centre); NaN where no frame. */
  readonly maxTimeS: Float64Array;
  /** The window's ENBW, Hz (the RBW asked for, to the rounding of the frame length). */
  readonly resolutionHz: number;
  readonly frameLength: number;
  readonly frameCount: number;
  /** The largest max-hold bin: its level, frequency from the channel centre and time. */
  readonly peakDbfs: number;
  readonly peakFrequencyHz: number;
  readonly peakTimeS: number | null;
  /** With `referenceBandHz`: the highest power one frame held within that band, dBFS, and when (frame centre, s); else null. */
  readonly bandPeakDbfs: number | null;
  readonly bandPeakTimeS: number | null;
  /** The linear result (FS² in the RBW), for further computation. */
  readonly linear: SpectrumHold;
}

export interface WholeSpanFigures {
  readonly offsetHz: number;
  readonly bandwidthHz: number;
  /** Channel sample rate, S/s. */
  readonly sampleRateHz: number;
  /** Channel samples measured (after the extractor's transient). */
  readonly samples: number;
  /** Time covered by them, s. */
  readonly durationS: number;
  /** Mean channel power over the span, dBFS (10·log10 of the mean |x|², full scale 1). */
  readonly meanPowerDbfs: number;
  /** Carrier, Hz from the capture centre (as recorded: the caller applies --ppm). */
  readonly carrierOffsetHz: Measurement<"Hz">;
  /** The reference the deviations are measured from, Hz from the capture centre, and where it came from. */
  readonly deviationReferenceHz: number | null;
  readonly deviationReference: "given" | "whole-span mean";
  readonly positivePeak: DeviationPeak;
  readonly negativePeak: DeviationPeak;
  /** The larger of the two. */
  readonly peak: DeviationPeak;
  /** Peak |f − f_ref| before the audio low-pass, for information (clicks included). */
  readonly rawPeakDeviationHz: number | null;
  /** RMS noise of the filtered deviation (σ above), Hz. */
  readonly deviationNoiseHz: number | null;
  readonly audioBandwidthHz: number;
  /** Channel PSD, frequencies from the channel centre, FS²/Hz. */
  readonly psd: WelchPsd;
  /** Null when the options left the spectra out (`hold: false`). */
  readonly hold: HoldSpectra | null;
  /** The lengths of every array the accumulators held (WholeSpanAccumulator.stateLengths): fixed, whatever the span. */
  readonly stateLengths: readonly number[];
  readonly warnings: readonly string[];
}

/** Reads the span once through the channel and returns the whole-span figures (module comment). */
export async function wholeSpanFigures(source: CaptureSource, span: SampleSpan, options: WholeSpanOptions): Promise<WholeSpanFigures> {
  const fs = source.meta.sampleRateHz;
  const extractor = new ChannelExtractor({ sampleRateHz: fs, offsetHz: options.offsetHz, bandwidthHz: options.bandwidthHz, reuseOutput: true });
  const acc = new WholeSpanAccumulator(extractor, span.sampleCount, options);
  const blockSamples = options.blockSamples ?? WHOLE_SPAN_DEFAULTS.blockSamples;
  let read = 0;
  for await (const block of source.blocks(span, blockSamples, { reuse: true })) {
    read += block.length / 2;
    acc.push(extractor.push(block));
    options.onProgress?.(read, span.sampleCount);
  }
  return acc.finish();
}

/** Streaming carrier estimate: Σ x[n]·conj(x[n−1]) over the span and per segment (Welford over segments). */
class CarrierSums {
  re = 0;
  im = 0;
  private segRe = 0;
  private segIm = 0;
  private segFill = 0;
  private firstRe = 0;
  private firstIm = 0;
  segments = 0;
  private mean = 0;
  private m2 = 0;

  constructor(private readonly segmentSamples: number) {}

  add(re: number, im: number): void {
    this.re += re;
    this.im += im;
    this.segRe += re;
    this.segIm += im;
    if (++this.segFill === this.segmentSamples) this.closeSegment();
  }

  private closeSegment(): void {
    if (this.segments === 0) { this.firstRe = this.segRe; this.firstIm = this.segIm; }
    // The segment's phase step relative to the first segment's, so that no estimate wraps.
    const d = Math.atan2(this.segIm * this.firstRe - this.segRe * this.firstIm, this.segRe * this.firstRe + this.segIm * this.firstIm);
    this.segments++;
    const delta = d - this.mean;
    this.mean += delta / this.segments;
    this.m2 += delta * (d - this.mean);
    this.segRe = 0;
    this.segIm = 0;
    this.segFill = 0;
  }

  /** Standard deviation of the segment estimates, rad a sample; null below 2 segments. */
  spreadRad(): number | null {
    return this.segments >= 2 ? Math.sqrt(this.m2 / (this.segments - 1)) : null;
  }
}

/** Extremes of the filtered frequency, with their times. */
interface Extremes { max: number; maxT: number; min: number; minT: number; rawMax: number; rawMin: number; residual2: number; count: number }

/**
 * The accumulators of the whole-span stage, fed with the extractor's output blocks in order.
 * Exported for the check of its memory bound (stateLengths) and for callers that read the
 * channel themselves.
 */
export class WholeSpanAccumulator {
  private readonly fsc: number;
  private readonly skip: number;
  private readonly delayS: number;
  private readonly audioHz: number;
  private readonly audioTaps: number;
  private readonly taps: Float64Array;
  private readonly warnings: string[] = [];
  private readonly carrier: CarrierSums;
  private readonly discriminator: StreamingDiscriminator;
  private readonly fir: StreamingFirPair;
  private readonly welch: WelchAccumulator;
  private readonly hold: SpectrumHoldAccumulator | null;
  private readonly deviationOn: boolean;
  private readonly carry: Float32Array;
  /** The carried tail and the block, one array reused (grown to the largest block). */
  private joined = new Float32Array(0);
  private carryLength = 0;
  private skipped = 0;
  private kept = 0;
  private power = 0;
  private prevI = 0;
  private prevQ = 0;
  private readonly ext: Extremes = { max: -Infinity, maxT: NaN, min: Infinity, minT: NaN, rawMax: -Infinity, rawMin: Infinity, residual2: 0, count: 0 };
  private readonly sink = (a: Float64Array, r: Float64Array, count: number, first: number): void => this.onAudio(a, r, count, first);

  /** `inputSamples`: the span's length, for the segment length of the carrier's spread. Throws RangeError for bad options. */
  constructor(
    extractor: ChannelExtractor,
    inputSamples: number,
    private readonly options: WholeSpanOptions,
  ) {
    const fsc = extractor.outputRateHz;
    this.fsc = fsc;
    this.skip = Math.ceil(extractor.delayS * fsc);
    this.delayS = extractor.delayS;
    const wanted = options.audioBandwidthHz ?? WHOLE_SPAN_DEFAULTS.audioBandwidthHz;
    if (!(wanted > 0 && Number.isFinite(wanted))) throw new RangeError(`audioBandwidthHz ${wanted} is not a positive finite frequency`);
    if (options.carrierOffsetHz !== undefined && !Number.isFinite(options.carrierOffsetHz)) throw new RangeError(`carrierOffsetHz ${options.carrierOffsetHz} is not finite`);
    this.audioHz = Math.min(wanted, 0.39 * fsc);
    // A narrowed low-pass is noted by measureEmission, which knows whether the class reads audio.
    const h = audioLowpassTaps(this.audioHz, fsc);
    this.audioTaps = h.length;
    this.taps = h;
    // The complement δ[n − D] − h: f delayed minus a, the residual whose power gives σ.
    const g = new Float64Array(h.length);
    for (let k = 0; k < h.length; k++) g[k] = -(h[k] as number);
    g[(h.length - 1) >> 1] = (g[(h.length - 1) >> 1] as number) + 1;
    this.fir = new StreamingFirPair(h, g);
    this.discriminator = new StreamingDiscriminator(fsc);
    const channelSamples = Math.max(0, Math.floor(inputSamples / extractor.decimation) - this.skip);
    this.carrier = new CarrierSums(Math.max(256, Math.min(Math.round(fsc), Math.floor(channelSamples / 16))));
    this.welch = new WelchAccumulator({ fftLength: welchLength(fsc, options), sampleRateHz: fsc });
    const rbw = options.maskResolutionHz ?? WHOLE_SPAN_DEFAULTS.maskResolutionHz;
    if (!(rbw > 0 && Number.isFinite(rbw))) throw new RangeError(`maskResolutionHz ${rbw} is not a positive finite frequency`);
    const holdLength = holdFrameLength(rbw, fsc);
    if (holdLength > 65_536) throw new RangeError(`maskResolutionHz ${rbw} Hz needs frames of ${holdLength} samples at ${fsc} S/s (at most 65 536)`);
    const band = options.referenceBandHz;
    if (band !== undefined && !(band > 0 && Number.isFinite(band))) throw new RangeError(`referenceBandHz ${band} is not a positive finite width`);
    this.hold = options.hold === false ? null : new SpectrumHoldAccumulator({ frameLength: holdLength, sampleRateHz: fsc, ...(band === undefined ? {} : { bandHz: band }) });
    this.deviationOn = options.deviation !== false;
    const prefix = Math.max(this.welch.snapshot().fftLength, this.hold === null ? 0 : holdLength) - 1;
    this.carry = new Float32Array(2 * prefix);
  }

  /** The lengths of every array the accumulator holds: they do not depend on the span's length. */
  stateLengths(): number[] {
    const w = this.welch.snapshot();
    return [this.carry.length, w.powerSum.length, w.powerMax.length, ...(this.hold?.stateLengths() ?? []), this.fir.fftSize, this.fir.tapCount];
  }

  /** The next block of the extractor's output (interleaved I,Q, channel centre at 0 Hz). */
  push(y: Float32Array): void {
    let from = 0;
    const n = y.length >> 1;
    if (this.skipped < this.skip) {
      from = Math.min(this.skip - this.skipped, n);
      this.skipped += from;
    }
    if (from >= n) return;
    const x = from === 0 ? y : y.subarray(2 * from);
    this.carrierAndPower(x);
    this.spectra(x);
    if (this.deviationOn) {
      const f = this.discriminator.push(x);
      this.rawExtremes(f);
      this.fir.push(f, this.sink);
    }
    this.kept += x.length >> 1;
  }

  private carrierAndPower(x: Float32Array): void {
    const n = x.length >> 1;
    let k = 0;
    let pi = this.prevI;
    let pq = this.prevQ;
    let p = 0;
    if (this.kept === 0) {
      pi = x[0] as number;
      pq = x[1] as number;
      p += pi * pi + pq * pq;
      k = 1;
    }
    for (; k < n; k++) {
      const ci = x[2 * k] as number;
      const cq = x[2 * k + 1] as number;
      this.carrier.add(ci * pi + cq * pq, cq * pi - ci * pq);
      p += ci * ci + cq * cq;
      pi = ci;
      pq = cq;
    }
    this.prevI = pi;
    this.prevQ = pq;
    this.power += p;
  }

  /** Feeds the carried tail and the block to both spectra (frameGrid.ts block contract), then keeps the new tail. */
  private spectra(x: Float32Array): void {
    const n = x.length >> 1;
    const t = this.carryLength;
    const start = this.kept - t;
    const joined = t === 0 ? x : this.join(t, x);
    this.welch.push(joined, start, this.kept);
    this.hold?.push(joined, start, this.kept);
    const total = t + n;
    const keep = Math.min(this.carry.length >> 1, total);
    this.carry.set(joined.subarray(2 * (total - keep), 2 * total));
    this.carryLength = keep;
  }

  private join(t: number, x: Float32Array): Float32Array {
    const len = 2 * t + x.length;
    if (this.joined.length < len) this.joined = new Float32Array(len);
    this.joined.set(this.carry.subarray(0, 2 * t));
    this.joined.set(x, 2 * t);
    return this.joined.subarray(0, len);
  }

  private rawExtremes(f: Float64Array): void {
    const e = this.ext;
    for (let i = 0; i < f.length; i++) {
      const v = f[i] as number;
      if (v > e.rawMax) e.rawMax = v;
      if (v < e.rawMin) e.rawMin = v;
    }
  }

  /** Audio outputs j = first …: a[j] the low-passed f[j − D], r[j] = f[j − D] − a[j]; valid from j = L − 1. */
  private onAudio(a: Float64Array, r: Float64Array, count: number, first: number): void {
    const e = this.ext;
    const l = this.audioTaps;
    const j0 = Math.max(0, l - 1 - first);
    for (let j = j0; j < count; j++) {
      const v = a[j] as number;
      if (v > e.max) { e.max = v; e.maxT = first + j; }
      if (v < e.min) { e.min = v; e.minT = first + j; }
      e.residual2 += (r[j] as number) ** 2;
    }
    if (count > j0) e.count += count - j0;
  }

  /** Time of audio output j: f[j − D] is the step between kept samples j − D and j − D + 1. */
  private audioTimeS(j: number): number {
    const d = (this.audioTaps - 1) >> 1;
    return (j - d + 0.5 + this.skip) / this.fsc - this.delayS;
  }

  /** The figures of everything pushed so far. */
  finish(): WholeSpanFigures {
    const fsc = this.fsc;
    const offsetHz = this.options.offsetHz;
    const carrier = this.carrierMeasurement();
    const given = this.options.carrierOffsetHz;
    const refCapture = given ?? carrier.value;
    const devs = this.deviations(refCapture === null ? null : refCapture - offsetHz, given === undefined ? (carrier.uncertainty ?? 0) : 0);
    const psd = this.welch.finish();
    return {
      offsetHz, bandwidthHz: this.options.bandwidthHz, sampleRateHz: fsc,
      samples: this.kept, durationS: this.kept / fsc,
      meanPowerDbfs: powerToDb(this.kept > 0 ? this.power / this.kept : 0),
      carrierOffsetHz: carrier,
      deviationReferenceHz: refCapture,
      deviationReference: given === undefined ? "whole-span mean" : "given",
      ...devs,
      audioBandwidthHz: this.audioHz,
      psd,
      hold: this.hold === null ? null : this.holdSpectra(this.hold),
      stateLengths: this.stateLengths(),
      warnings: this.warnings,
    };
  }

  private carrierMeasurement(): Measurement<"Hz"> {
    const c = this.carrier;
    const fsc = this.fsc;
    const method = "carrier: arg Σ x[n]·conj(x[n−1]) · fs/2π over the whole span (power-weighted mean instantaneous frequency); ± 2·s/√M from the spread of M segment estimates, plus float32 rounding";
    const s = c.spreadRad();
    if (s === null || (c.re === 0 && c.im === 0)) return notAvailable("Hz", method, `only ${c.segments} segments of the channel (at least 2 needed) or no signal`);
    const value = this.options.offsetHz + (Math.atan2(c.im, c.re) * fsc) / (2 * Math.PI);
    const u = (2 * s * fsc) / (2 * Math.PI) / Math.sqrt(c.segments) + 2.7e-8 * fsc;
    return measurement(value, "Hz", u, `${method}; M = ${c.segments}, T ${(this.kept / fsc).toPrecision(4)} s`);
  }

  /** Peaks relative to `refHz` (Hz from the channel centre), with the module comment's uncertainty. */
  private deviations(refHz: number | null, uRef: number): Pick<WholeSpanFigures, "positivePeak" | "negativePeak" | "peak" | "rawPeakDeviationHz" | "deviationNoiseHz"> {
    const e = this.ext;
    const method = `peak deviation over the whole span after an audio low-pass 0-${this.audioHz.toFixed(0)} Hz (Kaiser, ${this.audioTaps} taps, 60 dB from 1.25 W)`;
    if (refHz === null || e.count < 16) {
      const na: DeviationPeak = { deviationHz: notAvailable("Hz", method, "too few channel samples for the audio filter, or no carrier"), timeS: null };
      return { positivePeak: na, negativePeak: na, peak: na, rawPeakDeviationHz: null, deviationNoiseHz: null };
    }
    const { inBand, outBand } = audioNoiseIntegrals(this.taps, this.fsc);
    const sigma = outBand > 0 ? Math.sqrt(((e.residual2 / e.count) * inBand) / outBand) : 0;
    const independent = Math.max(2, (e.count * 2 * this.audioHz) / this.fsc);
    const noisePeak = sigma * Math.max(2, Math.sqrt(2 * Math.log(independent)));
    const note = `; ± ripple ${FM_AUDIO_RIPPLE * 100} %, noise peak (σ ${sigma.toPrecision(2)} Hz, M ${independent.toPrecision(3)})${uRef > 0 ? " and the carrier's uncertainty" : ""}; clicks not counted`;
    const peakOf = (v: number, j: number, side: string): DeviationPeak => {
      const x = Math.max(0, v);
      return { deviationHz: measurement(x, "Hz", FM_AUDIO_RIPPLE * x + noisePeak + uRef, `${side} ${method}${note}`), timeS: this.audioTimeS(j) };
    };
    const positivePeak = peakOf(e.max - refHz, e.maxT, "positive");
    const negativePeak = peakOf(refHz - e.min, e.minT, "negative");
    const peak = (positivePeak.deviationHz.value ?? 0) >= (negativePeak.deviationHz.value ?? 0) ? positivePeak : negativePeak;
    return { positivePeak, negativePeak, peak, rawPeakDeviationHz: Math.max(e.rawMax - refHz, refHz - e.rawMin, 0), deviationNoiseHz: sigma };
  }

  /** Centre of hold frame `frame`, s from the span start; NaN for −1 (no frame). */
  private frameTimeS(h: SpectrumHold, frame: number): number {
    return frame < 0 ? NaN : (frame * h.hopLength + h.frameLength / 2 + this.skip) / this.fsc - this.delayS;
  }

  private holdSpectra(hold: SpectrumHoldAccumulator): HoldSpectra {
    const h = hold.finish();
    const n = h.fftLength;
    const frequencyHz = new Float64Array(n);
    const maxHoldDbfs = new Float64Array(n);
    const averageDbfs = new Float64Array(n);
    const maxTimeS = new Float64Array(n);
    let best = 0;
    for (let i = 0; i < n; i++) {
      frequencyHz[i] = (i - n / 2) * h.binWidthHz;
      maxHoldDbfs[i] = powerToDb(h.maxHoldFs2[i] as number);
      averageDbfs[i] = powerToDb(h.averageFs2[i] as number);
      const frame = h.maxFrame[i] as number;
      maxTimeS[i] = this.frameTimeS(h, frame);
      if ((h.maxHoldFs2[i] as number) > (h.maxHoldFs2[best] as number)) best = i;
    }
    const peakTime = maxTimeS[best] as number;
    const banded = this.options.referenceBandHz !== undefined && h.bandPeakFrame >= 0;
    return {
      bandPeakDbfs: banded ? powerToDb(h.bandPeakFs2) : null,
      bandPeakTimeS: banded ? this.frameTimeS(h, h.bandPeakFrame) : null,
      frequencyHz, maxHoldDbfs, averageDbfs, maxTimeS, resolutionHz: h.resolutionHz, frameLength: h.frameLength, frameCount: h.frameCount,
      peakDbfs: maxHoldDbfs[best] as number, peakFrequencyHz: frequencyHz[best] as number, peakTimeS: Number.isNaN(peakTime) ? null : peakTime,
      linear: h,
    };
  }
}

/**
 * FFT length of the Welch PSD: with `welchResolutionHz` the smallest power of two ≥ 256 whose
 * Hann ENBW 1.5·fs/N is at most it; else the smallest with bins fs/N ≤ bandwidthHz/400 (as
 * `measure`, RBW ≤ 1 % of the OBW, REFERENCES.md §3); at most 65 536 either way.
 */
function welchLength(fsc: number, options: WholeSpanOptions): number {
  const r = options.welchResolutionHz;
  if (r !== undefined && !(r > 0 && Number.isFinite(r))) throw new RangeError(`welchResolutionHz ${r} is not a positive finite frequency`);
  const binHz = r === undefined ? options.bandwidthHz / 400 : r / 1.5;
  let n = 256;
  while (n < 65_536 && fsc / n > binHz) n *= 2;
  return n;
}
