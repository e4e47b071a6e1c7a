/**
 * Features for telling analogue classes apart, from the channel baseband and its PSD. The
 * caller hands over one emission's channel (or a capture holding one emission); the features
 * are measured over [lowerHz, upperHz], by default the whole band ±fs/2.
 *
 * - snrDb: in-channel SNR as channelPower.ts defines it (given, or computed here).
 * - occupiedHz: 99 % bandwidth (occupiedBandwidth.ts); resolutionHz: the PSD's ENBW.
 * - lineShare: of the power above the floor in the range, the share in the strongest line,
 *   i.e. the largest bin and its neighbours within the window's main-lobe half-width.
 *   An unmodulated carrier has nearly all of it; tone AM 1/(1 + m²/2) (REFERENCES.md §5);
 *   FM and PSK much less.
 * - envelopeExcessVariance κ: the variance of the power envelope |s|² of the signal over its
 *   squared mean, with the noise's part removed. For z = s + w, w circular Gaussian noise of
 *   power N independent of s: E|z|² = S + N and var|z|² = var|s|² + 2SN + N², so
 *   κ = (var|z|² − 2SN − N²)/S², S = E|z|² − N, N = floor × band width.
 *   0 for a constant envelope (CW, FM); tone AM of depth m gives (2m² + m⁴/8)/(1 + m²/2)²
 *   (0.166 at m = 0.3, 0.944 at m = 1); Gaussian noise-like signals 1.
 * - frequencySpread ξ: the RMS of the instantaneous frequency arg(z[n]·z*[n−1])·fs/2π about
 *   its mean, with the noise's part removed (phase noise of two-sided density N0/(2S) through
 *   the first difference, 4·sin²(πf/fs), over the band about the mean frequency; ≈ N·B²/(24·S)
 *   for a band B ≪ fs), over the occupied bandwidth. FM has it
 *   (tone FM: (D/√2)/OBW, 0.26 for β = 3); a carrier has none. Below about 10 dB SNR in the
 *   analysed band, phase wraps ("clicks") inflate ξ, so it is only read after the line test.
 * - noiseLevelShare: the share of samples whose power |z|² is at the noise level, ≤ 4N (noise
 *   alone exceeds 4N with probability e^−4 ≈ 2 %, |w|² being exponential with mean N). An on-off
 *   keyed carrier sits there for its whole off share (≈ ½ for random bits).
 * - amNoiseLevelShareMax: the most of that share AM of depth m ≤ 100 % can give at this S/N.
 *   The envelope A(1 + m·cos φ) of tone AM never reaches 0 for m < 1 and at m = 1 is below εA for
 *   a share acos(1 − ε)/π of the time (arcsine law of cos φ). A sample reads at the noise level
 *   when |s| ≤ 2√N, or up to one noise rms more when the noise pulls it down: ε = 3√N/A, with
 *   the smallest carrier the power allows, A² = S/1.5 (S = A²(1 + m²/2), m = 1). So
 *   max = acos(1 − min(2, 3·√(1.5N/S)))/π + 0.02 (the 2 % of noise-only excursions). Speech has a
 *   higher crest factor than a tone, so it dwells at its negative peaks less and stays below it.
 *
 * Records longer than 2^20 samples are analysed over their first 2^20 samples.
 */
import { noiseFloor, type WelchPsd } from "../dsp/index.js";
import { bandLimitedRecord } from "./bandLimit.js";
import { channelPower } from "./channelPower.js";
import { mainLobeHalfWidthBins } from "./detectDcSpike.js";
import { occupiedBandwidth } from "./occupiedBandwidth.js";

/** Measured features of an emission (module comment). Null where the input cannot give one. */
export interface AnalogFeatures {
  readonly snrDb: number | null;
  readonly occupiedHz: number | null;
  readonly resolutionHz: number;
  readonly lineShare: number | null;
  readonly envelopeExcessVariance: number | null;
  readonly frequencySpread: number | null;
  readonly noiseLevelShare: number | null;
  readonly amNoiseLevelShareMax: number | null;
}

