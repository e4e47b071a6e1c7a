/**
 * The figures of an analogue FM emission from its complex baseband: deviation (peak, positive,
 * negative, RMS), modulating frequency, modulation index, Carson bandwidth, carrier offset and
 * the sub-audible (CTCSS) tone. Formulas and sources are in docs/methods.md, "Analog modulation".
 */
import { designLowpass } from "../dsp/index.js";
import { dominantLine } from "./audioLine.js";
import { filterLinearPhase, transientLength } from "./firFilter.js";
import { instantaneousFrequencyHz } from "./fmDiscriminator.js";
import { measurement, notAvailable, type Measurement } from "./measurement.js";
import { minMaxBuckets } from "./minMaxTrace.js";
import { subAudibleTone } from "./subAudibleTone.js";

/** Options of `fmFigures`. */
export interface FmFiguresOptions {
  /** Upper edge W of the audio band, Hz: the passband of the audio low-pass. Default 3000 Hz. */
  readonly audioBandwidthHz?: number;
  /** The carrier, Hz from the capture centre, when the caller knows it better than the mean
   * instantaneous frequency; deviations are then measured from it. */
  readonly carrierOffsetHz?: number;
}

/** Defaults of `fmFigures`: W = 3 kHz, the top of land-mobile speech (47 CFR 2.202(g) F3E, M = 3000 Hz). */
export const FM_FIGURES_DEFAULTS = { audioBandwidthHz: 3000 } as const;

/** Transition band of the audio low-pass as a share of W; stopband from 1.25·W. */
const AUDIO_TRANSITION_SHARE = 0.25;
/** Stopband attenuation of the audio low-pass, dB (passband ripple ±1e-3, Kaiser design). */
const AUDIO_STOPBAND_DB = 60;
/** Lower edge of the search for the modulating frequency, Hz: above the sub-audible range. */
const AUDIO_LOW_EDGE_HZ = 300;
/** Blocks whose means give the spread of the carrier estimate. */
const CARRIER_BLOCKS = 16;

/** A reduced trace of the filtered deviation for a figure. */
export interface FmTrace {
  /** Bucket centre times, s from the first sample. */
  readonly timeS: Float64Array;
  /** Lowest and highest filtered instantaneous frequency in each bucket, Hz from the carrier. */
  readonly minHz: Float32Array;
  readonly maxHz: Float32Array;
}

/** The figures of `fmFigures` (report fields fm.*, interface.md). Deviations are magnitudes ≥ 0. */
export interface FmFigures {
  /** max(positive, negative) after the audio low-pass. */
  readonly peakDeviationHz: Measurement<"Hz">;
  readonly positiveDeviationHz: Measurement<"Hz">;
  readonly negativeDeviationHz: Measurement<"Hz">;
  /** √(mean of the squared filtered deviation). */
  readonly rmsDeviationHz: Measurement<"Hz">;
  /** Peak |deviation| before the audio low-pass (clicks included), for information. */
  readonly rawPeakDeviationHz: Measurement<"Hz">;
  readonly modulatingFrequencyHz: Measurement<"Hz">;
  /** Share of the audio power in the dominant line (audioLine.ts `lineShare`): near 1 for one test tone; null without audio. */
  readonly modulatingToneShare: number | null;
  /** Peak deviation / modulating frequency (dimensionless). */
  readonly modulationIndex: Measurement<"">;
  /** 2·(peak deviation + modulating frequency). */
  readonly carsonBandwidthHz: Measurement<"Hz">;
  /** Mean instantaneous frequency, Hz from the capture centre. */
  readonly carrierOffsetHz: Measurement<"Hz">;
  readonly toneHz: Measurement<"Hz">;
  readonly toneDeviationHz: Measurement<"Hz">;
  /** Nearest standard CTCSS tone (REFERENCES.md §10) to toneHz, within 1 Hz, or null. */
  readonly standardToneHz: number | null;
  readonly audioBandwidthHz: number;
  /** One line per processing step. */
  readonly method: readonly string[];
  readonly trace: FmTrace;
}

/**
 * FM figures of one emission: `iq` interleaved I,Q at `sampleRateHz`, the emission near 0 Hz.
 *
 * d[k] = f[k] − fc with f the discriminator output (`instantaneousFrequencyHz`) and fc its mean
 * (or options.carrierOffsetHz); a[k] = d low-passed to W (Kaiser, passband 0–W, stopband from
 * 1.25·W, 60 dB), the filter transient at each end left out. Then positive = max a, negative =
 * −min a, peak = the larger, RMS = √mean a², modulating frequency fm = the dominant line of a in
 * 300 Hz–W, index β = peak/fm, Carson B = 2(peak + fm) (REFERENCES.md §2). Throws RangeError for
 * a bad rate or bandwidth (1.25·W must stay below fs/2).
 */
