/**
 * The bursts of a keyed emission: where its smoothed envelope stands above the on/off
 * threshold (Otsu 1979, as the OOK figures use), concatenated with a guard of one smoothing
 * length trimmed from both ends of each burst so that no ramp is kept. A bursty FSK or PSK
 * telemetry link first looks like on-off keying; its modulation shows inside the bursts.
 */
import { envelopeSplit, movingAverageInPlace } from "./digitalFeatures.js";

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

/** Where the bursts of a record lie, before their samples are gathered (burstSpans). */
export interface BurstSpans {
  /** Each burst's samples in the record, [start, end), guards trimmed, in order. */
  readonly spans: readonly (readonly [number, number])[];
  /** Samples inside the bursts, Σ (end − start). */
  readonly keptSamples: number;
  readonly dutyCyclePercent: number;
  readonly onOffDb: number;
}

/**
 * Bursts of `iq` (interleaved I,Q at `sampleRateHz`); `smoothingS` is the envelope smoothing
 * (default 0.5 ms), also the guard trimmed from each burst's ends.
 */
export function burstSamples(iq: Float32Array, sampleRateHz: number, smoothingS = 5e-4): Bursts {
  return gatherBursts(iq, burstSpans(iq, sampleRateHz, smoothingS));
}

/**
 * Where the bursts of `iq` lie (as burstSamples), without a copy of their samples: a caller
 * that may not want them (a record that is not keyed) decides on these figures first.
 */
export function burstSpans(iq: Float32Array, sampleRateHz: number, smoothingS = 5e-4): BurstSpans {
  if (!(sampleRateHz > 0) || iq.length % 2 !== 0) throw new RangeError(`burstSamples: bad rate ${sampleRateHz} or odd length ${iq.length}`);
  const n = iq.length / 2;
  const envelope = new Float64Array(n);
  for (let k = 0; k < n; k++) envelope[k] = Math.hypot(iq[2 * k] as number, iq[2 * k + 1] as number);
  const len = Math.max(1, Math.round(smoothingS * sampleRateHz));
  const smooth = movingAverageInPlace(envelope, len);
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
  const onOffDb = 20 * Math.log10(Math.max(highMean, 1e-30) / Math.max(lowMean, 1e-30));
  const keptSamples = keep.reduce((a, [s, e]) => a + (e - s), 0);
  return { spans: keep, keptSamples, dutyCyclePercent: (100 * on) / Math.max(n, 1), onOffDb };
}

/** The samples of the bursts of `iq` at `spans` (burstSpans), joined end to end. */
export function gatherBursts(iq: Float32Array, spans: BurstSpans): Bursts {
  const out = new Float32Array(2 * spans.keptSamples);
  const segments: [number, number][] = [];
  let o = 0;
  for (const [s, e] of spans.spans) {
    out.set(iq.subarray(2 * s, 2 * e), o);
    segments.push([o / 2, o / 2 + (e - s)]);
    o += 2 * (e - s);
  }
  return { iq: out, dutyCyclePercent: spans.dutyCyclePercent, burstCount: spans.spans.length, segments, onOffDb: spans.onOffDb };
}
