/**
 * Keyed signals: NRZ data levels (for 2-FSK through `fmFromAudio`), on-off keying, and a
 * periodic burst gate with raised-cosine edges (burst telemetry). Pure functions of the sample
 * index, so captures can be built block by block.
 */
import { requirePositive } from "./checks.js";

/**
 * NRZ levels of `bits` (1 → +1, 0 → −1), bit j occupying [firstBitS + j/Rb, firstBitS + (j+1)/Rb),
 * and 0 outside the sequence; for n = startSample … startSample+count−1 at t = n/fs.
 * Fed to `fmFromAudio` with deviationHz = shift/2 this is continuous-phase 2-FSK with tones at
 * ±shift/2 and modulation index h = shift/Rb (REFERENCES.md §2, F1B/F1D: D = shift/2).
 */
export function nrzLevels(
  bits: ArrayLike<number>,
  bitRateBd: number,
  sampleRateHz: number,
  startSample: number,
  count: number,
  firstBitS = 0,
): Float64Array {
  requirePositive("bitRateBd", bitRateBd);
  requirePositive("sampleRateHz", sampleRateHz);
  const out = new Float64Array(count);
  for (let n = 0; n < count; n++) {
    const j = Math.floor(((startSample + n) / sampleRateHz - firstBitS) * bitRateBd);
    if (j >= 0 && j < bits.length) out[n] = bits[j] ? 1 : -1;
  }
  return out;
}

/**
 * On-off keying at complex baseband: I = 1 while the current bit is 1, 0 for a 0 bit and outside
 * the sequence; Q = 0 (rectangular keying, class A1D). Timing as in `nrzLevels`.
 */
export function ookFromBits(
  bits: ArrayLike<number>,
  bitRateBd: number,
  sampleRateHz: number,
  startSample: number,
  count: number,
  firstBitS = 0,
): Float64Array {
  const levels = nrzLevels(bits, bitRateBd, sampleRateHz, startSample, count, firstBitS);
  const out = new Float64Array(2 * count);
  for (let n = 0; n < count; n++) out[2 * n] = levels[n] === 1 ? 1 : 0;
  return out;
}

/** A periodic burst schedule: burst k is on during [firstStartS + k·periodS, … + onS). */
export interface BurstSchedule {
  readonly periodS: number;
  readonly onS: number;
  readonly firstStartS: number;
  /** Raised-cosine edge length, s, centred on each nominal edge (gate = 0.5 there). Default 0. */
  readonly rampS?: number;
}

/** Duty cycle of a schedule in percent: 100·onS/periodS (the fraction of time on). */
export function dutyCyclePercent(schedule: BurstSchedule): number {
  return (100 * schedule.onS) / schedule.periodS;
}

/** Start time, s, of burst k of `schedule`. */
export function burstStartS(schedule: BurstSchedule, k: number): number {
  return schedule.firstStartS + k * schedule.periodS;
}

/**
 * The gate of a burst schedule, in [0, 1], for n = startSample … startSample+count−1 at t = n/fs:
 * 1 inside a burst, 0 between bursts (and before firstStartS), with edges
 * g = ½(1 + sin(π·u/rampS)) for |u| < rampS/2 around each nominal edge. Because the edges are
 * odd-symmetric about the nominal edge, the time with g ≥ ½ is exactly onS per burst.
 */
export function burstGate(startSample: number, count: number, sampleRateHz: number, schedule: BurstSchedule): Float64Array {
  requirePositive("sampleRateHz", sampleRateHz);
  requirePositive("periodS", schedule.periodS);
  requirePositive("onS", schedule.onS);
  const ramp = schedule.rampS ?? 0;
  const out = new Float64Array(count);
  for (let n = 0; n < count; n++) {
    const t = (startSample + n) / sampleRateHz - schedule.firstStartS;
    // Nearest burst start at or before t + ramp/2 (a rising edge's ramp begins before the edge).
    const k = Math.floor((t + ramp / 2) / schedule.periodS);
    if (k < 0) continue;
    const u = t - k * schedule.periodS;
    out[n] = edge(u, ramp) * edge(schedule.onS - u, ramp);
  }
  return out;
}

function edge(u: number, ramp: number): number {
  if (ramp <= 0) return u >= 0 ? 1 : 0;
  if (u <= -ramp / 2) return 0;
  if (u >= ramp / 2) return 1;
  return 0.5 * (1 + Math.sin((Math.PI * u) / ramp));
}
