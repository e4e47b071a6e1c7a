/**
 * Noise floor of a Welch PSD: a low percentile of its bins, corrected for the spread of the
 * averaged periodogram so that it estimates the mean noise density.
 *
 * For Gaussian noise of density S, a Welch bin is distributed as S·χ²_ν/ν with the equivalent
 * degrees of freedom of overlapped segments (Welch 1967; Percival & Walden 1993, "Spectral
 * Analysis for Physical Applications", eq. 292b, number from memory):
 *   ν = 2M / (1 + 2·Σ_{m=1}^{M−1} (1 − m/M)·ρ(m)²),  ρ(m) = Σ_n w[n]·w[n + mH] / Σ_n w[n]²
 * (2 degrees of freedom per complex segment; Hann at 50 % overlap has ρ(1) = 1/6, Harris 1978
 * Table 1 "overlap correlation" 16.7 %). The p-quantile of χ²_ν/ν is taken from Wilson & Hilferty
 * (1931): q_p ≈ (1 − 2/(9ν) + z_p·√(2/(9ν)))³, z_p the standard normal quantile (Abramowitz &
 * Stegun 26.2.23, |error| < 4.5e-4). The floor is S = (p-th percentile of the bins) / q_p.
 *
 * Why a low percentile: emissions only raise bins, so with a fraction f of the band occupied the
 * p-th percentile of all bins is the p/(1 − f) quantile of the noise bins; for p = 0.2 it stays a
 * noise bin while f < 80 %, and the bias is (q_{p/(1−f)} − q_p)/q_p, small when ν is large. A DC
 * spike or notch is kept out by dropping the bins within `dcExclusionBins` of 0 Hz.
 * Limits: a receiver's anti-alias roll-off at the band edges lowers the lowest bins and so the
 * figure; coloured noise gives the level of its quieter part.
 */
import { powerToDb } from "./db.js";
import type { WelchPsd } from "./welch.js";
import { windowCoefficients } from "./windows.js";

/** Options of noiseFloor, with NOISE_FLOOR_DEFAULTS. */
export interface NoiseFloorOptions {
  /** The percentile p of the bins, 0 < p < 1. */
  readonly percentile?: number;
  /** Bins on each side of DC left out (the DC bin itself always is). */
  readonly dcExclusionBins?: number;
}

/** Defaults of noiseFloor: the 20th percentile, DC ± 2 bins left out. */
export const NOISE_FLOOR_DEFAULTS: Required<NoiseFloorOptions> = { percentile: 0.2, dcExclusionBins: 2 };

/** A noise floor: density in FS²/Hz and in dBFS/Hz, and a one-line method note. */
export interface NoiseFloor {
  readonly densityPerHz: number;
  readonly dbfsPerHz: number;
  readonly method: string;
}

/** The noise density of `psd` (module comment). Throws RangeError for options out of bounds. */
export function noiseFloor(psd: WelchPsd, options: NoiseFloorOptions = {}): NoiseFloor {
  const p = options.percentile ?? NOISE_FLOOR_DEFAULTS.percentile;
  const exclusion = options.dcExclusionBins ?? NOISE_FLOOR_DEFAULTS.dcExclusionBins;
  if (!(p > 0 && p < 1)) throw new RangeError(`percentile ${p} is outside (0, 1)`);
  const n = psd.fftLength;
  if (!Number.isInteger(exclusion) || exclusion < 0 || 2 * exclusion + 1 >= n) {
    throw new RangeError(`dcExclusionBins ${exclusion} is not an integer in [0, ${Math.ceil(n / 2) - 1})`);
  }
  const dc = n / 2;
  const kept = new Float64Array(n - (2 * exclusion + 1));
  let j = 0;
  for (let i = 0; i < n; i++) {
    if (Math.abs(i - dc) > exclusion) kept[j++] = psd.densityPerHz[i] as number;
  }
  kept.sort();
  const level = interpolatedQuantile(kept, p);
  const nu = equivalentDegreesOfFreedom(psd);
  const bias = nu > 0 ? chiSquareQuantileOverNu(nu, p) : 1;
  const densityPerHz = level / bias;
  return {
    densityPerHz,
    dbfsPerHz: powerToDb(densityPerHz),
    method: `${Math.round(100 * p)}th percentile of ${kept.length} PSD bins (DC ±${exclusion} left out) `
      + `over chi-square(${nu.toFixed(1)} dof)/dof quantile ${bias.toFixed(4)} (Wilson-Hilferty)`,
  };
}

/**
 * Equivalent degrees of freedom ν of the Welch mean (Percival & Walden 1993, eq. 292b, see the
 * module comment): 2M for non-overlapping segments, less with overlap. 0 when M = 0.
 */
export function equivalentDegreesOfFreedom(psd: WelchPsd): number {
  const m = psd.segmentCount;
  if (m === 0) return 0;
  const w = windowCoefficients(psd.window, psd.fftLength);
  const hop = psd.fftLength - psd.overlapLength;
  let energy = 0;
  for (let i = 0; i < w.length; i++) energy += (w[i] as number) * (w[i] as number);
  let sum = 0;
  for (let lag = 1; lag < m && lag * hop < w.length; lag++) {
    let c = 0;
    for (let i = 0; i + lag * hop < w.length; i++) c += (w[i] as number) * (w[i + lag * hop] as number);
    const rho = c / energy;
    sum += (1 - lag / m) * rho * rho;
  }
  return (2 * m) / (1 + 2 * sum);
}

/** p-quantile of χ²_ν/ν by Wilson & Hilferty (1931), clamped at 0. */
export function chiSquareQuantileOverNu(nu: number, p: number): number {
  const v = 2 / (9 * nu);
  const c = 1 - v + standardNormalQuantile(p) * Math.sqrt(v);
  return c > 0 ? c * c * c : 0;
}

/** Standard normal quantile z_p, 0 < p < 1 (Abramowitz & Stegun 26.2.23, |error| < 4.5e-4). */
export function standardNormalQuantile(p: number): number {
  const lower = p < 0.5;
  const t = Math.sqrt(-2 * Math.log(lower ? p : 1 - p));
  const z = t - (2.515517 + 0.802853 * t + 0.010328 * t * t) / (1 + 1.432788 * t + 0.189269 * t * t + 0.001308 * t * t * t);
  return lower ? -z : z;
}

/** Linear-interpolated p-quantile of sorted values (Hyndman & Fan 1996, type 7). */
function interpolatedQuantile(sorted: Float64Array, p: number): number {
  const h = (sorted.length - 1) * p;
  const lo = Math.floor(h);
  const hi = Math.min(lo + 1, sorted.length - 1);
  return (sorted[lo] as number) + (h - lo) * ((sorted[hi] as number) - (sorted[lo] as number));
}
