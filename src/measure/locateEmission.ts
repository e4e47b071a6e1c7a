/**
 * Finding the emission in a pass-1 PSD (centred order, FS²/Hz).
 *
 * Rule: bins above floor × 10^(thresholdDb/10) (default 10 dB) seed regions; each region grows
 * outwards while bins stay above floor × 10^(growDb/10) (default 3 dB), so that its skirts are
 * included; regions whose gap is at most `mergeGapHz` (default the larger of 3 bins and 2 % of
 * fs, so that the lines of a tone-modulated AM or FM signal join) become one. The emission is
 * the region with the most power above the floor, Σ (PSD − floor)·Δf.
 *
 * A receiver DC spike (detectDcSpike.ts) is set to the floor before the search, so an
 * off-centre emission is not displaced by it. If the strongest remaining region has a
 * mirror-image partner about 0 Hz holding power within 6 dB of its own, the two are the
 * sidebands of a carrier at 0 Hz: the emission is then both of them and the line between.
 * (An IQ image is 25 dB or more below its signal in any usable receiver, so it does not pair.)
 *
 * With `channel` given, the region is that channel, whatever the PSD holds.
 * Edges are bin edges: the lowest bin's centre − Δf/2 and the highest's + Δf/2.
 */
import { binFrequencyHz, dbToPower, powerToDb, type WelchPsd } from "../dsp/index.js";
import { detectDcSpike } from "./detectDcSpike.js";

/** Where the emission is, offsets from the capture centre. */
export interface EmissionRegion {
  /** Midpoint of the edges, Hz. */
  readonly centerOffsetHz: number;
  readonly lowerEdgeHz: number;
  readonly upperEdgeHz: number;
  readonly widthHz: number;
  /** Centred index of the largest bin in the region. */
  readonly peakBinIndex: number;
  /** Σ PSD·Δf over the region (noise included), dBFS. */
  readonly powerDbfs: number;
  /** True when a DC spike was set aside before the search. */
  readonly dcSpikeSkipped: boolean;
}

/** Options of locateEmission; defaults in LOCATE_EMISSION_DEFAULTS. */
export interface LocateEmissionOptions {
  readonly channel?: { readonly offsetHz: number; readonly widthHz: number } | undefined;
  readonly thresholdDb?: number;
  readonly growDb?: number;
  /** Largest gap between regions that are joined, Hz. Default max(3 bins, 0.02·fs). */
  readonly mergeGapHz?: number;
}

/** Defaults: seed 10 dB and grow to 3 dB above the floor. */
export const LOCATE_EMISSION_DEFAULTS = { thresholdDb: 10, growDb: 3, mergeGapBins: 3, mergeGapFractionOfFs: 0.02 } as const;

interface Run { lo: number; hi: number; excess: number }

/**
 * The emission in `psd` above `noiseFloorPerHz` (FS²/Hz) by the rule of the module comment, or
 * null when no bin stands thresholdDb above the floor. Throws RangeError for bad parameters.
 */
