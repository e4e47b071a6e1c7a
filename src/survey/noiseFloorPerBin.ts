/**
 * The noise floor of every frequency bin of a spectrogram, robust to emissions, to a sloped or
 * gently rippled floor, and with the error of the estimate stated so the threshold can allow for it.
 *
 * 1. Across time: T_b = median over the rows of the row means in bin b, over m_K, the median of
 *    G/K (G ~ Gamma(K, 1), K frames a row; rowThreshold.ts). An emission present in bin b for less
 *    than half the rows does not move it.
 * 2. Across neighbouring bins: U_b = median of T over b − h … b + h (clamped at the band edges). A
 *    median over a window is unbiased for a floor that is linear in the window (a slope).
 * 3. A morphological opening of U (the running minimum over ±g bins, then the running maximum over
 *    ±g of that; Serra 1982, "Image Analysis and Mathematical Morphology", from memory): it removes
 *    every bump narrower than 2g + 1 bins (an emission on for more than half the time, the DC line)
 *    and returns a monotone floor unchanged. Limit: a ripple whose crests are narrower than the
 *    opening is cut down at its crests; a continuous emission wider than 2g + 1 bins raises the
 *    floor under it (and is then not found).
 *
 * The error of Ŝ = S·(1 + ε) (asymptotics of the sample median: Kendall & Stuart, "The Advanced
 * Theory of Statistics", Vol. 1, sd = 1/(2·f(m)·√n); from memory):
 * - T: sd_T = 1/(2·f(m_K)·m_K·√R) relative, f the density of G/K, R rows;
 * - U: sd_U = sd_T·√(π/2)/√n_eff, the median of n_eff effectively independent values of nearly
 *   normal spread; n_eff = n/(1 + 2·Σ_{d≥1}(1 − d/n)·ρ_d), n the window's bins (h + 1 at a band
 *   edge: the worst case is used everywhere), ρ_d = |Σ w²·e^(−j2πdn/N)|²/(Σ w²)² the correlation
 *   of periodogram powers d bins apart (Hann: ρ_1 = 4/9, ρ_2 = 1/36);
 * - the opening's minimum pulls the estimate down: by at most the expected maximum of
 *   m = (2g + 1)/(2h + 1) independent normals, σ·Φ⁻¹((m − 0.375)/(m + 0.25)) (Blom 1958), since
 *   U is correlated over about 2h + 1 bins; the following maximum gives part of it back, so this
 *   bias bound is conservative.
 * Memory: the R × N rows are read in place; work arrays of N and R values.
 */
import { standardNormalQuantile, windowCoefficients, type Spectrogram, type WindowName } from "../dsp/index.js";
import { rowMeanDensity, rowMeanQuantile, type FloorError } from "./rowThreshold.js";

/** Options of noiseFloorPerBin, defaults in NOISE_FLOOR_PER_BIN_DEFAULTS. */
export interface NoiseFloorPerBinOptions {
  /** Half-width h of the median across bins. */
  readonly smoothingBins?: number;
  /** Half-width g of the opening, bins (default: max(h, N/16)). */
  readonly openingBins?: number;
}

export const NOISE_FLOOR_PER_BIN_DEFAULTS = { smoothingBins: 8, openingFraction: 1 / 16 } as const;

/** The floor per bin (centred order, FS²/Hz) and the error of the estimate. */
export interface NoiseFloorPerBin {
  readonly floorPerHz: Float64Array;
  readonly error: FloorError;
  /** The typical frames a row (the median of framesPerRow over the rows that hold any). */
  readonly framesPerRow: number;
  readonly method: string;
}

/** The floor of `spectrogram` (module comment). Throws RangeError when no row holds a frame. */
export function noiseFloorPerBin(spectrogram: Spectrogram, options: NoiseFloorPerBinOptions = {}): NoiseFloorPerBin {
  const n = spectrogram.fftLength;
  const h = options.smoothingBins ?? NOISE_FLOOR_PER_BIN_DEFAULTS.smoothingBins;
  const g = options.openingBins ?? Math.max(h, Math.round(n * NOISE_FLOOR_PER_BIN_DEFAULTS.openingFraction));
  if (!Number.isInteger(h) || h < 0 || !Number.isInteger(g) || g < 0) {
    throw new RangeError(`smoothingBins ${h} and openingBins ${g} must be whole numbers ≥ 0`);
  }
  const rows = filledRows(spectrogram);
  if (rows.length === 0) throw new RangeError("the spectrogram holds no frame");
  const frames = medianOf(rows.map((r) => spectrogram.framesPerRow[r] as number));
  const mK = rowMeanQuantile(frames, 0.5);
  const t = timeMedian(spectrogram, rows, mK);
  const u = runningMedian(t, h);
  const floorPerHz = opening(u, g);
  const error = floorError(spectrogram, rows.length, frames, mK, h, g);
  return {
    floorPerHz, error, framesPerRow: frames,
    method: `median over ${rows.length} rows (over the Gamma(${frames}) median ${mK.toFixed(4)}), median over ±${h} bins, `
      + `opening over ±${g} bins; floor error ${(100 * error.biasRel).toFixed(2)} % ± ${(100 * error.sdRel).toFixed(2)} %`,
  };
}

