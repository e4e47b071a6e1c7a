/**
 * Decibels that stay finite. A power of zero (a silent capture, a perfectly balanced mixer) has
 * no logarithm; reports are JSON, where -Infinity and NaN cannot be written, so every dB figure
 * iqaudit reports goes through here and is clamped to [DB_FLOOR, DB_CEILING].
 */

/** The lowest dB value reported: −300 dB, a power ratio of 1e-30, far below any float32 capture. */
export const DB_FLOOR = -300;

/** The highest dB value reported: +300 dB (an unbounded ratio, e.g. a perfect image rejection). */
export const DB_CEILING = 300;

/**
 * 10·log10(power) for a power or power ratio, clamped to [DB_FLOOR, DB_CEILING]. Zero, negative
 * and NaN inputs give DB_FLOOR; +Infinity gives DB_CEILING.
 */
export function powerToDb(power: number): number {
  if (!(power > 1e-30)) return DB_FLOOR;
  if (!(power < 1e30)) return DB_CEILING;
  return 10 * Math.log10(power);
}

/** The power (or power ratio) of a dB value: 10^(db/10). */
export function dbToPower(db: number): number {
  return Math.pow(10, db / 10);
}
