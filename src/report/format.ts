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
