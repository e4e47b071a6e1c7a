/**
 * Occupied bandwidth by the β % method (ITU-R SM.328; ITU-R SM.443-4 Annex 1; 47 CFR 2.202(a)):
 * the band outside which lies β/2 of the mean power on each side, β = 1 − fraction (0.5 % each
 * side for the 99 % bandwidth).
 *
 * Computed on e_k = max(0, PSD_k − floor) over the bins whose centres lie in [lowerHz, upperHz]
 * (the noise floor removed, interface.md). Each bin holds e_k·Δf spread evenly over
 * [f_k − Δf/2, f_k + Δf/2], so the cumulative power is piecewise linear and each edge is
 * interpolated inside its bin. Clamping noise bins at zero leaves, per noise-only bin, about
 * floor·√(1/(πν)) of residual (ν the Welch degrees of freedom); keep the range to the emission
 * and a margin (locateEmission) so that this stays small beside β/2.
 *
 * Uncertainty (k = 2), per edge: the first two in quadrature, plus the third:
 * - the bin quantisation Δf/2;
 * - the window's smearing: RBW/2 (RBW = ENBW) in a continuous spectrum; where the edge falls in
 *   the main lobe of a line (a local maximum within the lobe's half-width h bins standing over
 *   4× the level h + 2 bins either side of it), h·Δf: the window spreads the line's power over
 *   its lobe, and the edge lies wherever in it the 0.5 % is reached, while the line itself has
 *   no width;
 * - the noise floor: the edge moved by raising the floor two standard deviations of a bin's
 *   Welch estimate, 2·floor·√(1.33/M), above which a noise-only bin rises with probability
 *   about 2 %, so that most of the noise's clamped residual is gone (M segments; 1.33 =
 *   1 + 2·0.167, the correlation of Hann segments overlapped by half, Welch 1967, from memory). At low SNR the clamped noise
 *   residual over many bins is comparable to the 0.5 % tails and pushes the edges out; this
 *   term then says so instead of a width of a few bins. It is a one-sided bias, left uncorrected,
 *   so it is added to the quadrature sum of the others, not in quadrature.
 * The width's uncertainty: the edges' quantisation and smearing in quadrature, plus the width's
 * own change under the raised floor (both edges move together, so their shifts add).
 */
import { binFrequencyHz, type WelchPsd } from "../dsp/index.js";
import { mainLobeHalfWidthBins } from "./detectDcSpike.js";
import { measurement, notAvailable, type Measurement } from "./measurement.js";

/** Options of occupiedBandwidth. */
export interface OccupiedBandwidthOptions {
  readonly lowerHz: number;
  readonly upperHz: number;
  /** Noise density removed before integrating, FS²/Hz (≥ 0). */
  readonly noiseFloorPerHz: number;
  /** Share of the power inside the band, (0, 1). Default 0.99. */
  readonly fraction?: number;
}

/** Default: the 99 % bandwidth. */
export const OCCUPIED_BANDWIDTH_DEFAULTS = { fraction: 0.99 } as const;

/** The occupied bandwidth and its edges (offsets), Hz. */
export interface OccupiedBandwidth {
  readonly occupiedHz: Measurement<"Hz">;
  readonly lowerEdgeHz: Measurement<"Hz">;
  readonly upperEdgeHz: Measurement<"Hz">;
}

