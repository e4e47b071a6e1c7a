/**
 * Real-valued modulating signals ("audio") for the analogue modulators, as pure functions of the
 * sample index so that a capture can be built block by block. Values lie in [−1, 1], so a
 * modulator's deviation or depth parameter is the value reached at |audio| = 1.
 */
import { ParameterError } from "../errors.js";
import { requirePositive } from "./checks.js";

/**
 * cos(2π·frequencyHz·(n/fs − referenceS)) for n = startSample … startSample+count−1: a test tone,
 * or a sub-audible CTCSS tone (REFERENCES.md §10), with its positive peak at t = referenceS.
 */
export function toneAudio(
  startSample: number,
  count: number,
  sampleRateHz: number,
  frequencyHz: number,
  referenceS = 0,
): Float64Array {
  requirePositive("sampleRateHz", sampleRateHz);
  const out = new Float64Array(count);
  for (let k = 0; k < count; k++) {
    const cycles = frequencyHz * ((startSample + k) / sampleRateHz - referenceS);
    out[k] = Math.cos(2 * Math.PI * (cycles - Math.floor(cycles)));
  }
  return out;
}

/** One partial of the speech-like signal: a tone whose frequency glides sinusoidally. */
export interface GlidingTone {
  /** Centre frequency, Hz; an odd integer (see `speechLikeAudio`). */
  readonly frequencyHz: number;
  /** Peak excursion of the glide, Hz. */
  readonly glideHz: number;
  /** Rate of the glide, Hz; an even integer (see `speechLikeAudio`). */
  readonly glideRateHz: number;
}

export interface SpeechLikeOptions {
  /** The time of the positive peak (+1); the negative peak (−1) is 0.5 s later. Default 0.5 s. */
  readonly peakTimeS?: number;
  /** Syllable spacing, s. Default 0.25 s (4 syllables per second). */
  readonly syllablePeriodS?: number;
  /** Syllable length, s (≤ syllablePeriodS; the rest is a pause). Default 0.2 s. */
  readonly syllableLengthS?: number;
  /** The partials. Default: four partials between 440 and 2420 Hz. */
  readonly tones?: readonly GlidingTone[];
}

/**
 * Default partials: instantaneous frequencies stay within 443–2419 Hz, inside the 300–3000 Hz
 * speech band of land-mobile FM (common practice, REFERENCES.md §2, M = 3000 Hz).
 */
export const SPEECH_LIKE_TONES: readonly GlidingTone[] = [
  { frequencyHz: 523, glideHz: 80, glideRateHz: 2 },
  { frequencyHz: 887, glideHz: 120, glideRateHz: 4 },
  { frequencyHz: 1451, glideHz: 150, glideRateHz: 2 },
  { frequencyHz: 2219, glideHz: 200, glideRateHz: 4 },
];

// A fixed syllable pattern (no randomness needed): loudness and partial weights per syllable.
// Index 0 and 2 hold the syllables of the two peaks and must be 1.
const SYLLABLE_LEVEL = [1, 0.55, 1, 0.8, 0, 0.65, 0.9, 0.45, 0.7, 0, 0.85];
const SYLLABLE_WEIGHTS = [
  [1, 0.6, 0.4, 0.2], [0.5, 1, 0.5, 0.3], [0.8, 0.5, 1, 0.4], [0.3, 0.7, 0.6, 1],
  [1, 1, 1, 1], [0.9, 0.3, 0.7, 0.5], [0.4, 1, 0.3, 0.6], [1, 0.4, 0.8, 0.2],
  [0.6, 0.6, 1, 0.8], [1, 1, 1, 1], [0.7, 0.9, 0.4, 0.6],
];

