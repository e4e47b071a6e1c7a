/**
 * The sidebands of one emission that the threshold cut off from it: a pair of weaker parts, one
 * each side of a stronger one, at equal distances from its centre, of equal power and width, on
 * over the same span. Double-sideband modulation puts equal sidebands at ±fm about the carrier
 * (AM by a tone: lines of amplitude m/2 either side, REFERENCES.md §5), and the spectrum of any
 * real-valued modulation is symmetric about its carrier (theory), so such a triple is one emission.
 * Tolerances: centre within one spectrogram bin; powers within 3 dB of each other (the sidebands
 * are equal; 3 dB covers the noise of weak parts and the window's scallop loss on lines, 1.42 dB
 * for Hann, Harris 1978); widths within a factor 2 or 2 bins; each sideband's span inside the
 * stronger part's, two rows allowed at each end (a sideband near the threshold is found only in
 * some of the rows it is on).
 * Limit: three unrelated emissions so placed and so matched would be joined.
 */
import type { DetectedEmission } from "./detectedEmission.js";

/** Indices [centre, lower, upper] of a sideband triple among `e`, or null. */
export function sidebandTriple(e: readonly DetectedEmission[], binWidthHz: number, rowS: number): [number, number, number] | null {
  for (let c = 0; c < e.length; c++) {
    const centre = e[c] as DetectedEmission;
    for (let l = 0; l < e.length; l++) {
      const low = e[l] as DetectedEmission;
      if (l === c || low.offsetHz >= centre.offsetHz || low.powerDbfs >= centre.powerDbfs || !sameSpan(low, centre, rowS)) continue;
      for (let u = 0; u < e.length; u++) {
        const up = e[u] as DetectedEmission;
        if (u === c || u === l || up.offsetHz <= centre.offsetHz || up.powerDbfs >= centre.powerDbfs) continue;
        if (isPair(low, up, centre, binWidthHz, rowS)) return [c, l, u];
      }
    }
  }
  return null;
}

/** Whether the span of `inner` lies inside that of `outer`, two rows allowed at each end. */
function sameSpan(inner: DetectedEmission, outer: DetectedEmission, rowS: number): boolean {
  return inner.startS >= outer.startS - 2 * rowS && inner.endS <= outer.endS + 2 * rowS;
}

function isPair(low: DetectedEmission, up: DetectedEmission, centre: DetectedEmission, binWidthHz: number, rowS: number): boolean {
  const symmetric = Math.abs((low.offsetHz + up.offsetHz) / 2 - centre.offsetHz) <= binWidthHz;
  const equal = Math.abs(low.powerDbfs - up.powerDbfs) <= 3;
  const wide = Math.max(low.bandwidthHz, up.bandwidthHz);
  const narrow = Math.min(low.bandwidthHz, up.bandwidthHz);
  const width = wide <= 2 * narrow || wide - narrow <= 2 * binWidthHz;
  return symmetric && equal && width && sameSpan(up, centre, rowS);
}
