/**
 * Health figures of a capture from its first and second moments, streamed over blocks and
 * mergeable across workers.
 *
 * With z = I + jQ, means μ_I, μ_Q and, on the DC-removed signal, the population moments
 * a = E[(I−μ_I)²], b = E[(Q−μ_Q)²], c = E[(I−μ_I)(Q−μ_Q)]:
 * - DC offset: 10·log10(μ_I² + μ_Q²) dBFS; mean power: 10·log10(E|z|²) = 10·log10(a + b + μ_I² + μ_Q²) dBFS
 *   (0 dBFS = a full-scale complex tone, interface.md).
 * - IQ imbalance, for the model I' = x, Q' = g·(y·cos φ + x·sin φ) of a circular signal x + jy
 *   (E x² = E y², E xy = 0): b/a = g² and c/√(ab) = sin φ. So
 *   gain imbalance = 20·log10 g = 10·log10(b/a) dB, Q relative to I (positive: Q larger);
 *   phase imbalance φ = asin(c/√(ab)) in degrees (positive: Q' leans towards +I, so the angle from
 *   I to Q is 90° − φ for a tone; a tone cos ωt + j·g·sin(ωt + φ)).
 * - Image rejection ratio of that g and φ (Razavi, RF Microelectronics, 2nd ed., §4.2 on image
 *   rejection with gain and phase mismatch; equation recalled from memory, and re-derived from
 *   the model above: a tone e^(jωt) becomes ½[(1 + g·e^(jφ))e^(jωt) + (1 − g·e^(−jφ))e^(−jωt)]):
 *   IRR = (1 + 2g·cos φ + g²) / (1 − 2g·cos φ + g²), the denominator evaluated as
 *   (1 − g)² + 4g·sin²(φ/2) to avoid cancellation.
 * Limit: the imbalance figures assume the wanted signal is circular (noise-like, many tones, or
 * one complex tone over many periods). A real signal, or an improper modulation such as BPSK or
 * AM on a carrier at DC, shows a "phase/gain imbalance" that is the signal's own, not the mixer's.
 * Only samples at index ≥ ownedStart count (frameGrid.ts contract). Blocks are reduced to their
 * own mean and centred sums, then combined by the pairwise update of Chan, Golub & LeVeque
 * (1979, "Updating formulae and a pairwise algorithm for computing sample variances"), which stays
 * accurate for long captures with a large DC offset.
 */
import { powerToDb, DB_CEILING, DB_FLOOR } from "./db.js";
import { kernelMoments } from "./fft.js";
import { checkBlock } from "./frameGrid.js";

/** The health figures of interface.md's `quality` section (the noise floor comes from noiseFloor.ts). */
export interface HealthFigures {
  /** Complex samples counted. */
  readonly samples: number;
  /** Clipped components over all components (2 per complex sample), %. */
  readonly clippingPercent: number;
  /** Samples with a NaN or infinite component (decoded as 0). */
  readonly nonFiniteSamples: number;
  readonly dcOffsetDbfs: number;
  readonly meanPowerDbfs: number;
  /** 10·log10(var Q / var I), dB. */
  readonly iqGainImbalanceDb: number;
  /** asin(cov(I,Q)/√(var I·var Q)), degrees. */
  readonly iqPhaseImbalanceDeg: number;
  /** Image rejection ratio implied by the gain and phase imbalance, dB (capped at DB_CEILING). */
  readonly imageRejectionDb: number;
}

/** The accumulator's state: plain numbers, structured-cloneable. Moments are centred sums. */
export interface HealthState {
  readonly samples: number;
  readonly meanI: number;
  readonly meanQ: number;
  /** Σ(I − μ_I)². */
  readonly sumSqI: number;
  /** Σ(Q − μ_Q)². */
  readonly sumSqQ: number;
  /** Σ(I − μ_I)(Q − μ_Q). */
  readonly sumIQ: number;
  readonly clippedComponents: number;
  readonly nonFiniteSamples: number;
}

const EMPTY: HealthState = {
  samples: 0, meanI: 0, meanQ: 0, sumSqI: 0, sumSqQ: 0, sumIQ: 0, clippedComponents: 0, nonFiniteSamples: 0,
};

/** Streams blocks into the health figures: `push`, `addDecodeCounts`, `snapshot`/`merge`, `finish`. */
export class HealthAccumulator {
  private state: HealthState = EMPTY;

  /** Adds the samples of the block at index ≥ ownedStart. `iq` is interleaved I,Q. */
  push(iq: Float32Array, dataStart: number, ownedStart: number = dataStart): void {
    const n = checkBlock(iq, dataStart, ownedStart);
    const first = ownedStart - dataStart;
    if (first >= n) return;
    this.merge(blockMoments(iq, first, n));
  }

  /** Adds the decoder's counts for one block (clipped components count I and Q separately). */
  addDecodeCounts(counts: { readonly clippedComponents: number; readonly nonFiniteSamples: number }): void {
    const s = this.state;
    this.state = {
      ...s,
      clippedComponents: s.clippedComponents + counts.clippedComponents,
      nonFiniteSamples: s.nonFiniteSamples + counts.nonFiniteSamples,
    };
  }

  /** The state, for postMessage to the merging side. */
  snapshot(): HealthState {
    return { ...this.state };
  }

  /** Adds another accumulator's state (Chan, Golub & LeVeque 1979, pairwise update). */
  merge(other: HealthState): void {
    this.state = combine(this.state, other);
  }

