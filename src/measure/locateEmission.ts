/**
 * Finding the emission in a pass-1 PSD (centred order, FS²/Hz).
 *
 * Rule: bins above floor × 10^(thresholdDb/10) (default 10 dB) seed runs; each run grows
 * outwards while bins stay above floor × 10^(growDb/10) (default 3 dB), so that its skirts are
 * included; runs whose gap is at most `mergeGapHz` (default the larger of 3 bins and 2 % of fs,
 * so that the lines of a tone-modulated AM or FM signal join) become one region. Each region is
 * then trimmed to the fewest neighbouring runs around its strongest run that hold `keepShare`
 * (99.9 %) of its power above the floor: an emission's own lines or skirts beyond that hold less
 * than −30 dB of it, while the spurs that quantisation, clipping or a strong line leave nearby
 * (harmonics and intermodulation products) would otherwise join it across the merge gap. The
 * emission is the region with the most power above the floor, Σ (PSD − floor)·Δf.
 *
 * A receiver DC spike (detectDcSpike.ts) is set to the level beside it before the search, and no
 * gap is merged across 0 Hz, so that an off-centre emission is neither displaced by the spike
 * nor joined to it by the spurs around it. If the strongest region has a mirror-image partner
 * about 0 Hz holding power within 6 dB of its own, the two are the sidebands of a carrier at
 * 0 Hz: the emission is then both of them and the line between. A region that runs through
 * 0 Hz without a gap takes the line too. (An IQ image is 25 dB or more below its signal in any
 * usable receiver, and a quantiser's image spur far more, so neither pairs.)
 *
 * With `channel` given, the region is that channel, whatever the PSD holds; when it contains a
 * DC spike, the same search inside the channel decides whether the spike is set aside (an
 * emission in the channel does not run through 0 Hz: `dcSpikeSkipped`) or taken as the carrier.
 * With `near` given (and no channel), only the regions that reach into the window
 * offsetHz ± halfWidthHz are candidates, the strongest of them is the emission, and null means
 * none reaches in (`--nominal` without `--channel`: measureEmission widens the window in steps).
 *
 * Edges are bin edges: the lowest bin's centre − Δf/2 and the highest's + Δf/2.
 */
import { binFrequencyHz, dbToPower, powerToDb, type WelchPsd } from "../dsp/index.js";
import { detectDcSpike, type DcSpike } from "./detectDcSpike.js";

/** Where the emission is, offsets from the capture centre. */
export interface EmissionRegion {
  /** Midpoint of the edges, Hz. */
  readonly centerOffsetHz: number;
  readonly lowerEdgeHz: number;
  readonly upperEdgeHz: number;
  readonly widthHz: number;
  /** Centred index of the largest bin in the region. */
  readonly peakBinIndex: number;
  /** Σ PSD·Δf over the region (noise included, a set-aside DC spike not), dBFS. */
  readonly powerDbfs: number;
  /** True when a DC spike was set aside before the search (it is not part of the emission). */
  readonly dcSpikeSkipped: boolean;
  /** True when the region holds the 0 Hz bin and a DC spike stands there (taken or set aside). */
  readonly dcSpikeInside: boolean;
}

/** Options of locateEmission; defaults in LOCATE_EMISSION_DEFAULTS. */
export interface LocateEmissionOptions {
  readonly channel?: { readonly offsetHz: number; readonly widthHz: number } | undefined;
  /** Only regions reaching into offsetHz ± halfWidthHz (offsets from the capture centre, Hz). */
  readonly near?: { readonly offsetHz: number; readonly halfWidthHz: number } | undefined;
  readonly thresholdDb?: number;
  readonly growDb?: number;
  /** Largest gap between regions that are joined, Hz. Default max(3 bins, 0.02·fs). */
  readonly mergeGapHz?: number;
  /** The capture's DC offset from pass-1 health, dBFS, for detectDcSpike's check. */
  readonly dcOffsetDbfs?: number | undefined;
}

