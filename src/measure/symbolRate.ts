/**
 * Blind symbol rate from the spectral line of a cyclostationary feature.
 *
 * A linearly modulated signal x(t) = Σ s_k·p(t − kT) is cyclostationary with period T; a
 * quadratic feature of it has a periodic mean and therefore discrete spectral lines at k/T.
 * For PSK/QAM with excess bandwidth the squared envelope |x|² carries a line at Rs = 1/T whose
 * strength grows with the roll-off α (its spectrum lives in |f| ≤ (1+α)Rs, and the line at Rs
 * is fed only by the band overlap of width α·Rs: a roll-off near 0 gives a weak or no line;
 * W. A. Gardner, "Exploitation of spectral redundancy in cyclostationary signals", IEEE SP
 * Magazine 8(2), 1991; the same line the Oerder & Meyr 1988 timing estimator uses).
 * Features (`feature`):
 * - "squaredEnvelope" (default, PSK/QAM): |x[n]|²;
 * - "envelope" (OOK, ASK): (|x[n+1]| − |x[n]|)², a transition detector (a random NRZ envelope
 *   itself has spectral nulls at k·Rs and no line, its squared difference does);
 * - "frequency" (FSK): (f[n+1] − f[n])², f the instantaneous frequency of the discriminator.
 *
 * Estimator: the mean is removed, the feature (at most 2^19 samples) is zero-padded to twice its
 * length and transformed (as a real sequence, through a complex transform of half the length); the largest bin with a frequency in [minBd, maxBd] is the coarse line,
 * unless a line at 1/4, 1/3 or 1/2 of its frequency also stands clear (transition features of
 * rectangular keying have equal lines at every k·Rs; the lowest is taken), then the periodogram maximum is refined by Newton steps on |X(ν)|² (Rife & Boorstyn 1974,
 * "Single-tone parameter estimation from discrete-time observations", IEEE Trans. Inf. Theory
 * IT-20(5)): ML for a line in white noise.
 * The line "stands clear" when its periodogram exceeds the mean background level b (read from
 * the bins within ±BACKGROUND_BINS, excluding ±4 around the line) by T = ln(K/p) with p = 1e-3 and
 * K the bins searched: K exponential noise bins exceed T·b with probability ≈ K·e^(−T) = p.
 * Uncertainty (k = 2): 2σ of the Cramér–Rao bound for a tone, var(f) = 6fs²/((2π)²·ρ·N(N²−1)),
 * with ρ = |X(f̂)|²/(N·b) the line-to-background ratio per sample (Rife & Boorstyn 1974); the
 * feature's background is self-noise rather than white noise, so the figure is indicative.
 */
import { transformInPlace } from "../dsp/index.js";
import { instantaneousFrequencyHz } from "./fmDiscriminator.js";
import { measurement, notAvailable, type Measurement } from "./measurement.js";
import { dtftAt, lineFrequencyCrbVariance, refinePeak } from "./periodogramPeak.js";

/** The cyclostationary feature whose line is searched. */
export type SymbolRateFeature = "squaredEnvelope" | "envelope" | "frequency";

/** Options of symbolRateBlind. */
export interface SymbolRateOptions {
  /** Lowest rate searched, Bd. Default 16 bins of the padded transform (fs·8/N). */
  readonly minBd?: number;
  /** Highest rate searched, Bd. Default fs/2 (at least 2 samples per symbol). */
  readonly maxBd?: number;
  /** A rate expected by the caller: the search is narrowed to hintBd ± 10 % (within the range). */
  readonly hintBd?: number;
  /** Default "squaredEnvelope". */
  readonly feature?: SymbolRateFeature;
}

/** Defaults of symbolRateBlind. */
export const SYMBOL_RATE_DEFAULTS = {
  feature: "squaredEnvelope", falseAlarmProbability: 1e-3, hintFraction: 0.1, maxSamples: 1 << 19,
} as const;

/** Half-width of the background window around the line, bins of the padded transform. */
const BACKGROUND_BINS = 256;

