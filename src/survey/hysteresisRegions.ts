/**
 * Regions of a spectrogram above the floor, connected in frequency and time, by hysteresis: a
 * region starts at a seed cell (row mean above seedFactor[r]·floor[b]) and grows through the
 * 8 neighbours of its cells that stand above growFactor[r]·floor[b] (Canny 1986, "A computational
 * approach to edge detection", hysteresis thresholding; the same two-level rule on a time-frequency
 * grid). Memory: one Int32 label and one queue entry a cell, R × N of each.
 */
import type { Spectrogram } from "../dsp/index.js";

/** One connected region: its label in the label map and its extent, rows and centred bins inclusive. */
export interface Region {
  readonly label: number;
  readonly rowFirst: number;
  readonly rowLast: number;
  readonly binFirst: number;
  readonly binLast: number;
  readonly cellCount: number;
}

/** The label map (R × N, 0 = no region, else region index + 1) and the regions. */
export interface RegionMap {
  readonly labels: Int32Array;
  readonly regions: readonly Region[];
}

/**
 * Labels the regions of `s` above the two thresholds (module comment). seedFactor and growFactor
 * are per row (rows of no frame are never part of a region); floorPerHz is per centred bin.
 */
export function hysteresisRegions(
  s: Spectrogram,
  floorPerHz: Float64Array,
  seedFactor: Float64Array,
  growFactor: Float64Array,
): RegionMap {
  const n = s.fftLength;
  const rows = s.rowCount;
  const labels = new Int32Array(rows * n);
  const queue = new Int32Array(rows * n);
  const regions: Region[] = [];
  const above = (cell: number, factor: Float64Array): boolean => {
    const r = Math.floor(cell / n);
    return (s.framesPerRow[r] as number) > 0 && (s.meanPerHz[cell] as number) > (factor[r] as number) * (floorPerHz[cell - r * n] as number);
  };
  for (let cell = 0; cell < rows * n; cell++) {
    if (labels[cell] !== 0 || !above(cell, seedFactor)) continue;
    const label = regions.length + 1;
    labels[cell] = label;
    let head = 0;
    let tail = 0;
    queue[tail++] = cell;
    let rowFirst = rows;
    let rowLast = -1;
    let binFirst = n;
    let binLast = -1;
    while (head < tail) {
      const c = queue[head++] as number;
      const r = Math.floor(c / n);
      const b = c - r * n;
      rowFirst = Math.min(rowFirst, r);
      rowLast = Math.max(rowLast, r);
      binFirst = Math.min(binFirst, b);
      binLast = Math.max(binLast, b);
      for (let dr = -1; dr <= 1; dr++) {
        const rr = r + dr;
        if (rr < 0 || rr >= rows) continue;
        for (let db = -1; db <= 1; db++) {
          const bb = b + db;
          if (bb < 0 || bb >= n) continue;
          const nc = rr * n + bb;
          if (labels[nc] !== 0 || !above(nc, growFactor)) continue;
          labels[nc] = label;
          queue[tail++] = nc;
        }
      }
    }
    regions.push({ label, rowFirst, rowLast, binFirst, binLast, cellCount: tail });
  }
  return { labels, regions };
}
