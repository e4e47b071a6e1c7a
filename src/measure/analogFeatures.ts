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
 * - audioFrequencyRmsHz: the RMS of the instantaneous frequency about its mean within the audio
 *   band |f| ≤ audioBandwidthHz of its spectrum (Hann periodogram, Parseval), with the noise's
 *   part over the same band removed (the integral of frequencyNoiseVariance below over
 *   [−audio, audio]); audioFrequencyNoiseRmsHz is that noise part. A carrier's frequency moves
 *   only by noise; FM, even speech FM silent most of the time, moves it by hundreds of Hz.
 *   Not given (null) below 10 dB S/N over the analysed band, where clicks break the noise model.
 *
 * Records longer than 2^20 samples are analysed over their first 2^20 samples.
 */
import { noiseFloor, transformInPlace, type WelchPsd } from "../dsp/index.js";
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
  /** RMS of the instantaneous frequency within the audio band, noise part removed, Hz (module comment). */
  readonly audioFrequencyRmsHz: number | null;
  /** The RMS the noise alone gives the frequency in the audio band, Hz (what audioFrequencyRmsHz had removed). */
  readonly audioFrequencyNoiseRmsHz: number | null;
}

/** Options of analogFeatures. */
export interface AnalogFeaturesOptions {
  /** Noise density, FS²/Hz; default noiseFloor(psd). */
  readonly noiseFloorPerHz?: number | undefined;
  /** In-channel SNR already measured, dB; computed here when absent. */
  readonly snrDb?: number | null | undefined;
  readonly lowerHz?: number | undefined;
  readonly upperHz?: number | undefined;
  /** Audio bandwidth for audioFrequencyRmsHz, Hz; default 3000 (speech, 47 CFR 2.202(g)). */
  readonly audioBandwidthHz?: number | undefined;
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
    audioFrequencyRmsHz: null, audioFrequencyNoiseRmsHz: null,
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
  const { kappa, spreadHz, noiseShare, signalPower, audioRmsHz, audioNoiseRmsHz } =
    envelopeAndFrequency(band.iq, sampleRateHz, noisePower, band.lowerHz, band.upperHz, options.audioBandwidthHz ?? 3000);
  return {
    snrDb, occupiedHz: obw, resolutionHz: psd.enbwHz, lineShare,
    envelopeExcessVariance: kappa, frequencySpread: spreadHz === null ? null : spreadHz / obw,
    noiseLevelShare: noiseShare, amNoiseLevelShareMax: signalPower === null ? null : amNoiseLevelShareMax(signalPower, noisePower),
    audioFrequencyRmsHz: audioRmsHz, audioFrequencyNoiseRmsHz: audioNoiseRmsHz,
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

interface EnvelopeAndFrequency {
  kappa: number | null; spreadHz: number | null; noiseShare: number | null; signalPower: number | null;
  audioRmsHz: number | null; audioNoiseRmsHz: number | null;
}

function envelopeAndFrequency(
  z: Float64Array, fs: number, noisePower: number, lowerHz: number, upperHz: number, audioHz: number,
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
  const freq = new Float64Array(Math.max(0, to - from));
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
    freq[count] = f;
    count++;
  }
  const none = { kappa: null, spreadHz: null, noiseShare: null, signalPower: null, audioRmsHz: null, audioNoiseRmsHz: null };
  if (count < 64) return none;
  m1 /= count;
  const varP = m2 / count - m1 * m1;
  const s = m1 - noisePower;
  const noiseShare = atNoise / count;
  if (!(s > 0)) return { ...none, noiseShare };
  const kappa = (varP - 2 * s * noisePower - noisePower * noisePower) / (s * s);
  f1 /= count;
  const varF = f2 / count - f1 * f1;
  const n0 = noisePower / (upperHz - lowerHz);
  const spreadHz = Math.sqrt(Math.max(0, varF - frequencyNoiseVariance(fs, n0, s, lowerHz - f1, upperHz - f1)));
  // The audio band: |f| ≤ audioHz of the frequency's spectrum; the noise's part over the same band.
  const audioNoiseVar = frequencyNoiseVariance(fs, n0, s, Math.max(lowerHz - f1, -audioHz), Math.min(upperHz - f1, audioHz));
  const audioVar = audioBandVariance(freq, f1, fs, audioHz);
  const clickFree = s >= CLICK_FREE_SNR * noisePower;
  const audioRmsHz = clickFree ? Math.sqrt(Math.max(0, audioVar - audioNoiseVar)) : null;
  return { kappa, spreadHz, noiseShare, signalPower: s, audioRmsHz, audioNoiseRmsHz: clickFree ? Math.sqrt(audioNoiseVar) : null };
}

/**
 * Below this S/N over the analysed band (10 dB) the discriminator clicks (2π phase slips, Rice's
 * FM threshold, common practice) add a flat spectrum to the frequency that the noise model does
 * not hold, and the audio-band movement is not given.
 */
const CLICK_FREE_SNR = 10;

/**
 * Variance of x (mean `mean` removed) in |f| ≤ bandHz, Hz², from a Hann-windowed periodogram
 * normalised by the window's power (Parseval); the bins within the window's main lobe of 0 Hz
 * (|k| ≤ 2) are left out with the mean. The window keeps the noise above the band, whose
 * density rises as f², from leaking into it.
 */
function audioBandVariance(x: Float64Array, mean: number, fs: number, bandHz: number): number {
  const n = x.length;
  let size = 2;
  while (size < n) size *= 2;
  const out = new Float64Array(2 * size);
  let windowPower = 0;
  for (let i = 0; i < n; i++) {
    const w = 0.5 - 0.5 * Math.cos((2 * Math.PI * (i + 0.5)) / n);
    out[2 * i] = w * ((x[i] as number) - mean);
    windowPower += w * w;
  }
  transformInPlace(out);
  const last = Math.min(size / 2 - 1, Math.floor((bandHz * size) / fs));
  let sum = 0;
  for (let k = 3; k <= last; k++) {
    for (const j of [k, size - k]) sum += (out[2 * j] as number) ** 2 + (out[2 * j + 1] as number) ** 2;
  }
  return sum / (size * windowPower);
}

/**
 * Variance (Hz²) that white noise of density n0 (over [a, b] Hz relative to the carrier) adds to
 * the first-difference frequency arg(z[n]z*[n−1])·fs/2π at high SNR: phase noise of two-sided
 * density n0/(2S) through |1 − e^(−j2πf/fs)|² = 4·sin²(πf/fs), scaled by (fs/2π)². Over a part
 * [a, b] of the frequency's own spectrum (the audio band) the same integral holds.
 */
function frequencyNoiseVariance(fs: number, n0: number, s: number, a: number, b: number): number {
  const integral = (f: number): number => 2 * (f - (fs / (2 * Math.PI)) * Math.sin((2 * Math.PI * f) / fs));
  return (fs / (2 * Math.PI)) ** 2 * (n0 / (2 * s)) * (integral(b) - integral(a));
}
