/**
 * The detection threshold for spectrogram cells, from the law of averaged periodograms.
 *
 * A cell of a spectrogram row is the mean of K density-scaled periodograms of frames that do not
 * overlap (src/dsp/spectrogram.ts). For complex white Gaussian noise of density S, each
 * periodogram bin of a windowed frame is S·E with E exponential of mean 1 (|X|² of a circular
 * complex Gaussian), and frames that do not overlap are independent, so the cell is
 *   X = S·G/K,  G ~ Gamma(K, 1),  i.e.  2K·X/S ~ χ²_{2K}
 * (Percival & Walden 1993, "Spectral Analysis for Physical Applications", §6.6, chi-square law of
 * the periodogram; from memory). For an even number ν = 2K of degrees of freedom the tail is a
 * finite sum (Abramowitz & Stegun 26.4.21, equation number from memory):
 *   Q(χ² | ν) = e^(−χ²/2) · Σ_{j=0}^{K−1} (χ²/2)^j / j!,
 * so P(X > t·S) = e^(−Kt) · Σ_{j<K} (Kt)^j / j!, and the threshold factor t for a false-alarm
 * probability p per cell solves that equation (bisection on log t).
 *
 * The floor S is not known but estimated, Ŝ = S·(1 + ε). With ε ~ N(b, σ²) (b the estimate's bias,
 * σ its relative standard error, both from noiseFloorPerBin) the false-alarm probability of the
 * rule X > t·Ŝ is the average E_ε[P(G > K·t·(1 + ε))]; t is chosen so that this average, not the
 * known-floor tail, equals p. The average is a sum over ε = b + σ·z, z = −6 … 6 in steps of 0.05,
 * weighted by the normal density (the rest of the normal mass, 2e-9, is left out).
 * Overlapping frames would need the equivalent degrees of freedom of src/dsp/noiseFloor.ts
 * instead of 2K; the spectrogram's frames never overlap.
 */

/** log of P(G > x), G ~ Gamma(k, 1), k a positive integer: the A&S 26.4.21 sum, in log space. */
export function logGammaTail(k: number, x: number): number {
  if (!Number.isInteger(k) || k < 1) throw new RangeError(`k ${k} is not a positive integer`);
  if (!(x > 0)) return 0;
  // Terms x^j/j! grow then fall; sum them scaled by the largest to stay finite.
  const logTerms = new Float64Array(k);
  let lt = 0;
  let top = 0;
  for (let j = 0; j < k; j++) {
    if (j > 0) lt += Math.log(x / j);
    logTerms[j] = lt;
    if (lt > top) top = lt;
  }
  let sum = 0;
  for (let j = 0; j < k; j++) sum += Math.exp((logTerms[j] as number) - top);
  return Math.min(0, -x + top + Math.log(sum));
}

/** P(X > t·S) for a row mean of K noise periodograms with the floor known: e^(−Kt)·Σ_{j<K}(Kt)^j/j!. */
export function rowMeanTail(frames: number, factor: number): number {
  return Math.exp(logGammaTail(frames, frames * factor));
}

/** The floor estimate's error, relative: Ŝ = S·(1 + ε), ε ~ N(biasRel, sdRel²). */
export interface FloorError {
  readonly biasRel: number;
  readonly sdRel: number;
}

const Z_STEP = 0.05;
const Z_MAX = 6;

/** The false-alarm probability of X > t·Ŝ, averaged over the floor's error (module comment). */
export function falseAlarmProbability(frames: number, factor: number, error: FloorError): number {
  if (error.sdRel === 0) return rowMeanTail(frames, factor * Math.max(1e-12, 1 + error.biasRel));
  let sum = 0;
  let weights = 0;
  for (let z = -Z_MAX; z <= Z_MAX + 1e-9; z += Z_STEP) {
    const w = Math.exp(-0.5 * z * z);
    const scale = Math.max(1e-12, 1 + error.biasRel + error.sdRel * z);
    sum += w * rowMeanTail(frames, factor * scale);
    weights += w;
  }
  return sum / weights;
}

/**
 * The factor t over the estimated floor at which a row mean of `frames` noise periodograms
 * exceeds t·Ŝ with probability `pfa`, the floor's error included (module comment).
 * Throws RangeError for pfa outside (0, 1) or frames not a positive integer.
 */
export function rowThresholdFactor(frames: number, pfa: number, error: FloorError = { biasRel: 0, sdRel: 0 }): number {
  if (!(pfa > 0 && pfa < 1)) throw new RangeError(`pfa ${pfa} is outside (0, 1)`);
  if (!Number.isInteger(frames) || frames < 1) throw new RangeError(`frames ${frames} is not a positive integer`);
  let lo = Math.log(1e-6);
  let hi = Math.log(1e4);
  for (let i = 0; i < 200 && hi - lo > 1e-12; i++) {
    const mid = 0.5 * (lo + hi);
    if (falseAlarmProbability(frames, Math.exp(mid), error) > pfa) lo = mid;
    else hi = mid;
  }
  return Math.exp(hi);
}

/** The p-quantile of G/K, G ~ Gamma(K, 1) (the law of a row mean over S), by bisection on the tail. */
export function rowMeanQuantile(frames: number, p: number): number {
  if (!(p > 0 && p < 1)) throw new RangeError(`p ${p} is outside (0, 1)`);
  let lo = 0;
  let hi = 1;
  while (rowMeanTail(frames, hi) > 1 - p) hi *= 2;
  for (let i = 0; i < 200 && hi - lo > 1e-14 * hi; i++) {
    const mid = 0.5 * (lo + hi);
    if (rowMeanTail(frames, mid) > 1 - p) lo = mid;
    else hi = mid;
  }
  return 0.5 * (lo + hi);
}

/** The density of G/K at y, G ~ Gamma(K, 1): K·(Ky)^(K−1)·e^(−Ky)/(K−1)!. */
export function rowMeanDensity(frames: number, y: number): number {
  if (!(y > 0)) return 0;
  let logFact = 0;
  for (let j = 2; j < frames; j++) logFact += Math.log(j);
  return Math.exp(Math.log(frames) + (frames - 1) * Math.log(frames * y) - frames * y - logFact);
}
