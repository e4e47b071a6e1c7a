/**
 * The figures of a double-sideband full-carrier AM emission (A3E) from its complex baseband:
 * modulation depth (positive, negative, mean), modulating frequency and the first sideband
 * levels. Formulas and sources are in docs/methods.md, "Analog modulation".
 */
import { designLowpass, powerToDb } from "../dsp/index.js";
import { dominantLine } from "./audioLine.js";
import { filterLinearPhase, transientLength } from "./firFilter.js";
import { lineSpectrum, linePower, meanPhaseStepHz } from "./lineSpectrum.js";
import { measurement, notAvailable, type Measurement } from "./measurement.js";
import { minMaxBuckets } from "./minMaxTrace.js";

/** Options of `amFigures`. */
export interface AmFiguresOptions {
  /** Upper edge W of the audio band, Hz: the passband of the envelope low-pass. Default 3000 Hz. */
  readonly audioBandwidthHz?: number;
}

/** Defaults of `amFigures`: W = 3 kHz (A3E telephony, M = 3000 Hz in 47 CFR 2.202(g), REFERENCES.md §2). */
export const AM_FIGURES_DEFAULTS = { audioBandwidthHz: 3000 } as const;

/** Robust extremes: the 0.1 % and 99.9 % quantiles of the filtered envelope. */
export const AM_EXTREME_QUANTILE = 0.001;

const TRANSITION_SHARE = 0.25;
const STOPBAND_DB = 60;
const AUDIO_LOW_EDGE_HZ = 20;

/** A reduced trace of the filtered envelope for a figure. */
export interface AmTrace {
  /** Bucket centre times, s from the first sample. */
  readonly timeS: Float64Array;
  /** Lowest and highest filtered envelope |x| in each bucket, full scale 1.0. */
  readonly minFs: Float32Array;
  readonly maxFs: Float32Array;
}

/** The figures of `amFigures` (report fields am.*, interface.md). */
export interface AmFigures {
  /** (m+ + m−)/2 × 100. */
  readonly modulationDepthPercent: Measurement<"Percent">;
  /** m+ = (Vmax − Vc)/Vc × 100. */
  readonly positiveDepthPercent: Measurement<"Percent">;
  /** m− = (Vc − Vmin)/Vc × 100. */
  readonly negativeDepthPercent: Measurement<"Percent">;
  /** Carrier level Vc = mean envelope, full scale 1.0. */
  readonly carrierAmplitudeFs: Measurement<"">;
  readonly modulatingFrequencyHz: Measurement<"Hz">;
  /** Share of the audio power in the dominant line (audioLine.ts `lineShare`): near 1 for one test tone; null without audio. */
  readonly modulatingToneShare: number | null;
  /** First sideband lines at fc ± fm relative to the carrier line, dBc. */
  readonly sidebandLevelsDbc: { readonly upper: Measurement<"Db">; readonly lower: Measurement<"Db"> };
  readonly audioBandwidthHz: number;
  /** One line per processing step. */
  readonly method: readonly string[];
  readonly trace: AmTrace;
}

/**
 * AM figures of one emission: `iq` interleaved I,Q at `sampleRateHz`, carrier near 0 Hz.
 *
 * e[k] = |x[k]|, low-passed to W (Kaiser, passband 0–W, stopband from 1.25·W, 60 dB; the transient
 * at each end left out) → ē. Vc = mean ē, Vmax/Vmin = the 99.9 %/0.1 % quantiles of ē (robust to
 * noise spikes; a tone's peak is lowered by under 1 − cos(π·0.001) = 5e-6 of its swing, but a
 * single short peak of speech is missed), m+ = (Vmax − Vc)/Vc, m− = (Vc − Vmin)/Vc, depth
 * (m+ + m−)/2 (REFERENCES.md §5, trapezoid/envelope method). fm = the dominant line of ē in
 * 20 Hz–W. Sidebands: lines at fc ± fm over the carrier line, from a Blackman–Harris Welch
 * spectrum (lineSpectrum.ts); theory 20·log10(m/2) dBc. Throws RangeError for bad parameters.
 */
