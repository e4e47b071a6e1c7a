/**
 * A receiver DC spike: the line that direct-conversion (zero-IF) receivers leave at 0 Hz (LO
 * leakage, ADC offset; common practice for zero-IF receivers, not from a standard). It is told
 * from an emission by its shape and by what stands beside it, not by its level, so the rule holds
 * when the DC line is the strongest thing in the capture:
 *
 * - core: the bins within h of the DC bin, h = the window's main-lobe half-width in bins
 *   (rectangular 1, Hann 2, Blackman–Harris 4; Harris 1978 Table 1);
 * - position: the DC bin is the largest of the core (a constant is exactly at 0 Hz), and the two
 *   bins beside it agree within `symmetryDb` (3 dB): a line δ bins off centre makes them differ by
 *   about 1.5 dB per 0.1 bin with Hann, so 3 dB admits a line within ±0.2 bin of 0 Hz;
 * - width: the core's equivalent width, W = Σ (PSD − local)·Δf / (PSD_dc − local), lies between
 *   ENBW·Δf (an on-bin line) and ENBW·Δf·10^(scallop/10) (a line half a bin off) for any line,
 *   whatever its level (Harris 1978 §IV, ENBW and scallop loss), and is larger for anything
 *   wider than a line; W may exceed the on-bin value by `widthTolerance` (10 %, the scatter of a
 *   Welch average of a few tens of segments);
 * - level: the DC bin stands `thresholdDb` (10 dB) above both the noise floor and the local level,
 *   the median of the `guardBins` bins on each side beyond the core. The median, not the mean, so
 *   that the sparse spurs an 8-bit quantiser adds around a strong DC line (harmonics of the
 *   carriers and their intermodulation with the DC term) do not hide it;
 * - when the capture's own DC offset (its mean, pass-1 health) is given, the core's line power
 *   must be within `healthToleranceDb` (3 dB) of it: a DC offset is the mean of the samples, while
 *   a narrow emission near 0 Hz that is not coherent over the capture has a small mean.
 *
 * A carrier at exactly 0 Hz looks the same (it is a mean too) and is reported as present;
 * locateEmission takes it back when the emission spans 0 Hz or has sidebands mirror-symmetric
 * about it.
 */
import { dbToPower, enbwBins, powerToDb, windowCoefficients, type WelchPsd, type WindowName } from "../dsp/index.js";

/** The result of detectDcSpike. levelDbfs and widthHz describe the core even when not present. */
export interface DcSpike {
  readonly present: boolean;
  /** Power of the core above the local level, Σ (PSD − local)·Δf, dBFS. */
  readonly levelDbfs: number;
  /** Contiguous bins around DC more than 3 dB above the local level, times the bin width, Hz. */
  readonly widthHz: number;
  /** Centred index range [first, last] of the core bins. */
  readonly coreBins: readonly [number, number];
  /** The local level beside the core (median of the guard bins, at least the floor), FS²/Hz. */
  readonly localDensityPerHz: number;
}

/** Options of detectDcSpike, defaults in DC_SPIKE_DEFAULTS. */
export interface DcSpikeOptions {
  readonly thresholdDb?: number;
  readonly guardBins?: number;
  readonly symmetryDb?: number;
  readonly widthTolerance?: number;
  /** The capture's DC offset (pass-1 health), dBFS; not checked when absent. */
  readonly dcOffsetDbfs?: number | undefined;
  readonly healthToleranceDb?: number;
}

/** Defaults: 10 dB above floor and local level, 16 guard bins each side, 3 dB symmetry, 10 % width, 3 dB health. */
export const DC_SPIKE_DEFAULTS = { thresholdDb: 10, guardBins: 16, symmetryDb: 3, widthTolerance: 0.1, healthToleranceDb: 3 } as const;

/** Main-lobe half-width of the PSD's window, bins (Harris 1978 Table 1). */
export function mainLobeHalfWidthBins(psd: WelchPsd): number {
  return psd.window === "rectangular" ? 1 : psd.window === "hann" ? 2 : 4;
}

