/**
 * Receiver artefacts among the detected emissions, marked rather than listed as emissions:
 * - "dc": the line a direct-conversion receiver leaves at 0 Hz (common practice for zero-IF
 *   receivers), when detectDcSpike (src/measure/detectDcSpike.ts) finds it in the Welch PSD and
 *   the emission sits on it: its centre within one spectrogram bin of 0 Hz and its 99 % bandwidth
 *   no wider than two spectrogram bins (a line under the window; wider is an emission over DC);
 * - "image": the mirror at −f that an IQ gain and phase imbalance makes of an emission at +f, of
 *   level below it by the image-rejection ratio IRR of the capture's health figures
 *   (src/dsp/health.ts: a tone e^(jωt) becomes ½[(1 + g·e^(jφ))·e^(jωt) + (1 − g·e^(−jφ))·e^(−jωt)]).
 *   An emission B is the image of a stronger A when B's centre is at −(A's centre) within
 *   max(2 bins, 5 % of A's bandwidth), B is no wider than A by more than 25 %, B's span lies
 *   inside A's (within two spectrogram rows at each end), and P_A − P_B is within `toleranceDb`
 *   of IRR (the issue asks a few dB: the row powers of a weak image carry its noise, and IRR is
 *   a whole-capture figure). An image may be narrower and shorter than A: its skirts, and the
 *   quieter moments of a weak image, sit under the detection threshold, so it is found in parts.
 */
import type { DetectedEmission } from "./detectedEmission.js";

/** What markArtefacts needs to know of the capture. */
export interface ArtefactContext {
  readonly dcSpikePresent: boolean;
  readonly imageRejectionDb: number;
  readonly binWidthHz: number;
  readonly rowDurationS: number;
  readonly toleranceDb: number;
}

/** The emissions with `artefact` and `mirrorOfId` set (module comment); ids must be set already. */
export function markArtefacts(emissions: readonly DetectedEmission[], c: ArtefactContext): DetectedEmission[] {
  const out = emissions.map((e) => (c.dcSpikePresent && isDcLine(e, c) ? { ...e, artefact: "dc" as const } : e));
  const byPower = out.map((_, i) => i).sort((a, b) => (out[b] as DetectedEmission).powerDbfs - (out[a] as DetectedEmission).powerDbfs);
  for (const ia of byPower) {
    const a = out[ia] as DetectedEmission;
    if (a.artefact !== null) continue;
    for (const ib of byPower) {
      const b = out[ib] as DetectedEmission;
      if (ib === ia || b.artefact !== null || b.powerDbfs >= a.powerDbfs) continue;
      if (isImage(a, b, c)) out[ib] = { ...b, artefact: "image", mirrorOfId: a.id };
    }
  }
  return out;
}

function isDcLine(e: DetectedEmission, c: ArtefactContext): boolean {
  return Math.abs(e.offsetHz) <= c.binWidthHz && e.bandwidthHz <= 2 * c.binWidthHz;
}

function isImage(a: DetectedEmission, b: DetectedEmission, c: ArtefactContext): boolean {
  const place = Math.abs(a.offsetHz + b.offsetHz) <= Math.max(2 * c.binWidthHz, 0.05 * a.bandwidthHz);
  const width = b.bandwidthHz <= 1.25 * a.bandwidthHz;
  const span = b.startS >= a.startS - 2 * c.rowDurationS && b.endS <= a.endS + 2 * c.rowDurationS;
  const level = Math.abs(a.powerDbfs - b.powerDbfs - c.imageRejectionDb) <= c.toleranceDb;
  return place && width && span && level;
}
