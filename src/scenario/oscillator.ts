/**
 * Complex oscillators and frequency shifting for synthetic captures.
 *
 * Convention (STYLE.md §3): interleaved I,Q in a Float64Array, full scale 1.0; sample n sits at
 * t = n / sampleRateHz, and n counts from the first sample of the capture, so a capture built
 * block by block (startSample = 0, B, 2B, …) is the same as one built in a single call.
 * The phase is computed from the cycle count f·n/fs reduced to [0, 1) before multiplying by 2π,
 * which keeps it accurate to ~1e-10 rad for n up to 1e9.
 */
import { requirePositive } from "./checks.js";

/** Options of `tone`. */
export interface ToneOptions {
  /** Index of the first sample within the capture (t = startSample / sampleRateHz). Default 0. */
  readonly startSample?: number;
  /** Peak amplitude, full scale 1.0. Default 1. */
  readonly amplitude?: number;
  /** Phase at t = 0, radians. Default 0. */
  readonly phaseRad?: number;
}

/**
 * A complex exponential A·exp(j(2π·offsetHz·n/fs + φ0)) for n = startSample … startSample+count−1,
 * interleaved I,Q. Mean power A² (an unmodulated carrier, REFERENCES.md §5 with m = 0).
 */
export function tone(count: number, sampleRateHz: number, offsetHz: number, options: ToneOptions = {}): Float64Array {
  requirePositive("sampleRateHz", sampleRateHz);
  const start = options.startSample ?? 0;
  const a = options.amplitude ?? 1;
  const phi0 = options.phaseRad ?? 0;
  const out = new Float64Array(2 * count);
  const cyclesPerSample = offsetHz / sampleRateHz;
  for (let k = 0; k < count; k++) {
    const ph = 2 * Math.PI * fraction(cyclesPerSample * (start + k)) + phi0;
    out[2 * k] = a * Math.cos(ph);
    out[2 * k + 1] = a * Math.sin(ph);
  }
  return out;
}

/**
 * Frequency shift (mixing): y[n] = x[n]·exp(j2π·offsetHz·(startSample + n)/fs). Returns a new
 * array; `iq` is not changed. A signal at baseband frequency f moves to f + offsetHz.
 */
export function frequencyShift(iq: Float64Array, sampleRateHz: number, offsetHz: number, startSample = 0): Float64Array {
  requirePositive("sampleRateHz", sampleRateHz);
  const count = iq.length >> 1;
  const out = new Float64Array(2 * count);
  const cyclesPerSample = offsetHz / sampleRateHz;
  for (let k = 0; k < count; k++) {
    const ph = 2 * Math.PI * fraction(cyclesPerSample * (startSample + k));
    const c = Math.cos(ph);
    const s = Math.sin(ph);
    const i = iq[2 * k] as number;
    const q = iq[2 * k + 1] as number;
    out[2 * k] = i * c - q * s;
    out[2 * k + 1] = i * s + q * c;
  }
  return out;
}

function fraction(x: number): number {
  return x - Math.floor(x);
}