export function amFigures(iq: Float32Array, sampleRateHz: number, options: AmFiguresOptions = {}): AmFigures {
  const w = options.audioBandwidthHz ?? AM_FIGURES_DEFAULTS.audioBandwidthHz;
  if (!(Number.isFinite(sampleRateHz) && sampleRateHz > 0)) {
    throw new RangeError(`sampleRateHz ${sampleRateHz} is not a positive finite rate`);
  }
  if (!(Number.isFinite(w) && w > 0 && w * (1 + TRANSITION_SHARE) < sampleRateHz / 2)) {
    throw new RangeError(`audioBandwidthHz ${w} must be positive and 1.25 times it below half the rate ${sampleRateHz / 2}`);
  }
  if (iq.length % 2 !== 0) throw new RangeError(`iq length ${iq.length} is odd: not interleaved I,Q`);
  const n = iq.length >> 1;
  const env = new Float64Array(n);
  for (let k = 0; k < n; k++) env[k] = Math.hypot(iq[2 * k] as number, iq[2 * k + 1] as number);
  const taps = designLowpass({ cutoffHz: w, transitionHz: TRANSITION_SHARE * w, stopbandDb: STOPBAND_DB, sampleRateHz });
  const skip = transientLength(taps);
  const method = [
    `envelope |x| low-passed 0-${w} Hz (Kaiser, ${taps.length} taps, ${STOPBAND_DB} dB from ${1.25 * w} Hz)`,
    `Vc = mean envelope; Vmax, Vmin = 99.9 % and 0.1 % quantiles; m+ = (Vmax - Vc)/Vc, m- = (Vc - Vmin)/Vc, depth = (m+ + m-)/2`,
    `sidebands: lines at fc ± fm over the carrier line, Blackman-Harris Welch spectrum`,
  ];
  const first = skip;
  const end = n - skip;
  if (end - first < 16) return tooShort(`${n} samples do not outlast the envelope filter transient (${2 * skip})`, w, method);

  const filtered = filterLinearPhase(env, taps);
  const span = filtered.subarray(first, end);
  let sum = 0;
  let residual2 = 0;
  for (let k = first; k < end; k++) {
    sum += filtered[k] as number;
    residual2 += ((env[k] as number) - (filtered[k] as number)) ** 2;
  }
  const vc = sum / (end - first);
  const sorted = Float64Array.from(span).sort();
  const vmin = quantile(sorted, AM_EXTREME_QUANTILE);
  const vmax = quantile(sorted, 1 - AM_EXTREME_QUANTILE);
  // In-band envelope noise from the out-of-band residual, assuming white envelope noise: the
  // filter keeps about 0–1.125·W of the 0–fs/2 of a real signal.
  const keep = 1.125 * w;
  const sigmaIn = Math.sqrt(((residual2 / (end - first)) * keep) / Math.max(sampleRateHz / 2 - keep, 1e-300));
  // k = 2: twice the noise on one extreme, plus the ±1e-3 passband ripple of the 60 dB design.
  const uDepth = vc > 0 ? (100 * (2 * sigmaIn + 1e-3 * vmax)) / vc : null;
  const depthNote = "m+ = (Vmax − Vc)/Vc, m− = (Vc − Vmin)/Vc from 0.1 %/99.9 % quantiles of the filtered envelope";
  const carrierM = measurement(vc, "", (2 * sigmaIn) / Math.sqrt(end - first), "carrier level Vc: mean of the filtered envelope");
  if (!(vc > 0)) {
    return tooShort("the envelope is zero: no carrier", w, method);
  }
  const mPlus = (vmax - vc) / vc;
  const mMinus = (vc - vmin) / vc;
  const posM = measurement(100 * mPlus, "Percent", uDepth, `positive depth (Vmax - Vc)/Vc: ${depthNote}`);
  const negM = measurement(100 * mMinus, "Percent", uDepth, `negative depth (Vc - Vmin)/Vc: ${depthNote}`);
  const depthM = measurement(50 * (mPlus + mMinus), "Percent", uDepth, `depth (m+ + m-)/2: ${depthNote}`,
    mMinus > 0.999 ? ["the envelope reaches zero: the carrier may be over-modulated (negative depth 100 %)"] : []);

  const line = dominantLine(span, sampleRateHz, AUDIO_LOW_EDGE_HZ, w);
  const fmMethod = `modulating frequency: dominant line of the envelope in ${AUDIO_LOW_EDGE_HZ}-${w} Hz, Hann Welch spectrum, log-parabolic interpolation, ±0.1 bin`;
  const fmM = line.frequencyHz === null
    ? notAvailable("Hz", fmMethod, "no envelope line: too few samples")
    : measurement(line.frequencyHz, "Hz", 0.1 * line.binWidthHz, fmMethod,
      line.prominenceDb < 10 ? [`the dominant envelope line stands only ${line.prominenceDb.toFixed(1)} dB over the band median: no clear tone`] : []);
  const sidebands = sidebandLevels(iq, sampleRateHz, fmM.value);
  const trace = minMaxBuckets(filtered, first, end, sampleRateHz, 0);
  return {
    modulationDepthPercent: depthM, positiveDepthPercent: posM, negativeDepthPercent: negM,
    carrierAmplitudeFs: carrierM, modulatingFrequencyHz: fmM, modulatingToneShare: line.frequencyHz === null ? null : line.lineShare, sidebandLevelsDbc: sidebands,
    audioBandwidthHz: w, method, trace: { timeS: trace.timeS, minFs: trace.min, maxFs: trace.max },
  };
}

