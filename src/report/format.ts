/** Number formatting for text a person reads: SI-scaled frequencies, fixed decimals, byte sizes. */

/** "156.800 000 MHz"-style: Hz scaled to Hz/kHz/MHz/GHz with `digits` decimals. */
export function formatHz(hz: number, digits = 3): string {
  const a = Math.abs(hz);
  if (a >= 1e9) return `${(hz / 1e9).toFixed(digits + 3)} GHz`;
  if (a >= 1e6) return `${(hz / 1e6).toFixed(digits + 3)} MHz`;
  if (a >= 1e3) return `${(hz / 1e3).toFixed(digits)} kHz`;
  return `${hz.toFixed(Math.max(digits - 2, 1))} Hz`;
}

/** A rate in samples per second: "2.4 MS/s". */
export function formatRate(sps: number): string {
  if (sps >= 1e6) return `${trim(sps / 1e6)} MS/s`;
  if (sps >= 1e3) return `${trim(sps / 1e3)} kS/s`;
  return `${trim(sps)} S/s`;
}

export function formatBytes(n: number): string {
  if (n >= 2 ** 30) return `${(n / 2 ** 30).toFixed(2)} GiB`;
  if (n >= 2 ** 20) return `${(n / 2 ** 20).toFixed(2)} MiB`;
  if (n >= 2 ** 10) return `${(n / 2 ** 10).toFixed(1)} KiB`;
  return `${n} B`;
}

export function formatSeconds(s: number): string {
  if (s === 0) return "0 s";
  if (s >= 1) return `${s.toFixed(3)} s`;
  if (s >= 1e-3) return `${(s * 1e3).toFixed(3)} ms`;
  return `${(s * 1e6).toFixed(1)} µs`;
}

function trim(x: number): string {
  return Number(x.toPrecision(6)).toString();
}

/** Lines of "label   value" with the values aligned. */
export function alignedRows(rows: readonly (readonly [string, string])[], indent = "  "): string {
  const width = Math.max(...rows.map(([k]) => k.length));
  return rows.map(([k, v]) => `${indent}${k.padEnd(width)}  ${v}`).join("\n");
}

/**
 * Decimals for an uncertainty: at least `digits`, and more until it shows at least 3 units of
 * its last digit (so a non-zero uncertainty never reads as 0 and rounding changes it by at most
 * a sixth); two or more when it is below 1. Common practice (GUM §7.2.6: one or two significant
 * digits, value rounded to the same place).
 */
export function uncertaintyDecimals(u: number, digits: number): number {
  let d = Math.max(0, digits);
  if (!(u > 0) || !Number.isFinite(u)) return d;
  if (u < 1) d = Math.max(d, 2);
  while (d < 15 && Math.round(u * 10 ** d) < 3) d++;
  return d;
}

/** The unit an uncertainty is stated in: a level's (dBFS) or a ratio's (dBc) spread is in dB. */
export function uncertaintyUnit(unit: string): string {
  return unit === "dBFS" || unit === "dBc" ? "dB" : unit;
}

/** "± 0.0027 Hz": an uncertainty with at least `digits` decimals (uncertaintyDecimals). */
export function formatUncertainty(u: number, digits: number, unit: string): string {
  return `± ${u.toFixed(uncertaintyDecimals(u, digits))} ${uncertaintyUnit(unit)}`.trim();
}

/** An uncertainty in Hz for text: SI-scaled from 1 kHz up (formatHz), else with enough decimals. */
export function formatHzUncertainty(u: number): string {
  return u >= 1e3 ? formatHz(u, 3) : `${u.toFixed(uncertaintyDecimals(u, 1))} Hz`;
}
