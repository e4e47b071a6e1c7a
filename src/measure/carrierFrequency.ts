/**
 * Carrier frequency: of an unmodulated carrier (a line), and of an emission without one.
 *
 * toneFrequency, for one complex tone in white noise, z[n] = A·e^(j(2πf n/fs + φ)) + w[n]:
 * 1. coarse: the largest bin of the record zero-padded to at least 2N points (FFT);
 * 2. fine: Candan's bias-corrected three-sample interpolation on DTFT samples spaced fs/N
 *    around it, δ = tan(π/N)/(π/N) · Re[(X₋ − X₊)/(2X₀ − X₋ − X₊)] (Ç. Candan, "A method for
 *    fine resolution frequency estimation from three DFT samples", IEEE Signal Process. Lett.
 *    18(6), 2011, refining E. Jacobsen & P. Kootsookos, IEEE SP Magazine 24(3), 2007);
 * 3. Newton steps on the periodogram |X(f)|², whose maximiser is the maximum-likelihood
 *    estimate (D. C. Rife & R. R. Boorstyn, "Single-tone parameter estimation from
 *    discrete-time observations", IEEE Trans. Inf. Theory IT-20(5), 1974).
 * Uncertainty (k = 2): 2σ from the Cramér–Rao bound of the same paper (in quadrature with the
 * last Newton step, the interpolation limit),
 *   var(f) = 6·fs² / ((2π)²·SNR·N(N² − 1)),   SNR = A²/σ²,
 * with A² = |X(f̂)|²/N² and σ² = mean|z|² − A² measured from the record. The bound holds above
 * the threshold region (N·SNR well above ~20, Rife & Boorstyn Fig. 1); below it a warning says so.
 *
 * psdCentroidHz: the power-weighted mean frequency of PSD − floor over a range, for emissions
 * with no carrier line (common practice, e.g. the centre of a PSK or noise-like emission).
 */
import { binFrequencyHz, equivalentDegreesOfFreedom, transformInPlace, type WelchPsd } from "../dsp/index.js";
import { refinePeakStep } from "./periodogramPeak.js";
import { measurement, notAvailable, type Measurement } from "./measurement.js";

const TONE_METHOD = "FFT peak, Candan 2011 interpolation, ML (Rife-Boorstyn 1974) refinement; ±2σ Cramér-Rao bound";

/**
 * Frequency of the one unmodulated carrier in `iq` (interleaved I,Q at `sampleRateHz`), Hz
 * offset from the centre of the record's band, with 2σ CRB uncertainty (module comment).
 * Throws RangeError for a bad rate or an odd-length array; null value for fewer than 8 samples.
 */
/** Longest record toneFrequency uses (its first samples). */
export const TONE_MAX_SAMPLES = 1 << 19;

