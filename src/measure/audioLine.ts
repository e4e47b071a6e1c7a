/**
 * The strongest spectral line of a real signal (demodulated audio, an envelope) within a band.
 * Module-internal: used for the modulating frequency of FM and AM.
 *
 * Spectrum: Welch average (dsp WelchAccumulator) of the signal as the real part of a complex
 * input, Hann window, 50 % overlap, segments the longest power of two that fits, up to a bin
 * width of about 1 Hz. Peak: the largest bin in [loHz, hiHz], refined by fitting a parabola to
 * the logarithm of the three bins around it (Gaussian interpolation; for the Hann window its
 * bias stays below about 0.02 bin, common practice, value recalled from memory; the stated
 * uncertainty of ±0.1 bin covers it with margin).
 */
import { WelchAccumulator, binFrequencyHz } from "../dsp/index.js";

/** The dominant line of a band. */
export interface AudioLine {
  /** Interpolated frequency, Hz; null when the band holds no bin. */
  readonly frequencyHz: number | null;
  /** Bin width of the spectrum, Hz. */
  readonly binWidthHz: number;
  /** Peak bin over the median bin of the band, dB (how clearly the line stands out). */
  readonly prominenceDb: number;
  /**
   * Share of the band's power within ±3 bins of the peak (the Hann main lobe is ±2 bins): near 1
   * for one tone, well below for speech or several tones. 0 when there is no line.
   */
  readonly lineShare: number;
}

/** Finest bin width asked for, Hz. */
const TARGET_BIN_WIDTH_HZ = 1;
/** Samples of the signal converted for the Welch accumulator at a time (with one segment before them), so that no copy of the whole signal is made. */
const CHUNK_SAMPLES = 1 << 16;

/** The dominant line of real signal `x` (at `sampleRateHz`) in [loHz, hiHz]; see the file comment. */
export function dominantLine(x: Float64Array, sampleRateHz: number, loHz: number, hiHz: number): AudioLine {
  let fftLength = 256;
  while (fftLength * 2 <= x.length && sampleRateHz / fftLength > TARGET_BIN_WIDTH_HZ) fftLength *= 2;
  if (fftLength > x.length) return { frequencyHz: null, binWidthHz: sampleRateHz / fftLength, prominenceDb: 0, lineShare: 0 };
  let mean = 0;
  for (let i = 0; i < x.length; i++) mean += x[i] as number;
  mean /= x.length;
  const acc = new WelchAccumulator({ fftLength, sampleRateHz, window: "hann" });
  // Blocks with a prefix of one segment (the block contract of dsp/frameGrid.ts): the same
  // segments, in the same order, as one push of the whole signal. Q stays 0.
  const chunk = new Float32Array(2 * (CHUNK_SAMPLES + fftLength));
  for (let owned = 0; owned < x.length; owned += CHUNK_SAMPLES) {
    const start = Math.max(0, owned - fftLength);
    const stop = Math.min(x.length, owned + CHUNK_SAMPLES);
    for (let i = start; i < stop; i++) chunk[2 * (i - start)] = (x[i] as number) - mean;
    acc.push(chunk.subarray(0, 2 * (stop - start)), start, owned);
  }
  const psd = acc.finish();
  const bin = psd.binWidthHz;
  const first = Math.max(1, Math.ceil(loHz / bin)) + fftLength / 2;
  const last = Math.min(fftLength / 2 - 2, Math.floor(hiHz / bin)) + fftLength / 2;
  if (last < first) return { frequencyHz: null, binWidthHz: bin, prominenceDb: 0, lineShare: 0 };
  const d = psd.densityPerHz;
  let best = first;
  const band: number[] = [];
  for (let i = first; i <= last; i++) {
    band.push(d[i] as number);
    if ((d[i] as number) > (d[best] as number)) best = i;
  }
  band.sort((a, b) => a - b);
  const median = band[band.length >> 1] as number;
  const peak = d[best] as number;
  if (!(peak > 0)) return { frequencyHz: null, binWidthHz: bin, prominenceDb: 0, lineShare: 0 };
  const offset = parabolicPeakOffset(d[best - 1] as number, peak, d[best + 1] as number);
  const prominenceDb = median > 0 ? 10 * Math.log10(peak / median) : 300;
  let inLine = 0;
  let total = 0;
  for (let i = first; i <= last; i++) {
    total += d[i] as number;
    if (Math.abs(i - best) <= 3) inLine += d[i] as number;
  }
  return { frequencyHz: binFrequencyHz(psd, best) + offset * bin, binWidthHz: bin, prominenceDb, lineShare: total > 0 ? inLine / total : 0 };
}

/**
 * Offset in bins (within ±½) of the vertex of the parabola through (−1, ln a), (0, ln b),
 * (1, ln c), b the largest: δ = ½(ln a − ln c)/(ln a − 2 ln b + ln c).
 */
export function parabolicPeakOffset(a: number, b: number, c: number): number {
  const tiny = b * 1e-30;
  const la = Math.log(Math.max(a, tiny));
  const lb = Math.log(b);
  const lc = Math.log(Math.max(c, tiny));
  const den = la - 2 * lb + lc;
  if (!(den < 0)) return 0;
  const delta = (0.5 * (la - lc)) / den;
  return Math.max(-0.5, Math.min(0.5, delta));
}