  /** The figures of everything pushed and merged so far. */
  finish(): HealthFigures {
    return healthFigures(this.state);
  }
}

/**
 * Mean and centred sums of complex samples first..n−1 of `iq`, in two passes: by the SIMD
 * kernel when `iq` lies in the fast engine's memory (fft.ts, kernelMoments: one pass on the data
 * shifted by its first sample, equal to these to rounding), else here.
 */
function blockMoments(iq: Float32Array, first: number, n: number): HealthState {
  const m = kernelMoments(iq, first, n);
  if (m !== null) {
    return {
      samples: n - first, meanI: m[0] as number, meanQ: m[1] as number, sumSqI: m[2] as number, sumSqQ: m[3] as number,
      sumIQ: m[4] as number, clippedComponents: 0, nonFiniteSamples: 0,
    };
  }
  let si = 0;
  let sq = 0;
  for (let j = 2 * first; j < 2 * n; j += 2) {
    si += iq[j] as number;
    sq += iq[j + 1] as number;
  }
  const count = n - first;
  const mi = si / count;
  const mq = sq / count;
  let sii = 0;
  let sqq = 0;
  let siq = 0;
  for (let j = 2 * first; j < 2 * n; j += 2) {
    const di = (iq[j] as number) - mi;
    const dq = (iq[j + 1] as number) - mq;
    sii += di * di;
    sqq += dq * dq;
    siq += di * dq;
  }
  return { samples: count, meanI: mi, meanQ: mq, sumSqI: sii, sumSqQ: sqq, sumIQ: siq, clippedComponents: 0, nonFiniteSamples: 0 };
}

function combine(a: HealthState, b: HealthState): HealthState {
  const n = a.samples + b.samples;
  const counts = {
    clippedComponents: a.clippedComponents + b.clippedComponents,
    nonFiniteSamples: a.nonFiniteSamples + b.nonFiniteSamples,
  };
  if (a.samples === 0) return { ...b, ...counts };
  if (b.samples === 0) return { ...a, ...counts };
  const di = b.meanI - a.meanI;
  const dq = b.meanQ - a.meanQ;
  const w = (a.samples * b.samples) / n;
  return {
    samples: n,
    meanI: a.meanI + (di * b.samples) / n,
    meanQ: a.meanQ + (dq * b.samples) / n,
    sumSqI: a.sumSqI + b.sumSqI + di * di * w,
    sumSqQ: a.sumSqQ + b.sumSqQ + dq * dq * w,
    sumIQ: a.sumIQ + b.sumIQ + di * dq * w,
    ...counts,
  };
}

/**
 * The figures of a state (formulas in the module comment). Degenerate cases stay finite: with
 * no samples, or zero variance on both branches (a constant signal), the figures are those of a
 * balanced pair (0 dB, 0°, image rejection DB_CEILING) and the powers are floored at DB_FLOOR; with
 * zero variance on one branch only (a real capture has Q = 0) the gain imbalance is clamped to
 * DB_FLOOR or DB_CEILING, the phase is 0 and the image rejection is that of g = 0 or ∞, i.e. 0 dB.
 */
export function healthFigures(s: HealthState): HealthFigures {
  const n = s.samples;
  const base = {
    samples: n,
    clippingPercent: n > 0 ? (100 * s.clippedComponents) / (2 * n) : 0,
    nonFiniteSamples: s.nonFiniteSamples,
  };
  if (n === 0) {
    return { ...base, dcOffsetDbfs: DB_FLOOR, meanPowerDbfs: DB_FLOOR, iqGainImbalanceDb: 0, iqPhaseImbalanceDeg: 0, imageRejectionDb: DB_CEILING };
  }
  const dcPower = s.meanI * s.meanI + s.meanQ * s.meanQ;
  const a = s.sumSqI / n;
  const b = s.sumSqQ / n;
  const c = s.sumIQ / n;
  let gainDb: number;
  let phaseRad: number;
  let irrDb: number;
  if (a > 0 && b > 0) {
    const g = Math.sqrt(b / a);
    phaseRad = Math.asin(Math.max(-1, Math.min(1, c / Math.sqrt(a * b))));
    gainDb = 20 * Math.log10(g);
    irrDb = imageRejectionRatioDb(g, phaseRad);
  } else {
    gainDb = a === b ? 0 : a > b ? DB_FLOOR : DB_CEILING;
    phaseRad = 0;
    irrDb = a === b ? DB_CEILING : 0;
  }
  return {
    ...base,
    dcOffsetDbfs: powerToDb(dcPower),
    meanPowerDbfs: powerToDb(a + b + dcPower),
    iqGainImbalanceDb: gainDb,
    iqPhaseImbalanceDeg: (phaseRad * 180) / Math.PI,
    imageRejectionDb: irrDb,
  };
}

/**
 * Image rejection ratio, dB, of a quadrature pair with amplitude ratio g (Q over I, linear) and
 * phase error φ (rad): 10·log10[(1 + 2g·cos φ + g²) / (1 − 2g·cos φ + g²)] (Razavi, RF
 * Microelectronics, §4.2; from memory, re-derived in the module comment). Capped at DB_CEILING.
 */
export function imageRejectionRatioDb(g: number, phaseRad: number): number {
  const sinHalf = Math.sin(phaseRad / 2);
  const wanted = (1 + g) * (1 + g) - 4 * g * sinHalf * sinHalf;
  const image = (1 - g) * (1 - g) + 4 * g * sinHalf * sinHalf;
  return powerToDb(wanted / image);
}
