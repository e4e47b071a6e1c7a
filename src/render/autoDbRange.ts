/** Step to which {@link autoDbRange} rounds its ends, in dB. */
export const AUTO_DB_RANGE_STEP_DB = 5;

/** Headroom below the noise floor that {@link autoDbRange} leaves, in dB. */
export const AUTO_DB_RANGE_FLOOR_MARGIN_DB = 3;

/** Narrowest range {@link autoDbRange} returns, in dB. */
export const AUTO_DB_RANGE_MIN_SPAN_DB = 20;

/** Percentile taken as the noise floor when none is given (a low percentile: common practice). */
export const AUTO_DB_RANGE_FLOOR_PERCENTILE = 10;

// Enough values for a stable percentile without sorting millions.
const MAX_SAMPLED_VALUES = 200_000;

/**
 * A display range for dB values: from AUTO_DB_RANGE_FLOOR_MARGIN_DB below the noise floor
 * (`noiseFloorDb`, or the 10th percentile of the finite values) up to the peak, both ends
 * rounded outward to multiples of 5 dB, and at least 20 dB wide (the top is raised). NaN and
 * ±Infinity are ignored; with no finite value at all the range is −100 … 0 dB.
 */
export function autoDbRange(valuesDb: Float32Array, noiseFloorDb?: number): { minDb: number; maxDb: number } {
  const stride = Math.max(1, Math.ceil(valuesDb.length / MAX_SAMPLED_VALUES));
  let peak = -Infinity;
  for (const v of valuesDb) if (Number.isFinite(v) && v > peak) peak = v;
  if (peak === -Infinity) return { minDb: -100, maxDb: 0 };
  let floor = noiseFloorDb;
  if (floor === undefined || !Number.isFinite(floor)) {
    const sample: number[] = [];
    for (let i = 0; i < valuesDb.length; i += stride) {
      const v = valuesDb[i] ?? NaN;
      if (Number.isFinite(v)) sample.push(v);
    }
    if (sample.length === 0) sample.push(peak);
    sample.sort((a, b) => a - b);
    floor = sample[Math.floor(((sample.length - 1) * AUTO_DB_RANGE_FLOOR_PERCENTILE) / 100)] ?? peak;
  }
  const step = AUTO_DB_RANGE_STEP_DB;
  const minDb = Math.floor((floor - AUTO_DB_RANGE_FLOOR_MARGIN_DB) / step) * step;
  const maxDb = Math.max(Math.ceil(peak / step) * step, minDb + AUTO_DB_RANGE_MIN_SPAN_DB);
  return { minDb, maxDb };
}
