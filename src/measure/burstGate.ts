/**
 * The bursts of a keyed emission: where its smoothed envelope stands above the on/off
 * threshold (Otsu 1979, as the OOK figures use), concatenated with a guard of one smoothing
 * length trimmed from both ends of each burst so that no ramp is kept. A bursty FSK or PSK
 * telemetry link first looks like on-off keying; its modulation shows inside the bursts.
 */
import { envelopeSplit, movingAverage } from "./digitalFeatures.js";

export interface Bursts {
  /** The samples inside the bursts, interleaved I,Q, bursts joined end to end. */
  readonly iq: Float32Array;
  /** Share of the record on, %. */
  readonly dutyCyclePercent: number;
  readonly burstCount: number;
  /** Where each burst lies in `iq` (sample indices, end exclusive), in order. */
  readonly segments: readonly (readonly [number, number])[];
  /** Mean smoothed envelope on over off, dB (20·log10 of the two Otsu classes' means). */
  readonly onOffDb: number;
}

/**
 * Bursts of `iq` (interleaved I,Q at `sampleRateHz`); `smoothingS` is the envelope smoothing
 * (default 0.5 ms), also the guard trimmed from each burst's ends.
 */
export function burstSamples(iq: Float32Array, sampleRateHz: number, smoothingS = 5e-4): Bursts {
  if (!(sampleRateHz > 0) || iq.length % 2 !== 0) throw new RangeError(`burstSamples: bad rate ${sampleRateHz} or odd length ${iq.length}`);
  const n = iq.length / 2;
  const envelope = new Float64Array(n);
  for (let k = 0; k < n; k++) envelope[k] = Math.hypot(iq[2 * k] as number, iq[2 * k + 1] as number);
  const len = Math.max(1, Math.round(smoothingS * sampleRateHz));
  const smooth = movingAverage(envelope, len);
  const { threshold, lowMean, highMean } = envelopeSplit(smooth);
  const keep: [number, number][] = [];
  let on = 0;
  for (let k = 0; k < n; ) {
    if ((smooth[k] as number) <= threshold) { k++; continue; }
    let j = k;
    while (j < n && (smooth[j] as number) > threshold) j++;
    on += j - k;
    if (j - len > k + len) keep.push([k + len, j - len]);
    k = j;
  }
  const total = keep.reduce((a, [s, e]) => a + (e - s), 0);
  const out = new Float32Array(2 * total);
  const segments: [number, number][] = [];
  let o = 0;
  for (const [s, e] of keep) {
    out.set(iq.subarray(2 * s, 2 * e), o);
    segments.push([o / 2, o / 2 + (e - s)]);
    o += 2 * (e - s);
  }
  const onOffDb = 20 * Math.log10(Math.max(highMean, 1e-30) / Math.max(lowMean, 1e-30));
  return { iq: out, dutyCyclePercent: (100 * on) / Math.max(n, 1), burstCount: keep.length, segments, onOffDb };
}