/**
 * A deterministic speech-like signal: syllables of a few gliding tones under a cos² envelope.
 *
 *   a(t) = L_k · cos²(π(t − c_k)/ℓ) · Σ_i w_ki cos φ_i(t) / Σ_i w_ki      for |t − c_k| < ℓ/2, else 0
 *   φ_i(t) = 2π f_i τ + (g_i / r_i)(1 − cos 2π r_i τ),   τ = t − peakTimeS
 *
 * with syllable centres c_k = peakTimeS + k·syllablePeriodS, loudness L_k ∈ [0, 1] from a fixed
 * pattern, and instantaneous partial frequency f_i + g_i sin(2π r_i τ). So |a| ≤ 1 always;
 * a(peakTimeS) = +1, and since f_i are odd integers and r_i even integers (in Hz) every partial
 * is at phase π at τ = 0.5 s, so a(peakTimeS + 0.5) = −1. A modulator with deviation D (or
 * depth m) therefore reaches exactly +D and −D (or 1 ± m) at those two instants.
 */
export function speechLikeAudio(
  startSample: number,
  count: number,
  sampleRateHz: number,
  options: SpeechLikeOptions = {},
): Float64Array {
  requirePositive("sampleRateHz", sampleRateHz);
  const t0 = options.peakTimeS ?? 0.5;
  const period = options.syllablePeriodS ?? 0.25;
  const length = options.syllableLengthS ?? 0.2;
  const tones = options.tones ?? SPEECH_LIKE_TONES;
  requirePositive("syllablePeriodS", period);
  requirePositive("syllableLengthS", length);
  if (length > period) throw new ParameterError("syllableLengthS", `${length} exceeds syllablePeriodS ${period}`);
  if (Math.abs(0.5 / period - Math.round(0.5 / period)) > 1e-9) {
    throw new ParameterError("syllablePeriodS", `${period} must divide 0.5 s so that both peaks fall on a syllable centre`);
  }
  for (const p of tones) {
    if (!Number.isInteger(p.frequencyHz) || p.frequencyHz % 2 === 0) {
      throw new ParameterError("tones.frequencyHz", `${p.frequencyHz} must be an odd integer (Hz)`);
    }
    if (!Number.isInteger(p.glideRateHz) || p.glideRateHz <= 0 || p.glideRateHz % 2 !== 0) {
      throw new ParameterError("tones.glideRateHz", `${p.glideRateHz} must be a positive even integer (Hz)`);
    }
  }
  const peakSyllableStep = Math.round(0.5 / period);
  const out = new Float64Array(count);
  for (let n = 0; n < count; n++) {
    const tau = (startSample + n) / sampleRateHz - t0;
    const k = Math.round(tau / period);
    const u = tau - k * period;
    if (Math.abs(u) >= length / 2) continue;
    const slot = patternIndex(k, peakSyllableStep);
    const level = SYLLABLE_LEVEL[slot] as number;
    if (level === 0) continue;
    const weights = SYLLABLE_WEIGHTS[slot] as number[];
    const env = Math.cos((Math.PI * u) / length) ** 2;
    let sum = 0;
    let wsum = 0;
    for (let i = 0; i < tones.length; i++) {
      const p = tones[i] as GlidingTone;
      const w = weights[i % weights.length] as number;
      const cyc = p.frequencyHz * tau - Math.floor(p.frequencyHz * tau);
      const glideCyc = p.glideRateHz * tau - Math.floor(p.glideRateHz * tau);
      const phase = 2 * Math.PI * cyc + (p.glideHz / p.glideRateHz) * (1 - Math.cos(2 * Math.PI * glideCyc));
      sum += w * Math.cos(phase);
      wsum += w;
    }
    out[n] = (level * env * sum) / wsum;
  }
  return out;
}

// Syllable k → pattern slot. The syllables of the two peaks (k = 0 and k = step) map to slots 0
// and 2, both of loudness 1; the others cycle through the pattern.
function patternIndex(k: number, step: number): number {
  if (k === 0) return 0;
  if (k === step) return 2;
  const n = SYLLABLE_LEVEL.length;
  return (((k * 7 + 3) % n) + n) % n;
}
