/**
 * Symbol rate and symbol timing of a level-keyed record (the instantaneous frequency of an FSK
 * burst, say) from the instants where it crosses the thresholds between its levels. Made for
 * records cut into segments (the bursts of a bursty link, joined end to end), where the symbol
 * clock starts afresh in every segment and a spectral line of the whole record is smeared.
 *
 * Method:
 * 1. Crossings: for each threshold (midpoints between adjacent levels) the record crosses it
 *    with hysteresis of a quarter of the smallest level gap; the crossing instant is
 *    interpolated linearly between the two samples either side of the threshold.
 * 2. Coherence: every transition lies on the symbol grid t = t₀ + kT, so the phasors
 *    exp(j2π R t) of one segment add in phase at R = 1/T and its harmonics. The incoherent sum
 *    over segments, C(R) = Σ_s |Σ_i exp(j2πR t_i)|² / Σ_s n_s², is searched on a grid of step
 *    1/(8 D) (D the longest segment) from max(minBd, 4/D_median) to maxBd; the fundamental is
 *    the lowest local maximum within 0.7 of the highest (the harmonics of random data are as
 *    coherent as the fundamental; sub-multiples are not). This is the periodogram of a pulse at
 *    each transition, the transition-tracking form of the cyclostationary line (Gardner 1986).
 * 3. Refinement and uncertainty: each transition is numbered on its segment's grid, and
 *    T is the pooled least-squares slope of instant on number with a free intercept per segment.
 *    Standard error of the slope from the residuals (any regression text); the k = 2
 *    uncertainty of R = 1/T follows by propagation.
 */
import { measurement, notAvailable, type Measurement } from "./measurement.js";

export type Segments = readonly (readonly [number, number])[];

/** Rate, and per segment the sample index of one symbol boundary (null where none was seen). */
export interface TransitionTiming {
  readonly rateBd: Measurement<"Bd">;
  readonly boundaries: readonly (number | null)[];
  readonly transitions: number;
}

const METHOD = "symbol rate from the level transitions: coherence of the crossing instants per segment, then least-squares grid fit";

/**
 * Timing of `x` (one real value per sample at `fs`, e.g. the instantaneous frequency in Hz),
 * keyed between `levels` (ascending), inside `segments` (sample ranges of x).
 */
export function transitionTiming(
  x: ArrayLike<number>, fs: number, levels: readonly number[], segments: Segments, minBd: number, maxBd: number,
): TransitionTiming {
  const crossings = segments.map(([a, b]) => crossingsOf(x, a, b, levels));
  const transitions = crossings.reduce((s, c) => s + c.length, 0);
  const none = (why: string): TransitionTiming => ({ rateBd: notAvailable("Bd", METHOD, why), boundaries: segments.map(() => null), transitions });
  if (transitions < 8) return none(`${transitions} level transitions are too few for a symbol rate`);
  const lengths = segments.map(([a, b]) => (b - a) / fs).sort((p, q) => p - q);
  const longest = lengths[lengths.length - 1] as number;
  const median = lengths[lengths.length >> 1] as number;
  const lo = Math.max(minBd, 4 / median);
  const hi = Math.min(maxBd, fs / 2);
  if (!(hi > lo)) return none(`segments of ${(median * 1e3).toFixed(1)} ms are too short for a rate search`);
  const coarse = coarseRate(crossings, fs, lo, hi, 1 / (8 * longest));
  if (coarse === null) return none("no symbol grid is coherent across the transitions");
  return gridFit(crossings, fs, coarse, transitions);
}

/** Crossing instants (fractional sample index) of the thresholds between `levels` in x[a, b). */
function crossingsOf(x: ArrayLike<number>, a: number, b: number, levels: readonly number[]): number[] {
  const out: number[] = [];
  let minGap = Infinity;
  for (let j = 1; j < levels.length; j++) minGap = Math.min(minGap, (levels[j] as number) - (levels[j - 1] as number));
  const h = 0.25 * minGap;
  for (let j = 1; j < levels.length; j++) {
    const th = ((levels[j] as number) + (levels[j - 1] as number)) / 2;
    let state = 0;
    let last = -1;
    for (let i = a; i < b; i++) {
      const v = x[i] as number;
      if (i > a) {
        const p = x[i - 1] as number;
        if ((p - th) * (v - th) < 0 || v === th) last = i - 1 + (th - p) / (v - p || 1);
      }
      const s = v > th + h ? 1 : v < th - h ? -1 : 0;
      if (s !== 0 && s !== state) {
        if (state !== 0 && last >= 0) out.push(last);
        state = s;
      }
    }
  }
  return out.sort((p, q) => p - q);
}