/** Type-7 quantile (linear interpolation, Hyndman & Fan 1996) of sorted values. */
function quantile(sorted: Float64Array, p: number): number {
  const h = (sorted.length - 1) * p;
  const lo = Math.floor(h);
  const hi = Math.min(sorted.length - 1, lo + 1);
  return (sorted[lo] as number) + (h - lo) * ((sorted[hi] as number) - (sorted[lo] as number));
}

function sidebandLevels(iq: Float32Array, fs: number, fmHz: number | null): AmFigures["sidebandLevelsDbc"] {
  const m = "first sideband line over the carrier line (9 Blackman-Harris bins each); theory 20·log10(m/2) dBc";
  if (fmHz === null || !(fmHz > 0)) {
    const na = notAvailable("Db", m, "no modulating frequency");
    return { upper: na, lower: na };
  }
  const psd = lineSpectrum(iq, fs, fmHz);
  const fc = meanPhaseStepHz(iq, fs);
  const pc = linePower(psd, fc);
  const noise9 = 9 * psd.binWidthHz * median(psd.densityPerHz);
  const one = (p: number): Measurement<"Db"> => {
    // k = 2 amplitude perturbation of the line by the noise in its 9 bins, as dB.
    const u = 2 * 8.686 * Math.sqrt(noise9 / Math.max(p, 1e-300)) + 2 * 8.686 * Math.sqrt(noise9 / Math.max(pc, 1e-300));
    return measurement(powerToDb(p / pc), "Db", u, m);
  };
  return { upper: one(linePower(psd, fc + fmHz)), lower: one(linePower(psd, fc - fmHz)) };
}

function median(x: Float64Array): number {
  const s = Float64Array.from(x).sort();
  return s[s.length >> 1] as number;
}

function tooShort(reason: string, w: number, method: string[]): AmFigures {
  const pct = (what: string): Measurement<"Percent"> => notAvailable("Percent", what, reason);
  const db = notAvailable("Db", "sideband level", reason);
  return {
    modulationDepthPercent: pct("depth"), positiveDepthPercent: pct("positive depth"),
    negativeDepthPercent: pct("negative depth"), carrierAmplitudeFs: notAvailable("", "carrier level", reason),
    modulatingFrequencyHz: notAvailable("Hz", "modulating frequency", reason), modulatingToneShare: null,
    sidebandLevelsDbc: { upper: db, lower: db }, audioBandwidthHz: w, method,
    trace: { timeS: new Float64Array(0), minFs: new Float32Array(0), maxFs: new Float32Array(0) },
  };
}