/** Defaults: seed 10 dB and grow to 3 dB above the floor; a region keeps 99.9 % of its power. */
export const LOCATE_EMISSION_DEFAULTS = { thresholdDb: 10, growDb: 3, mergeGapBins: 3, mergeGapFractionOfFs: 0.02, keepShare: 0.999 } as const;

interface Run { lo: number; hi: number; excess: number }
interface Search { lo: number; hi: number; carrierTaken: boolean }

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
  const thresholdDb = options.thresholdDb ?? LOCATE_EMISSION_DEFAULTS.thresholdDb;
  const growDb = options.growDb ?? LOCATE_EMISSION_DEFAULTS.growDb;
  if (!(thresholdDb >= growDb && growDb >= 0)) throw new RangeError(`thresholdDb ${thresholdDb} and growDb ${growDb} need thresholdDb ≥ growDb ≥ 0`);
  const mergeGapHz = options.mergeGapHz
    ?? Math.max(LOCATE_EMISSION_DEFAULTS.mergeGapBins * df, LOCATE_EMISSION_DEFAULTS.mergeGapFractionOfFs * psd.sampleRateHz);
  if (!(mergeGapHz >= 0)) throw new RangeError(`mergeGapHz ${mergeGapHz} is negative`);
  const spike = detectDcSpike(psd, noiseFloorPerHz, { thresholdDb, dcOffsetDbfs: options.dcOffsetDbfs });
  const q = Float64Array.from(psd.densityPerHz);
  if (spike.present) for (let i = spike.coreBins[0]; i <= spike.coreBins[1]; i++) q[i] = spike.localDensityPerHz;
  const params = { floor: noiseFloorPerHz, seed: noiseFloorPerHz * dbToPower(thresholdDb), grow: noiseFloorPerHz * dbToPower(growDb), gapBins: mergeGapHz / df };
  const dc = n / 2;
  if (options.channel !== undefined) {
    const { offsetHz, widthHz } = options.channel;
    if (!(widthHz > 0) || !Number.isFinite(offsetHz) || Math.abs(offsetHz) + widthHz / 2 > psd.sampleRateHz / 2 + df) {
      throw new RangeError(`channel ${offsetHz}:${widthHz} Hz does not fit in ±${psd.sampleRateHz / 2} Hz`);
    }
    const lo = Math.max(0, Math.ceil((offsetHz - widthHz / 2) / df + n / 2 - 1e-9));
    const hi = Math.min(n - 1, Math.floor((offsetHz + widthHz / 2) / df + n / 2 + 1e-9));
    const inside = spike.present && lo <= dc && hi >= dc;
    let skipped = false;
    if (inside) {
      const masked = q.map((v, i) => (i < lo || i > hi ? noiseFloorPerHz : v));
      const found = search(masked, spike, params);
      skipped = found !== null && !found.carrierTaken;
    }
    const { peak, sum } = peakAndSum(skipped ? q : psd.densityPerHz, lo, hi, df);
    return {
      centerOffsetHz: offsetHz, lowerEdgeHz: offsetHz - widthHz / 2, upperEdgeHz: offsetHz + widthHz / 2, widthHz,
      peakBinIndex: peak, powerDbfs: powerToDb(sum), dcSpikeSkipped: skipped, dcSpikeInside: inside,
    };
  }
  const near = options.near === undefined ? undefined
    : { lo: (options.near.offsetHz - options.near.halfWidthHz) / df + dc - 0.5, hi: (options.near.offsetHz + options.near.halfWidthHz) / df + dc + 0.5 };
  const found = search(q, spike, params, near);
  if (found === null) return null;
  const { lo, hi, carrierTaken } = found;
  const { peak, sum } = peakAndSum(carrierTaken ? psd.densityPerHz : q, lo, hi, df);
  const lowerEdgeHz = binFrequencyHz(psd, lo) - df / 2;
  const upperEdgeHz = binFrequencyHz(psd, hi) + df / 2;
  return {
    centerOffsetHz: (lowerEdgeHz + upperEdgeHz) / 2, lowerEdgeHz, upperEdgeHz, widthHz: upperEdgeHz - lowerEdgeHz,
    peakBinIndex: peak, powerDbfs: powerToDb(sum), dcSpikeSkipped: spike.present && !carrierTaken, dcSpikeInside: spike.present && carrierTaken,
  };
}