/**
 * The symbol rate of `iq` (interleaved I,Q at `sampleRateHz`), Bd, with a 2σ CRB-style
 * uncertainty (module comment). Null with a reason when no line stands clear of the feature's
 * background. Throws RangeError for a bad rate, odd-length input or an empty search range.
 */
export function symbolRateBlind(iq: Float32Array | Float64Array, sampleRateHz: number, options: SymbolRateOptions = {}): Measurement<"Bd"> {
  if (!(sampleRateHz > 0) || !Number.isFinite(sampleRateHz)) throw new RangeError(`sampleRateHz ${sampleRateHz} is not a positive finite rate`);
  if (iq.length % 2 !== 0) throw new RangeError(`iq has odd length ${iq.length}; it must be interleaved I,Q pairs`);
  const kind = options.feature ?? SYMBOL_RATE_DEFAULTS.feature;
  const method = `spectral line of the ${kind} feature, FFT peak and ML refinement (Rife-Boorstyn 1974); ±2σ CRB-style`;
  const feature = featureOf(iq, sampleRateHz, kind);
  const n = feature.length;
  if (n < 64) return notAvailable("Bd", method, `${n} feature samples are too few for a symbol-rate line`);
  let size = 2;
  while (size < 2 * n) size *= 2;
  const df = sampleRateHz / size;
  let lo = options.minBd ?? 8 * df;
  let hi = options.maxBd ?? sampleRateHz / 2;
  if (options.hintBd !== undefined) {
    if (!(options.hintBd > 0)) throw new RangeError(`hintBd ${options.hintBd} is not a positive rate`);
    lo = Math.max(lo, options.hintBd * (1 - SYMBOL_RATE_DEFAULTS.hintFraction));
    hi = Math.min(hi, options.hintBd * (1 + SYMBOL_RATE_DEFAULTS.hintFraction));
  }
  if (!(lo > 0) || !(hi > lo) || hi > sampleRateHz / 2) throw new RangeError(`symbol-rate range ${lo}..${hi} Bd is empty or not within (0, fs/2]`);
  const spectrum = paddedRealPower(feature, size);
  const power = (k: number): number => spectrum[k] as number;
  const kLo = Math.max(1, Math.ceil(lo / df));
  const kHi = Math.min(size / 2, Math.floor(hi / df));
  if (kHi < kLo) throw new RangeError(`symbol-rate range ${lo}..${hi} Bd holds no bin of width ${df} Hz`);
  let kPeak = kLo;
  for (let k = kLo; k <= kHi; k++) if (power(k) > power(kPeak)) kPeak = k;
  const backgroundAt = (centre: number): number => {
    let sum = 0;
    let count = 0;
    for (let k = Math.max(1, centre - BACKGROUND_BINS); k <= Math.min(size / 2, centre + BACKGROUND_BINS); k++) {
      if (Math.abs(k - centre) <= 4) continue;
      sum += power(k);
      count++;
    }
    return sum / Math.max(1, count);
  };
  const searched = kHi - kLo + 1;
  const threshold = Math.log(searched / SYMBOL_RATE_DEFAULTS.falseAlarmProbability);
  // Rectangular keying makes a transition feature an impulse train with lines of equal height
  // at every k·Rs: prefer the lowest sub-multiple (1/4, 1/3, 1/2) whose line also stands clear
  // of its own background (a feature whose continuous spectrum falls with frequency, smooth
  // transitions, would otherwise pass a sub-multiple measured against the background at Rs).
  for (const div of [4, 3, 2]) {
    const centre = Math.round(kPeak / div);
    if (centre < kLo) continue;
    let kSub = centre;
    for (let k = centre - 2; k <= centre + 2; k++) if (power(k) > power(kSub)) kSub = k;
    if (power(kSub) / backgroundAt(kSub) > threshold) { kPeak = kSub; break; }
  }
  const background = backgroundAt(kPeak);
  const ratio = power(kPeak) / background;
  if (!(ratio > threshold)) {
    return notAvailable("Bd", method, `no line stands clear of the ${kind} background in ${lo.toFixed(1)}..${hi.toFixed(1)} Bd (peak ${ratio.toFixed(1)}× the background, needs ${threshold.toFixed(1)}×); a roll-off near 0 gives a weak line`);
  }
  const nu = refinePeak(feature, kPeak / size, 6, "real");
  const [xr, xi] = dtftAt(feature, nu, "real");
  const rho = (xr * xr + xi * xi) / (n * background);
  const crbVar = lineFrequencyCrbVariance(rho, n) * sampleRateHz * sampleRateHz;
  const warnings: string[] = [];
  const rate = nu * sampleRateHz;
  if (rate < 4 * sampleRateHz / n) warnings.push(`the record holds only ${(rate * n / sampleRateHz).toFixed(1)} symbols`);
  return measurement(rate, "Bd", 2 * Math.sqrt(crbVar), `${method}, ${n} samples, line ${(10 * Math.log10(ratio)).toFixed(1)} dB over background`, warnings);
}

