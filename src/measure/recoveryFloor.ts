/**
 * The recovery's own EVM floor: the EVM that recoverSymbols reads on an ideal, noiseless record
 * of the same constellation, samples a symbol and roll-off. Whatever the recovery leaves
 * (timing and phase estimation self-noise, the truncated matched filter, interpolation) shows up
 * there; on a real record it adds in power to the emission's own error vector, so the EVM read
 * is high by at most √(EVM² + F²) − EVM ≤ F²/(2·EVM) (a one-sided bias, stated in the
 * uncertainty, not removed from the figure).
 *
 * The ideal record: as many random points as the real record holds of the constellation (a fixed seed) shaped by a
 * root-raised-cosine pulse spanning ±PULSE_HALF_SPAN symbols, evaluated at the real sample
 * instants n/sps, so any ratio fs/Rs is exact (a pulse that long leaves inter-symbol
 * interference far below the floors measured, near −50 dB).
 */
import { constellation, rootRaisedCosine, type ConstellationKind } from "../dsp/index.js";
import { recoverSymbols } from "./pskQamRecovery.js";

/** Fewest symbols of the ideal record (the estimators' self-noise falls with the record's length). */
const MIN_FLOOR_SYMBOLS = 2048;
/** Half-span of the transmit pulse, symbols. */
const PULSE_HALF_SPAN = 32;

/**
 * The EVM, %, that recoverSymbols reads on an ideal record of `kind` at `samplesPerSymbol` and
 * `rollOff`, as long as the real record's `symbolCount` symbols (at least MIN_FLOOR_SYMBOLS).
 */
export function recoveryFloorPercent(kind: ConstellationKind, samplesPerSymbol: number, rollOff: number, symbolCount: number): number {
  const iq = idealRecord(kind, samplesPerSymbol, rollOff, Math.max(MIN_FLOOR_SYMBOLS, Math.round(symbolCount)));
  const r = recoverSymbols(iq, samplesPerSymbol, { symbolRateBd: 1, rollOff, order: { kind } });
  return r.evm.evmRmsPercent.value ?? 0;
}

function idealRecord(kind: ConstellationKind, sps: number, rollOff: number, symbolCount: number): Float32Array {
  const points = constellation(kind);
  const m = points.length >> 1;
  // A fixed linear congruential sequence (Numerical Recipes' constants): the same record every run.
  let state = 12345;
  const symbols = new Int32Array(symbolCount);
  for (let k = 0; k < symbolCount; k++) {
    state = (Math.imul(state, 1664525) + 1013904223) >>> 0;
    symbols[k] = Math.floor((state / 2 ** 32) * m);
  }
  const n = Math.floor(symbolCount * sps);
  const out = new Float32Array(2 * n);
  for (let i = 0; i < n; i++) {
    const t = i / sps;
    const lo = Math.max(0, Math.ceil(t - PULSE_HALF_SPAN));
    const hi = Math.min(symbolCount - 1, Math.floor(t + PULSE_HALF_SPAN));
    let re = 0;
    let im = 0;
    for (let k = lo; k <= hi; k++) {
      const h = rootRaisedCosine(t - k, rollOff);
      const s = symbols[k] as number;
      re += h * (points[2 * s] as number);
      im += h * (points[2 * s + 1] as number);
    }
    out[2 * i] = re;
    out[2 * i + 1] = im;
  }
  return out;
}