interface SearchParams { floor: number; seed: number; grow: number; gapBins: number }

/** Runs, merged regions, trimmed, the strongest, and its mirror partner (module comment). */
function search(q: Float64Array, spike: DcSpike, s: SearchParams, near?: { lo: number; hi: number }): Search | null {
  const dc = q.length / 2;
  const runs = seedRuns(q, s);
  if (runs.length === 0) return null;
  for (const r of runs) r.excess = excessOf(q, r.lo, r.hi, s.floor);
  const regions: Run[][] = [];
  for (const r of runs) {
    const last = regions[regions.length - 1];
    const prev = last?.[last.length - 1];
    const acrossDc = spike.present && prev !== undefined && prev.hi < dc && r.lo > dc;
    if (last !== undefined && prev !== undefined && r.lo - prev.hi - 1 <= s.gapBins && !acrossDc) last.push(r);
    else regions.push([r]);
  }
  const merged = regions.map(trimRegion);
  const candidates = near === undefined ? merged : merged.filter((r) => r.hi >= near.lo && r.lo <= near.hi);
  if (candidates.length === 0) return null;
  let best = candidates[0] as Run;
  for (const r of candidates) if (r.excess > best.excess) best = r;
  let lo = best.lo;
  let hi = best.hi;
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
  return { lo, hi, carrierTaken: lo < dc && hi > dc };
}

/** Runs of bins above the grow level that hold a bin above the seed level. */
function seedRuns(q: Float64Array, s: SearchParams): Run[] {
  const n = q.length;
  const runs: Run[] = [];
  for (let i = 0; i < n; i++) {
    if ((q[i] as number) <= s.seed) continue;
    let lo = i;
    let hi = i;
    while (lo > 0 && (q[lo - 1] as number) > s.grow) lo--;
    while (hi < n - 1 && (q[hi + 1] as number) > s.grow) hi++;
    const last = runs[runs.length - 1];
    if (last !== undefined && lo <= last.hi) last.hi = Math.max(last.hi, hi);
    else runs.push({ lo, hi, excess: 0 });
    i = hi;
  }
  return runs;
}

/** The fewest neighbouring runs around the strongest that hold keepShare of the region's excess. */
function trimRegion(region: readonly Run[]): Run {
  let total = 0;
  let k = 0;
  for (let j = 0; j < region.length; j++) {
    total += (region[j] as Run).excess;
    if ((region[j] as Run).excess > (region[k] as Run).excess) k = j;
  }
  let a = k;
  let b = k;
  let held = (region[k] as Run).excess;
  while (held < LOCATE_EMISSION_DEFAULTS.keepShare * total) {
    const left = a > 0 ? (region[a - 1] as Run).excess : -1;
    const right = b < region.length - 1 ? (region[b + 1] as Run).excess : -1;
    if (left < 0 && right < 0) break;
    if (left >= right) held += (region[--a] as Run).excess;
    else held += (region[++b] as Run).excess;
  }
  return { lo: (region[a] as Run).lo, hi: (region[b] as Run).hi, excess: held };
}

function peakAndSum(p: ArrayLike<number>, lo: number, hi: number, df: number): { peak: number; sum: number } {
  let peak = lo;
  let sum = 0;
  for (let i = lo; i <= hi; i++) {
    sum += (p[i] as number) * df;
    if ((p[i] as number) > (p[peak] as number)) peak = i;
  }
  return { peak, sum };
}

function excessOf(q: Float64Array, lo: number, hi: number, floor: number): number {
  let s = 0;
  for (let i = lo; i <= hi; i++) s += Math.max(0, (q[i] as number) - floor);
  return s;
}