export function locateEmission(psd: WelchPsd, noiseFloorPerHz: number, options: LocateEmissionOptions = {}): EmissionRegion | null {
  if (!(noiseFloorPerHz > 0) || !Number.isFinite(noiseFloorPerHz)) {
    throw new RangeError(`noiseFloorPerHz ${noiseFloorPerHz} is not a positive finite density`);
  }
  const n = psd.fftLength;
  const df = psd.binWidthHz;
  const p = psd.densityPerHz;
  if (options.channel !== undefined) {
    const { offsetHz, widthHz } = options.channel;
    if (!(widthHz > 0) || !Number.isFinite(offsetHz) || Math.abs(offsetHz) + widthHz / 2 > psd.sampleRateHz / 2 + df) {
      throw new RangeError(`channel ${offsetHz}:${widthHz} Hz does not fit in ±${psd.sampleRateHz / 2} Hz`);
    }
    const lo = Math.max(0, Math.ceil((offsetHz - widthHz / 2) / df + n / 2 - 1e-9));
    const hi = Math.min(n - 1, Math.floor((offsetHz + widthHz / 2) / df + n / 2 + 1e-9));
    let peak = lo;
    let sum = 0;
    for (let i = lo; i <= hi; i++) {
      sum += (p[i] as number) * df;
      if ((p[i] as number) > (p[peak] as number)) peak = i;
    }
    return {
      centerOffsetHz: offsetHz, lowerEdgeHz: offsetHz - widthHz / 2, upperEdgeHz: offsetHz + widthHz / 2, widthHz,
      peakBinIndex: peak, powerDbfs: powerToDb(sum), dcSpikeSkipped: false,
    };
  }
  const thresholdDb = options.thresholdDb ?? LOCATE_EMISSION_DEFAULTS.thresholdDb;
  const growDb = options.growDb ?? LOCATE_EMISSION_DEFAULTS.growDb;
  if (!(thresholdDb >= growDb && growDb >= 0)) throw new RangeError(`thresholdDb ${thresholdDb} and growDb ${growDb} need thresholdDb ≥ growDb ≥ 0`);
  const mergeGapHz = options.mergeGapHz
    ?? Math.max(LOCATE_EMISSION_DEFAULTS.mergeGapBins * df, LOCATE_EMISSION_DEFAULTS.mergeGapFractionOfFs * psd.sampleRateHz);
  if (!(mergeGapHz >= 0)) throw new RangeError(`mergeGapHz ${mergeGapHz} is negative`);

  const spike = detectDcSpike(psd, noiseFloorPerHz, { thresholdDb });
  const q = Float64Array.from(p);
  if (spike.present) for (let i = spike.coreBins[0]; i <= spike.coreBins[1]; i++) q[i] = noiseFloorPerHz;
  const seed = noiseFloorPerHz * dbToPower(thresholdDb);
  const grow = noiseFloorPerHz * dbToPower(growDb);
  const runs: Run[] = [];
  for (let i = 0; i < n; i++) {
    if ((q[i] as number) <= seed) continue;
    let lo = i;
    let hi = i;
    while (lo > 0 && (q[lo - 1] as number) > grow) lo--;
    while (hi < n - 1 && (q[hi + 1] as number) > grow) hi++;
    const last = runs[runs.length - 1];
    if (last !== undefined && lo <= last.hi) last.hi = Math.max(last.hi, hi);
    else runs.push({ lo, hi, excess: 0 });
    i = hi;
  }
  if (runs.length === 0) return null;
  const gapBins = mergeGapHz / df;
  const merged: Run[] = [];
  for (const r of runs) {
    const last = merged[merged.length - 1];
    if (last !== undefined && r.lo - last.hi - 1 <= gapBins) last.hi = r.hi;
    else merged.push({ ...r });
  }
  for (const r of merged) r.excess = excessOf(q, r.lo, r.hi, noiseFloorPerHz, df);
  let best = merged[0] as Run;
  for (const r of merged) if (r.excess > best.excess) best = r;
  let lo = best.lo;
  let hi = best.hi;
  const dc = n / 2;
  if (spike.present && (best.hi < dc || best.lo > dc)) {
    // A mirror partner about DC: the region whose mirrored span overlaps best's.
    const mlo = 2 * dc - best.hi;
    const mhi = 2 * dc - best.lo;
    for (const r of merged) {
      if (r === best || r.hi < mlo - 1 || r.lo > mhi + 1) continue;
      if (Math.abs(10 * Math.log10(r.excess / best.excess)) <= 6) {
        lo = Math.min(lo, r.lo);
        hi = Math.max(hi, r.hi);
      }
    }
  }
  const carrierTaken = lo < dc && hi > dc;
  const source = carrierTaken ? p : q;
  let peak = lo;
  let sum = 0;
  for (let i = lo; i <= hi; i++) {
    sum += (source[i] as number) * df;
    if ((source[i] as number) > (source[peak] as number)) peak = i;
  }
  const lowerEdgeHz = binFrequencyHz(psd, lo) - df / 2;
  const upperEdgeHz = binFrequencyHz(psd, hi) + df / 2;
  return {
    centerOffsetHz: (lowerEdgeHz + upperEdgeHz) / 2, lowerEdgeHz, upperEdgeHz, widthHz: upperEdgeHz - lowerEdgeHz,
    peakBinIndex: peak, powerDbfs: powerToDb(sum), dcSpikeSkipped: spike.present && !carrierTaken,
  };
}

function excessOf(q: Float64Array, lo: number, hi: number, floor: number, df: number): number {
  let s = 0;
  for (let i = lo; i <= hi; i++) s += Math.max(0, (q[i] as number) - floor) * df;
  return s;
}
