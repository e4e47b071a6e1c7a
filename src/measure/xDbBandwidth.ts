/**
 * x-dB bandwidth (ITU-R SM.443-4 Annex 2; SM.328): the distance between the outermost
 * frequencies at which the PSD is x dB below its maximum in the range ("26 dB emission
 * bandwidth" for x = 26, as US rules use it). Outermost means the search runs inwards from the
 * range ends, so a weaker part of the emission beyond a dip still counts.
 *
 * Each edge is interpolated linearly in dB between the last bin below the level and the first
 * at or above it. If the PSD never falls x dB below the peak before a range end, that edge is
 * the range end and a warning says so. Uncertainty (k = 2): as occupiedBandwidth, each edge
 * ±√((Δf/2)² + (RBW/2)²), the width ±√(Δf² + RBW²).
 */
import { binFrequencyHz, powerToDb, type WelchPsd } from "../dsp/index.js";
import { measurement, type Measurement } from "./measurement.js";

/** Options of xDbBandwidth. */
export interface XDbBandwidthOptions {
  readonly lowerHz: number;
  readonly upperHz: number;
  /** Level below the maximum, dB (> 0). Default 26. */
  readonly xDb?: number;
}

/** Default: the 26 dB bandwidth. */
export const X_DB_BANDWIDTH_DEFAULTS = { xDb: 26 } as const;

/** The x-dB bandwidth, its edges (offsets, Hz) and the x used. */
export interface XDbBandwidth {
  readonly bandwidthHz: Measurement<"Hz">;
  readonly lowerEdgeHz: Measurement<"Hz">;
  readonly upperEdgeHz: Measurement<"Hz">;
  readonly xDb: number;
}

/** x-dB bandwidth of `psd` over [lowerHz, upperHz] (module comment). Throws RangeError for bad options. */
export function xDbBandwidth(psd: WelchPsd, options: XDbBandwidthOptions): XDbBandwidth {
  const { lowerHz, upperHz } = options;
  const xDb = options.xDb ?? X_DB_BANDWIDTH_DEFAULTS.xDb;
  if (!(xDb > 0) || !Number.isFinite(xDb)) throw new RangeError(`xDb ${xDb} is not a positive number of dB`);
  if (!(upperHz > lowerHz)) throw new RangeError(`upperHz ${upperHz} is not above lowerHz ${lowerHz}`);
  const df = psd.binWidthHz;
  const first = Math.max(0, Math.ceil(lowerHz / df + psd.fftLength / 2 - 1e-9));
  const last = Math.min(psd.fftLength - 1, Math.floor(upperHz / df + psd.fftLength / 2 + 1e-9));
  if (last < first) throw new RangeError(`${lowerHz}..${upperHz} Hz holds no bin of the PSD`);
  const method = `outermost points ${xDb} dB below the PSD maximum (ITU-R SM.443 Annex 2), RBW ${psd.enbwHz.toFixed(2)} Hz`;
  const db = (i: number): number => powerToDb(psd.densityPerHz[i] as number);
  let peak = first;
  for (let i = first; i <= last; i++) if ((psd.densityPerHz[i] as number) > (psd.densityPerHz[peak] as number)) peak = i;
  const level = db(peak) - xDb;
  const warnings: string[] = [];
  let lo = first;
  while (db(lo) < level) lo++;
  let lowerEdge: number;
  if (lo === first) {
    lowerEdge = binFrequencyHz(psd, first) - df / 2;
    warnings.push(`the PSD does not fall ${xDb} dB below its peak below ${lowerEdge.toFixed(1)} Hz`);
  } else {
    lowerEdge = binFrequencyHz(psd, lo - 1) + df * ((level - db(lo - 1)) / (db(lo) - db(lo - 1)));
  }
  let hi = last;
  while (db(hi) < level) hi--;
  let upperEdge: number;
  if (hi === last) {
    upperEdge = binFrequencyHz(psd, last) + df / 2;
    warnings.push(`the PSD does not fall ${xDb} dB below its peak above ${upperEdge.toFixed(1)} Hz`);
  } else {
    upperEdge = binFrequencyHz(psd, hi + 1) - df * ((level - db(hi + 1)) / (db(hi) - db(hi + 1)));
  }
  const rbw = psd.enbwHz;
  const uEdge = Math.hypot(df / 2, rbw / 2);
  return {
    bandwidthHz: measurement(upperEdge - lowerEdge, "Hz", Math.hypot(df, rbw), method, warnings),
    lowerEdgeHz: measurement(lowerEdge, "Hz", uEdge, method, warnings),
    upperEdgeHz: measurement(upperEdge, "Hz", uEdge, method, warnings),
    xDb,
  };
}
