// Test helpers for the scenario tests: spectral lines by correlation, instantaneous frequency.

/**
 * The complex amplitude of the line at frequencyHz: (1/N)·Σ x[n]·exp(−j2π f n/fs). Over a whole
 * number of periods of every line present, lines at other frequencies contribute exactly zero
 * (orthogonality of the DFT basis), so this reads the Fourier coefficient of that line.
 */
export function lineAmplitude(iq: ArrayLike<number>, sampleRateHz: number, frequencyHz: number): { re: number; im: number; abs: number } {
  const n = iq.length >> 1;
  let re = 0;
  let im = 0;
  for (let k = 0; k < n; k++) {
    const c = frequencyHz * k / sampleRateHz;
    const ph = -2 * Math.PI * (c - Math.floor(c));
    const cs = Math.cos(ph);
    const sn = Math.sin(ph);
    const i = iq[2 * k] as number;
    const q = iq[2 * k + 1] as number;
    re += i * cs - q * sn;
    im += i * sn + q * cs;
  }
  re /= n;
  im /= n;
  return { re, im, abs: Math.hypot(re, im) };
}

/** Instantaneous frequency, Hz, from the phase difference arg(x[n]·conj(x[n−1]))·fs/2π (n ≥ 1). */
export function instantaneousFrequencyHz(iq: ArrayLike<number>, sampleRateHz: number): Float64Array {
  const n = iq.length >> 1;
  const out = new Float64Array(Math.max(0, n - 1));
  for (let k = 1; k < n; k++) {
    const i0 = iq[2 * k - 2] as number;
    const q0 = iq[2 * k - 1] as number;
    const i1 = iq[2 * k] as number;
    const q1 = iq[2 * k + 1] as number;
    out[k - 1] = (Math.atan2(q1 * i0 - i1 * q0, i1 * i0 + q1 * q0) * sampleRateHz) / (2 * Math.PI);
  }
  return out;
}

export function maxOf(a: ArrayLike<number>): number {
  let m = -Infinity;
  for (let k = 0; k < a.length; k++) m = Math.max(m, a[k] as number);
  return m;
}

export function minOf(a: ArrayLike<number>): number {
  let m = Infinity;
  for (let k = 0; k < a.length; k++) m = Math.min(m, a[k] as number);
  return m;
}

/** Mean of |z|² over interleaved I,Q. */
export function meanPower(iq: ArrayLike<number>): number {
  let p = 0;
  for (let k = 0; k < iq.length; k++) p += (iq[k] as number) ** 2;
  return p / (iq.length >> 1);
}

/**
 * FM deviation, Hz, at every sample n ≥ 1: the phase arg x[n] unwrapped and differentiated,
 * (φ[n] − φ[n−1])·fs/2π, less the carrier's offsetHz. Unwrapping adds the multiple of 2π that
 * takes each step into (−π, π], so the difference of the unwrapped phase is that wrapped step.
 * Element 0 is NaN (no earlier sample). Unambiguous while |f| < fs/2.
 */
export function unwrappedDeviationHz(iq: ArrayLike<number>, sampleRateHz: number, offsetHz: number): Float64Array {
  const n = iq.length >> 1;
  const out = new Float64Array(n);
  out[0] = Number.NaN;
  let previous = Math.atan2(iq[1] as number, iq[0] as number);
  for (let k = 1; k < n; k++) {
    const phase = Math.atan2(iq[2 * k + 1] as number, iq[2 * k] as number);
    let step = phase - previous;
    step -= 2 * Math.PI * Math.round(step / (2 * Math.PI));
    out[k] = (step * sampleRateHz) / (2 * Math.PI) - offsetHz;
    previous = phase;
  }
  return out;
}

/** The largest |d[n]| for from ≤ n ≤ to, and its index. */
export function peakAbs(d: ArrayLike<number>, from: number, to: number): { valueHz: number; index: number } {
  let best = { valueHz: -Infinity, index: -1 };
  for (let k = from; k <= to; k++) {
    const v = Math.abs(d[k] as number);
    if (v > best.valueHz) best = { valueHz: v, index: k };
  }
  return best;
}

/**
 * The pauses of the speech-like audio (audio.ts): syllables 0.2 s long centred every 0.25 s on
 * 0.5 s, so the audio is exactly 0 for t in [0.10, 0.15] s modulo 0.25 s. Each window keeps 5 ms
 * clear of the syllables on either side; as sample ranges [from, to] at rate fs.
 */
export function pauseWindows(fs: number, durationS: number): { from: number; to: number }[] {
  const out: { from: number; to: number }[] = [];
  for (let startS = 0.105; startS + 0.04 < durationS; startS += 0.25) {
    out.push({ from: Math.round(startS * fs), to: Math.round((startS + 0.04) * fs) });
  }
  return out;
}
