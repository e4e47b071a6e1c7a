/**
 * One-dimensional level clustering, for keyed signals whose samples sit at a few discrete
 * levels (tone frequencies of FSK, on/off envelope of OOK). Module-internal to src/measure.
 */

/** k clusters of scalar values: centres (ascending), counts, pooled spread and separation. */
export interface LevelClusters {
  readonly centres: readonly number[];
  readonly counts: readonly number[];
  /** Pooled within-cluster standard deviation, in the values' unit. */
  readonly spread: number;
  /** Smallest gap between adjacent centres over `spread` (∞ when spread is 0). */
  readonly separation: number;
}

/**
 * Lloyd's k-means in one dimension (S. P. Lloyd, "Least squares quantization in PCM", IEEE
 * Trans. Inf. Theory 28(2), 1982), started at the quantiles (i + ½)/k, 30 iterations at most.
 * Separation = min gap / pooled σ: for two equal Gaussian clusters the error of the midpoint
 * threshold is Q(separation/2) (common practice). Throws RangeError for k < 2.
 */
export function levelClusters(values: ArrayLike<number>, k: number): LevelClusters {
  if (!(Number.isInteger(k) && k >= 2)) throw new RangeError(`k ${k} must be an integer of at least 2`);
  const n = values.length;
  const sorted = Float64Array.from(values as ArrayLike<number>).sort();
  if (n < 2 * k) return { centres: [], counts: [], spread: Number.NaN, separation: 0 };
  let c = Array.from({ length: k }, (_, i) => sorted[Math.floor(((i + 0.5) / k) * n)] as number);
  let counts = new Array<number>(k).fill(0);
  let ss = 0;
  for (let it = 0; it < 30; it++) {
    // Boundaries are midpoints; walk the sorted values once.
    const sum = new Array<number>(k).fill(0);
    const cnt = new Array<number>(k).fill(0);
    let sq = 0;
    let j = 0;
    for (let i = 0; i < n; i++) {
      const v = sorted[i] as number;
      while (j < k - 1 && v > ((c[j] as number) + (c[j + 1] as number)) / 2) j++;
      sum[j] = (sum[j] as number) + v;
      cnt[j] = (cnt[j] as number) + 1;
      sq += (v - (c[j] as number)) ** 2;
    }
    const next = c.map((old, i) => ((cnt[i] as number) > 0 ? (sum[i] as number) / (cnt[i] as number) : old));
    counts = cnt;
    ss = sq;
    const moved = next.some((v, i) => v !== c[i]);
    c = next;
    if (!moved) break;
  }
  // Recompute the spread about the final centres.
  ss = 0;
  let j = 0;
  for (let i = 0; i < n; i++) {
    const v = sorted[i] as number;
    while (j < k - 1 && v > ((c[j] as number) + (c[j + 1] as number)) / 2) j++;
    ss += (v - (c[j] as number)) ** 2;
  }
  const spread = Math.sqrt(ss / Math.max(1, n - k));
  let gap = Infinity;
  for (let i = 1; i < k; i++) gap = Math.min(gap, (c[i] as number) - (c[i - 1] as number));
  return { centres: c, counts, spread, separation: spread > 0 ? gap / spread : Infinity };
}
