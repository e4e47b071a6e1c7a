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
 * Uncertainty (k = 2): each edge ±√((Δf/2)² + (RBW/2)²), the bin quantisation combined with
 * the smearing of the window's resolution bandwidth RBW = ENBW; the width ±√(Δf² + RBW²).
 */
import { binFrequencyHz, type WelchPsd } from "../dsp/index.js";
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
  const e = new Float64Array(Math.max(0, last - first + 1));
  let total = 0;
  for (let i = first; i <= last; i++) {
    const v = Math.max(0, (psd.densityPerHz[i] as number) - noiseFloorPerHz) * df;
    e[i - first] = v;
    total += v;
  }
  if (!(total > 0)) {
    const na = notAvailable("Hz", method, "no power above the noise floor in the range");
    return { occupiedHz: na, lowerEdgeHz: na, upperEdgeHz: na };
  }
  const tail = ((1 - fraction) / 2) * total;
  const lowerEdge = crossing(e, tail, binFrequencyHz(psd, first) - df / 2, df);
  // The upper edge: the same search from the top, mirrored.
  const reversed = e.slice().reverse();
  const upperEdge = -crossing(reversed, tail, -(binFrequencyHz(psd, last) + df / 2), df);
  const rbw = psd.enbwHz;
  const uEdge = Math.hypot(df / 2, rbw / 2);
  const warnings: string[] = [];
  if (psd.enbwHz > 0.05 * (upperEdge - lowerEdge)) {
    warnings.push(`resolution ${rbw.toFixed(2)} Hz exceeds 5 % of the occupied bandwidth; the figure is widened by the window`);
  }
  return {
    occupiedHz: measurement(upperEdge - lowerEdge, "Hz", Math.hypot(df, rbw), method, warnings),
    lowerEdgeHz: measurement(lowerEdge, "Hz", uEdge, method, warnings),
    upperEdgeHz: measurement(upperEdge, "Hz", uEdge, method, warnings),
  };
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
