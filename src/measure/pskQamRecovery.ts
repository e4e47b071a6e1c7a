/**
 * PSK/QAM symbol recovery from a decimated channel at a known symbol rate and roll-off:
 *
 * 1. RRC matched filter at the sample rate (rootRaisedCosineTaps, any real fs/Rs);
 * 2. feed-forward timing, per block of symbols (Oerder & Meyr 1988, symbolTiming.ts), symbols
 *    taken by cubic Farrow interpolation (matchedFilter.ts);
 * 3. carrier frequency and phase from the M-th power line of the symbols (carrierRecovery.ts);
 *    the frequency is then removed from the samples before the matched filter and the symbols are
 *    taken again (so that the filter is matched), and the residual frequency and phase estimated;
 * 4. decision-directed second-order phase tracking, gain normalised by least squares against the
 *    decisions to the reference constellation's RMS (unit mean energy);
 * 5. EVM/MER against the decisions (evm.ts).
 * When `order` is not given every kind in RECOVERY_DEFAULTS.kinds is tried from step 3 on and the
 * most likely is kept (bestConstellation).
 *
 * Memory: the record is read in place (no copy at the input rate). The timing needs |y|² of the
 * matched filter (one double a sample); the symbols are then filtered only at the four samples
 * around each instant that the interpolation reads, the frequency-shifted record as the output of
 * shifted taps (matchedFilter.ts, filteredAt), so no shifted copy of the record is made. One
 * padded transform of ≥ 4·K points serves every carrier estimate. At most maxSymbols symbols
 * (K ≤ 2^15 by default) are recovered: 16·K bytes a symbol array (512 KiB), 16·4·K bytes for the
 * transform, done in place (2 MiB), 8 bytes an input sample for |y|² (K·sps samples).
 */
import { CONSTELLATION_KINDS, rootRaisedCosineTaps, type ConstellationKind } from "../dsp/index.js";
import { derotate, lineTransform, powerLineCarrier, trackPhase, type LineTransform } from "./carrierRecovery.js";
import { bestConstellation, evmFigures, normaliseGain, type EvmFigures } from "./evm.js";
import { filteredAt, matchedFilterPower } from "./matchedFilter.js";
import { measurement, type Measurement } from "./measurement.js";
import { symbolInstants } from "./symbolTiming.js";

/** Options of recoverSymbols. */
export interface RecoveryOptions {
  readonly symbolRateBd: number;
  /** RRC roll-off α ∈ (0, 1]; default 0.35. */
  readonly rollOff?: number;
  /** The constellation, when known; else every kind of RECOVERY_DEFAULTS.kinds is tried. */
  readonly order?: { readonly kind: ConstellationKind };
  /** At most this many symbols are recovered (from the start). Default 2^15 = 32 768: EVM to
   * ±EVM/181 (k = 2, evm.ts), and the recovery's arrays bounded whatever the record's length. */
  readonly maxSymbols?: number;
}

/** Defaults of recoverSymbols. */
export const RECOVERY_DEFAULTS = {
  rollOff: 0.35, maxSymbols: 1 << 15, spanSymbols: 32, blockSymbols: 256, loopBandwidth: 0.002,
  kinds: CONSTELLATION_KINDS,
} as const;

/** What recoverSymbols hands back. */
export interface Recovered {
  readonly kind: ConstellationKind;
  /** Recovered symbols, unit-RMS reference scale, interleaved I,Q. */
  readonly symbols: Float64Array;
  /** The decided ideal point of each symbol, interleaved I,Q. */
  readonly ideal: Float64Array;
  /** Carrier frequency error of the channel, Hz (offset of the emission from 0 Hz). */
  readonly frequencyErrorHz: Measurement<"Hz">;
  /** Carrier phase at the middle symbol, rad, modulo 2π/M of the constellation's symmetry. */
  readonly phaseRad: Measurement<"Rad">;
  readonly evm: EvmFigures;
  readonly warnings: readonly string[];
}

/**
 * Symbols of the RRC-shaped PSK/QAM emission in `iq` (interleaved I,Q at `sampleRateHz`, the
 * emission near 0 Hz); module comment for the steps. Throws RangeError for bad parameters or
 * fewer than 64 symbols in the record.
 */
