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
import { dtftAt, lineFrequencyCrbVariance, refinePeak } from "./periodogramPeak.js";
import { minMaxBuckets } from "./minMaxTrace.js";

/** Options of `amFigures`. */
export interface AmFiguresOptions {
  /** Upper edge W of the audio band, Hz: the passband of the envelope low-pass. Default 3000 Hz. */
  readonly audioBandwidthHz?: number;
  /** Complex noise density N0 of the channel (two-sided, FS²/Hz), e.g. the capture's noise floor;
   * without it the envelope noise is estimated from the record itself. */
  readonly noiseFloorPerHz?: number | undefined;
}

/** Defaults of `amFigures`: W = 3 kHz (A3E telephony, M = 3000 Hz in 47 CFR 2.202(g), REFERENCES.md §2). */
export const AM_FIGURES_DEFAULTS = { audioBandwidthHz: 3000 } as const;

/** Robust extremes: the 0.1 % and 99.9 % quantiles of the filtered envelope. */
export const AM_EXTREME_QUANTILE = 0.001;

/** Audio whose dominant line holds at least this share of its power is one test tone (as in
 * measureEmission: a sinusoid keeps > 99 % within its Hann main lobe; common practice). */
export const AM_TONE_SHARE = 0.8;

/** Standard normal 99.9 % quantile (Abramowitz & Stegun 26.2.23): how far Gaussian noise can
 * raise the 99.9 % quantile of the envelope above the signal's own extreme. */
const Z_999 = 3.09;

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
  if (!(vc > 0)) {
    return tooShort("the envelope is zero: no carrier", w, method);
  }
  // Envelope noise: the in-phase part of complex noise of density N0 has two-sided density N0/2,
  // and after the low-pass a variance (N0/2)·fs·Σh² (Parseval). Without N0, from the
  // out-of-band residual, taking the envelope noise as white (the filter keeps about 0–1.125·W).
  let tapEnergy = 0;
  for (const h of taps) tapEnergy += h * h;
  const n0 = options.noiseFloorPerHz;
  const keep = 1.125 * w;
  const sigmaIn = n0 !== undefined && n0 > 0
    ? Math.sqrt((n0 / 2) * sampleRateHz * tapEnergy)
    : Math.sqrt(((residual2 / (end - first)) * keep) / Math.max(sampleRateHz / 2 - keep, 1e-300));
  const carrierM = measurement(vc, "", (2 * sigmaIn) / Math.sqrt(end - first), "carrier level Vc: mean of the filtered envelope");
  const line = dominantLine(span, sampleRateHz, AUDIO_LOW_EDGE_HZ, w);
  const tone = line.frequencyHz !== null && line.lineShare >= AM_TONE_SHARE && line.prominenceDb >= 10
    ? periodicEnvelope(env, sampleRateHz, line.frequencyHz, w, n0)
    : null;
  let depths: { mPlus: number; mMinus: number; u: number; uDepth: number; note: string };
  if (tone !== null) {
    depths = { ...tone, note: `one tone: ${tone.note}` };
    method[1] = `one test tone: envelope fitted by its harmonics to W over whole periods; m+ = (Vmax - Vc)/Vc, m- = (Vc - Vmin)/Vc of the fitted period`;
  } else {
    const sorted = Float64Array.from(span).sort();
    const vmin = quantile(sorted, AM_EXTREME_QUANTILE);
    const vmax = quantile(sorted, 1 - AM_EXTREME_QUANTILE);
    // k = 2: twice the noise on one extreme, the most the noise raises a 99.9 % quantile
    // (z·σ, a bias), and the ±1e-3 passband ripple of the 60 dB design on the swing.
    const base = (2 * sigmaIn + Z_999 * sigmaIn + 1e-3 * (vmax - vmin) / 2) / vc;
    // The quantiles miss the few peaks of speech: the true extreme lies up to the absolute
    // extreme, less the most the noise lifts a maximum of M = 2W·T independent values,
    // σ·√(2 ln M) (Cramér's extreme-value law). One-sided, so added, not in quadrature.
    const lift = sigmaIn * Math.sqrt(2 * Math.log(Math.max(2, (2 * w * (end - first)) / sampleRateHz)));
    const gapPlus = Math.max(0, (sorted[sorted.length - 1] as number) - vmax - lift) / vc;
    const gapMinus = Math.max(0, vmin - (sorted[0] as number) - lift) / vc;
    depths = {
      mPlus: (vmax - vc) / vc, mMinus: (vc - vmin) / vc, u: base + Math.max(gapPlus, gapMinus), uDepth: base + (gapPlus + gapMinus) / 2,
      note: "m+ = (Vmax − Vc)/Vc, m− = (Vc − Vmin)/Vc from 0.1 %/99.9 % quantiles of the filtered envelope; ± includes the noise bias of the extremes and how far the absolute extremes (less the noise's lift) lie beyond the quantiles",
    };
  }
  const { mPlus, mMinus } = depths;
  const uPeak = 100 * depths.u;
  const depthNote = depths.note;
  const posM = measurement(100 * mPlus, "Percent", uPeak, `positive depth (Vmax - Vc)/Vc: ${depthNote}`);
  const negM = measurement(100 * mMinus, "Percent", uPeak, `negative depth (Vc - Vmin)/Vc: ${depthNote}`);
  const depthM = measurement(50 * (mPlus + mMinus), "Percent", 100 * depths.uDepth, `depth (m+ + m-)/2: ${depthNote}`,
    mMinus > 0.999 ? ["the envelope reaches zero: the carrier may be over-modulated (negative depth 100 %)"] : []);

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