/** Options of analogFeatures. */
export interface AnalogFeaturesOptions {
  /** Noise density, FS²/Hz; default noiseFloor(psd). */
  readonly noiseFloorPerHz?: number | undefined;
  /** In-channel SNR already measured, dB; computed here when absent. */
  readonly snrDb?: number | null | undefined;
  readonly lowerHz?: number | undefined;
  readonly upperHz?: number | undefined;
}

const MAX_SAMPLES = 1 << 18;

/**
 * Features of the emission in `iq` (interleaved I,Q at `sampleRateHz`) whose Welch PSD, at the
 * same rate, is `psd`. Throws RangeError when the rates differ or the array is odd.
 */
export function analogFeatures(
  iq: Float32Array | Float64Array,
  sampleRateHz: number,
  psd: WelchPsd,
  options: AnalogFeaturesOptions = {},
): AnalogFeatures {
  if (psd.sampleRateHz !== sampleRateHz) throw new RangeError(`psd rate ${psd.sampleRateHz} Hz differs from sampleRateHz ${sampleRateHz}`);
  if (iq.length % 2 !== 0) throw new RangeError(`iq has odd length ${iq.length}; it must be interleaved I,Q pairs`);
  const floor = options.noiseFloorPerHz ?? noiseFloor(psd).densityPerHz;
  const lowerHz = Math.max(options.lowerHz ?? -sampleRateHz / 2, -sampleRateHz / 2);
  const upperHz = Math.min(options.upperHz ?? sampleRateHz / 2, sampleRateHz / 2);
  const empty: AnalogFeatures = {
    snrDb: options.snrDb ?? null, occupiedHz: null, resolutionHz: psd.enbwHz,
    lineShare: null, envelopeExcessVariance: null, frequencySpread: null, noiseLevelShare: null, amNoiseLevelShareMax: null,
  };
  if (!(floor > 0)) return empty;
  const obw = occupiedBandwidth(psd, { lowerHz, upperHz, noiseFloorPerHz: floor }).occupiedHz.value;
  if (obw === null) return empty;
  const snrDb = options.snrDb !== undefined
    ? options.snrDb
    : channelPower(psd, { lowerHz, upperHz, noiseFloorPerHz: floor, occupiedHz: obw }).snrDb.value;
  const lineShare = strongestLineShare(psd, lowerHz, upperHz, floor);
  const band = bandLimited(iq, sampleRateHz, lowerHz, upperHz);
  const noisePower = floor * band.widthHz;
  const { kappa, spreadHz, noiseShare, signalPower } = envelopeAndFrequency(band.iq, sampleRateHz, noisePower, band.lowerHz, band.upperHz);
  return {
    snrDb, occupiedHz: obw, resolutionHz: psd.enbwHz, lineShare,
    envelopeExcessVariance: kappa, frequencySpread: spreadHz === null ? null : spreadHz / obw,
    noiseLevelShare: noiseShare, amNoiseLevelShareMax: signalPower === null ? null : amNoiseLevelShareMax(signalPower, noisePower),
  };
}

function strongestLineShare(psd: WelchPsd, lowerHz: number, upperHz: number, floor: number): number | null {
  const n = psd.fftLength;
  const first = Math.max(0, Math.ceil(lowerHz / psd.binWidthHz + n / 2 - 1e-9));
  const last = Math.min(n - 1, Math.floor(upperHz / psd.binWidthHz + n / 2 + 1e-9));
  const e = (i: number): number => Math.max(0, (psd.densityPerHz[i] as number) - floor);
  let total = 0;
  let peak = first;
  for (let i = first; i <= last; i++) {
    total += e(i);
    if (e(i) > e(peak)) peak = i;
  }
  if (!(total > 0)) return null;
  const h = mainLobeHalfWidthBins(psd);
  let line = 0;
  for (let i = Math.max(first, peak - h); i <= Math.min(last, peak + h); i++) line += e(i);
  return line / total;
}