export function toneFrequency(iq: Float32Array | Float64Array, sampleRateHz: number): Measurement<"Hz"> {
  if (!(sampleRateHz > 0) || !Number.isFinite(sampleRateHz)) throw new RangeError(`sampleRateHz ${sampleRateHz} is not a positive finite rate`);
  if (iq.length % 2 !== 0) throw new RangeError(`iq has odd length ${iq.length}; it must be interleaved I,Q pairs`);
  // At most 2^19 samples: the bound then is already far below any receiver's reference error,
  // and the zero-padded transform stays at 2^20 points (16 MiB, transformed in place).
  const n = Math.min(iq.length / 2, TONE_MAX_SAMPLES);
  if (n < 8) return notAvailable("Hz", TONE_METHOD, `${n} samples are too few for a frequency estimate`);
  let size = 2;
  while (size < 2 * n) size *= 2;
  const out = new Float64Array(2 * size);
  for (let k = 0; k < 2 * n; k++) out[k] = iq[k] as number;
  transformInPlace(out);
  let kMax = 0;
  let pMax = -1;
  for (let k = 0; k < size; k++) {
    const pk = (out[2 * k] as number) ** 2 + (out[2 * k + 1] as number) ** 2;
    if (pk > pMax) { pMax = pk; kMax = k; }
  }
  // Cycles per sample, in [−0.5, 0.5).
  let nu = (kMax < size / 2 ? kMax : kMax - size) / size;
  const step = 1 / n;
  const xm = dtft(iq, n, nu - step, 0);
  const x0 = dtft(iq, n, nu, 0);
  const xp = dtft(iq, n, nu + step, 0);
  const numRe = xm[0] - xp[0];
  const numIm = xm[1] - xp[1];
  const denRe = 2 * x0[0] - xm[0] - xp[0];
  const denIm = 2 * x0[1] - xm[1] - xp[1];
  const den2 = denRe * denRe + denIm * denIm;
  if (den2 > 0) {
    const delta = (Math.tan(Math.PI / n) / (Math.PI / n)) * ((numRe * denRe + numIm * denIm) / den2);
    if (Math.abs(delta) <= 0.5) nu += delta * step;
  }
  const c = (n - 1) / 2;
  const refined = refinePeakStep(iq.subarray(0, 2 * n), nu, 3);
  nu = refined.nu;
  const peak = dtft(iq, n, nu, c);
  const a2 = (peak[0] * peak[0] + peak[1] * peak[1]) / (n * n);
  let total = 0;
  for (let k = 0; k < 2 * n; k++) total += (iq[k] as number) ** 2;
  total /= n;
  const noise = Math.max(total - a2, total * 1e-15);
  const snr = a2 / noise;
  const crbVar = (6 * sampleRateHz * sampleRateHz) / ((2 * Math.PI) ** 2 * snr * n * (n * n - 1));
  const warnings: string[] = [];
  if (n * snr < 20) warnings.push(`N·SNR = ${(n * snr).toFixed(1)} is near the threshold region; the Cramér-Rao uncertainty may understate the error`);
  if (snr < 1) warnings.push(`the line holds less power than the rest of the record (SNR ${(10 * Math.log10(snr)).toFixed(1)} dB); is it an unmodulated carrier?`);
  // k = 2: the Cramér–Rao spread, with the last Newton step (the interpolation limit) and the
  // double-precision phase of the DTFT (about N·2⁻⁵³ rad over the record, far below both).
  const interpolationHz = refined.lastStep * sampleRateHz;
  const roundingHz = (2 ** -53 * sampleRateHz) / (2 * Math.PI);
  const u = Math.hypot(2 * Math.sqrt(crbVar), interpolationHz) + roundingHz;
  return measurement(nu * sampleRateHz, "Hz", u, `${TONE_METHOD} with the last Newton step, N ${n}, SNR ${(10 * Math.log10(snr)).toFixed(1)} dB`, warnings);
}

/** X(ν) = Σ z[n]·e^(−j2πν(n − c)), ν in cycles per sample. */
function dtft(iq: Float32Array | Float64Array, n: number, nu: number, c: number): [number, number] {
  let re = 0;
  let im = 0;
  const w = -2 * Math.PI * nu;
  for (let k = 0; k < n; k++) {
    const ph = w * (k - c);
    const cs = Math.cos(ph);
    const sn = Math.sin(ph);
    const i = iq[2 * k] as number;
    const q = iq[2 * k + 1] as number;
    re += i * cs - q * sn;
    im += i * sn + q * cs;
  }
  return [re, im];
}


/**
 * Power-weighted mean frequency Σ f_k·e_k / Σ e_k, e_k = max(0, PSD_k − floor), over the bins
 * whose centres lie in [lowerHz, upperHz], Hz. Uncertainty (k = 2): the statistical spread of
 * that mean, each bin varying as PSD_k·√(2/ν) (ν the Welch degrees of freedom), combined in
 * quadrature with half a bin. Null when nothing stands above the floor.
 */
export function psdCentroidHz(psd: WelchPsd, lowerHz: number, upperHz: number, noiseFloorPerHz: number): Measurement<"Hz"> {
  if (!(upperHz > lowerHz)) throw new RangeError(`upperHz ${upperHz} is not above lowerHz ${lowerHz}`);
  if (!(noiseFloorPerHz >= 0)) throw new RangeError(`noiseFloorPerHz ${noiseFloorPerHz} is negative`);
  const method = "centroid of PSD minus noise floor";
  let s = 0;
  let sf = 0;
  const p = psd.densityPerHz;
  for (let i = 0; i < psd.fftLength; i++) {
    const f = binFrequencyHz(psd, i);
    if (f < lowerHz || f > upperHz) continue;
    const e = Math.max(0, (p[i] as number) - noiseFloorPerHz);
    s += e;
    sf += e * f;
  }
  if (!(s > 0)) return notAvailable("Hz", method, "no power above the noise floor in the range");
  const centre = sf / s;
  const nu = equivalentDegreesOfFreedom(psd);
  let v = 0;
  for (let i = 0; i < psd.fftLength; i++) {
    const f = binFrequencyHz(psd, i);
    if (f < lowerHz || f > upperHz) continue;
    v += ((f - centre) ** 2) * (p[i] as number) ** 2 * (nu > 0 ? 2 / nu : 1);
  }
  const u = Math.hypot(2 * Math.sqrt(v) / s, psd.binWidthHz / 2);
  return measurement(centre, "Hz", u, `${method}, ${lowerHz.toFixed(0)}..${upperHz.toFixed(0)} Hz`);
}