function filledRows(s: Spectrogram): number[] {
  const rows: number[] = [];
  for (let r = 0; r < s.rowCount; r++) if ((s.framesPerRow[r] as number) > 0) rows.push(r);
  return rows;
}

function medianOf(values: ArrayLike<number>): number {
  const v = Float64Array.from(values).sort();
  const m = v.length >> 1;
  return v.length % 2 === 1 ? (v[m] as number) : 0.5 * ((v[m - 1] as number) + (v[m] as number));
}

/** T_b: the median over the filled rows of bin b, over m_K. */
function timeMedian(s: Spectrogram, rows: readonly number[], mK: number): Float64Array {
  const n = s.fftLength;
  const column = new Float64Array(rows.length);
  const t = new Float64Array(n);
  for (let b = 0; b < n; b++) {
    for (let i = 0; i < rows.length; i++) column[i] = s.meanPerHz[(rows[i] as number) * n + b] as number;
    t[b] = medianOf(column) / mK;
  }
  return t;
}

/** The median of v over each index ± h, the window clamped to the array. */
function runningMedian(v: Float64Array, h: number): Float64Array {
  const out = new Float64Array(v.length);
  for (let b = 0; b < v.length; b++) out[b] = medianOf(v.subarray(Math.max(0, b - h), Math.min(v.length, b + h + 1)));
  return out;
}

/** Running extreme over ± g, the window clamped to the array. */
function running(v: Float64Array, g: number, pick: (a: number, b: number) => number): Float64Array {
  const out = new Float64Array(v.length);
  for (let b = 0; b < v.length; b++) {
    let e = v[b] as number;
    for (let k = Math.max(0, b - g); k <= Math.min(v.length - 1, b + g); k++) e = pick(e, v[k] as number);
    out[b] = e;
  }
  return out;
}

/** Morphological opening: erosion (running minimum), then dilation (running maximum). */
function opening(v: Float64Array, g: number): Float64Array {
  return running(running(v, g, Math.min), g, Math.max);
}

/** The bias and standard error of the floor estimate, relative (module comment). */
function floorError(s: Spectrogram, rowCount: number, frames: number, mK: number, h: number, g: number): FloorError {
  const sdT = 1 / (2 * rowMeanDensity(frames, mK) * mK * Math.sqrt(rowCount));
  const window = h + 1; // the clamped window at a band edge, the worst case
  const rho = binPowerCorrelation(s.window, s.fftLength, window);
  let sum = 0;
  for (let d = 1; d < window; d++) sum += (1 - d / window) * (rho[d] as number);
  const nEff = window / (1 + 2 * sum);
  const sdU = nEff > 1 ? sdT * Math.sqrt(Math.PI / 2) / Math.sqrt(nEff) : sdT;
  const m = (2 * g + 1) / (2 * h + 1);
  const bias = m > 1 ? -sdU * standardNormalQuantile((m - 0.375) / (m + 0.25)) : 0;
  return { biasRel: bias, sdRel: sdU };
}

/** ρ_d for d = 0 … count − 1: the correlation of periodogram powers d bins apart (module comment). */
export function binPowerCorrelation(window: WindowName, fftLength: number, count: number): Float64Array {
  const w = windowCoefficients(window, fftLength);
  const n = w.length;
  let energy = 0;
  for (let i = 0; i < n; i++) energy += (w[i] as number) ** 2;
  const rho = new Float64Array(count);
  for (let d = 0; d < count; d++) {
    let re = 0;
    let im = 0;
    for (let i = 0; i < n; i++) {
      const p = (w[i] as number) ** 2;
      re += p * Math.cos((2 * Math.PI * d * i) / n);
      im -= p * Math.sin((2 * Math.PI * d * i) / n);
    }
    rho[d] = (re * re + im * im) / (energy * energy);
  }
  return rho;
}
