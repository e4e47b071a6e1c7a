/**
 * Adjacent channel power: the mean power in a band of the integration bandwidth B centred one
 * channel spacing S above and below the assigned frequency, relative to the power in the same
 * bandwidth centred on it (the ACLR/ACPR definition, REFERENCES.md §10: filtered mean power of
 * the adjacent channel over that of the assigned channel; here the filter is a rectangular band
 * of width B). Both from the whole-span Welch PSD (density scaling): P = Σ_k (S_k − N0)·Δf over
 * the bins inside the band (REFERENCES.md §10 "channel power"), the noise density N0 taken out
 * so that the figure is the emission's, not the receiver's; a band whose power does not stand
 * above the noise reads as "at most" the noise's power in it.
 */
import { binFrequencyHz, type WelchPsd } from "../dsp/index.js";

export interface AdjacentChannelInput {
  readonly psd: WelchPsd;
  /** The assigned frequency in the PSD's frequencies, Hz. */
  readonly centreHz: number;
  readonly spacingHz: number;
  readonly bandwidthHz: number;
  /** The receiver's noise density, FS²/Hz. */
  readonly noiseDensityPerHz: number;
}

export interface AdjacentSide {
  /** Power relative to the assigned channel's, dB. */
  readonly relativeDb: number;
  /** True when the band's power does not stand above the noise: relativeDb is then the noise's, an upper bound. */
  readonly atMost: boolean;
}

export interface AdjacentChannelResult {
  readonly lower: AdjacentSide | null;
  readonly upper: AdjacentSide | null;
  /** Power in the assigned channel's band, dBFS. */
  readonly mainDbfs: number;
}

/** Null sides where the band reaches outside the PSD's frequencies. */
export function adjacentChannelPower(input: AdjacentChannelInput): AdjacentChannelResult | null {
  const { psd, centreHz, spacingHz, bandwidthHz } = input;
  const main = bandPower(psd, centreHz, bandwidthHz, input.noiseDensityPerHz);
  if (main === null || !(main.power > 0)) return null;
  const side = (c: number): AdjacentSide | null => {
    const p = bandPower(psd, c, bandwidthHz, input.noiseDensityPerHz);
    if (p === null) return null;
    const atMost = p.power <= p.noise;
    return { relativeDb: 10 * Math.log10(Math.max(atMost ? p.noise : p.power, 1e-300) / main.power), atMost };
  };
  return { lower: side(centreHz - spacingHz), upper: side(centreHz + spacingHz), mainDbfs: 10 * Math.log10(main.power) };
}

/** Σ (S_k − N0)·Δf over the band, and N0·B; null when the band is not inside the PSD's span. */
function bandPower(psd: WelchPsd, centreHz: number, widthHz: number, n0: number): { power: number; noise: number } | null {
  const lo = centreHz - widthHz / 2;
  const hi = centreHz + widthHz / 2;
  const top = (psd.fftLength / 2 - 1) * psd.binWidthHz;
  const bottom = -(psd.fftLength / 2) * psd.binWidthHz;
  if (lo < bottom || hi > top) return null;
  let p = 0;
  let bins = 0;
  for (let i = 0; i < psd.fftLength; i++) {
    const f = binFrequencyHz(psd, i);
    if (f < lo || f > hi) continue;
    p += (psd.densityPerHz[i] as number) - n0;
    bins++;
  }
  return { power: p * psd.binWidthHz, noise: n0 * bins * psd.binWidthHz };
}
