/**
 * Features for telling keyed and linearly modulated digital emissions apart (OOK, FSK, PSK,
 * QAM), from the channel baseband and its PSD. classifyEmission.ts turns them into a class.
 *
 * - OOK: the envelope |x|, smoothed over a quarter symbol (rate from the transition line of the
 *   envelope, symbolRate.ts), split at the Otsu threshold (N. Otsu, "A threshold selection
 *   method from gray-level histograms", IEEE Trans. SMC 9(1), 1979). `midFraction` is the share of
 *   time the smoothed envelope spends in the middle half between the two level means: keyed
 *   levels dwell at the ends (only the transitions cross), a sinusoidal envelope (tone AM) spends
 *   1/3 of the time there (arcsine law). Keying crosses it only in its transitions: with random
 *   bits (a transition every second symbol) and the quarter-symbol smoother, rectangular keying
 *   spends 1/16 of the time there (half of a T/4 ramp per two symbols) and raised-cosine edges over
 *   a share r of a symbol add about r/6 (a third of each edge lies in the middle half), so ≤ 0.15
 *   for edges up to half a symbol. `offOverNoiseDb`: the off level (offLevel: the noise-equivalent
 *   median of the samples dwelling in the lower quarter between the levels) over the noise power
 *   in the band.
 * - FSK: the instantaneous frequency of the record band-limited to 1.2 × its 99 % band, averaged
 *   over each symbol (rate from the frequency-transition line), at the timing phase of 8 that
 *   maximises the variance of the averages (integrate-and-dump of rectangular FSK); clustered
 *   into 2 and 4 levels (levelClusters.ts): `separation` is min gap / pooled σ.
 * - PSK/QAM: rate from the squared-envelope line searched in [OBW/1.7, OBW] (RRC signalling,
 *   REFERENCES.md §3); symbol-instant samples (symbolSampling.ts: matched filter, square-law timing,
 *   power-law carrier) and their normalised cumulants (cumulants.ts) with the noise removed.
 */
import { noiseFloor, type WelchPsd } from "../dsp/index.js";
import { bandLimit } from "./bandLimit.js";
import { complexAbs, normalisedCumulants, type NormalisedCumulants } from "./cumulants.js";
import { instantaneousFrequencyHz } from "./fmDiscriminator.js";
import { levelClusters, type LevelClusters } from "./levelClusters.js";
import { occupiedBandwidth } from "./occupiedBandwidth.js";
import type { Measurement } from "./measurement.js";
import { symbolRateBlind, type SymbolRateFeature } from "./symbolRate.js";
import { symbolSamples } from "./symbolSampling.js";

/** Envelope (OOK) evidence. */
export interface EnvelopeKeying {
  readonly symbolRateBd: number;
  readonly onPower: number;
  readonly offPower: number;
  readonly midFraction: number;
  readonly offOverNoiseDb: number;
  readonly dutyFraction: number;
}

/** Frequency (FSK) evidence. */
export interface FrequencyKeying {
  readonly symbolRateBd: number;
  /** Per-symbol mean frequencies, Hz (at most 2^15). */
  readonly symbolFrequenciesHz: Float64Array;
  /** Share of adjacent symbols in the same of the 2 clusters (0 for a strict alternation). */
  readonly repeatFraction: number;
  readonly two: LevelClusters;
  readonly four: LevelClusters;
}

/** Linear-modulation (PSK/QAM) evidence. */
export interface LinearKeying {
  readonly symbolRateBd: number;
  readonly powerLaw: 2 | 4 | 8 | null;
  readonly cumulants: NormalisedCumulants;
  /** |C20|/C21, |C40|/C21², C42/C21² (Swami & Sadler 2000). */
  readonly c20Abs: number;
  readonly c40Abs: number;
  readonly c42: number;
  readonly symbolCount: number;
}

/** All digital features; a group is null when its symbol-rate line was not found. */
export interface DigitalFeatures {
  readonly occupiedHz: number | null;
  /**
   * Excess power-envelope variance κ = (var|z|² − 2SN − N²)/S², N = floor·fs (as in
   * analogFeatures.ts): 0 for a constant envelope (FSK), 1 for Gaussian-like signals.
   */
  readonly envelopeKappa: number | null;
  readonly noiseFloorPerHz: number;
  readonly envelope: EnvelopeKeying | null;
  readonly frequency: FrequencyKeying | null;
  readonly linear: LinearKeying | null;
}

