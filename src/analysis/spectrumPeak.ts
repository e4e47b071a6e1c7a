/**
 * The strongest line of a Welch PSD: its frequency (parabolic interpolation of the dB values of
 * the peak bin and its two neighbours, which is exact for a Gaussian-shaped peak; common
 * practice for windowed power spectra) and the power in one resolution bandwidth at that bin,
 * density × ENBW, which reads a steady carrier's power to within the window's scallop loss
 * (Hann: at most 1.42 dB, Harris 1978, Table 1).
 */
import { binFrequencyHz, powerToDb, type WelchPsd } from "../dsp/index.js";

export interface SpectrumPeak {
  readonly offsetHz: number;
  readonly dbfs: number;
  readonly binIndex: number;
}

export function spectrumPeak(psd: WelchPsd): SpectrumPeak {
  const d = psd.densityPerHz;
  let best = 0;
  for (let i = 1; i < d.length; i++) if ((d[i] as number) > (d[best] as number)) best = i;
  let delta = 0;
  if (best > 0 && best < d.length - 1) {
    const a = powerToDb(d[best - 1] as number);
    const b = powerToDb(d[best] as number);
    const c = powerToDb(d[best + 1] as number);
    const denominator = a - 2 * b + c;
    if (denominator < 0) delta = Math.max(-0.5, Math.min(0.5, (0.5 * (a - c)) / denominator));
  }
  return {
    offsetHz: binFrequencyHz(psd, best) + delta * psd.binWidthHz,
    dbfs: powerToDb((d[best] as number) * psd.enbwHz),
    binIndex: best,
  };
}