/** β % occupied bandwidth of `psd` (module comment). Throws RangeError for bad options. */
export function occupiedBandwidth(psd: WelchPsd, options: OccupiedBandwidthOptions): OccupiedBandwidth {
  const { lowerHz, upperHz, noiseFloorPerHz } = options;
  const fraction = options.fraction ?? OCCUPIED_BANDWIDTH_DEFAULTS.fraction;
  if (!(fraction > 0 && fraction < 1)) throw new RangeError(`fraction ${fraction} is outside (0, 1)`);
  if (!(upperHz > lowerHz)) throw new RangeError(`upperHz ${upperHz} is not above lowerHz ${lowerHz}`);
  if (!(noiseFloorPerHz >= 0) || !Number.isFinite(noiseFloorPerHz)) throw new RangeError(`noiseFloorPerHz ${noiseFloorPerHz} is not a finite density ≥ 0`);
  const df = psd.binWidthHz;
  const method = `${(100 * fraction).toFixed(1)} % power bandwidth of PSD minus noise floor (ITU-R SM.328 beta/2 each side), RBW ${psd.enbwHz.toFixed(2)} Hz`;
  const first = Math.max(0, Math.ceil((lowerHz / df) + psd.fftLength / 2 - 1e-9));
  const last = Math.min(psd.fftLength - 1, Math.floor((upperHz / df) + psd.fftLength / 2 + 1e-9));
  const { e, total } = binPowers(psd, first, last, noiseFloorPerHz);
  if (!(total > 0)) {
    const na = notAvailable("Hz", method, "no power above the noise floor in the range");
    return { occupiedHz: na, lowerEdgeHz: na, upperEdgeHz: na };
  }
  const startHz = binFrequencyHz(psd, first) - df / 2;
  const [lowerEdge, upperEdge] = edges(e, fraction, startHz, df);
  // The floor raised by two standard deviations of a bin's estimate (module comment).
  const raised = noiseFloorPerHz * (1 + 2 * Math.sqrt(1.33 / Math.max(1, psd.segmentCount)));
  const [lowerRaised, upperRaised] = edgesAbove(psd, first, last, raised, fraction, startHz) ?? [lowerEdge, upperEdge];
  const rbw = psd.enbwHz;
  const lobe = mainLobeHalfWidthBins(psd);
  const smear = (edgeHz: number): number => (inLineLobe(e, Math.floor((edgeHz - startHz) / df), lobe) ? lobe * df : rbw / 2);
  // The floor's part is a one-sided bias (the clamped residual only widens), not corrected, so it
  // is added to the expanded uncertainty rather than in quadrature (common practice for an
  // uncorrected systematic effect).
  const uLower = Math.hypot(df / 2, smear(lowerEdge)) + Math.abs(lowerRaised - lowerEdge);
  const uUpper = Math.hypot(df / 2, smear(upperEdge)) + Math.abs(upperRaised - upperEdge);
  const warnings: string[] = [];
  if (psd.enbwHz > 0.05 * (upperEdge - lowerEdge)) {
    warnings.push(`resolution ${rbw.toFixed(2)} Hz exceeds 5 % of the occupied bandwidth; the figure is widened by the window`);
  }
  return {
    // The floor moves both edges the same way (outwards for a floor read low): its part of the width adds, not in quadrature.
    occupiedHz: measurement(upperEdge - lowerEdge, "Hz", Math.hypot(df / 2, df / 2, smear(lowerEdge), smear(upperEdge)) + Math.abs((upperRaised - lowerRaised) - (upperEdge - lowerEdge)), method, warnings),
    lowerEdgeHz: measurement(lowerEdge, "Hz", uLower, method, warnings),
    upperEdgeHz: measurement(upperEdge, "Hz", uUpper, method, warnings),
  };
}

/** The lower and upper β edges of the bin powers e (bins of width df from startHz). */
function edges(e: Float64Array, fraction: number, startHz: number, df: number): [number, number] {
  let total = 0;
  for (const v of e) total += v;
  const tail = ((1 - fraction) / 2) * total;
  const lower = crossing(e, tail, startHz, df);
  // The upper edge: the same search from the top, mirrored.
  const upper = -crossing(e.slice().reverse(), tail, -(startHz + e.length * df), df);
  return [lower, upper];
}

/** Power above `floor` of bins first..last (PSD minus floor, clamped at 0, times the bin width) and their sum. */
function binPowers(psd: WelchPsd, first: number, last: number, floor: number): { e: Float64Array; total: number } {
  const e = new Float64Array(Math.max(0, last - first + 1));
  let total = 0;
  for (let i = first; i <= last; i++) {
    const v = Math.max(0, (psd.densityPerHz[i] as number) - floor) * psd.binWidthHz;
    e[i - first] = v;
    total += v;
  }
  return { e, total };
}

/** The edges with `floor` removed instead, or null when nothing stands above it. */
function edgesAbove(psd: WelchPsd, first: number, last: number, floor: number, fraction: number, startHz: number): [number, number] | null {
  const { e, total } = binPowers(psd, first, last, floor);
  return total > 0 ? edges(e, fraction, startHz, psd.binWidthHz) : null;
}

/** Whether bin k lies in the main lobe (half-width h bins) of a line: a local maximum standing over 4× the level h + 2 bins either side. */
function inLineLobe(e: Float64Array, k: number, h: number): boolean {
  let m = -1;
  for (let i = Math.max(0, k - h); i <= Math.min(e.length - 1, k + h); i++) if (m < 0 || (e[i] as number) > (e[m] as number)) m = i;
  if (m < 0 || !((e[m] as number) > 0)) return false;
  const side = Math.max(e[m - h - 2] ?? 0, e[m + h + 2] ?? 0);
  return (e[m] as number) > 4 * side;
}

/** The frequency where the cumulative sum of e (bins of width df from startHz) reaches `target`. */
function crossing(e: Float64Array, target: number, startHz: number, df: number): number {
  let cum = 0;
  for (let k = 0; k < e.length; k++) {
    const v = e[k] as number;
    if (cum + v >= target && v > 0) return startHz + (k + (target - cum) / v) * df;
    cum += v;
  }
  return startHz + e.length * df;
}
