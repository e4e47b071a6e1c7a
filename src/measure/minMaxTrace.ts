/**
 * A time trace reduced for a figure: the signal is cut into at most `maxPoints` buckets of
 * consecutive samples and each bucket keeps its minimum and maximum, so every peak survives the
 * reduction (the usual min/max decimation of waveform displays, common practice).
 * Module-internal: FM and AM build their `trace` fields with it.
 */

/** Bucket times and extremes. */
export interface MinMaxBuckets {
  /** Centre time of each bucket, s (t = 0 at the first sample of the input span). */
  readonly timeS: Float64Array;
  readonly min: Float32Array;
  readonly max: Float32Array;
}

/** Default upper bound on the number of buckets. */
export const TRACE_POINTS = 2000;

/**
 * Buckets of x[first … end − 1]; sample i sits at time (i + timeOffsetSamples)/fs. Bucket b holds
 * the samples first + ⌊b·L/B⌋ … first + ⌊(b+1)·L/B⌋ − 1, L = end − first, B = min(maxPoints, L).
 */
export function minMaxBuckets(
  x: ArrayLike<number>,
  first: number,
  end: number,
  sampleRateHz: number,
  timeOffsetSamples: number,
  maxPoints = TRACE_POINTS,
): MinMaxBuckets {
  const length = Math.max(0, end - first);
  const count = Math.min(maxPoints, length);
  const timeS = new Float64Array(count);
  const min = new Float32Array(count);
  const max = new Float32Array(count);
  for (let b = 0; b < count; b++) {
    const lo = first + Math.floor((b * length) / count);
    const hi = first + Math.floor(((b + 1) * length) / count);
    let mn = Infinity;
    let mx = -Infinity;
    for (let i = lo; i < hi; i++) {
      const v = x[i] as number;
      if (v < mn) mn = v;
      if (v > mx) mx = v;
    }
    min[b] = mn;
    max[b] = mx;
    timeS[b] = ((lo + hi - 1) / 2 + timeOffsetSamples) / sampleRateHz;
  }
  return { timeS, min, max };
}