/** Options of digitalFeatures. */
export interface DigitalFeaturesOptions {
  /** Noise density, FS²/Hz; default noiseFloor(psd). */
  readonly noiseFloorPerHz?: number;
}

/** Digital features of the one emission in `iq` (rate `sampleRateHz`, Welch PSD `psd`). */
export function digitalFeatures(
  iq: Float32Array | Float64Array, sampleRateHz: number, psd: WelchPsd, options: DigitalFeaturesOptions = {},
): DigitalFeatures {
  if (psd.sampleRateHz !== sampleRateHz) throw new RangeError(`psd rate ${psd.sampleRateHz} Hz differs from sampleRateHz ${sampleRateHz}`);
  if (iq.length % 2 !== 0) throw new RangeError(`iq has odd length ${iq.length}; it must be interleaved I,Q pairs`);
  const fs = sampleRateHz;
  const floor = options.noiseFloorPerHz ?? noiseFloor(psd).densityPerHz;
  const obw = occupiedBandwidth(psd, { lowerHz: -fs / 2, upperHz: fs / 2, noiseFloorPerHz: floor });
  const occupiedHz = obw.occupiedHz.value;
  const kappa = envelopeKappa(iq, floor * fs);
  const none: DigitalFeatures = { occupiedHz, envelopeKappa: kappa, noiseFloorPerHz: floor, envelope: null, frequency: null, linear: null };
  if (occupiedHz === null || !(floor > 0) || iq.length < 512) return none;
  const lower = obw.lowerEdgeHz.value ?? -fs / 2;
  const upper = obw.upperEdgeHz.value ?? fs / 2;
  return {
    occupiedHz, envelopeKappa: kappa, noiseFloorPerHz: floor,
    envelope: envelopeKeying(iq, fs, floor),
    frequency: frequencyKeying(iq, fs, lower, upper),
    linear: linearKeying(iq, fs, occupiedHz, floor),
  };
}

function rateOf(
  iq: Float32Array | Float64Array, fs: number, feature: SymbolRateFeature, minBd = fs / 1000, maxBd = fs / 2,
): number | null {
  // A range made empty by a wide occupied bandwidth in a narrow channel holds no rate to find.
  if (!(maxBd > minBd)) return null;
  return fundamentalRate(iq, fs, feature, minBd, maxBd).value;
}

/**
 * symbolRateBlind, then the fundamental: a transition feature of rectangular keying is an
 * impulse train on the symbol grid, with lines of similar strength at every k·Rs, so the largest
 * may be a harmonic. The lowest R/k (k = 3, 2) at which a line also stands clear (searched within
 * ±10 % of R/k) is taken; on the true grid there is no line below Rs.
 */
export function fundamentalRate(
  iq: Float32Array | Float64Array, fs: number, feature: SymbolRateFeature, minBd: number, maxBd: number,
): Measurement<"Bd"> {
  const first = symbolRateBlind(iq, fs, { feature, minBd, maxBd });
  const r = first.value;
  if (r === null || feature === "squaredEnvelope") return first;
  for (const k of [3, 2]) {
    if (r / k < Math.max(minBd, 1.2 * fs / (iq.length >> 1))) continue;
    const sub = symbolRateBlind(iq, fs, { feature, minBd, maxBd, hintBd: r / k });
    if (sub.value !== null && Math.abs(sub.value * k / r - 1) < 0.01) return sub;
  }
  return first;
}

/** Moving average of x over `length` samples, centred (edges use what is there). */
export function movingAverage(x: ArrayLike<number>, length: number): Float64Array {
  return movingAverageInto(x, length, new Float64Array(x.length));
}

/**
 * movingAverage written over x itself (the same sums in the same order: the values that leave
 * the window are kept in a ring of h + 1 as they are overwritten), for a caller that no longer
 * needs x. Returns x.
 */
export function movingAverageInPlace(x: Float64Array, length: number): Float64Array {
  return movingAverageInto(x, length, x);
}

function movingAverageInto(x: ArrayLike<number>, length: number, out: Float64Array): Float64Array {
  const n = x.length;
  const h = Math.max(0, Math.floor(length / 2));
  // x[j] leaves the window at step j + h + 1; out[j] is written at step j, so when out is x the
  // leaving value is read from the ring, where it was put before x[j] was overwritten.
  const ring = new Float64Array(h + 1);
  let sum = 0;
  let lo = 0;
  let hi = -1;
  for (let i = 0; i < n; i++) {
    const a = Math.max(0, i - h);
    const b = Math.min(n - 1, i + h);
    while (hi < b) sum += x[++hi] as number;
    while (lo < a) { sum -= ring[lo % (h + 1)] as number; lo++; }
    ring[i % (h + 1)] = x[i] as number;
    out[i] = sum / (b - a + 1);
  }
  return out;
}