/**
 * |X[k]|², k = 0 … size/2, of the size-point DFT of the real `x` zero-padded to `size` (a power
 * of two ≥ 4), from one complex transform of size/2 points: z[m] = x[2m] + j·x[2m+1] gives the
 * transforms of the even and odd samples, E[k] = (Z[k] + Z*[M−k])/2 and
 * O[k] = (Z[k] − Z*[M−k])/(2j), M = size/2, and X[k] = E[k] + e^(−j2πk/size)·O[k] (the standard
 * real-input packing, e.g. Oppenheim & Schafer, Discrete-Time Signal Processing, 3rd ed.,
 * problem 9.41; from memory). The M points are transformed in place: 8 bytes a point of the
 * padded length (8 MiB for 2^20), and |X|² (4 MiB).
 */
function paddedRealPower(x: Float64Array, size: number): Float64Array {
  const m = size >> 1;
  const out = new Float64Array(2 * m);
  out.set(x);
  transformInPlace(out);
  const power = new Float64Array(m + 1);
  for (let k = 0; k <= m; k++) {
    const a = 2 * (k % m);
    const b = 2 * ((m - k) % m);
    const ar = out[a] as number;
    const ai = out[a + 1] as number;
    const br = out[b] as number;
    const bi = -(out[b + 1] as number);
    const er = (ar + br) / 2;
    const ei = (ai + bi) / 2;
    const or = (ai - bi) / 2;
    const oi = -(ar - br) / 2;
    const c = Math.cos((2 * Math.PI * k) / size);
    const sn = -Math.sin((2 * Math.PI * k) / size);
    const xr = er + c * or - sn * oi;
    const xi = ei + c * oi + sn * or;
    power[k] = xr * xr + xi * xi;
  }
  return power;
}

/** The chosen feature, mean removed, as a Float64Array of at most maxSamples values. */
function featureOf(iq: Float32Array | Float64Array, fs: number, kind: SymbolRateFeature): Float64Array {
  const n = Math.min(iq.length >> 1, SYMBOL_RATE_DEFAULTS.maxSamples + 1);
  let f: Float64Array;
  if (kind === "squaredEnvelope") {
    f = new Float64Array(n);
    for (let k = 0; k < n; k++) f[k] = (iq[2 * k] as number) ** 2 + (iq[2 * k + 1] as number) ** 2;
  } else {
    let base: ArrayLike<number>;
    if (kind === "envelope") {
      const e = new Float64Array(n);
      for (let k = 0; k < n; k++) e[k] = Math.hypot(iq[2 * k] as number, iq[2 * k + 1] as number);
      base = e;
    } else {
      base = instantaneousFrequencyHz(Float32Array.from(iq.subarray(0, 2 * n)), fs);
    }
    f = new Float64Array(Math.max(0, base.length - 1));
    for (let k = 0; k < f.length; k++) f[k] = ((base[k + 1] as number) - (base[k] as number)) ** 2;
  }
  const m = f.length > SYMBOL_RATE_DEFAULTS.maxSamples ? f.subarray(0, SYMBOL_RATE_DEFAULTS.maxSamples) : f;
  let mean = 0;
  for (let k = 0; k < m.length; k++) mean += m[k] as number;
  mean /= Math.max(1, m.length);
  for (let k = 0; k < m.length; k++) m[k] = (m[k] as number) - mean;
  return m;
}
