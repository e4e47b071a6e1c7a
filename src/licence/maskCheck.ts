/**
 * A spectral mask against a measured spectrum: every point of the max-hold (or average) spectrum
 * at the mask's resolution bandwidth, as a level relative to the mask's reference, against the
 * highest level the mask allows at that offset. The margin of a point is allowed − level (dB,
 * positive inside); the mask's result is its worst point, with the spans where the margin is
 * negative.
 *
 * Points whose reading is the measurement's own noise cannot show a limit below it: a point is
 * "not verifiable" when the mask allows less than the noise reading + 6 dB and the reading is
 * within 6 dB of the noise (common practice: a spectrum display confirms a limit only some dB
 * above its own noise; 6 dB keeps the noise's own spread out of the margin). Such points are left out of the decision and named; a reading well above the noise is
 * judged wherever it is.
 *
 * Offsets where the mask requires no attenuation (it allows 0 dB or more: the zone of mask D within
 * 5.625 kHz, a point mask's [0, 0]) are not judged either: the reference itself lies there (an
 * unmodulated moment of FM reads 0 dB at the carrier), so a margin there only restates it.
 */
import type { Mask } from "./masks.js";

/** The spectrum to judge, on the mask's frequency origin. */
export interface MaskSpectrum {
  /** Offsets from the mask's origin, Hz, ascending. */
  readonly offsetHz: ArrayLike<number>;
  /** Levels in the resolution bandwidth, dB relative to the reference. */
  readonly levelDb: ArrayLike<number>;
  /** When each point's level was reached, s from the span start (NaN where unknown). */
  readonly timeS: ArrayLike<number>;
  /** The noise's reading in the resolution bandwidth, dB relative to the reference (the same detector). */
  readonly noiseDb: number;
  /** |offset| up to which the spectrum is valid (the channel's passband), Hz. */
  readonly coveredHz: number;
}

export interface MaskPoint {
  readonly offsetHz: number;
  readonly levelDb: number;
  readonly allowedDb: number;
  readonly marginDb: number;
  readonly timeS: number | null;
}

export interface MaskSpan {
  readonly fromHz: number;
  readonly toHz: number;
  /** The worst margin inside the span, dB (negative). */
  readonly worstMarginDb: number;
}

export interface MaskResult {
  /** The point with the least margin among those judged, or null when none could be judged. */
  readonly worst: MaskPoint | null;
  /** Contiguous spans of judged points outside the mask (margin < 0). */
  readonly violations: readonly MaskSpan[];
  /** Contiguous spans left out as not verifiable (module comment). */
  readonly unverifiable: readonly MaskSpan[];
  readonly judgedPoints: number;
  /** Where the mask sets a limit beyond the covered offsets, the first such |offset|, Hz; else null. */
  readonly uncoveredFromHz: number | null;
  /** The allowed level at each offset (null where the mask sets none), for the figure. */
  readonly allowedDb: readonly (number | null)[];
}

/** A limit below the noise + this is not judged where the reading is the noise (module comment). */
const VERIFY_LIMIT_ABOVE_NOISE_DB = 6;
/** A reading within this of the noise is the noise. */
const READING_ABOVE_NOISE_DB = 6;

export function checkMask(mask: Mask, spectrum: MaskSpectrum): MaskResult {
  const n = spectrum.offsetHz.length;
  const allowed: (number | null)[] = new Array<number | null>(n).fill(null);
  const violations = new SpanBuilder();
  const unverifiable = new SpanBuilder();
  let worst: MaskPoint | null = null;
  let judged = 0;
  for (let i = 0; i < n; i++) {
    const f = spectrum.offsetHz[i] as number;
    const a = Math.abs(f) <= spectrum.coveredHz ? mask.allowedDb(Math.abs(f)) : null;
    allowed[i] = a;
    if (a === null || a >= 0) { violations.close(); unverifiable.close(); continue; }
    const level = spectrum.levelDb[i] as number;
    const margin = a - level;
    if (a < spectrum.noiseDb + VERIFY_LIMIT_ABOVE_NOISE_DB && level < spectrum.noiseDb + READING_ABOVE_NOISE_DB) {
      unverifiable.add(f, margin);
      violations.close();
      continue;
    }
    unverifiable.close();
    judged++;
    if (margin < 0) violations.add(f, margin); else violations.close();
    if (worst === null || margin < worst.marginDb) {
      const t = spectrum.timeS[i] as number;
      worst = { offsetHz: f, levelDb: level, allowedDb: a, marginDb: margin, timeS: Number.isNaN(t) ? null : t };
    }
  }
  violations.close();
  unverifiable.close();
  return {
    worst, violations: violations.spans, unverifiable: unverifiable.spans, judgedPoints: judged,
    uncoveredFromHz: firstUncoveredLimit(mask, spectrum.coveredHz), allowedDb: allowed,
  };
}

/** Collects runs of consecutive points into spans. */
class SpanBuilder {
  readonly spans: MaskSpan[] = [];
  private open: { fromHz: number; toHz: number; worst: number } | null = null;

  add(f: number, margin: number): void {
    if (this.open === null) this.open = { fromHz: f, toHz: f, worst: margin };
    else { this.open.toHz = f; this.open.worst = Math.min(this.open.worst, margin); }
  }

  close(): void {
    if (this.open !== null) this.spans.push({ fromHz: this.open.fromHz, toHz: this.open.toHz, worstMarginDb: this.open.worst });
    this.open = null;
  }
}

/** Whether the mask sets a limit beyond `coveredHz`: probed up to 10 × the covered offset (and 1 MHz). */
function firstUncoveredLimit(mask: Mask, coveredHz: number): number | null {
  const top = Math.max(10 * coveredHz, 1e6);
  for (let f = coveredHz * 1.001; f <= top; f *= 1.02) if (mask.allowedDb(f) !== null) return f;
  return null;
}
