/**
 * Module-internal: the maximum of a periodogram |X(ν)|² near a starting frequency, by Newton
 * steps (the ML frequency of one line in white noise; D. C. Rife & R. R. Boorstyn, "Single-tone
 * parameter estimation from discrete-time observations", IEEE Trans. Inf. Theory IT-20(5), 1974).
 */

/**
 * How a record is laid out: "iq" interleaved I,Q (N = length/2), or "real", one real value a
 * sample (N = length, Q = 0: the same sums as the record with zero Q, without its copy).
 */
export type RecordLayout = "iq" | "real";

/** X(ν) = Σ z[n]·e^(−j2πν(n − c)), ν in cycles per sample, c = (N − 1)/2. */
export function dtftAt(z: Float32Array | Float64Array, nu: number, layout: RecordLayout = "iq"): [number, number] {
  const real = layout === "real";
  const n = real ? z.length : z.length >> 1;
  const c = (n - 1) / 2;
  let re = 0;
  let im = 0;
  const w = -2 * Math.PI * nu;
  for (let k = 0; k < n; k++) {
    const cs = Math.cos(w * (k - c));
    const sn = Math.sin(w * (k - c));
    const i = (real ? z[k] : z[2 * k]) as number;
    const q = real ? 0 : (z[2 * k + 1] as number);
    re += i * cs - q * sn;
    im += i * sn + q * cs;
  }
  return [re, im];
}

/**
 * Newton steps on |X(ν)|² from ν0 (cycles per sample), each step limited to ±½ of 1/N, until
 * a step is below 1e-7/N or the curvature is not negative. Returns the refined ν.
 */
export function refinePeak(z: Float32Array | Float64Array, nu0: number, maxSteps = 6, layout: RecordLayout = "iq"): number {
  return refinePeakStep(z, nu0, maxSteps, layout).nu;
}

/**
 * As refinePeak, also returning the size of the last Newton step, cycles per sample (the
 * distance still left to the maximum is of that order or less: Newton converges quadratically
 * near it): the interpolation limit of the estimate.
 */
export function refinePeakStep(
  z: Float32Array | Float64Array, nu0: number, maxSteps = 6, layout: RecordLayout = "iq",
): { nu: number; lastStep: number } {
  const real = layout === "real";
  const n = real ? z.length : z.length >> 1;
  const c = (n - 1) / 2;
  const step = 1 / n;
  let nu = nu0;
  let lastStep = 0.5 * step;
  for (let iter = 0; iter < maxSteps; iter++) {
    let x0r = 0, x0i = 0, x1r = 0, x1i = 0, x2r = 0, x2i = 0;
    const w = -2 * Math.PI * nu;
    for (let k = 0; k < n; k++) {
      const t = k - c;
      const cs = Math.cos(w * t);
      const sn = Math.sin(w * t);
      const i = (real ? z[k] : z[2 * k]) as number;
      const q = real ? 0 : (z[2 * k + 1] as number);
      const er = i * cs - q * sn;
      const ei = i * sn + q * cs;
      // d/dν multiplies by −j2πt, d²/dν² by −(2πt)².
      const a = 2 * Math.PI * t;
      x0r += er; x0i += ei;
      x1r += a * ei; x1i -= a * er;
      x2r -= a * a * er; x2i -= a * a * ei;
    }
    const g = 2 * (x0r * x1r + x0i * x1i);
    const h = 2 * (x1r * x1r + x1i * x1i + x0r * x2r + x0i * x2i);
    if (!(h < 0)) break;
    const move = Math.max(-0.5 * step, Math.min(0.5 * step, -g / h));
    nu += move;
    lastStep = Math.abs(move);
    if (Math.abs(move) < 1e-7 * step) break;
  }
  return { nu, lastStep };
}

/** Cramér–Rao variance of a line frequency, (cycles per sample)²: 6/((2π)²·ρ·N(N² − 1)),
 * ρ the line-to-noise power ratio per sample (Rife & Boorstyn 1974). */
export function lineFrequencyCrbVariance(rho: number, n: number): number {
  return 6 / ((2 * Math.PI) ** 2 * rho * n * (n * n - 1));
}
