/**
 * When an emission is on, and how strong, from the spectrogram rows over its bins.
 *
 * Row power P_r = Σ_b (row mean − floor_b)·Δf over the emission's bins (FS², unbiased for noise).
 * The power while on, P_on, is the mean of P_r over the rows that are on with both neighbours on
 * (whole rows inside a burst), or over all on rows when no burst is three rows long. A row at a
 * burst's edge is on for the share f_r = P_r/P_on of its time, clamped to [0, 1] (the row mean is
 * the time average of the frames' power; Parseval), so a burst of on rows a … z, with rows a − 1
 * and z + 1 beside it, starts at rowStop_a − f_a·d_a − f_(a−1)·d_(a−1) and ends at
 * rowStart_z + f_z·d_z + f_(z+1)·d_(z+1) (d the row durations). Each run of consecutive on rows is
 * a burst; the duty cycle is their summed length over the emission's span. The peak is the largest
 * P_r of an on row (a row's power is the mean over its frames: "any time slice" is one row).
 */
import type { Spectrogram } from "../dsp/index.js";

/** The emission's bursts and levels, linear powers in FS². */
export interface BurstTiming {
  readonly startS: number;
  readonly endS: number;
  readonly burstCount: number;
  readonly dutyCyclePercent: number;
  readonly onPower: number;
  /** Rows averaged into onPower. */
  readonly onRowCount: number;
  readonly peakPower: number;
}

/** Bursts and levels of the emission on bins binFirst … binLast in the rows marked in onRows (module comment). */
export function burstTiming(
  s: Spectrogram,
  floorPerHz: Float64Array,
  binFirst: number,
  binLast: number,
  onRows: Uint8Array,
): BurstTiming {
  const rows = s.rowCount;
  const power = rowPowers(s, floorPerHz, binFirst, binLast);
  const on = (r: number): boolean => r >= 0 && r < rows && onRows[r] === 1;
  const { onPower, onRowCount } = meanOnPower(power, rows, on);
  const share = (r: number): number => (r < 0 || r >= rows || !(onPower > 0) ? 0 : Math.min(1, Math.max(0, (power[r] as number) / onPower)));
  const duration = (r: number): number => (r < 0 || r >= rows ? 0 : (s.rowStopS[r] as number) - (s.rowStartS[r] as number));
  let startS = Infinity;
  let endS = -Infinity;
  let onS = 0;
  let bursts = 0;
  let peakPower = 0;
  for (let r = 0; r < rows; r++) {
    if (!on(r)) continue;
    peakPower = Math.max(peakPower, power[r] as number);
    if (on(r - 1)) continue;
    let z = r;
    while (on(z + 1)) z++;
    const start = (s.rowStopS[r] as number) - share(r) * duration(r) - share(r - 1) * duration(r - 1);
    const end = (s.rowStartS[z] as number) + share(z) * duration(z) + share(z + 1) * duration(z + 1);
    startS = Math.min(startS, start);
    endS = Math.max(endS, end);
    onS += Math.max(0, end - start);
    bursts++;
  }
  const spanS = endS - startS;
  return { startS, endS, burstCount: bursts, dutyCyclePercent: spanS > 0 ? Math.min(100, (100 * onS) / spanS) : 100, onPower, onRowCount, peakPower };
}

/** P_r for every row (0 for a row of no frame). */
function rowPowers(s: Spectrogram, floorPerHz: Float64Array, binFirst: number, binLast: number): Float64Array {
  const n = s.fftLength;
  const power = new Float64Array(s.rowCount);
  for (let r = 0; r < s.rowCount; r++) {
    if ((s.framesPerRow[r] as number) === 0) continue;
    let sum = 0;
    for (let b = binFirst; b <= binLast; b++) sum += (s.meanPerHz[r * n + b] as number) - (floorPerHz[b] as number);
    power[r] = sum * s.binWidthHz;
  }
  return power;
}

/** P_on: the mean power of whole rows inside bursts, else of all on rows. */
function meanOnPower(power: Float64Array, rows: number, on: (r: number) => boolean): { onPower: number; onRowCount: number } {
  let inner = 0;
  let innerCount = 0;
  let all = 0;
  let allCount = 0;
  for (let r = 0; r < rows; r++) {
    if (!on(r)) continue;
    all += power[r] as number;
    allCount++;
    if (on(r - 1) && on(r + 1)) {
      inner += power[r] as number;
      innerCount++;
    }
  }
  if (innerCount > 0) return { onPower: inner / innerCount, onRowCount: innerCount };
  return { onPower: allCount > 0 ? all / allCount : 0, onRowCount: allCount };
}
