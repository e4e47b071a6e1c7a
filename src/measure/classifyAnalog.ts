/**
 * Analogue modulation class from measured features (analogFeatures.ts). Rules, in order:
 *
 * 1. noise: no SNR, or SNR below 6 dB (too little above the noise to say more).
 * 2. am: the power envelope varies, κ ≥ 0.01, a carrier line holds ≥ 40 % of the power
 *    (double-sideband full-carrier AM keeps at least 2/3 in its carrier at 100 % tone depth,
 *    REFERENCES.md §5), and the envelope sits at the noise level no longer than AM of depth
 *    ≤ 100 % allows (analogFeatures.ts `amNoiseLevelShareMax`: tone AM at m < 1 never reaches 0,
 *    at m = 1 only near the troughs, a share acos(1 − ε)/π). An envelope at the noise level
 *    longer than that (on-off keying: the whole off share, about ½) is keying or over-modulation,
 *    not AM: the class is then unknown here and classifyEmission decides (ook).
 * 3. cw: a line holds ≥ 90 % of the power, the envelope is constant, κ < 0.01, and the
 *    frequency does not move in the audio band: the RMS of the instantaneous frequency averaged
 *    over the audio band's time scale, its noise part removed (analogFeatures.ts
 *    `audioFrequencyRmsHz`), is under twice what the noise alone gives it and under 30 Hz.
 *    Speech FM with pauses keeps most of its power in the carrier line (the syllables'
 *    sidebands spread thin) but moves the frequency by hundreds of Hz; a carrier moves it only
 *    by its noise. Twice the noise RMS is four times its variance, clear of the noise model's
 *    error above 10 dB (common practice of detection margins; chosen from the noise model, not
 *    fitted on the evaluation set); 30 Hz leaves room for a carrier's own drift.
 * 4. fm: constant envelope, κ < 0.01, and an instantaneous-frequency spread ξ ≥ 0.03 of the
 *    occupied bandwidth (frequency modulation moves the frequency, not the amplitude); or a
 *    line with a constant envelope whose frequency moves in the audio band (rule 3).
 * 5. unknown: anything else, e.g. a PSK/QAM signal (envelope varies but no carrier line) or a
 *    noise-like emission (κ ≈ 1). Digital classes are decided elsewhere.
 *
 * The thresholds sit between the values the module comment of analogFeatures.ts derives for
 * each class, with room for the noise-correction error at SNR ≥ 15 dB (common practice of
 * feature-based classifiers, tuned here, not from a standard). Limits: AM of a depth so small
 * that κ < 0.01 reads cw; FM of index below ~0.3 keeps ≥ 90 % in its carrier and reads cw.
 *
 * confidence: 0.5 + 0.5 × the smallest margin by which the deciding features clear their
 * thresholds (each margin ramped 0..1 over a stated span); a score of clarity, not a probability.
 * 0.5 means a feature sits on its threshold, 1 that every deciding feature clears it by the
 * whole span. For am the noise-level share is one of them (span 0.05 below its bound), so an
 * envelope that dwells at the noise floor near the limit of AM cannot read am at 1.
 */
import type { AnalogFeatures } from "./analogFeatures.js";

/** The analogue classes, plus "noise" and "unknown" (interface.md `modulation.class`). */
export type AnalogClass = "cw" | "am" | "fm" | "noise" | "unknown";

/** A class decision with its confidence (0..1) and a one-line reason. */
export interface AnalogClassification {
  readonly class: AnalogClass;
  readonly confidence: number;
  readonly method: string;
}

/** Thresholds of classifyAnalog (module comment). */
export const CLASSIFY_ANALOG_THRESHOLDS = {
  minSnrDb: 6, envelopeKappa: 0.01, amLineShare: 0.4, cwLineShare: 0.9, fmSpread: 0.03, amNoiseShareSpan: 0.05,
  audioMoveOverNoise: 2, audioMoveMinHz: 30,
} as const;

const ramp = (x: number, a: number, b: number): number => Math.min(1, Math.max(0, (x - a) / (b - a)));

