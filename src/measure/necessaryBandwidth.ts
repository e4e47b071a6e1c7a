/**
 * Necessary-bandwidth formulas of 47 CFR 2.202(g) and ITU-R SM.1138 for analogue telephony.
 * Symbols as there: M the highest modulating frequency (Hz), D the peak deviation (Hz, half the
 * span of the instantaneous frequency), K an overall numerical factor (1 for telephony).
 */

/**
 * F3E and the like: Bn = 2M + 2DK, Hz (47 CFR 2.202(g); ITU-R SM.1138). M = 3000, D = 5000,
 * K = 1 gives 16 000 Hz (16K0F3E). Throws RangeError for negative or non-finite inputs.
 */
export function necessaryBandwidthFmHz(maxModulatingHz: number, peakDeviationHz: number, k = 1): number {
  check("maxModulatingHz", maxModulatingHz);
  check("peakDeviationHz", peakDeviationHz);
  check("k", k);
  return 2 * maxModulatingHz + 2 * peakDeviationHz * k;
}

/**
 * A3E, double-sideband AM telephony: Bn = 2M, Hz (47 CFR 2.202(g); ITU-R SM.1138). M = 3000
 * gives 6000 Hz (6K00A3E). Throws RangeError for a negative or non-finite M.
 */
export function necessaryBandwidthAmHz(maxModulatingHz: number): number {
  check("maxModulatingHz", maxModulatingHz);
  return 2 * maxModulatingHz;
}

function check(name: string, v: number): void {
  if (!(v >= 0) || !Number.isFinite(v)) throw new RangeError(`${name} ${v} is not a finite number ≥ 0`);
}
