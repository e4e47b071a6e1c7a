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
  /** Complex noise density N0 of the channel (two-sided, FS²/Hz), e.g. the capture's noise floor,
   * for the noise of the filtered deviation; without it, estimated from the discriminator output. */
  readonly noiseFloorPerHz?: number | undefined;
}

/** Defaults of `fmFigures`: W = 3 kHz, the top of land-mobile speech (47 CFR 2.202(g) F3E, M = 3000 Hz). */
export const FM_FIGURES_DEFAULTS = { audioBandwidthHz: 3000 } as const;

/** Transition band of the audio low-pass as a share of W; stopband from 1.25·W. */
const AUDIO_TRANSITION_SHARE = 0.25;
/** Stopband attenuation of the audio low-pass, dB (passband ripple ±1e-3, Kaiser design). */
const AUDIO_STOPBAND_DB = 60;
/** Lower edge of the search for the modulating frequency, Hz: above the sub-audible range. */
const AUDIO_LOW_EDGE_HZ = 300;
/** Blocks whose mean squares give the spread of the RMS deviation. */
const RMS_BLOCKS = 16;
/** Bound of the discriminator's arctangent error per phase step, as a share of fs (fmDiscriminator.ts). */
const ATAN_ERROR_SHARE = 3.2e-7;
/** Passband ripple of the 60 dB Kaiser audio low-pass, δ = 10^(−60/20) (Kaiser 1974). */
const AUDIO_RIPPLE = 1e-3;

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
  const taps = audioLowpassTaps(w, sampleRateHz);
  const skip = transientLength(taps);
  const method = [
    `discriminator arg(x[k+1]·conj(x[k]))·fs/2π, ${f.length} steps at ${sampleRateHz} Hz`,
    `carrier = ${options.carrierOffsetHz === undefined ? "mean instantaneous frequency" : "given by the caller"}`,
    `deviation after an audio low-pass 0-${w} Hz (Kaiser, ${taps.length} taps, ${AUDIO_STOPBAND_DB} dB from ${1.25 * w} Hz): discriminator clicks suppressed`,
    `modulating frequency: dominant line of the filtered audio in ${AUDIO_LOW_EDGE_HZ}-${w} Hz; index = peak/fm; Carson 2(peak + fm)`,
  ];
  const carrier = carrierEstimate(f, sampleRateHz);
  const ref = options.carrierOffsetHz ?? (carrier.value as number);
  // The deviation d = f − ref is read from f as it is needed, never stored (8 bytes a sample).
  let rawPeak = 0;
  for (let i = 0; i < f.length; i++) rawPeak = Math.max(rawPeak, Math.abs((f[i] as number) - ref));
  const a = filterLinearPhase(f, taps, ref);
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
  const count = end - first;
  const rms = Math.sqrt(sumSq / count);
  const sigmaN = deviationNoiseHz(iq, f, ref, a, taps, sampleRateHz, first, end, options.noiseFloorPerHz);
  // Noise raises a filtered peak by about the largest of M independent noise values,
  // σ·√(2 ln M) with M = 2W·T (Cramér's extreme-value law); below, it can lower it by about 2σ.
  const independent = Math.max(2, (count * 2 * w) / sampleRateHz);
  const noisePeak = sigmaN * Math.max(2, Math.sqrt(2 * Math.log(independent)));
  // Discriminator clicks (2π phase slips) each raise the filtered deviation by up to 2W.
  const clicks = clickChance(iq, a, first, end, sampleRateHz, options.noiseFloorPerHz);
  const clickU = clicks >= CLICK_CHANCE ? 2 * w : 0;
  const clickNote = clickU > 0 ? `, discriminator clicks (chance ${(100 * Math.min(clicks, 1)).toFixed(0)} % of at least one in the record, Rice's rate; each raises the peak by up to 2W = ${clickU.toFixed(0)} Hz)` : "";
  const devNote = `filtered peak; ± ripple ${AUDIO_RIPPLE * 100} %, noise (σ ${sigmaN.toPrecision(2)} Hz in the audio band, raises peaks)${clickNote} and the carrier's uncertainty`;
  // A measured carrier moves positive and negative deviation by its own uncertainty.
  const uRef = options.carrierOffsetHz === undefined ? (carrier.uncertainty ?? 0) : 0;
  const devU = (x: number): number => AUDIO_RIPPLE * x + noisePeak + clickU + uRef;
  const peakM = measurement(peak, "Hz", devU(peak), `peak deviation: ${devNote}`);
  const posM = measurement(pos, "Hz", devU(pos), `positive deviation: ${devNote}`);
  const negM = measurement(neg, "Hz", devU(neg), `negative deviation: ${devNote}`);
  const rmsM = measurement(rms, "Hz", rmsUncertainty(a, first, end, rms, sigmaN) + uRef,
    "RMS deviation: √mean a² of the filtered deviation; ± block spread of the mean square, ripple, noise power, carrier");
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

