/**
 * What an evaluation case is and what is true about it: the parameters it was generated from,
 * and the figures that follow from them by theory (theory.ts).
 */

/** Class labels of the truth and of the measurement: the class with its order where it has one. */
export type TrueLabel =
  | "cw" | "am" | "fm" | "fsk2" | "fsk4" | "ook" | "psk2" | "psk4" | "psk8" | "qam16" | "qam32" | "qam64";

export const TRUE_LABELS: readonly TrueLabel[] = [
  "cw", "am", "fm", "fsk2", "fsk4", "ook", "psk2", "psk4", "psk8", "qam16", "qam32", "qam64",
];

/** Variants of the generator, each with its class label. */
export type Variant =
  | "cw" | "am-tone" | "am-speech" | "fm-tone" | "fm-speech"
  | "fsk2" | "fsk4" | "fsk2-burst" | "fsk4-burst" | "gfsk2"
  | "ook" | "ook-soft"
  | "bpsk" | "qpsk" | "8psk" | "16qam" | "32qam" | "64qam";

export const VARIANT_LABEL: Readonly<Record<Variant, TrueLabel>> = {
  cw: "cw", "am-tone": "am", "am-speech": "am", "fm-tone": "fm", "fm-speech": "fm",
  fsk2: "fsk2", fsk4: "fsk4", "fsk2-burst": "fsk2", "fsk4-burst": "fsk4", gfsk2: "fsk2",
  ook: "ook", "ook-soft": "ook",
  bpsk: "psk2", qpsk: "psk4", "8psk": "psk8", "16qam": "qam16", "32qam": "qam32", "64qam": "qam64",
};

export const VARIANTS = Object.keys(VARIANT_LABEL) as readonly Variant[];

export type FileFormat = "cu8" | "cf32";

/** The figures compared for coverage, by their report path. */
export type Quantity = "carrierOffsetHz" | "fmPeakDeviationHz" | "amDepthPercent" | "occupiedHz" | "symbolRateBd" | "evmRmsPercent";

export const QUANTITIES: readonly Quantity[] = [
  "carrierOffsetHz", "fmPeakDeviationHz", "amDepthPercent", "occupiedHz", "symbolRateBd", "evmRmsPercent",
];

/** Report path of each quantity's value and of its k = 2 uncertainty. */
export const QUANTITY_PATH: Readonly<Record<Quantity, string>> = {
  carrierOffsetHz: "carrier.offsetHz",
  fmPeakDeviationHz: "fm.peakDeviationHz",
  amDepthPercent: "am.modulationDepthPercent",
  occupiedHz: "bandwidth.occupiedHz",
  symbolRateBd: "digital.symbolRateBd",
  evmRmsPercent: "digital.evmRmsPercent",
};

export interface CaseTruth {
  readonly variant: Variant;
  readonly label: TrueLabel;
  readonly sampleRateHz: number;
  readonly centerHz: number;
  readonly durationS: number;
  readonly format: FileFormat;
  /** DC offset added before quantisation, dB relative to the emission's power; null when none. */
  readonly dcSpikeDbc: number | null;
  /** SNR drawn, and the SNR reached after quantisation (cu8), in the reference bandwidth below. */
  readonly drawnSnrDb: number;
  readonly snrDb: number;
  readonly snrReferenceHz: number;
  /** Parameters of the emission (Hz, Bd, %, …), as drawn. */
  readonly params: Readonly<Record<string, number>>;
  /** The true figures, null where theory gives none for this case (not compared). */
  readonly figures: Readonly<Record<Quantity, number | null>>;
}

export interface EvalCase {
  readonly id: string;
  readonly seed: number;
  readonly truth: CaseTruth;
}
