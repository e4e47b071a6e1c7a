/** Number formatting for text a person reads: SI-scaled frequencies, fixed decimals, byte sizes. */

/**
 * "164.849 787 MHz"-style: Hz scaled to Hz/kHz/MHz with `digits` decimals (MHz carry three more),
 * the digits grouped in threes either side of the decimal point with a space (groupDigits).
 * Frequencies of 1 MHz and above, absolute ones above all, are always in MHz.
 */
export function formatHz(hz: number, digits = 3): string {
  const a = Math.abs(hz);
  if (a >= 1e6) return `${groupDigits((hz / 1e6).toFixed(digits + 3))} MHz`;
  if (a >= 1e3) return `${groupDigits((hz / 1e3).toFixed(digits))} kHz`;
  return `${groupDigits(hz.toFixed(Math.max(digits - 2, 1)))} Hz`;
}

/**
 * A decimal numeral with its digits in groups of three counted from the decimal point, joined by
 * a space (SI Brochure, 9th edition, §5.4.4: groups of three, separated by a space, never by a
 * point or comma). A group of four digits is left whole before the point ("1234.5"), as the
 * brochure allows; "-164.849787" → "-164.849 787".
 */
export function groupDigits(numeral: string): string {
  const m = /^(-?)(\d+)(?:\.(\d+))?$/.exec(numeral);
  if (m === null) return numeral;
  const [, sign, whole, fraction] = m as unknown as [string, string, string, string | undefined];
  const w = whole.length <= 4 ? whole : whole.replace(/\B(?=(\d{3})+$)/g, " ");
  const f = fraction === undefined ? "" : `.${fraction.length <= 4 ? fraction : (fraction.match(/\d{1,3}/g) as string[]).join(" ")}`;
  return `${sign}${w}${f}`;
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