/**
 * The audio low-pass of the FM figures: Kaiser, passband 0–W, stopband from 1.25·W, 60 dB
 * (designLowpass; odd, symmetric, unity DC gain). Shared with the whole-span stage so that both
 * filter the deviation alike.
 */
export function audioLowpassTaps(audioBandwidthHz: number, sampleRateHz: number): Float64Array {
  return designLowpass({
    cutoffHz: audioBandwidthHz, transitionHz: AUDIO_TRANSITION_SHARE * audioBandwidthHz, stopbandDb: AUDIO_STOPBAND_DB, sampleRateHz,
  });
}

/**
 * ∫₀^{fs/2} |H(f)|²·f² df (inBand) and ∫₀^{fs/2} (1 − H(f))²·f² df (outBand), Hz³, for the
 * zero-phase response H of the symmetric `taps` at `fs` (a 512-point midpoint sum): the f²
 * noise law of the discriminator weighted by the audio low-pass and by its complement
 * (deviationNoiseHz).
 */
export function audioNoiseIntegrals(taps: Float64Array, fs: number): { inBand: number; outBand: number } {
  const points = 512;
  let inBand = 0;
  let outBand = 0;
  const c = (taps.length - 1) / 2;
  for (let j = 0; j < points; j++) {
    const f = ((j + 0.5) / points) * (fs / 2);
    let h = 0;
    for (let k = 0; k < taps.length; k++) h += (taps[k] as number) * Math.cos((2 * Math.PI * f * (k - c)) / fs);
    inBand += h * h * f * f;
    outBand += (1 - h) ** 2 * f * f;
  }
  const df = fs / 2 / points;
  return { inBand: inBand * df, outBand: outBand * df };
}

/** Passband ripple of the audio low-pass (δ = 10^(−60/20)), for the deviation's uncertainty. */
export const FM_AUDIO_RIPPLE = AUDIO_RIPPLE;

/**
 * Mean instantaneous frequency f̄ = (total phase advance)/(2π·T), T = N/fs. Its error is the
 * phase of the modulation and of the noise at the two ends, (ψ(T) − ψ(0))/(2πT), ψ the phase
 * about the carrier's; with s_ψ the spread of ψ over the record (in cycles: the running sum of
 * (f − f̄)/fs), the standard error is √2·s_ψ/T (for tone FM, β/(2πT): the known bound of the
 * mean of a sinusoid over a non-integer number of periods). k = 2, plus the arctangent bound of
 * the discriminator (3.2e-7·fs) and the float32 rounding of f (6e-8·|f̄|).
 */
function carrierEstimate(f: Float32Array, fs: number): Measurement<"Hz"> {
  const m = "carrier: mean instantaneous frequency (total phase advance / time); ± 2·√2·s_ψ/T from the spread s_ψ of the phase about the carrier's (the phase at the two ends), plus the discriminator's arctangent bound";
  if (f.length < 16) return notAvailable("Hz", m, `only ${f.length} phase steps`);
  let total = 0;
  for (let i = 0; i < f.length; i++) total += f[i] as number;
  const mean = total / f.length;
  // ψ[k] = Σ_{i<k} (f[i] − f̄)/fs cycles; its mean and spread in one pass.
  let psi = 0;
  let s1 = 0;
  let s2 = 0;
  for (let i = 0; i < f.length; i++) {
    psi += ((f[i] as number) - mean) / fs;
    s1 += psi;
    s2 += psi * psi;
  }
  const sPsi = Math.sqrt(Math.max(s2 / f.length - (s1 / f.length) ** 2, 0));
  const t = f.length / fs;
  const u = (2 * Math.SQRT2 * sPsi) / t + ATAN_ERROR_SHARE * fs + 6e-8 * Math.abs(mean);
  return measurement(mean, "Hz", u, `${m}, T ${t.toPrecision(4)} s`);
}

