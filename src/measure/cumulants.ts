/**
 * Second- and fourth-order cumulants of complex samples, normalised, for telling linear digital
 * modulations apart (A. Swami & B. M. Sadler, "Hierarchical digital modulation classification
 * using cumulants", IEEE Trans. Commun. 48(3), 2000, eqs. for C20 … C42 and Table I).
 */

/** A complex number. */
export interface Complex {
  readonly re: number;
  readonly im: number;
}

/** Normalised cumulants of one record (see `normalisedCumulants`). */
export interface NormalisedCumulants {
  /** C20/C21 (complex): 1 for BPSK, 0 for circular constellations (QPSK and up). */
  readonly c20: Complex;
  /** C21 = E|y|², FS², of the zero-mean samples, less `noisePower` when one was given. */
  readonly c21: number;
  /** C40/C21² (complex; the magnitude does not depend on the carrier phase). */
  readonly c40: Complex;
  /** C41/C21² (complex). */
  readonly c41: Complex;
  /** C42/C21² (real, phase-invariant). */
  readonly c42: number;
  readonly sampleCount: number;
}

/** Options of `normalisedCumulants`. */
export interface NormalisedCumulantsOptions {
  /**
   * Power (FS², E|w|²) of additive circular Gaussian noise in the samples, removed from C21
   * before normalising; default 0. Higher-order cumulants of Gaussian noise are zero, and C20 of
   * circular noise is zero, so only C21 needs the correction (Swami & Sadler 2000, §II).
   */
  readonly noisePower?: number;
}

/**
 * Normalised cumulants of the complex samples y (interleaved I,Q), mean removed first:
 *
 *   C20 = E[y²]          C21 = E[|y|²]
 *   C40 = E[y⁴] − 3·C20²
 *   C41 = E[y³·y*] − 3·C20·C21
 *   C42 = E[|y|⁴] − |C20|² − 2·C21²
 *
 * reported as C20/C21 and C4k/C21² with C21 less the noise power (Swami & Sadler 2000, eq. 6 ff.).
 * Ideal values (their Table I): BPSK C40 = C42 = −2; QPSK C40 = 1, C42 = −1; 8PSK 0, −1;
 * 16QAM −0.68, −0.68; 64QAM −0.619, −0.619 (C40 real when the constellation sits on its usual
 * axes). Moments summed in double precision. Returns NaN fields for fewer than 2 samples or no
 * signal power left; throws RangeError for an odd-length array or a negative noise power.
 */
export function normalisedCumulants(
  iq: Float32Array | Float64Array,
  options: NormalisedCumulantsOptions = {},
): NormalisedCumulants {
  if (iq.length % 2 !== 0) throw new RangeError(`iq length ${iq.length} is odd: not interleaved I,Q`);
  const noise = options.noisePower ?? 0;
  if (!(noise >= 0)) throw new RangeError(`noisePower ${noise} must be zero or positive`);
  const n = iq.length >> 1;
  let mi = 0;
  let mq = 0;
  for (let k = 0; k < n; k++) {
    mi += iq[2 * k] as number;
    mq += iq[2 * k + 1] as number;
  }
  mi /= n;
  mq /= n;
  // Raw moments of the zero-mean samples.
  let m20r = 0, m20i = 0, m21 = 0, m40r = 0, m40i = 0, m41r = 0, m41i = 0, m42 = 0;
  for (let k = 0; k < n; k++) {
    const a = (iq[2 * k] as number) - mi;
    const b = (iq[2 * k + 1] as number) - mq;
    const p = a * a + b * b;
    const sr = a * a - b * b; // y²
    const si = 2 * a * b;
    m20r += sr; m20i += si;
    m21 += p;
    m40r += sr * sr - si * si; m40i += 2 * sr * si; // y⁴
    m41r += sr * p; m41i += si * p; // y³y* = y²·|y|²
    m42 += p * p;
  }
  m20r /= n; m20i /= n; m21 /= n; m40r /= n; m40i /= n; m41r /= n; m41i /= n; m42 /= n;
  const c21 = m21 - noise;
  const c20sqR = m20r * m20r - m20i * m20i;
  const c20sqI = 2 * m20r * m20i;
  const c40r = m40r - 3 * c20sqR;
  const c40i = m40i - 3 * c20sqI;
  // Noise enters E[y³y*] as 3·E[y²]·N (Isserlis), which cancels in C41 only with C21 as measured.
  const c41r = m41r - 3 * m20r * m21;
  const c41i = m41i - 3 * m20i * m21;
  const c42 = m42 - (m20r * m20r + m20i * m20i) - 2 * m21 * m21;
  const d2 = c21 * c21;
  const ok = n >= 2 && c21 > 0;
  const q = (x: number, d: number): number => (ok ? x / d : Number.NaN);
  return {
    c20: { re: q(m20r, c21), im: q(m20i, c21) },
    c21: ok ? c21 : Number.NaN,
    c40: { re: q(c40r, d2), im: q(c40i, d2) },
    c41: { re: q(c41r, d2), im: q(c41i, d2) },
    c42: q(c42, d2),
    sampleCount: n,
  };
}

/** |z| of a complex number. */
export function complexAbs(z: Complex): number {
  return Math.hypot(z.re, z.im);
}
