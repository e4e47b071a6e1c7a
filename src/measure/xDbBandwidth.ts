/**
 * x-dB bandwidth (ITU-R SM.443-4 Annex 2; SM.328): the distance between the outermost
 * frequencies at which the PSD is x dB below its maximum in the range ("26 dB emission
 * bandwidth" for x = 26, as US rules use it). Outermost means the search runs inwards from the
 * range ends, so a weaker part of the emission beyond a dip still counts.
 *
 * The 0 dB reference, and the trace the edges are found on, is `reference`: "average" the Welch
 * mean PSD (its maximum is the carrier line of an FM emission, which holds its power only while
 * the modulation is small, so the mean's edges lie inside the 99 % OBW); "peak-hold" the max-hold
 * of the same segments (`maxHoldPerHz`), the maximum of the spectrum over time that SM.443 Annex 2
 * ("x dB below the maximum of the spectrum") and the usual 26 dB emission-bandwidth practice mean:
 * the edges are where the emission ever reached, as a spectrum analyser's max-hold shows them.
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
  /** The trace whose maximum is the 0 dB reference and on which the edges are found. Default "average". */
  readonly reference?: XDbReference;
}

/** The 0 dB reference of an x-dB bandwidth: the Welch mean PSD or its max-hold (module comment). */
export type XDbReference = "average" | "peak-hold";
export const X_DB_REFERENCES: readonly XDbReference[] = ["average", "peak-hold"];

/** Default: the 26 dB bandwidth on the mean PSD. */
export const X_DB_BANDWIDTH_DEFAULTS = { xDb: 26, reference: "average" } as const;

/** The x-dB bandwidth, its edges (offsets, Hz) and the x used. */
export interface XDbBandwidth {
  readonly bandwidthHz: Measurement<"Hz">;
  readonly lowerEdgeHz: Measurement<"Hz">;
  readonly upperEdgeHz: Measurement<"Hz">;
  readonly xDb: number;
  readonly reference: XDbReference;
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
  const reference = options.reference ?? X_DB_BANDWIDTH_DEFAULTS.reference;
  const trace = reference === "peak-hold" ? psd.maxHoldPerHz : psd.densityPerHz;
  const method = reference === "peak-hold"
    ? `outermost points ${xDb} dB below the maximum of the max-hold spectrum over ${psd.segmentCount} segments, edges on the max-hold trace (ITU-R SM.443 Annex 2), RBW ${psd.enbwHz.toFixed(2)} Hz`
    : `outermost points ${xDb} dB below the maximum of the mean (Welch) PSD, edges on the mean PSD (ITU-R SM.443 Annex 2), RBW ${psd.enbwHz.toFixed(2)} Hz`;
  const db = (i: number): number => powerToDb(trace[i] as number);
  let peak = first;
  for (let i = first; i <= last; i++) if ((trace[i] as number) > (trace[peak] as number)) peak = i;
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
    reference,
  };
}
