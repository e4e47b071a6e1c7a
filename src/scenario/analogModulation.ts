/**
 * Analogue modulators at complex baseband (carrier at 0 Hz; move it with `frequencyShift`).
 * Audio is real and in [−1, 1] (see audio.ts); outputs are interleaved I,Q Float64Array.
 */
import { requirePositive, requireRange } from "./checks.js";

/** Result of `fmFromAudio`: the samples and the phase to pass to the next block. */
export interface FmBlock {
  readonly iq: Float64Array;
  /** Phase after the last sample, radians in [0, 2π): `startPhaseRad` of the next block. */
  readonly endPhaseRad: number;
}

/**
 * Frequency modulation by phase accumulation:
 *   φ[n] = φ[n−1] + 2π·deviationHz·audio[n]/fs,   φ[−1] = startPhaseRad,   x[n] = A·exp(jφ[n]),
 * so the instantaneous frequency (φ[n] − φ[n−1])·fs/2π is deviationHz·audio[n] and the peak
 * deviation is deviationHz·max|audio|. For a tone audio = cos(2π fm t) this is the tone FM of
 * REFERENCES.md §1 with modulation index β = deviationHz/fm (to a factor (ω/2)/sin(ω/2),
 * ω = 2π fm/fs, from summing instead of integrating: 1 + ω²/24). Also gives continuous-phase
 * 2-FSK when audio is an NRZ ±1 sequence (deviationHz = half the shift). Mean power A².
 */
export function fmFromAudio(
  audio: ArrayLike<number>,
  sampleRateHz: number,
  deviationHz: number,
  startPhaseRad = 0,
  amplitude = 1,
): FmBlock {
  requirePositive("sampleRateHz", sampleRateHz);
  const step = (2 * Math.PI * deviationHz) / sampleRateHz;
  const out = new Float64Array(2 * audio.length);
  let phi = startPhaseRad;
  for (let n = 0; n < audio.length; n++) {
    phi += step * (audio[n] as number);
    // Keep φ small so that cos/sin stay accurate over long captures.
    if (phi > Math.PI || phi < -Math.PI) phi -= 2 * Math.PI * Math.round(phi / (2 * Math.PI));
    out[2 * n] = amplitude * Math.cos(phi);
    out[2 * n + 1] = amplitude * Math.sin(phi);
  }
  const end = phi - 2 * Math.PI * Math.floor(phi / (2 * Math.PI));
  return { iq: out, endPhaseRad: end };
}

/**
 * Double-sideband full-carrier AM (class A3E): x[n] = A·(1 + m·audio[n]) + j0, with depth
 * m = depthPercent/100 in [0, 1]. For |audio| reaching 1 the envelope spans A(1 − m)…A(1 + m), so
 * m = (Vmax − Vmin)/(Vmax + Vmin); a tone gives sidebands of amplitude m/2 re the carrier and
 * mean power A²(1 + m²/2) (REFERENCES.md §5).
 */
export function amFromAudio(audio: ArrayLike<number>, depthPercent: number, amplitude = 1): Float64Array {
  requireRange("depthPercent", depthPercent, 0, 100);
  const m = depthPercent / 100;
  const out = new Float64Array(2 * audio.length);
  for (let n = 0; n < audio.length; n++) out[2 * n] = amplitude * (1 + m * (audio[n] as number));
  return out;
}