function coherence(crossings: readonly number[][], fs: number, rateBd: number): number {
  let num = 0;
  let den = 0;
  const w = (2 * Math.PI * rateBd) / fs;
  for (const c of crossings) {
    let re = 0;
    let im = 0;
    for (const t of c) { re += Math.cos(w * t); im += Math.sin(w * t); }
    num += re * re + im * im;
    den += c.length * c.length;
  }
  return den > 0 ? num / den : 0;
}

/** The fundamental of the coherence on the grid (module comment, step 2), refined by a parabola. */
function coarseRate(crossings: readonly number[][], fs: number, lo: number, hi: number, step: number): number | null {
  const count = Math.min(200_000, Math.ceil((hi - lo) / step) + 1);
  const d = (hi - lo) / Math.max(1, count - 1);
  const c = new Float64Array(count);
  let max = 0;
  for (let i = 0; i < count; i++) { c[i] = coherence(crossings, fs, lo + i * d); max = Math.max(max, c[i] as number); }
  if (!(max > 0)) return null;
  for (let i = 1; i + 1 < count; i++) {
    const v = c[i] as number;
    if (v >= 0.7 * max && v >= (c[i - 1] as number) && v >= (c[i + 1] as number)) {
      const a = c[i - 1] as number;
      const b = c[i + 1] as number;
      const den = a - 2 * v + b;
      return lo + (i + (den < 0 ? (0.5 * (a - b)) / den : 0)) * d;
    }
  }
  return null;
}

/** Pooled least-squares fit of the transition instants to one grid per segment (module comment, step 3). */
function gridFit(crossings: readonly number[][], fs: number, rateBd: number, transitions: number): TransitionTiming {
  let period = fs / rateBd;
  const boundaries: (number | null)[] = [];
  let sxx = 0;
  let sxy = 0;
  const fits: { n: number[]; t: number[] }[] = [];
  for (const c of crossings) {
    if (c.length === 0) { fits.push({ n: [], t: [] }); continue; }
    const w = (2 * Math.PI) / period;
    let re = 0;
    let im = 0;
    for (const t of c) { re += Math.cos(w * t); im += Math.sin(w * t); }
    const phase = Math.atan2(im, re);
    const origin = (phase / (2 * Math.PI)) * period;
    const n = c.map((t) => Math.round((t - origin) / period));
    fits.push({ n, t: c });
    const nm = mean(n);
    const tm = mean(c);
    for (let i = 0; i < c.length; i++) { sxx += ((n[i] as number) - nm) ** 2; sxy += ((n[i] as number) - nm) * ((c[i] as number) - tm); }
  }
  if (sxx > 0) period = sxy / sxx;
  let ss = 0;
  for (const { n, t } of fits) {
    if (t.length === 0) continue;
    const nm = mean(n);
    const tm = mean(t);
    for (let i = 0; i < t.length; i++) ss += ((t[i] as number) - tm - period * ((n[i] as number) - nm)) ** 2;
  }
  const used = fits.filter((f) => f.t.length > 0).length;
  const dof = Math.max(1, transitions - used - 1);
  const sePeriod = sxx > 0 ? Math.sqrt(ss / dof / sxx) : period;
  // Per segment, in order: the intercept of its grid (a boundary instant), null without transitions.
  for (const { n, t } of fits) boundaries.push(t.length === 0 ? null : mean(t) - period * mean(n));
  const rate = fs / period;
  // A floor of 1e-6 relative keeps a noiseless record from stating an uncertainty of zero.
  const u = Math.max(2 * rate * (sePeriod / period), 1e-6 * rate);
  return {
    rateBd: measurement(rate, "Bd", u, `${METHOD} (${transitions} transitions in ${used} segments)`),
    boundaries,
    transitions,
  };
}

function mean(v: readonly number[]): number {
  let s = 0;
  for (const x of v) s += x;
  return v.length > 0 ? s / v.length : 0;
}