export function fmFigures(iq: Float32Array, sampleRateHz: number, options: FmFiguresOptions = {}): FmFigures {
  const w = options.audioBandwidthHz ?? FM_FIGURES_DEFAULTS.audioBandwidthHz;
  if (!(Number.isFinite(sampleRateHz) && sampleRateHz > 0)) {
    throw new RangeError(`sampleRateHz ${sampleRateHz} is not a positive finite rate`);
  }
  if (!(Number.isFinite(w) && w > 0 && w * (1 + AUDIO_TRANSITION_SHARE) < sampleRateHz / 2)) {
    throw new RangeError(`audioBandwidthHz ${w} must be positive and 1.25 times it below half the rate ${sampleRateHz / 2}`);
  }
  if (options.carrierOffsetHz !== undefined && !Number.isFinite(options.carrierOffsetHz)) {
    throw new RangeError(`carrierOffsetHz ${options.carrierOffsetHz} is not finite`);
  }
  const f = instantaneousFrequencyHz(iq, sampleRateHz);
  const taps = designLowpass({
    cutoffHz: w, transitionHz: AUDIO_TRANSITION_SHARE * w, stopbandDb: AUDIO_STOPBAND_DB, sampleRateHz,
  });
  const skip = transientLength(taps);
  const method = [
    `discriminator arg(x[k+1]·conj(x[k]))·fs/2π, ${f.length} steps at ${sampleRateHz} Hz`,
    `carrier = ${options.carrierOffsetHz === undefined ? "mean instantaneous frequency" : "given by the caller"}`,
    `deviation after an audio low-pass 0-${w} Hz (Kaiser, ${taps.length} taps, ${AUDIO_STOPBAND_DB} dB from ${1.25 * w} Hz): discriminator clicks suppressed`,
    `modulating frequency: dominant line of the filtered audio in ${AUDIO_LOW_EDGE_HZ}-${w} Hz; index = peak/fm; Carson 2(peak + fm)`,
  ];
  const carrier = carrierEstimate(f);
  const ref = options.carrierOffsetHz ?? (carrier.value as number);
  const d = new Float64Array(f.length);
  let rawPeak = 0;
  for (let i = 0; i < f.length; i++) {
    const v = (f[i] as number) - ref;
    d[i] = v;
    if (Math.abs(v) > rawPeak) rawPeak = Math.abs(v);
  }
  const a = filterLinearPhase(d, taps);
  const first = skip;
  const end = a.length - skip;
  if (end - first < 16) return tooShort(f.length, skip, w, method, carrier);

  let max = -Infinity;
  let min = Infinity;
  let sumSq = 0;
  for (let i = first; i < end; i++) {
    const v = a[i] as number;
    if (v > max) max = v;
    if (v < min) min = v;
    sumSq += v * v;
  }
  const pos = Math.max(0, max);
  const neg = Math.max(0, -min);
  const peak = Math.max(pos, neg);
  const rms = Math.sqrt(sumSq / (end - first));
  // Passband ripple of the Kaiser design is ±10^(−60/20) = ±1e-3; noise raises peaks and is not included.
  const devNote = "filtered peak (ripple ±0.1 %; noise not included, it raises peaks)";
  // A measured carrier moves positive and negative deviation by its own uncertainty.
  const uRef = options.carrierOffsetHz === undefined ? (carrier.uncertainty ?? 0) : 0;
  const devU = (x: number): number => 1e-3 * x + uRef;
  const peakM = measurement(peak, "Hz", devU(peak), `peak deviation: ${devNote}`);
  const posM = measurement(pos, "Hz", devU(pos), `positive deviation: ${devNote}`);
  const negM = measurement(neg, "Hz", devU(neg), `negative deviation: ${devNote}`);
  const rmsM = measurement(rms, "Hz", 1e-3 * rms, "RMS deviation: √mean a² of the filtered deviation");
  const rawWarn = rawPeak > 1.5 * peak && peak > 0
    ? [`the unfiltered peak ${rawPeak.toFixed(0)} Hz exceeds the filtered one by over 50 %: discriminator clicks or out-of-band energy`]
    : [];
  const rawM = measurement(rawPeak, "Hz", null, "peak |deviation| before the audio low-pass (information only)", rawWarn);

  const line = dominantLine(a.subarray(first, end), sampleRateHz, AUDIO_LOW_EDGE_HZ, w);
  const fmMethod = `modulating frequency: dominant line in ${AUDIO_LOW_EDGE_HZ}-${w} Hz of a Hann Welch spectrum, log-parabolic interpolation, ±0.1 bin`;
  const fmM = line.frequencyHz === null || peak === 0
    ? notAvailable("Hz", fmMethod, "no audio line: too few samples or no modulation")
    : measurement(line.frequencyHz, "Hz", 0.1 * line.binWidthHz, fmMethod,
      line.prominenceDb < 10 ? [`the dominant audio line stands only ${line.prominenceDb.toFixed(1)} dB over the band median: no clear tone`] : []);

  const indexM = ratio(peakM, fmM);
  const carsonMethod = "Carson's rule B = 2(Δf + fm) (J. R. Carson 1922)";
  const carsonM = fmM.value === null
    ? notAvailable("Hz", carsonMethod, "no modulating frequency")
    : measurement(2 * (peak + fmM.value), "Hz", 2 * Math.hypot(peakM.uncertainty ?? 0, fmM.uncertainty ?? 0), carsonMethod);

  const tone = subAudibleTone(a, first, end, sampleRateHz, w, peak);
  const trace = minMaxBuckets(a, first, end, sampleRateHz, 0.5);
  return {
    peakDeviationHz: peakM, positiveDeviationHz: posM, negativeDeviationHz: negM, rmsDeviationHz: rmsM,
    rawPeakDeviationHz: rawM, modulatingFrequencyHz: fmM, modulatingToneShare: line.frequencyHz === null ? null : line.lineShare, modulationIndex: indexM, carsonBandwidthHz: carsonM,
    carrierOffsetHz: carrier, toneHz: tone.toneHz, toneDeviationHz: tone.toneDeviationHz,
    standardToneHz: tone.standardToneHz, audioBandwidthHz: w, method,
    trace: { timeS: trace.timeS, minHz: trace.min, maxHz: trace.max },
  };
}

