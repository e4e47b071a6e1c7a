/**
 * Data windows for spectral estimation, in their periodic (DFT-even) form, which is the one for
 * spectral analysis: w[n] for n = 0..N−1 is the symmetric window of length N+1 without its last
 * point (Harris 1978, "On the use of windows for harmonic analysis with the discrete Fourier
 * transform", Proc. IEEE 66(1), §II; scipy.signal.windows `sym=False`).
 *
 * - "rectangular": w[n] = 1.
 * - "hann": w[n] = 0.5 − 0.5·cos(2πn/N)  (Harris 1978 eq. 27a, α = 2).
 * - "blackman-harris": the 4-term −92 dB Blackman–Harris window,
 *   w[n] = a0 − a1·cos(2πn/N) + a2·cos(4πn/N) − a3·cos(6πn/N),
 *   a = 0.35875, 0.48829, 0.14128, 0.01168 (Harris 1978 Table 1, eq. 33; digits from memory,
 *   they reproduce the coherent gain 0.359 and ENBW 2.00 bins of that table).
 */

/** The windows iqaudit offers. */
export type WindowName = "hann" | "blackman-harris" | "rectangular";

/** Every WindowName, for option parsing and help text. */
export const WINDOW_NAMES: readonly WindowName[] = ["hann", "blackman-harris", "rectangular"];

const BLACKMAN_HARRIS_4: readonly [number, number, number, number] = [0.35875, 0.48829, 0.14128, 0.01168];

/** True when `s` names a window of WINDOW_NAMES. */
export function isWindowName(s: string): s is WindowName {
  return (WINDOW_NAMES as readonly string[]).includes(s);
}

/**
 * The N periodic coefficients of window `name`. Throws RangeError for N not a positive integer.
 */
export function windowCoefficients(name: WindowName, length: number): Float64Array {
  if (!Number.isInteger(length) || length < 1) {
    throw new RangeError(`window length ${length} is not a positive integer`);
  }
  const w = new Float64Array(length);
  const step = (2 * Math.PI) / length;
  switch (name) {
    case "rectangular":
      w.fill(1);
      break;
    case "hann":
      for (let n = 0; n < length; n++) w[n] = 0.5 - 0.5 * Math.cos(step * n);
      break;
    case "blackman-harris": {
      const [a0, a1, a2, a3] = BLACKMAN_HARRIS_4;
      for (let n = 0; n < length; n++) {
        const x = step * n;
        w[n] = a0 - a1 * Math.cos(x) + a2 * Math.cos(2 * x) - a3 * Math.cos(3 * x);
      }
      break;
    }
  }
  return w;
}

/**
 * Coherent gain Σw[n] / N: the amplitude a windowed on-bin tone keeps (Harris 1978 Table 1,
 * "coherent gain"). Dimensionless.
 */
export function coherentGain(w: Float64Array): number {
  let s = 0;
  for (let n = 0; n < w.length; n++) s += w[n] as number;
  return s / w.length;
}

/**
 * Equivalent noise bandwidth in bins, N·Σw² / (Σw)² (Harris 1978 eq. 11; Heinzel, Rüdiger &
 * Schilling 2002, "Spectrum and spectral density estimation by the DFT", eq. 22). Multiply by
 * fs/N for hertz.
 */
export function enbwBins(w: Float64Array): number {
  let s1 = 0;
  let s2 = 0;
  for (let n = 0; n < w.length; n++) {
    const v = w[n] as number;
    s1 += v;
    s2 += v * v;
  }
  return (w.length * s2) / (s1 * s1);
}

/** Σw[n]², the noise power gain that density scaling divides by (Heinzel et al. 2002, S2). */
export function windowPowerSum(w: Float64Array): number {
  let s2 = 0;
  for (let n = 0; n < w.length; n++) s2 += (w[n] as number) * (w[n] as number);
  return s2;
}