/**
 * Otsu threshold of `x` on a 256-bin histogram, moved to the emptiest bin between the two class
 * means (the histogram valley), and the class statistics of `power` split by it.
 */
export function envelopeSplit(envelope: Float64Array): { threshold: number; lowMean: number; highMean: number } {
  let min = Infinity;
  let max = -Infinity;
  for (const v of envelope) { if (v < min) min = v; if (v > max) max = v; }
  const bins = 256;
  const hist = new Float64Array(bins);
  const w = (max - min) / bins || 1;
  for (const v of envelope) hist[Math.min(bins - 1, Math.floor((v - min) / w))]! += 1;
  const total = envelope.length;
  let sumAll = 0;
  for (let i = 0; i < bins; i++) sumAll += i * (hist[i] as number);
  let wB = 0, sumB = 0, best = -1, at = 0;
  for (let i = 0; i < bins - 1; i++) {
    wB += hist[i] as number;
    sumB += i * (hist[i] as number);
    const wF = total - wB;
    if (wB === 0 || wF === 0) continue;
    const between = wB * wF * (sumB / wB - (sumAll - sumB) / wF) ** 2;
    if (between > best) { best = between; at = i; }
  }
  let wl = 0, sl = 0;
  for (let i = 0; i <= at; i++) { wl += hist[i] as number; sl += i * (hist[i] as number); }
  const lowBin = wl > 0 ? sl / wl : 0;
  const highBin = total - wl > 0 ? (sumAll - sl) / (total - wl) : bins - 1;
  // The valley: the emptiest bin (histogram smoothed over 9 bins) in the middle third between
  // the class means; where the valley is flat (within 10 %), the bin nearest the midpoint.
  const sm = movingAverage(hist, 9);
  const midBin = (lowBin + highBin) / 2;
  const span = (highBin - lowBin) / 6;
  let valley = Math.round(midBin);
  for (let i = Math.ceil(midBin - span); i <= Math.floor(midBin + span); i++) {
    const better = (sm[i] as number) < 0.9 * (sm[valley] as number);
    const tie = !better && (sm[i] as number) <= (sm[valley] as number) / 0.9 && Math.abs(i - midBin) < Math.abs(valley - midBin);
    if (better || tie) valley = i;
  }
  const threshold = min + (valley + 0.5) * w;
  return { threshold, lowMean: min + (lowBin + 0.5) * w, highMean: min + (highBin + 0.5) * w };
}

function envelopeKeying(iq: Float32Array | Float64Array, fs: number, floor: number): EnvelopeKeying | null {
  const rate = rateOf(iq, fs, "envelope");
  if (rate === null) return null;
  const n = iq.length >> 1;
  const mag = new Float64Array(n);
  const pow = new Float64Array(n);
  for (let k = 0; k < n; k++) {
    pow[k] = (iq[2 * k] as number) ** 2 + (iq[2 * k + 1] as number) ** 2;
    mag[k] = Math.sqrt(pow[k] as number);
  }
  const smooth = movingAverage(mag, Math.max(1, Math.round(fs / rate / 4)));
  const split = envelopeSplit(smooth);
  let on = 0, onCount = 0, mid = 0;
  const gap = split.highMean - split.lowMean;
  const offDwell: number[] = [];
  for (let k = 0; k < n; k++) {
    const v = smooth[k] as number;
    if (v > split.threshold) { on += pow[k] as number; onCount++; }
    if (v <= split.lowMean + 0.25 * gap) offDwell.push(pow[k] as number);
    else if (v < split.highMean - 0.25 * gap) mid++;
  }
  const onPower = onCount > 0 ? on / onCount : 0;
  const offPower = offLevel(offDwell);
  return {
    symbolRateBd: rate, onPower, offPower, midFraction: mid / n,
    offOverNoiseDb: 10 * Math.log10(Math.max(offPower, 1e-30) / (floor * fs)), dutyFraction: onCount / n,
  };
}

