/**
 * A receiver DC spike: the narrow line that direct-conversion receivers leave at 0 Hz (LO
 * leakage, ADC offset). It is told from an emission by its shape, not its level:
 *
 * - core: the bins within h of the DC bin, h = the window's main-lobe half-width in bins
 *   (rectangular 1, Hann 2, Blackman–Harris 4; Harris 1978 Table 1), so an on-bin line of any
 *   strength stays inside it (at most 3 bins above the floor with Hann);
 * - the DC bin is the largest of the core and exceeds floor × 10^(thresholdDb/10);
 * - guard: on each side, the mean of the next `guardBins` bins beyond the core is within
 *   `guardDb` (3 dB) of the floor, i.e. only noise stands beside it.
 *
 * A carrier at exactly 0 Hz with no sideband within the guard looks the same and is reported as
 * present too; locateEmission then takes it back when sidebands sit mirror-symmetric about 0 Hz.
 * The rule is common practice for zero-IF receivers, not from a standard.
 */
import { dbToPower, powerToDb, type WelchPsd } from "../dsp/index.js";

/** The result of detectDcSpike. levelDbfs and widthHz describe the core even when not present. */
export interface DcSpike {
  readonly present: boolean;
  /** Power of the core above the floor, Σ (PSD − floor)·Δf, dBFS. */
  readonly levelDbfs: number;
  /** Contiguous bins around DC more than 3 dB above the floor, times the bin width, Hz. */
  readonly widthHz: number;
  /** Centred index range [first, last] of the core bins. */
  readonly coreBins: readonly [number, number];
}

/** Options of detectDcSpike, defaults in DC_SPIKE_DEFAULTS. */
export interface DcSpikeOptions {
  readonly thresholdDb?: number;
  readonly guardBins?: number;
  readonly guardDb?: number;
}

/** Defaults: 10 dB above the floor, 8 guard bins each side, guard mean within 3 dB of the floor. */
export const DC_SPIKE_DEFAULTS: Required<DcSpikeOptions> = { thresholdDb: 10, guardBins: 8, guardDb: 3 };

/** Main-lobe half-width of the PSD's window, bins (Harris 1978 Table 1). */
export function mainLobeHalfWidthBins(psd: WelchPsd): number {
  return psd.window === "rectangular" ? 1 : psd.window === "hann" ? 2 : 4;
}

/**
 * Whether `psd` (centred order, FS²/Hz) has a DC spike above `noiseFloorPerHz` (FS²/Hz) by the
 * rule of the module comment. Throws RangeError for a non-positive floor or bad options.
 */
export function detectDcSpike(psd: WelchPsd, noiseFloorPerHz: number, options: DcSpikeOptions = {}): DcSpike {
  const o = { ...DC_SPIKE_DEFAULTS, ...options };
  if (!(noiseFloorPerHz > 0) || !Number.isFinite(noiseFloorPerHz)) {
    throw new RangeError(`noiseFloorPerHz ${noiseFloorPerHz} is not a positive finite density`);
  }
  if (!Number.isInteger(o.guardBins) || o.guardBins < 1) throw new RangeError(`guardBins ${o.guardBins} is not a positive integer`);
  const p = psd.densityPerHz;
  const n = psd.fftLength;
  const dc = n / 2;
  const h = mainLobeHalfWidthBins(psd);
  const first = Math.max(0, dc - h);
  const last = Math.min(n - 1, dc + h);
  let excess = 0;
  let coreMax = 0;
  for (let i = first; i <= last; i++) {
    excess += Math.max(0, (p[i] as number) - noiseFloorPerHz) * psd.binWidthHz;
    coreMax = Math.max(coreMax, p[i] as number);
  }
  const grow = noiseFloorPerHz * dbToPower(3);
  let lo = dc;
  let hi = dc;
  if ((p[dc] as number) > grow) {
    while (lo > 0 && (p[lo - 1] as number) > grow) lo--;
    while (hi < n - 1 && (p[hi + 1] as number) > grow) hi++;
  }
  const widthHz = (p[dc] as number) > grow ? (hi - lo + 1) * psd.binWidthHz : 0;
  const strong = (p[dc] as number) > noiseFloorPerHz * dbToPower(o.thresholdDb) && (p[dc] as number) >= coreMax;
  const guardLimit = noiseFloorPerHz * dbToPower(o.guardDb);
  const quiet = (from: number, step: number): boolean => {
    let s = 0;
    let c = 0;
    for (let k = 0; k < o.guardBins; k++) {
      const i = from + step * k;
      if (i < 0 || i >= n) break;
      s += p[i] as number;
      c++;
    }
    return c > 0 && s / c <= guardLimit;
  };
  const present = strong && quiet(first - 1, -1) && quiet(last + 1, 1);
  return { present, levelDbfs: powerToDb(excess), widthHz, coreBins: [first, last] };
}

