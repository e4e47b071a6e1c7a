/**
 * A sub-audible tone (CTCSS, 67–254 Hz) in demodulated FM audio.
 *
 * 1. Decimate the audio (already low-passed to the audio bandwidth W, stopband from 1.25·W) by
 *    D1 = ⌊fs / 2.5W⌋, keeping fs1 ≥ 1.25·W + 400 Hz, so nothing aliases below 400 Hz.
 * 2. Low-pass at fs1 with `designLowpass`: passband 0–270 Hz, stopband from 400 Hz, 80 dB, which
 *    removes speech (land-mobile audio starts at 300 Hz, REFERENCES.md §2) by 80 dB; decimate by
 *    D2 = ⌊fs1 / 1000 Hz⌋ (fs2 ≥ 1 kHz > 2·400 Hz).
 * 3. Hann-windowed DFT, zero-padded 8×, of the mean-removed result; the largest interior local
 *    maximum in 60–270 Hz, refined by a parabola on the log power, is the tone frequency. Its
 *    amplitude, from the windowed DTFT at that frequency, 2·|Σ w[n]·a[n]·e^(−jωn)| / Σ w[n], is
 *    the tone's peak deviation in Hz.
 * 4. The tone stands clear when that peak exceeds the median power of the 50–300 Hz bins by
 *    20 dB (median of a Hann periodogram of white noise = ln 2 × its mean) and its deviation
 *    exceeds 1e-3 of the reference (peak) deviation; otherwise null, with the reason.
 * Uncertainties (k = 2): frequency 2 × the Cramér–Rao bound for a real sinusoid in white noise,
 * σ_f = fs2/(2π)·√(12 / (η·N·(N² − 1))), η = A²/(2σ²) (S. M. Kay, Fundamentals of Statistical
 * Signal Processing: Estimation Theory, 1993, Example 3.14; a lower bound: the Hann window
 * costs some efficiency), plus 0.01 bin for the interpolation; amplitude 2·√(2σ²·Σw²)/Σw.
 */
import { designLowpass, transformInPlace } from "../dsp/index.js";
import { filterLinearPhase, transientLength } from "./firFilter.js";
import { nearestCtcssToneHz } from "./ctcssTones.js";
import { measurement, notAvailable, type Measurement } from "./measurement.js";
import { parabolicPeakOffset } from "./audioLine.js";

/** The sub-audible tone figures. */
export interface SubAudibleTone {
  readonly toneHz: Measurement<"Hz">;
  readonly toneDeviationHz: Measurement<"Hz">;
  /** The nearest standard CTCSS tone (within 1 Hz) of REFERENCES.md §10, or null. */
  readonly standardToneHz: number | null;
}

const SEARCH_LO_HZ = 60;
const SEARCH_HI_HZ = 270;
/** Stopband edge of the tone low-pass, Hz (its passband ends at SEARCH_HI_HZ). */
const TONE_STOPBAND_HZ = 400;
const NOISE_LO_HZ = 50;
const NOISE_HI_HZ = 300;
const CLEAR_DB = 20;
const MIN_DURATION_S = 0.5;
const PAD_FACTOR = 8;

const FREQ_METHOD =
  "sub-audible tone: audio low-passed to 270 Hz (80 dB from 400 Hz), Hann DFT peak in 60-270 Hz, log-parabolic interpolation";
const DEV_METHOD = "sub-audible tone deviation: Hann-windowed DTFT amplitude at the tone frequency";

/**
 * The sub-audible tone of `audioHz` (instantaneous frequency minus the carrier, Hz, at
 * `sampleRateHz`, already low-passed to `audioBandwidthHz`); `referenceDeviationHz` is the peak
 * deviation, for the floor of step 4. Uses samples first … end − 1 only (the filtered span).
 */