/** Mean instantaneous frequency with a k = 2 uncertainty of 2·s/√K from K block means. */
function carrierEstimate(f: Float32Array): Measurement<"Hz"> {
  const m = "carrier: mean instantaneous frequency (total phase advance / time); ± 2·s/√16 of 16 block means";
  if (f.length < CARRIER_BLOCKS) return notAvailable("Hz", m, `only ${f.length} phase steps`);
  let total = 0;
  const means: number[] = [];
  for (let b = 0; b < CARRIER_BLOCKS; b++) {
    const lo = Math.floor((b * f.length) / CARRIER_BLOCKS);
    const hi = Math.floor(((b + 1) * f.length) / CARRIER_BLOCKS);
    let s = 0;
    for (let i = lo; i < hi; i++) s += f[i] as number;
    total += s;
    means.push(s / (hi - lo));
  }
  const mean = total / f.length;
  let v = 0;
  for (const x of means) v += (x - mean) ** 2;
  const s = Math.sqrt(v / (CARRIER_BLOCKS - 1));
  return measurement(mean, "Hz", (2 * s) / Math.sqrt(CARRIER_BLOCKS), m);
}

/** β = peak / fm with relative uncertainties added in quadrature. */
function ratio(peak: Measurement<"Hz">, fm: Measurement<"Hz">): Measurement<""> {
  const m = "modulation index β = peak deviation / modulating frequency";
  if (peak.value === null || fm.value === null || fm.value <= 0) return notAvailable("", m, "no modulating frequency");
  const beta = peak.value / fm.value;
  const rel = Math.hypot((peak.uncertainty ?? 0) / Math.max(peak.value, 1e-300), (fm.uncertainty ?? 0) / fm.value);
  return measurement(beta, "", beta * rel, m);
}

function tooShort(steps: number, skip: number, w: number, method: string[], carrier: Measurement<"Hz">): FmFigures {
  const reason = `${steps} phase steps do not outlast the audio filter transient (${2 * skip} samples)`;
  const na = (what: string): Measurement<"Hz"> => notAvailable("Hz", what, reason);
  return {
    peakDeviationHz: na("peak deviation"), positiveDeviationHz: na("positive deviation"),
    negativeDeviationHz: na("negative deviation"), rmsDeviationHz: na("RMS deviation"),
    rawPeakDeviationHz: na("raw peak deviation"), modulatingFrequencyHz: na("modulating frequency"), modulatingToneShare: null,
    modulationIndex: notAvailable("", "modulation index", reason), carsonBandwidthHz: na("Carson bandwidth"),
    carrierOffsetHz: carrier, toneHz: na("sub-audible tone"), toneDeviationHz: na("sub-audible tone deviation"),
    standardToneHz: null, audioBandwidthHz: w, method,
    trace: { timeS: new Float64Array(0), minHz: new Float32Array(0), maxHz: new Float32Array(0) },
  };
}