/**
 * RMS noise of the filtered deviation a, Hz. With N0: the discriminator turns complex noise of
 * density N0 on a carrier of power A² into frequency noise of density f²·N0/(2A²) (two-sided;
 * e.g. Taub & Schilling, Principles of Communication Systems, FM noise), so
 * σ² = (N0/A²)·∫₀^{fs/2} |H(f)|²·f² df, H the audio low-pass. Without N0, the same f² law is
 * scaled to the residual d − a, whose spectrum is (1 − H)²·f²·N0/(2A²) (it also holds any
 * out-of-band modulation, so it errs on the safe side).
 */
function deviationNoiseHz(
  iq: Float32Array, f: Float32Array, ref: number, a: Float64Array, taps: Float64Array, fs: number,
  first: number, end: number, n0: number | undefined,
): number {
  const { inBand, outBand } = audioNoiseIntegrals(taps, fs);
  if (n0 !== undefined && n0 > 0) {
    let p = 0;
    const n = iq.length >> 1;
    for (let k = 0; k < 2 * n; k++) p += (iq[k] as number) ** 2;
    const a2 = Math.max(p / n - n0 * fs, (p / n) * 1e-3);
    return Math.sqrt((n0 / a2) * inBand);
  }
  let r2 = 0;
  for (let i = first; i < end; i++) r2 += ((f[i] as number) - ref - (a[i] as number)) ** 2;
  r2 /= Math.max(end - first, 1);
  return outBand > 0 ? Math.sqrt((r2 * inBand) / outBand) : 0;
}

/** A chance of at least one click in the record from which the peak's uncertainty carries one (5 %). */
const CLICK_CHANCE = 0.05;

/**
 * The chance of at least one discriminator click in the record, 1 − e^(−λT), from Rice's click
 * rate for FM in white noise, λ = (B/(2√3))·erfc(√ρ) + mean|δf|·e^(−ρ) (S. O. Rice, "Noise in FM
 * receivers", 1963; as in Taub & Schilling, Principles of Communication Systems, from memory):
 * ρ the carrier-to-noise ratio over the record's band B = fs (white noise of density n0 over
 * the channel's sample rate, as deviationNoiseHz takes it, which errs towards more clicks) and
 * mean|δf| the mean absolute filtered deviation. 0 when the noise density is not known.
 */
function clickChance(iq: Float32Array, a: Float64Array, first: number, end: number, fs: number, n0: number | undefined): number {
  if (n0 === undefined || !(n0 > 0) || end <= first) return 0;
  const n = iq.length >> 1;
  let p = 0;
  for (let k = 0; k < 2 * n; k++) p += (iq[k] as number) ** 2;
  const noise = n0 * fs;
  const rho = Math.max(p / n - noise, 0) / noise;
  let meanAbs = 0;
  for (let i = first; i < end; i++) meanAbs += Math.abs(a[i] as number);
  meanAbs /= end - first;
  const rate = (fs / (2 * Math.sqrt(3))) * erfc(Math.sqrt(rho)) + meanAbs * Math.exp(-rho);
  return 1 - Math.exp(-rate * (n / fs));
}

/** erfc(x) for x ≥ 0, A&S 7.1.26 (absolute error ≤ 1.5e-7 on erf). */
function erfc(x: number): number {
  const t = 1 / (1 + 0.3275911 * x);
  const poly = t * (0.254829592 + t * (-0.284496736 + t * (1.421413741 + t * (-1.453152027 + t * 1.061405429))));
  return poly * Math.exp(-x * x);
}

/**
 * k = 2 uncertainty of the RMS deviation: twice the standard error of the mean square from 16
 * block means, over 2·rms; the ripple (1e-3 of the RMS); the noise power, which raises the
 * mean square by σ² (a bias of σ²/(2·rms)).
 */
function rmsUncertainty(a: Float64Array, first: number, end: number, rms: number, sigmaN: number): number {
  const count = end - first;
  const means: number[] = [];
  for (let b = 0; b < RMS_BLOCKS; b++) {
    const lo = first + Math.floor((b * count) / RMS_BLOCKS);
    const hi = first + Math.floor(((b + 1) * count) / RMS_BLOCKS);
    let s = 0;
    for (let i = lo; i < hi; i++) s += (a[i] as number) ** 2;
    if (hi > lo) means.push(s / (hi - lo));
  }
  const ms = rms * rms;
  let v = 0;
  for (const x of means) v += (x - ms) ** 2;
  const se = means.length > 1 ? Math.sqrt(v / (means.length - 1) / means.length) : ms;
  const r = Math.max(rms, 1e-300);
  return (2 * se) / (2 * r) + AUDIO_RIPPLE * rms + (sigmaN * sigmaN) / (2 * r) + 2 * sigmaN / Math.sqrt(Math.max(count, 1));
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