/** Largest equivalent width of a line, bins: ENBW times the scallop-loss factor |W(0)/W(½)|² (Harris 1978). */
export function lineWidthBoundBins(window: WindowName, fftLength: number): number {
  const w = windowCoefficients(window, fftLength);
  let s = 0;
  let re = 0;
  let im = 0;
  for (let k = 0; k < w.length; k++) {
    const v = w[k] as number;
    s += v;
    re += v * Math.cos((Math.PI * k) / w.length);
    im -= v * Math.sin((Math.PI * k) / w.length);
  }
  return enbwBins(w) * ((s * s) / (re * re + im * im));
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
  const local = Math.max(noiseFloorPerHz, guardMedian(p, first, last, o.guardBins));
  let excess = 0;
  let coreMax = 0;
  for (let i = first; i <= last; i++) {
    excess += Math.max(0, (p[i] as number) - local) * psd.binWidthHz;
    coreMax = Math.max(coreMax, p[i] as number);
  }
  const peak = p[dc] as number;
  const grow = local * dbToPower(3);
  let lo = dc;
  let hi = dc;
  if (peak > grow) {
    while (lo > first && (p[lo - 1] as number) > grow) lo--;
    while (hi < last && (p[hi + 1] as number) > grow) hi++;
  }
  const widthHz = peak > grow ? (hi - lo + 1) * psd.binWidthHz : 0;
  const strong = peak > local * dbToPower(o.thresholdDb) && peak >= coreMax;
  const left = (p[dc - 1] as number) - local;
  const right = (p[dc + 1] as number) - local;
  const symmetric = psd.window === "rectangular" || (left > 0 && right > 0 && Math.abs(powerToDb(left / right)) <= o.symmetryDb);
  const widthBins = excess / psd.binWidthHz / (peak - local);
  const narrow = widthBins <= lineWidthBoundBins(psd.window, n) * (1 + o.widthTolerance);
  const isMean = o.dcOffsetDbfs === undefined || Math.abs(powerToDb(excess) - o.dcOffsetDbfs) <= o.healthToleranceDb;
  return { present: strong && symmetric && narrow && isMean, levelDbfs: powerToDb(excess), widthHz, coreBins: [first, last], localDensityPerHz: local };
}

/** Median of the `count` bins on each side beyond [first, last] (those inside the array). */
function guardMedian(p: ArrayLike<number>, first: number, last: number, count: number): number {
  const v: number[] = [];
  for (let k = 1; k <= count; k++) {
    if (first - k >= 0) v.push(p[first - k] as number);
    if (last + k < p.length) v.push(p[last + k] as number);
  }
  if (v.length === 0) return 0;
  v.sort((a, b) => a - b);
  const m = v.length >> 1;
  return v.length % 2 === 1 ? (v[m] as number) : ((v[m - 1] as number) + (v[m] as number)) / 2;
}

/**
 * Removes a line of known frequency from a channel record (interleaved I,Q, in place): the
 * least-squares amplitude a = mean(z·e^(−j2πft)) of the tone e^(j2πft) is subtracted. Used for the
 * receiver DC line, which sits at −(channel offset) in the channel's baseband. Returns a, FS.
 * The estimate is unbiased by any other line more than a few 1/T away (T the record length).
 */
export function removeLine(iq: Float32Array, sampleRateHz: number, lineHz: number): { re: number; im: number } {
  const count = iq.length >> 1;
  if (count === 0) return { re: 0, im: 0 };
  const w = (2 * Math.PI * lineHz) / sampleRateHz;
  let sr = 0;
  let si = 0;
  for (let k = 0; k < count; k++) {
    const c = Math.cos(w * k);
    const s = Math.sin(w * k);
    const x = iq[2 * k] as number;
    const y = iq[2 * k + 1] as number;
    sr += x * c + y * s;
    si += y * c - x * s;
  }
  const re = sr / count;
  const im = si / count;
  for (let k = 0; k < count; k++) {
    const c = Math.cos(w * k);
    const s = Math.sin(w * k);
    iq[2 * k] = (iq[2 * k] as number) - (re * c - im * s);
    iq[2 * k + 1] = (iq[2 * k + 1] as number) - (re * s + im * c);
  }
  return { re, im };
}