export function subAudibleTone(
  audioHz: Float64Array,
  first: number,
  end: number,
  sampleRateHz: number,
  audioBandwidthHz: number,
  referenceDeviationHz: number,
): SubAudibleTone {
  const none = (reason: string): SubAudibleTone => ({
    toneHz: notAvailable("Hz", FREQ_METHOD, reason),
    toneDeviationHz: notAvailable("Hz", DEV_METHOD, reason),
    standardToneHz: null,
  });
  if ((end - first) / sampleRateHz < MIN_DURATION_S) {
    return none(`no sub-audible tone search: under ${MIN_DURATION_S} s of audio`);
  }
  // The tone low-pass reaches its stopband at 400 Hz: the audio must be sampled above 800 Hz.
  if (sampleRateHz <= 2 * TONE_STOPBAND_HZ) return none(`no sub-audible tone search: the ${sampleRateHz} S/s audio does not reach the filter's ${TONE_STOPBAND_HZ} Hz stopband`);
  const d1 = Math.max(1, Math.floor(sampleRateHz / (2.5 * audioBandwidthHz)));
  const fs1 = sampleRateHz / d1;
  const stage1 = new Float64Array(Math.floor((end - first) / d1));
  for (let i = 0; i < stage1.length; i++) stage1[i] = audioHz[first + i * d1] as number;
  const taps = designLowpass({ cutoffHz: SEARCH_HI_HZ, transitionHz: TONE_STOPBAND_HZ - SEARCH_HI_HZ, stopbandDb: 80, sampleRateHz: fs1 });
  const low = filterLinearPhase(stage1, taps);
  const skip = transientLength(taps);
  const d2 = Math.max(1, Math.floor(fs1 / 1000));
  const fs2 = fs1 / d2;
  const count = Math.floor((low.length - 2 * skip) / d2);
  if (count / fs2 < MIN_DURATION_S) return none(`no sub-audible tone search: under ${MIN_DURATION_S} s after filtering`);
  const a = new Float64Array(count);
  let mean = 0;
  for (let i = 0; i < count; i++) mean += (a[i] = low[skip + i * d2] as number);
  mean /= count;
  const w = new Float64Array(count);
  let sw = 0;
  let sw2 = 0;
  for (let i = 0; i < count; i++) {
    a[i] = (a[i] as number) - mean;
    const v = 0.5 - 0.5 * Math.cos((2 * Math.PI * i) / count);
    w[i] = v;
    sw += v;
    sw2 += v * v;
  }
  const power = paddedPowerSpectrum(a, w, PAD_FACTOR);
  const binHz = fs2 / (2 * (power.length - 1));
  const noiseBins: number[] = [];
  for (let k = Math.ceil(NOISE_LO_HZ / binHz); k <= Math.floor(NOISE_HI_HZ / binHz); k++) noiseBins.push(power[k] as number);
  noiseBins.sort((x, y) => x - y);
  const median = noiseBins[noiseBins.length >> 1] as number;
  let best = -1;
  for (let k = Math.ceil(SEARCH_LO_HZ / binHz) + 1; k < Math.floor(SEARCH_HI_HZ / binHz); k++) {
    const p = power[k] as number;
    if (p >= (power[k - 1] as number) && p >= (power[k + 1] as number) && (best < 0 || p > (power[best] as number))) best = k;
  }
  if (best < 0) return none("no sub-audible tone: no spectral peak inside 60-270 Hz");
  const clearDb = 10 * Math.log10((power[best] as number) / Math.max(median, 1e-300));
  const f = (best + parabolicPeakOffset(power[best - 1] as number, power[best] as number, power[best + 1] as number)) * binHz;
  const amplitude = (2 * dtftMagnitude(a, w, f / fs2)) / sw;
  if (clearDb < CLEAR_DB || amplitude < 1e-3 * referenceDeviationHz) {
    return none(`no sub-audible tone stands clear of the noise (peak at ${f.toFixed(1)} Hz is ${clearDb.toFixed(1)} dB over the median of 50-300 Hz; ${CLEAR_DB} dB needed)`);
  }
  // Noise variance per sample from the median bin (exponential distribution: median = ln2·mean).
  const sigma2 = median / (Math.LN2 * sw2);
  const eta = (amplitude * amplitude) / (2 * sigma2);
  const crlbHz = (fs2 / (2 * Math.PI)) * Math.sqrt(12 / (eta * count * (count * count - 1)));
  const uF = 2 * crlbHz + 0.01 * (fs2 / count);
  const uA = (2 * Math.sqrt(2 * sigma2 * sw2)) / sw;
  const standard = nearestCtcssToneHz(f);
  const warnings = standard === null ? [`sub-audible tone ${f.toFixed(2)} Hz is not within 1 Hz of a standard CTCSS tone`] : [];
  return {
    toneHz: measurement(f, "Hz", uF, FREQ_METHOD, warnings),
    toneDeviationHz: measurement(amplitude, "Hz", uA, DEV_METHOD),
    standardToneHz: standard,
  };
}

/** |DFT|² of w·a zero-padded to a power of two ≥ pad·N, bins 0 … size/2. */
function paddedPowerSpectrum(a: Float64Array, w: Float64Array, pad: number): Float64Array {
  let size = 2;
  while (size < pad * a.length) size *= 2;
  const out = new Float64Array(2 * size);
  for (let i = 0; i < a.length; i++) out[2 * i] = (a[i] as number) * (w[i] as number);
  transformInPlace(out);
  const p = new Float64Array(size / 2 + 1);
  for (let k = 0; k <= size / 2; k++) p[k] = (out[2 * k] as number) ** 2 + (out[2 * k + 1] as number) ** 2;
  return p;
}

/** |Σ w[n]·a[n]·e^(−j2πνn)|, ν in cycles/sample. */
function dtftMagnitude(a: Float64Array, w: Float64Array, nu: number): number {
  let re = 0;
  let im = 0;
  for (let n = 0; n < a.length; n++) {
    const ph = 2 * Math.PI * ((nu * n) % 1);
    const v = (a[n] as number) * (w[n] as number);
    re += v * Math.cos(ph);
    im -= v * Math.sin(ph);
  }
  return Math.hypot(re, im);
}
