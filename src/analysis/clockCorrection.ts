/**
 * Receiver clock correction (REFERENCES.md §10, common practice). A receiver whose reference runs
 * p ppm high tunes its local oscillator to fc·(1 + p·1e-6), so it reports an emission at true
 * offset Δ as Δ − p·1e-6·fc (the scaling of the sample clock changes an offset Δ only by
 * p·1e-6·Δ, negligible beside it). `--ppm p` undoes this: corrected offset = reported + p·1e-6·fc.
 * Without a known centre frequency nothing can be corrected.
 */
import type { CaptureMeta } from "../capture/index.js";

/** The offset corrected for meta.ppm (unchanged when the centre is unknown or ppm is 0). */
export function correctedOffsetHz(meta: CaptureMeta, reportedOffsetHz: number): number {
  if (meta.centerHz === null || meta.ppm === 0) return reportedOffsetHz;
  return reportedOffsetHz + meta.ppm * 1e-6 * meta.centerHz;
}

/** Absolute RF of a reported offset, corrected for meta.ppm; null when the centre is unknown. */
export function absoluteFrequencyHz(meta: CaptureMeta, reportedOffsetHz: number): number | null {
  if (meta.centerHz === null) return null;
  return meta.centerHz + correctedOffsetHz(meta, reportedOffsetHz);
}

/**
 * The offset at which the receiver shows an emission at absolute RF `frequencyHz` (the inverse of
 * absoluteFrequencyHz: frequencyHz − fc − p·1e-6·fc); null when the centre is unknown.
 */
export function reportedOffsetOfHz(meta: CaptureMeta, frequencyHz: number): number | null {
  if (meta.centerHz === null) return null;
  return frequencyHz - meta.centerHz - meta.ppm * 1e-6 * meta.centerHz;
}