/** Points per period at which the fitted envelope is searched for its extremes. */
const PERIOD_POINTS = 4096;
/** Most harmonics fitted (a test tone's distortion beyond the 32nd is negligible). */
const MAX_HARMONICS = 32;

/**
 * The envelope of one test tone fitted by its harmonics (common practice: a synchronous average
 * of a periodic waveform). fm is refined to the periodogram maximum (Rife & Boorstyn 1974); the
 * record is cut to whole periods, so DC and the harmonics h·fm ≤ W are orthogonal and each
 * c_h = (2/N)·Σ e[k]·e^(−j2πh·fm·k/fs) is their least-squares amplitude; Vmax, Vmin are the
 * extremes of Vc + Σ Re(c_h e^(jhθ)) over one period. Noise enters only through the narrow
 * bins at the harmonics, so the extremes carry no noise bias (unlike quantiles of the samples).
 * Uncertainty (k = 2), linearised: each c_h varies by 2S/T per component (S the two-sided
 * envelope noise density, T the fitted time) and Vc by S/T, independently (orthogonal fit), so
 * var(Vmax − Vc) = 2H·S/T and var(m±) = (2H + m±²)·S/(T·Vc²); for the mean depth
 * (Vmax − Vmin)/(2Vc), var = [Σ_h (2S/T)·|e^(jhθ+) − e^(jhθ−)|²/4 + m²·S/T]/Vc² (θ± where the
 * extremes lie; only odd harmonics count for a pure tone). Added: the search grid
 * (1 − cos(πH/P))·m, the amplitude loss (π·δf·T)²/6 from the fm error, the leakage between DC
 * and the harmonics from the half-sample cut (1/N)·m. The quadrature-noise lift σ²/(2e) of
 * the envelope detector is removed point by point (|e + n| ≈ e + n_I + n_Q²/(2e)); its next
 * term σ⁴/(8e³) stays in the budget. Null for fewer than 4 periods.
 */
