/**
 * `--nominal` without `--channel`: the emission nearest the nominal frequency, never the strongest
 * elsewhere in the capture. The pass-1 PSD is searched for a region reaching into a window
 * around the nominal, first ±12.5 kHz (half a 25 kHz channel, the widest land-mobile spacing in
 * use: common practice), then ×4 wider at each step until the window holds the whole band; the
 * strongest region in the first window that holds one is the emission. Beyond the first window
 * a warning says how far from the nominal it lies.
 */
import type { WelchPsd } from "../dsp/index.js";
import { locateEmission, type EmissionRegion } from "../measure/index.js";

/** First half-width of the search window, Hz, and the factor between steps. */
export const NEAR_NOMINAL = { firstHalfWidthHz: 12_500, growth: 4 } as const;

export interface NearNominal {
  readonly region: EmissionRegion | null;
  /** One line when the emission found lies beyond the first window, else null. */
  readonly warning: string | null;
}

/**
 * The region nearest `nominalOffsetHz` (the nominal frequency as an offset from the capture
 * centre, as the receiver shows it, Hz) in `psd` above `floorPerHz` (FS²/Hz); `nominalHz` is the
 * absolute frequency, for the warning.
 */
export function locateNearNominal(psd: WelchPsd, floorPerHz: number, nominalOffsetHz: number, nominalHz: number, dcOffsetDbfs: number): NearNominal {
  const wholeBandHz = Math.abs(nominalOffsetHz) + psd.sampleRateHz / 2;
  for (let halfWidthHz: number = NEAR_NOMINAL.firstHalfWidthHz; ; halfWidthHz *= NEAR_NOMINAL.growth) {
    const region = locateEmission(psd, floorPerHz, { near: { offsetHz: nominalOffsetHz, halfWidthHz }, dcOffsetDbfs });
    if (region !== null) {
      const first = halfWidthHz === NEAR_NOMINAL.firstHalfWidthHz;
      return { region, warning: first ? null : farWarning(region, nominalOffsetHz, nominalHz) };
    }
    if (halfWidthHz >= wholeBandHz) return { region: null, warning: null };
  }
}

function farWarning(region: EmissionRegion, nominalOffsetHz: number, nominalHz: number): string {
  const awayHz = region.centerOffsetHz - nominalOffsetHz;
  const at = nominalHz + awayHz;
  return `no emission within ±${NEAR_NOMINAL.firstHalfWidthHz / 1000} kHz of the nominal ${mhz(nominalHz)}; measured the nearest, at ${mhz(at)} ` +
    `(${(Math.abs(awayHz) / 1000).toFixed(1)} kHz ${awayHz >= 0 ? "above" : "below"} it; give --channel to choose another)`;
}

function mhz(hz: number): string {
  return `${(hz / 1e6).toFixed(6).replace(/0+$/, "").replace(/\.$/, "")} MHz`;
}
