/**
 * Channel power and in-channel SNR from a Welch PSD (density scaling, FS²/Hz).
 *
 * Channel power P_ch = Σ_k PSD_k·Δf over the bins whose centres lie in [lowerHz, upperHz]
 * (Heinzel, Rüdiger & Schilling 2002, §9: density scaling is already ENBW-corrected), in dBFS;
 * over the whole band it is the mean power E|z|² (Parseval). Uncertainty (k = 2): the
 * statistical spread of the sum, each bin varying as PSD_k·√(2/ν) with ν the Welch degrees of
 * freedom, so that the sum follows χ²_ν'/ν' with ν' = ν·(Σp)²/Σp² (Welch 1967; the weighted
 * sum of independent bins, Satterthwaite 1946), and the k = 2 interval is its 2.3 % and 97.7 %
 * quantiles (Wilson–Hilferty), stated as the larger side in dB.
 *
 * SNR (interface.md, in-channel): the signal power S = P_ch − floor·W_ch (the noise in the
 * channel's W_ch removed) over the noise power in the occupied bandwidth, floor·OBW:
 *   snrDb = 10·log10(S / (floor·OBW)).
 * Removing the channel's noise first makes pure noise read far below 0 dB rather than about
 * 0 dB; at high SNR this equals channel power over floor·OBW. Null when S ≤ 0 or OBW is unknown.
 * Uncertainty (k = 2): the channel-power interval carried to S (the larger side, in dB), in
 * quadrature with the relative uncertainty of the OBW (4.343·u_OBW/OBW dB) when it is given.
 */
import { binFrequencyHz, chiSquareQuantileOverNu, equivalentDegreesOfFreedom, powerToDb, type WelchPsd } from "../dsp/index.js";
import { measurement, notAvailable, type Measurement } from "./measurement.js";

/** Options of channelPower. */
export interface ChannelPowerOptions {
  readonly lowerHz: number;
  readonly upperHz: number;
  /** Noise density, FS²/Hz, for the SNR. */
  readonly noiseFloorPerHz?: number | undefined;
  /** Occupied bandwidth, Hz, for the SNR. */
  readonly occupiedHz?: number | null | undefined;
  /** Expanded uncertainty (k = 2) of occupiedHz, Hz. */
  readonly occupiedUncertaintyHz?: number | null | undefined;
}

/** Normal probabilities of ±2σ: the k = 2 interval of the chi-square law. */
const P_LOW = 0.02275;
const P_HIGH = 0.97725;

/** Channel power (dBFS), SNR (dB) and the linear channel power (FS²). */
export interface ChannelPower {
  readonly channelDbfs: Measurement<"Dbfs">;
  readonly snrDb: Measurement<"Db">;
  /** Σ PSD·Δf, FS² (mean-square full-scale units). */
  readonly channelPowerFs2: number;
  /** Width the bins cover, Hz. */
  readonly channelWidthHz: number;
}

/** Channel power and in-channel SNR of `psd` over [lowerHz, upperHz] (module comment). */
export function channelPower(psd: WelchPsd, options: ChannelPowerOptions): ChannelPower {
  const { lowerHz, upperHz } = options;
  if (!(upperHz > lowerHz)) throw new RangeError(`upperHz ${upperHz} is not above lowerHz ${lowerHz}`);
  const df = psd.binWidthHz;
  let sum = 0;
  let sum2 = 0;
  let bins = 0;
  for (let i = 0; i < psd.fftLength; i++) {
    const f = binFrequencyHz(psd, i);
    if (f < lowerHz - 1e-9 * df || f > upperHz + 1e-9 * df) continue;
    const v = (psd.densityPerHz[i] as number) * df;
    sum += v;
    sum2 += v * v;
    bins++;
  }
  const nu = equivalentDegreesOfFreedom(psd);
  // χ² interval of the sum; ν' from the bins' weights (one bin of a 1-segment PSD has ν = 2).
  const nuSum = nu > 0 && sum2 > 0 ? (nu * sum * sum) / sum2 : 2;
  const qHigh = chiSquareQuantileOverNu(nuSum, P_HIGH);
  const qLow = chiSquareQuantileOverNu(nuSum, P_LOW);
  const widthHz = bins * df;
  const method = `sum of PSD x bin width over ${bins} bins (${widthHz.toFixed(1)} Hz); ± chi-square(${nuSum.toFixed(0)} dof) interval`;
  const channelDbfs = bins === 0
    ? notAvailable("Dbfs", method, `no PSD bin lies in ${lowerHz}..${upperHz} Hz`)
    : measurement(powerToDb(sum), "Dbfs", sum > 0 ? dbInterval(sum, sum, qLow, qHigh) : null, method);
  const snrMethod = `signal (channel power minus floor x channel width) over floor x occupied bandwidth; ± chi-square(${nuSum.toFixed(0)} dof) interval of the channel sum and the OBW uncertainty`;
  let snrDb: Measurement<"Db">;
  const floor = options.noiseFloorPerHz;
  const obw = options.occupiedHz;
  if (floor === undefined || !(floor > 0)) snrDb = notAvailable("Db", snrMethod, "no noise floor given");
  else if (obw === undefined || obw === null || !(obw > 0)) snrDb = notAvailable("Db", snrMethod, "no occupied bandwidth");
  else {
    const signal = sum - floor * widthHz;
    const uObw = options.occupiedUncertaintyHz ?? 0;
    snrDb = signal > 0
      ? measurement(powerToDb(signal / (floor * obw)), "Db", Math.hypot(dbInterval(sum, signal, qLow, qHigh), (10 / Math.LN10) * (uObw / obw)), snrMethod)
      : notAvailable("Db", snrMethod, "no power above the noise floor in the channel");
  }
  return { channelDbfs, snrDb, channelPowerFs2: sum, channelWidthHz: widthHz };
}

/**
 * The larger side, in dB, of the change of `part` (a share of the sum, the rest known) when the
 * sum moves to its χ² quantiles sum·qLow and sum·qHigh. When the low side reaches zero, twice the
 * high side (the interval is then one-sided and wide).
 */
function dbInterval(sum: number, part: number, qLow: number, qHigh: number): number {
  const up = 10 * Math.log10(1 + (sum * (qHigh - 1)) / part);
  const downShare = 1 - (sum * (1 - qLow)) / part;
  const down = downShare > 0 ? -10 * Math.log10(downShare) : 2 * up;
  return Math.max(up, down);
}