export function recoverSymbols(iq: Float32Array | Float64Array, sampleRateHz: number, options: RecoveryOptions): Recovered {
  const rs = options.symbolRateBd;
  const alpha = options.rollOff ?? RECOVERY_DEFAULTS.rollOff;
  if (!(sampleRateHz > 0) || !Number.isFinite(sampleRateHz)) throw new RangeError(`sampleRateHz ${sampleRateHz} is not a positive finite rate`);
  if (!(rs > 0) || !Number.isFinite(rs)) throw new RangeError(`symbolRateBd ${rs} is not a positive finite rate`);
  if (!(alpha > 0 && alpha <= 1)) throw new RangeError(`rollOff ${alpha} must lie in (0, 1]`);
  const sps = sampleRateHz / rs;
  if (!(sps >= 2)) throw new RangeError(`${sps.toFixed(2)} samples per symbol are too few (at least 2)`);
  const maxSymbols = options.maxSymbols ?? RECOVERY_DEFAULTS.maxSymbols;
  if (!(maxSymbols >= 64)) throw new RangeError(`maxSymbols ${maxSymbols} must be at least 64`);
  const span = RECOVERY_DEFAULTS.spanSymbols;
  const n = Math.min(iq.length >> 1, Math.ceil((maxSymbols + span + 2) * sps));
  const x = iq.subarray(0, 2 * n);
  const taps = rootRaisedCosineTaps(sps, alpha, span);
  const margin = (taps.length - 1) / 2 + 2;
  const warnings: string[] = [];
  if (sps < 2 + alpha) warnings.push(`${sps.toFixed(2)} samples per symbol: the timing line of |y|² aliases below 2 + α`);

  let times = symbolInstants(matchedFilterPower(x, taps), sps, RECOVERY_DEFAULTS.blockSymbols, margin);
  if (times.length > maxSymbols) times = times.subarray(0, maxSymbols);
  if (times.length < 64) throw new RangeError(`the record holds ${times.length} whole symbols; at least 64 are needed`);
  const raw = filteredAt(x, taps, times);
  const kinds: readonly ConstellationKind[] = options.order ? [options.order.kind] : RECOVERY_DEFAULTS.kinds;
  const transform = lineTransform(times.length);
  if (kinds.length === 1) return recoverKind(x, times, raw, taps, kinds[0] as ConstellationKind, rs, sps, warnings, transform);
  // Only the most likely candidate so far is kept.
  let best: Recovered | null = null;
  let bestLl = -Infinity;
  for (const kind of kinds) {
    const c = recoverKind(x, times, raw, taps, kind, rs, sps, warnings, transform);
    const ll = bestConstellation(c.symbols, [c.kind]).scores[0]?.logLikelihood ?? -Infinity;
    if (best === null || ll > bestLl + 1e-3) { bestLl = ll; best = c; }
  }
  return best as Recovered;
}

/** Steps 3–5 for one constellation. */
function recoverKind(
  x: Float32Array | Float64Array, times: Float64Array, raw: Float64Array, taps: Float64Array,
  kind: ConstellationKind, rs: number, sps: number, baseWarnings: readonly string[], transform: LineTransform,
): Recovered {
  const warnings = [...baseWarnings];
  const coarse = powerLineCarrier(normaliseGain(raw, kind).symbols, kind, transform);
  // Remove the coarse frequency from the samples, filter and sample again (at the instants only).
  const second = filteredAt(x, taps, times, -coarse.frequencyCyclesPerSymbol / sps);
  const unit = normaliseGain(second, kind).symbols;
  const fine = powerLineCarrier(unit, kind, transform);
  const aligned = derotate(unit, fine.frequencyCyclesPerSymbol, fine.phaseRad);
  const tracked = trackPhase(aligned, kind, RECOVERY_DEFAULTS.loopBandwidth);
  const final = normaliseGain(tracked.symbols, kind);
  const evm = evmFigures(final.symbols, final.ideal, kind);
  const count = times.length;
  const nu = coarse.frequencyCyclesPerSymbol + fine.frequencyCyclesPerSymbol + tracked.residualCyclesPerSymbol;
  if (count * fine.lineSnr < 20) warnings.push(`the M-th power line of ${kind} is weak (K·SNR ${(count * fine.lineSnr).toFixed(1)}); carrier figures may be wrong`);
  const mPowMethod = `M-th power line of the ${kind} symbols (Viterbi & Viterbi 1983; Rife-Boorstyn 1974 refinement), ${count} symbols`;
  return {
    kind,
    symbols: final.symbols,
    ideal: final.ideal,
    frequencyErrorHz: measurement(nu * rs, "Hz", 2 * Math.sqrt(fine.frequencyVariance) * rs, `${mPowMethod}; ±2σ Cramér-Rao`, warnings),
    phaseRad: measurement(wrap(fine.phaseRad + 2 * Math.PI * coarse.frequencyCyclesPerSymbol * (times[count >> 1] as number) / sps), "Rad", null, `${mPowMethod}, at the middle symbol, modulo the constellation's symmetry`, warnings),
    evm,
    warnings,
  };
}

function wrap(a: number): number {
  return a - 2 * Math.PI * Math.round(a / (2 * Math.PI));
}