/** The class of an emission from its features, by the rules of the module comment. */
export function classifyAnalog(features: AnalogFeatures): AnalogClassification {
  const t = CLASSIFY_ANALOG_THRESHOLDS;
  const { snrDb, lineShare, envelopeExcessVariance: kappa, frequencySpread: xi } = features;
  if (snrDb === null || snrDb < t.minSnrDb) {
    const c = snrDb === null ? 1 : ramp(t.minSnrDb - snrDb, 0, 6);
    return { class: "noise", confidence: 0.5 + 0.5 * c, method: `SNR ${snrDb === null ? "none" : snrDb.toFixed(1) + " dB"} below ${t.minSnrDb} dB` };
  }
  const snrMargin = ramp(snrDb, t.minSnrDb, t.minSnrDb + 6);
  const note = `SNR ${snrDb.toFixed(1)} dB, line share ${fmt(lineShare)}, envelope kappa ${fmt(kappa)}, frequency spread ${fmt(xi)}`;
  if (kappa === null || lineShare === null) return { class: "unknown", confidence: 0.5, method: `${note}: features missing` };
  if (kappa >= t.envelopeKappa && lineShare >= t.amLineShare) {
    const share = features.noiseLevelShare;
    const max = features.amNoiseLevelShareMax;
    if (share !== null && max !== null && share > max) {
      return {
        class: "unknown", confidence: 0.5,
        method: `${note}: the envelope sits at the noise level ${(100 * share).toFixed(1)} % of the time, more than AM of depth ≤ 100 % gives (${(100 * max).toFixed(1)} %): keyed or over-modulated`,
      };
    }
    const shareMargin = share === null || max === null ? 1 : ramp(max - share, 0, t.amNoiseShareSpan);
    const c = Math.min(snrMargin, ramp(kappa, t.envelopeKappa, 3 * t.envelopeKappa), ramp(lineShare, t.amLineShare, t.amLineShare + 0.2), shareMargin);
    return { class: "am", confidence: 0.5 + 0.5 * c, method: `${note}: varying envelope with a carrier line` };
  }
  const constantEnvelope = 1 - ramp(kappa, t.envelopeKappa / 2, t.envelopeKappa);
  if (kappa < t.envelopeKappa && lineShare >= t.cwLineShare) {
    const moves = audioMovement(features);
    if (moves !== null && moves.ratio >= t.audioMoveOverNoise && moves.rmsHz >= t.audioMoveMinHz) {
      const c = Math.min(snrMargin, constantEnvelope, ramp(moves.ratio, t.audioMoveOverNoise, 2 * t.audioMoveOverNoise));
      return { class: "fm", confidence: 0.5 + 0.5 * c, method: `${note}: one line, constant envelope, but the frequency moves ${moves.rmsHz.toFixed(0)} Hz RMS in the audio band (noise ${moves.noiseHz.toFixed(0)} Hz)` };
    }
    const c = Math.min(snrMargin, constantEnvelope, ramp(lineShare, t.cwLineShare, 0.97));
    return { class: "cw", confidence: 0.5 + 0.5 * c, method: `${note}: one line, constant envelope` };
  }
  if (kappa < t.envelopeKappa && xi !== null && xi >= t.fmSpread) {
    const c = Math.min(snrMargin, constantEnvelope, ramp(xi, t.fmSpread, 2 * t.fmSpread));
    return { class: "fm", confidence: 0.5 + 0.5 * c, method: `${note}: constant envelope, moving frequency` };
  }
  return { class: "unknown", confidence: 0.5, method: `${note}: no analogue class fits` };
}

/** The audio-band frequency movement and its ratio to the noise's part (rule 3), or null. */
function audioMovement(f: AnalogFeatures): { rmsHz: number; noiseHz: number; ratio: number } | null {
  const rms = f.audioFrequencyRmsHz;
  const noise = f.audioFrequencyNoiseRmsHz;
  if (rms === null || noise === null) return null;
  return { rmsHz: rms, noiseHz: noise, ratio: rms / Math.max(noise, 1e-9) };
}

function fmt(x: number | null): string {
  return x === null ? "none" : x.toFixed(3);
}