function periodicEnvelope(
  env: Float64Array, fs: number, fmHz: number, w: number, n0: number | undefined,
): { mPlus: number; mMinus: number; u: number; uDepth: number; note: string } | null {
  const n = env.length;
  let mean = 0;
  for (let k = 0; k < n; k++) mean += env[k] as number;
  mean /= n;
  const z = new Float64Array(2 * n);
  for (let k = 0; k < n; k++) z[2 * k] = (env[k] as number) - mean;
  const nu = refinePeak(z, fmHz / fs, 4);
  const periods = Math.floor(n * nu);
  if (!(nu > 0) || periods < 4) return null;
  const m = Math.min(n, Math.round(periods / nu));
  const part = env.subarray(0, m);
  let vc = 0;
  for (let k = 0; k < m; k++) vc += part[k] as number;
  vc /= m;
  if (!(vc > 0)) return null;
  const harmonics = Math.min(MAX_HARMONICS, Math.max(1, Math.floor(w / (nu * fs))));
  const x = new Float64Array(2 * m);
  for (let k = 0; k < m; k++) x[2 * k] = (part[k] as number) - vc;
  const c: [number, number][] = [];
  for (let h = 1; h <= harmonics; h++) {
    const [re, im] = dtftAt(x, h * nu);
    c.push([(2 * re) / m, (2 * im) / m]);
  }
  // The residual of the fit: the in-phase noise per sample, σ² (and, for circular noise, the
  // quadrature noise too). |e + n| = e + n_I + n_Q²/(2e) + …: the quadrature noise lifts the
  // envelope by σ²/(2e), most where e is small, which flattens the swing (about −0.08 % of
  // depth at 30 dB carrier-to-noise); each point of the fitted period is corrected by it.
  const residual = fitResidualPower(part, vc, nu, c);
  const sigma = Math.sqrt(residual);
  let vmax = -Infinity;
  let vmin = Infinity;
  let thetaMax = 0;
  let thetaMin = 0;
  let level = 0;
  for (let i = 0; i < PERIOD_POINTS; i++) {
    const theta = (2 * Math.PI * i) / PERIOD_POINTS;
    let v = vc;
    for (let h = 1; h <= harmonics; h++) {
      const [re, im] = c[h - 1] as [number, number];
      v += re * Math.cos(h * theta) - im * Math.sin(h * theta);
    }
    if (v > 3 * sigma) v -= residual / (2 * v);
    level += v;
    if (v > vmax) { vmax = v; thetaMax = theta; }
    if (v < vmin) { vmin = v; thetaMin = theta; }
  }
  const vcFitted = vc;
  vc = level / PERIOD_POINTS;
  if (!(vc > 0)) return null;
  // Two-sided envelope noise density S: N0/2 (in-phase part of the complex noise), or from the
  // residual of the fit taken as white over the channel rate (then it also holds any
  // non-tone audio, so it is on the safe side).
  const s = n0 !== undefined && n0 > 0 ? n0 / 2 : residual / fs;
  const t = m / fs;
  const mPlus = (vmax - vc) / vc;
  const mMinus = (vc - vmin) / vc;
  // The next term of the expansion, σ⁴/(8e³), left in the envelope at its trough.
  // Within 3σ of zero the expansion fails: there the envelope is Rayleigh-like, lifted by up
  // to σ·√(π/2) (its mean at e = 0), which the budget then carries instead.
  const secondOrder = vmin > 3 * sigma
    ? (residual * residual) / (8 * vmin ** 3 * vc)
    : (sigma * Math.sqrt(Math.PI / 2)) / Math.max(vc, 1e-3 * vcFitted);
  const depth = Math.max(mPlus, mMinus);
  let spread = 0;
  for (let h = 1; h <= harmonics; h++) {
    spread += ((Math.cos(h * thetaMax) - Math.cos(h * thetaMin)) ** 2 + (Math.sin(h * thetaMax) - Math.sin(h * thetaMin)) ** 2) / 4;
  }
  const a1 = Math.hypot(...(c[0] as [number, number]));
  // Cramér–Rao spread of the refined fm (Rife & Boorstyn 1974), the line a1/2 per complex image.
  const rho = ((a1 / 2) ** 2) / Math.max(s * fs, 1e-300);
  const dnu = Math.sqrt(lineFrequencyCrbVariance(rho, m));
  const fmLoss = ((Math.PI * dnu * m) ** 2) / 6;
  const grid = 1 - Math.cos((Math.PI * harmonics) / PERIOD_POINTS);
  // Whole periods to within half a sample: DC and harmonics leak into each other by up to 1/m.
  const leak = 1 / m;
  const limits = (grid + fmLoss + leak) * depth + secondOrder;
  const u = (2 * Math.sqrt(((2 * harmonics + depth * depth) * s) / t)) / vc + limits;
  const meanDepth = (mPlus + mMinus) / 2;
  const uDepth = (2 * Math.sqrt(((2 * spread + meanDepth * meanDepth) * s) / t)) / vc + limits;
  return { mPlus, mMinus, u, uDepth, note: `${harmonics} harmonic${harmonics === 1 ? "" : "s"} of ${(nu * fs).toFixed(3)} Hz over ${periods} periods` };
}

/** Mean square of e[k] − Vc − Σ Re(c_h e^(j2πhν(k − c))) over the fitted samples. */
function fitResidualPower(part: Float64Array, vc: number, nu: number, c: readonly (readonly [number, number])[]): number {
  const m = part.length;
  const centre = (m - 1) / 2;
  const stepRe = Math.cos(2 * Math.PI * nu);
  const stepIm = Math.sin(2 * Math.PI * nu);
  let baseRe = Math.cos(-2 * Math.PI * nu * centre);
  let baseIm = Math.sin(-2 * Math.PI * nu * centre);
  let sum = 0;
  for (let k = 0; k < m; k++) {
    let v = vc;
    let pr = baseRe;
    let pi = baseIm;
    for (const [re, im] of c) {
      v += re * pr - im * pi;
      const t = pr * baseRe - pi * baseIm;
      pi = pr * baseIm + pi * baseRe;
      pr = t;
    }
    sum += ((part[k] as number) - v) ** 2;
    if ((k & 1023) === 1023) {
      // Re-anchor the rotating phasor against rounding drift.
      const ph = 2 * Math.PI * nu * (k + 1 - centre);
      baseRe = Math.cos(ph);
      baseIm = Math.sin(ph);
    } else {
      const t = baseRe * stepRe - baseIm * stepIm;
      baseIm = baseRe * stepIm + baseIm * stepRe;
      baseRe = t;
    }
  }
  return sum / m;
}