/**
 * The off level of a keyed envelope: the median power of the samples dwelling in the lower
 * quarter between the levels, over ln 2. For noise alone |w|² is exponential and its median is
 * N·ln 2, so this is N; the median ignores the tails of soft keying edges (samples of a
 * transition below a quarter of the gap, a minority of the dwell), which a mean would count.
 * A carrier leaking through the off state (|c|² ≫ N) reads 1.6 dB high, on the safe side of the
 * off-level rule.
 */
function offLevel(powers: number[]): number {
  if (powers.length === 0) return 0;
  powers.sort((a, b) => a - b);
  const m = powers.length >> 1;
  const median = powers.length % 2 === 1 ? (powers[m] as number) : ((powers[m - 1] as number) + (powers[m] as number)) / 2;
  return median / Math.LN2;
}

/** Per-symbol mean instantaneous frequency at the best of 8 timing phases. */
export function symbolFrequencies(freq: Float32Array, fs: number, rateBd: number): Float64Array {
  const sps = fs / rateBd;
  let best = new Float64Array(0);
  let bestVar = -1;
  for (let c = 0; c < 8; c++) {
    const t0 = (c / 8) * sps;
    const count = Math.floor((freq.length - t0) / sps) - 1;
    if (count < 4) continue;
    const v = new Float64Array(count);
    let m1 = 0, m2 = 0;
    for (let k = 0; k < count; k++) {
      const a = Math.round(t0 + k * sps);
      const b = Math.round(t0 + (k + 1) * sps);
      let s = 0;
      for (let i = a; i < b; i++) s += freq[i] as number;
      v[k] = s / Math.max(1, b - a);
      m1 += v[k] as number;
      m2 += (v[k] as number) ** 2;
    }
    const variance = m2 / count - (m1 / count) ** 2;
    if (variance > bestVar) { bestVar = variance; best = v; }
  }
  return best;
}

function frequencyKeying(iq: Float32Array | Float64Array, fs: number, lowerHz: number, upperHz: number): FrequencyKeying | null {
  const centre = (lowerHz + upperHz) / 2;
  const half = 0.6 * (upperHz - lowerHz);
  const band = bandLimit(iq, fs, centre - half, centre + half);
  const rate = rateOf(band, fs, "frequency");
  if (rate === null || fs / rate < 2) return null;
  const v = symbolFrequencies(instantaneousFrequencyHz(band, fs), fs, rate);
  if (v.length < 16) return null;
  const two = levelClusters(v, 2);
  const mid = two.centres.length === 2 ? ((two.centres[0] as number) + (two.centres[1] as number)) / 2 : 0;
  let repeats = 0;
  for (let k = 1; k < v.length; k++) if (((v[k] as number) > mid) === ((v[k - 1] as number) > mid)) repeats++;
  return { symbolRateBd: rate, symbolFrequenciesHz: v, repeatFraction: repeats / (v.length - 1), two, four: levelClusters(v, 4) };
}

function linearKeying(iq: Float32Array | Float64Array, fs: number, occupiedHz: number, floor: number): LinearKeying | null {
  // RRC signalling has OBW99 between 1.07·Rs (α = 0.2) and 1.63·Rs (α = 1) (REFERENCES.md §3):
  // search Rs in [OBW/1.7, OBW/1.0], away from the strong low-frequency self-noise of |x|².
  const rate = rateOf(iq, fs, "squaredEnvelope", occupiedHz / 1.7, Math.min(fs / 2, occupiedHz));
  if (rate === null || fs / rate < 1.5) return null;
  const s = symbolSamples(iq, fs, rate, occupiedHz, floor);
  if ((s.symbols.length >> 1) < 64) return null;
  const c = normalisedCumulants(s.symbols, { noisePower: s.noisePower });
  return {
    symbolRateBd: rate, powerLaw: s.powerLaw, cumulants: c,
    c20Abs: complexAbs(c.c20), c40Abs: complexAbs(c.c40), c42: c.c42, symbolCount: c.sampleCount,
  };
}

function envelopeKappa(iq: Float32Array | Float64Array, noisePower: number): number | null {
  const n = iq.length >> 1;
  let m1 = 0;
  let m2 = 0;
  for (let k = 0; k < n; k++) {
    const p = (iq[2 * k] as number) ** 2 + (iq[2 * k + 1] as number) ** 2;
    m1 += p;
    m2 += p * p;
  }
  m1 /= n;
  const s = m1 - noisePower;
  if (!(s > 0)) return null;
  return (m2 / n - m1 * m1 - 2 * s * noisePower - noisePower * noisePower) / (s * s);
}
