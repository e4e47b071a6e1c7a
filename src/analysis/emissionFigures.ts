/**
 * Everything `measure` finds about one emission, as Measurements (value, unit, k = 2
 * uncertainty, method). Built by measureEmission(); turned into the contract's JSON, the Markdown
 * report and the figures by src/report/.
 */
import type { WelchPsd } from "../dsp/index.js";
import type { WholeSpanFigures } from "./wholeSpan.js";
import type { Measurement } from "../measure/index.js";

export type EmissionClass = "cw" | "am" | "fm" | "fsk" | "ook" | "psk" | "qam" | "noise" | "unknown";

/** A min/max trace over time for a figure: one pair a time bucket. */
export interface Trace {
  readonly timeS: ArrayLike<number>;
  readonly min: ArrayLike<number>;
  readonly max: ArrayLike<number>;
}

export interface FmFiguresOut {
  readonly peakDeviationHz: Measurement;
  readonly positiveDeviationHz: Measurement;
  readonly negativeDeviationHz: Measurement;
  readonly rmsDeviationHz: Measurement;
  readonly rawPeakDeviationHz: Measurement;
  readonly modulatingFrequencyHz: Measurement;
  readonly modulationIndex: Measurement;
  readonly carsonBandwidthHz: Measurement;
  readonly toneHz: Measurement;
  readonly toneStandardHz: number | null;
  readonly toneDeviationHz: Measurement;
  readonly besselNullIndex: Measurement;
  readonly audioBandwidthHz: number;
  /** When the positive and the negative peak of the filtered deviation happened over the whole span, s from its start (null without the whole-span stage). */
  readonly positivePeakTimeS: number | null;
  readonly negativePeakTimeS: number | null;
  /** What the peak deviations were taken over: the channel record, or (a record cut short) the whole span. */
  readonly peaksOver: "record" | "whole span";
  /** Instantaneous frequency relative to the carrier, Hz. */
  readonly trace: Trace;
}

export interface AmFiguresOut {
  readonly modulationDepthPercent: Measurement;
  readonly positiveDepthPercent: Measurement;
  readonly negativeDepthPercent: Measurement;
  readonly modulatingFrequencyHz: Measurement;
  readonly upperSidebandDbc: Measurement;
  readonly lowerSidebandDbc: Measurement;
  /** Envelope relative to the carrier level (1 = carrier). */
  readonly trace: Trace;
}

export interface DigitalFiguresOut {
  readonly symbolRateBd: Measurement;
  readonly evmRmsPercent: Measurement;
  readonly evmPeakPercent: Measurement;
  readonly merDb: Measurement;
  readonly iqOriginOffsetDb: Measurement;
  readonly frequencyErrorHz: Measurement;
  readonly symbols: number | null;
  readonly rollOff: number | null;
  readonly rollOffMethod: string | null;
  readonly constellation: string | null;
  /** Recovered symbols and their decided ideal points, for the constellation figure. */
  readonly recovered: { readonly symbols: Float64Array; readonly ideal: Float64Array } | null;
}

export interface FskFiguresOut {
  readonly shiftHz: Measurement;
  readonly modulationIndex: Measurement;
  readonly toneFrequenciesHz: readonly Measurement[];
  /** Histogram of the instantaneous frequency (Hz from the channel centre). */
  readonly histogram: { readonly binsHz: ArrayLike<number>; readonly counts: ArrayLike<number> };
}

export interface OokFiguresOut {
  readonly onOffRatioDb: Measurement;
  readonly dutyCyclePercent: Measurement;
  readonly onLevelDbfs: Measurement;
}

export interface EmissionFigures {
  readonly channel: {
    readonly offsetHz: number;
    readonly widthHz: number;
    readonly givenByUser: boolean;
    readonly sampleRateHz: number;
    readonly decimation: number;
    readonly measuredS: number;
  };
  readonly dcSpike: { readonly present: boolean; readonly levelDbfs: number | null; readonly widthHz: number | null };
  readonly carrier: {
    readonly offsetHz: Measurement;
    readonly frequencyHz: Measurement;
    readonly errorPpm: Measurement;
    readonly nominalHz: number | null;
  };
  readonly bandwidth: {
    readonly occupiedHz: Measurement;
    readonly lowerEdgeHz: Measurement;
    readonly upperEdgeHz: Measurement;
    readonly xDbHz: Measurement;
    readonly xDbLowerEdgeHz: Measurement;
    readonly xDbUpperEdgeHz: Measurement;
    readonly xDb: number;
    /** The x-dB bandwidth's 0 dB reference: the mean PSD's maximum or the max-hold's. */
    readonly xDbReference: "average" | "peak-hold";
    readonly resolutionHz: number;
  };
  readonly power: { readonly channelDbfs: Measurement; readonly snrDb: Measurement };
  readonly modulation: {
    readonly class: EmissionClass;
    readonly order: number | null;
    readonly confidence: number;
    readonly forced: boolean;
    readonly method: string;
    readonly features: Readonly<Record<string, number>>;
  };
  readonly fm: FmFiguresOut | null;
  readonly am: AmFiguresOut | null;
  /** For every digital class (ook, fsk, psk, qam); EVM figures for psk and qam only. */
  readonly digital: DigitalFiguresOut | null;
  readonly fsk: FskFiguresOut | null;
  readonly ook: OokFiguresOut | null;
  readonly emission: {
    readonly designator: string | null;
    /** Where the designator's bandwidth came from (interface.md `emission.designatorBasis`), null without one. */
    readonly designatorBasis: "necessary" | "occupied" | null;
    readonly necessaryBandwidthHz: Measurement;
    readonly method: string;
  };
  /** PSD of the channel baseband (0 Hz = channel.offsetHz), for the spectrum figure. */
  readonly channelPsd: WelchPsd | null;
  readonly noiseFloorDbfsPerHz: number;
  /** The whole-span figures (carrier, peak deviations with times, PSD, max-hold spectra) when measureEmission read the channel itself, else null. */
  readonly wholeSpan: WholeSpanFigures | null;
  readonly warnings: readonly string[];
}