/** The first MAX_SAMPLES of the record limited to [lowerHz, upperHz] (bandLimit.ts), and the kept width. */
function bandLimited(
  iq: Float32Array | Float64Array, fs: number, lowerHz: number, upperHz: number,
): { iq: Float64Array; widthHz: number; lowerHz: number; upperHz: number } {
  const n = Math.min(iq.length / 2, MAX_SAMPLES);
  const full = lowerHz <= -fs / 2 && upperHz >= fs / 2;
  const r = bandLimitedRecord(iq.subarray(0, 2 * n), fs, lowerHz, upperHz);
  return full ? { ...r, lowerHz: -fs / 2, upperHz: fs / 2 } : { ...r, lowerHz, upperHz };
}

/** The largest noise-level share of AM with depth ≤ 100 % at signal power S and noise N (module comment). */
export function amNoiseLevelShareMax(signalPower: number, noisePower: number): number {
  const eps = Math.min(2, 3 * Math.sqrt((1.5 * noisePower) / signalPower));
  return Math.acos(1 - eps) / Math.PI + 0.02;
}

interface EnvelopeAndFrequency { kappa: number | null; spreadHz: number | null; noiseShare: number | null; signalPower: number | null }

function envelopeAndFrequency(
  z: Float64Array, fs: number, noisePower: number, lowerHz: number, upperHz: number,
): EnvelopeAndFrequency {
  const n = z.length / 2;
  // Skip 5 % at each end, where the circular band-limiting rings.
  const from = Math.max(1, Math.floor(0.05 * n));
  const to = n - Math.floor(0.05 * n);
  let m1 = 0;
  let m2 = 0;
  let f1 = 0;
  let f2 = 0;
  let count = 0;
  let atNoise = 0;
  for (let k = from; k < to; k++) {
    const i = z[2 * k] as number;
    const q = z[2 * k + 1] as number;
    const p = i * i + q * q;
    if (p <= 4 * noisePower) atNoise++;
    m1 += p;
    m2 += p * p;
    const pi = z[2 * k - 2] as number;
    const pq = z[2 * k - 1] as number;
    const f = (Math.atan2(q * pi - i * pq, i * pi + q * pq) * fs) / (2 * Math.PI);
    f1 += f;
    f2 += f * f;
    count++;
  }
  if (count < 8) return { kappa: null, spreadHz: null, noiseShare: null, signalPower: null };
  m1 /= count;
  const varP = m2 / count - m1 * m1;
  const s = m1 - noisePower;
  const noiseShare = atNoise / count;
  if (!(s > 0)) return { kappa: null, spreadHz: null, noiseShare, signalPower: null };
  const kappa = (varP - 2 * s * noisePower - noisePower * noisePower) / (s * s);
  f1 /= count;
  const varF = f2 / count - f1 * f1;
  const spreadHz = Math.sqrt(Math.max(0, varF - frequencyNoiseVariance(fs, noisePower / (upperHz - lowerHz), s, lowerHz - f1, upperHz - f1)));
  return { kappa, spreadHz, noiseShare, signalPower: s };
}

/**
 * Variance (Hz²) that white noise of density n0 (over [a, b] Hz relative to the carrier) adds to
 * the first-difference frequency arg(z[n]z*[n−1])·fs/2π at high SNR: phase noise of two-sided
 * density n0/(2S) through |1 − e^(−j2πf/fs)|² = 4·sin²(πf/fs), scaled by (fs/2π)².
 */
function frequencyNoiseVariance(fs: number, n0: number, s: number, a: number, b: number): number {
  const integral = (f: number): number => 2 * (f - (fs / (2 * Math.PI)) * Math.sin((2 * Math.PI * f) / fs));
  return (fs / (2 * Math.PI)) ** 2 * (n0 / (2 * s)) * (integral(b) - integral(a));
}
