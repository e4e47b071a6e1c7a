/**
 * The standard CTCSS (sub-audible squelch) tone frequencies, Hz: the 50-tone list of
 * EIA/TIA-603 (the older 37-tone EIA RS-220 list is a subset), as tabulated in REFERENCES.md §10
 * (CTCSS encoder datasheets and a repeater-engineering table; status V2).
 */
export const CTCSS_TONES_HZ: readonly number[] = [
  67.0, 69.3, 71.9, 74.4, 77.0, 79.7, 82.5, 85.4, 88.5, 91.5, 94.8, 97.4, 100.0, 103.5, 107.2,
  110.9, 114.8, 118.8, 123.0, 127.3, 131.8, 136.5, 141.3, 146.2, 151.4, 156.7, 159.8, 162.2,
  165.5, 167.9, 171.3, 173.8, 177.3, 179.9, 183.5, 186.2, 189.9, 192.8, 196.6, 199.5, 203.5,
  206.5, 210.7, 218.1, 225.7, 229.1, 233.6, 241.8, 250.3, 254.1,
];

/**
 * The standard tone nearest `frequencyHz`, or null when none lies within `toleranceHz` (default
 * 1 Hz: under half the closest spacing of the list, 2.3 Hz between 67.0 and 69.3 Hz).
 */
export function nearestCtcssToneHz(frequencyHz: number, toleranceHz = 1): number | null {
  let best: number | null = null;
  for (const t of CTCSS_TONES_HZ) {
    if (best === null || Math.abs(t - frequencyHz) < Math.abs(best - frequencyHz)) best = t;
  }
  return best !== null && Math.abs(best - frequencyHz) <= toleranceHz ? best : null;
}
