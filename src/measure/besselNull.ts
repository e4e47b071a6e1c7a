/**
 * The Bessel-null cross-check of the FM modulation index, and the line levels of tone FM.
 *
 * Tone FM with index β has lines at fc + n·fm of amplitude J_n(β)·A (A&S 9.1.41–9.1.43), so the
 * carrier line vanishes when β is a zero j_{0,k} of J_0 (2.4048, 5.5201, 8.6537, …, A&S Table
 * 9.5). When the measured carrier line is that weak, β = j_{0,k} for the zero nearest the index
 * measured from the deviation: a calibration that needs no frequency-discriminator gain
 * (REFERENCES.md §1, "carrier-null deviation calibration").
 */
import { powerToDb } from "../dsp/index.js";
import { besselJ, besselJZeros } from "./bessel.js";
import { lineSpectrum, linePower, meanPhaseStepHz, totalPower } from "./lineSpectrum.js";
import { measurement, notAvailable, type Measurement } from "./measurement.js";

/** Line levels of tone FM relative to the total power. */
export interface ToneFmLineLevels {
  /** The carrier used, Hz from the capture centre (mean phase step). */
  readonly carrierOffsetHz: number;
  /** levelsDb[n] for n = −nMax … nMax at index n + nMax: 10·log10(P(fc + n·fm) / P_total), dB. */
  readonly levelsDb: Float64Array;
  /** Bin width of the spectrum the lines were read from, Hz. */
  readonly binWidthHz: number;
}

/**
 * Carrier and sideband line levels of `iq` (interleaved I,Q at `sampleRateHz`), tone FM at
 * modulating frequency `modulatingFrequencyHz`, for n = −nMax … nMax, relative to the total
 * power: for a clean tone they are 20·log10|J_n(β)| (Σ J_n² = 1, A&S 9.1.76). Lines come from a
 * Blackman–Harris Welch spectrum with at least 64 bins per fm where the samples allow, each line
 * the power of its 9 nearest bins (lineSpectrum.ts). Throws RangeError for bad parameters.
 */
export function toneFmLineLevelsDb(
  iq: Float32Array,
  sampleRateHz: number,
  modulatingFrequencyHz: number,
  nMax: number,
): ToneFmLineLevels {
  if (!(Number.isFinite(sampleRateHz) && sampleRateHz > 0)) throw new RangeError(`sampleRateHz ${sampleRateHz} is not a positive finite rate`);
  if (!(Number.isFinite(modulatingFrequencyHz) && modulatingFrequencyHz > 0)) {
    throw new RangeError(`modulatingFrequencyHz ${modulatingFrequencyHz} is not a positive finite frequency`);
  }
  if (!Number.isInteger(nMax) || nMax < 0) throw new RangeError(`nMax ${nMax} is not a non-negative integer`);
  const psd = lineSpectrum(iq, sampleRateHz, modulatingFrequencyHz);
  const fc = meanPhaseStepHz(iq, sampleRateHz);
  const total = totalPower(psd);
  const levelsDb = new Float64Array(2 * nMax + 1);
  for (let n = -nMax; n <= nMax; n++) {
    levelsDb[n + nMax] = powerToDb(linePower(psd, fc + n * modulatingFrequencyHz) / total);
  }
  return { carrierOffsetHz: fc, levelsDb, binWidthHz: psd.binWidthHz };
}

/** Options of `besselNullIndex`. */
export interface BesselNullOptions {
  /** The carrier counts as vanished at or below this level re the total power, dB. Default −20 dB. */
  readonly nullThresholdDb?: number;
}

/** Defaults of `besselNullIndex`: −20 dB, i.e. |J_0(β)| ≤ 0.1. */
export const BESSEL_NULL_DEFAULTS = { nullThresholdDb: -20 } as const;

/**
 * The Bessel-null estimate of the modulation index: when the carrier line of tone FM
 * (`toneFmLineLevelsDb`, n = 0) is at or below `nullThresholdDb` re the total, β = j_{0,k} for the
 * zero of J_0 nearest `measuredIndex`; otherwise null with the reason. Uncertainty: the offset
 * from the zero that the residual carrier implies, |J_0(β)| ≈ |J_1(j_{0,k})|·|β − j_{0,k}| (first-
 * order Taylor, J_0' = −J_1), i.e. √(P_0/P_total) / |J_1(j_{0,k})|. Dimensionless.
 */
export function besselNullIndex(
  iq: Float32Array,
  sampleRateHz: number,
  modulatingFrequencyHz: number,
  measuredIndex: number,
  options: BesselNullOptions = {},
): Measurement<""> {
  const threshold = options.nullThresholdDb ?? BESSEL_NULL_DEFAULTS.nullThresholdDb;
  if (!Number.isFinite(measuredIndex) || measuredIndex < 0) throw new RangeError(`measuredIndex ${measuredIndex} is not a non-negative number`);
  if (!(threshold < 0)) throw new RangeError(`nullThresholdDb ${threshold} is not negative`);
  const { levelsDb } = toneFmLineLevelsDb(iq, sampleRateHz, modulatingFrequencyHz, 0);
  const carrierDb = levelsDb[0] as number;
  const method = `Bessel null: carrier line ${carrierDb.toFixed(1)} dB re total (threshold ${threshold} dB), β = nearest zero of J0 (A&S Table 9.5)`;
  if (carrierDb > threshold) {
    return notAvailable("", method, `the carrier line (${carrierDb.toFixed(1)} dB re total) is not near a Bessel null`);
  }
  const zeros = besselJZeros(0, Math.max(4, Math.ceil(measuredIndex / Math.PI) + 3));
  let best = zeros[0] as number;
  for (const z of zeros) if (Math.abs(z - measuredIndex) < Math.abs(best - measuredIndex)) best = z;
  const residual = Math.sqrt(Math.pow(10, carrierDb / 10));
  return measurement(best, "", residual / Math.abs(besselJ(1, best)), method);
}
