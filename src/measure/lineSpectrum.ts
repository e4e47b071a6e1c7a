/**
 * Power of discrete spectral lines of complex baseband, read from a long averaged spectrum.
 * Module-internal: used for the Bessel-null check and the AM sideband levels.
 *
 * The spectrum is a Welch average (dsp WelchAccumulator) with the 4-term Blackman–Harris window,
 * whose main lobe is ±4 bins wide and whose sidelobes stay below −92 dB (Harris 1978, Table 1).
 * The power of a line at f is the PSD summed over the 9 bins nearest f times the bin width:
 * for a tone of amplitude A this is A² to within the −92 dB sidelobe energy, wherever f falls
 * between bins (no scallop loss), and it adds the noise power of 9 bins (9·fs/N·N0).
 */
import { WelchAccumulator, isFftSize, type WelchPsd } from "../dsp/index.js";

/** Half-width of the summed neighbourhood, bins: the Blackman–Harris main-lobe half-width. */
const LINE_HALF_WIDTH_BINS = 4;

/** Bins per line spacing asked for; 8 main-lobe widths keep neighbouring lines apart. */
export const BINS_PER_SPACING = 64;

/** A Blackman–Harris Welch PSD of `iq` with bin width ≤ spacingHz / BINS_PER_SPACING where the
 * sample count allows (else the longest power-of-two segment that fits), 50 % overlap. */
export function lineSpectrum(iq: Float32Array, sampleRateHz: number, spacingHz: number): WelchPsd {
  const n = iq.length >> 1;
  let fftLength = 16;
  while (sampleRateHz / fftLength > spacingHz / BINS_PER_SPACING && fftLength * 2 <= n) fftLength *= 2;
  if (!isFftSize(fftLength) || fftLength > n) {
    throw new RangeError(`${n} samples are too few for a line spectrum (at least 16)`);
  }
  const acc = new WelchAccumulator({ fftLength, sampleRateHz, window: "blackman-harris" });
  acc.push(iq, 0);
  return acc.finish();
}

/** Line power at `frequencyHz` (FS², i.e. A² for a tone of amplitude A): PSD × bin width summed
 * over the 9 bins nearest it. 0 when the line lies outside the spectrum. */
export function linePower(psd: WelchPsd, frequencyHz: number): number {
  const centre = Math.round(frequencyHz / psd.binWidthHz) + psd.fftLength / 2;
  let sum = 0;
  for (let i = centre - LINE_HALF_WIDTH_BINS; i <= centre + LINE_HALF_WIDTH_BINS; i++) {
    if (i >= 0 && i < psd.fftLength) sum += psd.densityPerHz[i] as number;
  }
  return sum * psd.binWidthHz;
}

/** Total power of the spectrum, Σ PSD × bin width (FS²; Parseval, = mean |x|²). */
export function totalPower(psd: WelchPsd): number {
  let sum = 0;
  for (let i = 0; i < psd.fftLength; i++) sum += psd.densityPerHz[i] as number;
  return sum * psd.binWidthHz;
}

/** Mean phase step of `iq` as a frequency, Hz: arg Σ x[k]·conj(x[k−1]) · fs/2π (the carrier of
 * a tone-modulated emission, to the modulation's share of one period). */
export function meanPhaseStepHz(iq: Float32Array, sampleRateHz: number): number {
  const n = iq.length >> 1;
  let re = 0;
  let im = 0;
  for (let k = 1; k < n; k++) {
    const ci = iq[2 * k] as number;
    const cq = iq[2 * k + 1] as number;
    const pi = iq[2 * k - 2] as number;
    const pq = iq[2 * k - 1] as number;
    re += ci * pi + cq * pq;
    im += cq * pi - ci * pq;
  }
  return (Math.atan2(im, re) * sampleRateHz) / (2 * Math.PI);
}
