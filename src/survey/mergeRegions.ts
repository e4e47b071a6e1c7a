/**
 * The fragments of one emission gathered into one group, by two rules applied until nothing
 * changes (common practice for blob grouping on a time-frequency grid, no single source):
 * - the same channel: groups whose bin ranges overlap by at least half the narrower one are one
 *   emission whatever their times (the repeated bursts of one transmitter on one frequency);
 * - fragments side by side: groups at most `gapBins` empty bins apart whose row ranges overlap
 *   (the skirts of an emission that the threshold cut off, the gaps inside a speech channel).
 * Then every group's rows that hold one of its cells: `onRows`, R bytes a group.
 */
import type { Region, RegionMap } from "./hysteresisRegions.js";

/** A group of regions taken as one emission: its bin extent (centred, inclusive) and the rows it is on. */
export interface RegionGroup {
  readonly binFirst: number;
  readonly binLast: number;
  readonly rowFirst: number;
  readonly rowLast: number;
  /** 1 for each spectrogram row holding a cell of the group. */
  readonly onRows: Uint8Array;
}

interface Extent {
  binFirst: number;
  binLast: number;
  rowFirst: number;
  rowLast: number;
}

/** Groups the regions of `map` (module comment). `rowCount` and `fftLength` are the spectrogram's. */
export function mergeRegions(map: RegionMap, rowCount: number, fftLength: number, gapBins: number): RegionGroup[] {
  const owner = map.regions.map((_, i) => i);
  const find = (i: number): number => {
    while (owner[i] !== i) i = owner[i] = owner[owner[i] as number] as number;
    return i;
  };
  const extents: Extent[] = map.regions.map((r: Region) => ({ ...r }));
  // Passes over the pairs of groups, each joining what it can, until one joins nothing: a pass
  // is O(G²), and a join can only make another possible, so few passes are needed.
  let changed = true;
  while (changed) {
    changed = false;
    const roots = [...new Set(owner.map((_, i) => find(i)))];
    for (let a = 0; a < roots.length; a++) {
      const ra = roots[a] as number;
      if (find(ra) !== ra) continue;
      for (let b = a + 1; b < roots.length; b++) {
        const rb = roots[b] as number;
        if (find(rb) !== rb || !belongTogether(extents[ra] as Extent, extents[rb] as Extent, gapBins)) continue;
        owner[rb] = ra;
        extents[ra] = union(extents[ra] as Extent, extents[rb] as Extent);
        changed = true;
      }
    }
  }
  const roots = [...new Set(owner.map((_, i) => find(i)))];
  const index = new Map(roots.map((r, k) => [r, k]));
  const onRows = roots.map(() => new Uint8Array(rowCount));
  const regionGroup = map.regions.map((_, i) => index.get(find(i)) as number);
  for (let cell = 0; cell < map.labels.length; cell++) {
    const label = map.labels[cell] as number;
    if (label !== 0) (onRows[regionGroup[label - 1] as number] as Uint8Array)[Math.floor(cell / fftLength)] = 1;
  }
  return roots.map((r, k) => {
    const e = extents[r] as Extent;
    return { binFirst: e.binFirst, binLast: e.binLast, rowFirst: e.rowFirst, rowLast: e.rowLast, onRows: onRows[k] as Uint8Array };
  });
}

function belongTogether(a: Extent, b: Extent, gapBins: number): boolean {
  const overlapBins = Math.min(a.binLast, b.binLast) - Math.max(a.binFirst, b.binFirst) + 1;
  const narrower = Math.min(a.binLast - a.binFirst, b.binLast - b.binFirst) + 1;
  if (overlapBins >= 0.5 * narrower) return true;
  const rowsOverlap = Math.min(a.rowLast, b.rowLast) >= Math.max(a.rowFirst, b.rowFirst);
  return rowsOverlap && -overlapBins <= gapBins;
}

function union(a: Extent, b: Extent): Extent {
  return {
    binFirst: Math.min(a.binFirst, b.binFirst), binLast: Math.max(a.binLast, b.binLast),
    rowFirst: Math.min(a.rowFirst, b.rowFirst), rowLast: Math.max(a.rowLast, b.rowLast),
  };
}

/** One group of the given ones: the union of their extents and of their on rows. */
export function unionGroups(groups: readonly RegionGroup[]): RegionGroup {
  const first = groups[0] as RegionGroup;
  const onRows = new Uint8Array(first.onRows.length);
  let e: Extent = { ...first };
  for (const g of groups) {
    e = union(e, g);
    for (let r = 0; r < onRows.length; r++) onRows[r] = (onRows[r] as number) | (g.onRows[r] as number);
  }
  return { binFirst: e.binFirst, binLast: e.binLast, rowFirst: e.rowFirst, rowLast: e.rowLast, onRows };
}
