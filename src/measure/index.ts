// The public surface of src/measure: re-exports only.
export { measurement, notAvailable, type Measurement } from "./measurement.js";
export { fastAtan2 } from "./fastAtan2.js";
export { instantaneousFrequencyHz, StreamingDiscriminator } from "./fmDiscriminator.js";
export {
  fmFigures, FM_FIGURES_DEFAULTS, FM_AUDIO_RIPPLE, audioLowpassTaps, audioNoiseIntegrals, type FmFigures, type FmFiguresOptions, type FmTrace,
} from "./fmFigures.js";
export { CTCSS_TONES_HZ, nearestCtcssToneHz } from "./ctcssTones.js";
export { besselJ, besselJZeros } from "./bessel.js";
export {
  besselNullIndex, toneFmLineLevelsDb, BESSEL_NULL_DEFAULTS, type BesselNullOptions, type ToneFmLineLevels,
} from "./besselNull.js";
export {
  amFigures, AM_FIGURES_DEFAULTS, AM_EXTREME_QUANTILE, type AmFigures, type AmFiguresOptions, type AmTrace,
} from "./amFigures.js";
export { detectDcSpike, mainLobeHalfWidthBins, lineWidthBoundBins, removeLine, DC_SPIKE_DEFAULTS, type DcSpike, type DcSpikeOptions } from "./detectDcSpike.js";
export {
  locateEmission, LOCATE_EMISSION_DEFAULTS, type EmissionRegion, type LocateEmissionOptions,
} from "./locateEmission.js";
export { toneFrequency, psdCentroidHz } from "./carrierFrequency.js";
export {
  occupiedBandwidth, OCCUPIED_BANDWIDTH_DEFAULTS, type OccupiedBandwidth, type OccupiedBandwidthOptions,
} from "./occupiedBandwidth.js";
export { xDbBandwidth, X_DB_BANDWIDTH_DEFAULTS, X_DB_REFERENCES, type XDbBandwidth, type XDbBandwidthOptions, type XDbReference } from "./xDbBandwidth.js";
export { channelPower, type ChannelPower, type ChannelPowerOptions } from "./channelPower.js";
export { analogFeatures, amNoiseLevelShareMax, type AnalogFeatures, type AnalogFeaturesOptions } from "./analogFeatures.js";
export {
  classifyAnalog, CLASSIFY_ANALOG_THRESHOLDS, type AnalogClass, type AnalogClassification,
} from "./classifyAnalog.js";
export { bandwidthCode, emissionDesignator, type EmissionDesignator, type DesignatorClass } from "./designator.js";
export { necessaryBandwidthFmHz, necessaryBandwidthAmHz } from "./necessaryBandwidth.js";
export { frequencyErrorPpm, frequencyErrorPpmOf, REFERENCE_NOT_INCLUDED } from "./ppm.js";
export {
  normalisedCumulants, complexAbs, type Complex, type NormalisedCumulants, type NormalisedCumulantsOptions,
} from "./cumulants.js";
export {
  digitalFeatures, type DigitalFeatures, type DigitalFeaturesOptions, type EnvelopeKeying, type FrequencyKeying, type LinearKeying,
} from "./digitalFeatures.js";
export {
  classifyEmission, CLASSIFY_EMISSION_THRESHOLDS, IDEAL_CUMULANTS,
  type EmissionClass, type EmissionClassification, type ClassifyEmissionOptions,
} from "./classifyEmission.js";
export {
  symbolRateBlind, SYMBOL_RATE_DEFAULTS, type SymbolRateFeature, type SymbolRateOptions,
} from "./symbolRate.js";
export {
  evmFigures, decideSymbols, normaliseGain, bestConstellation, type EvmFigures, type ConstellationChoice,
} from "./evm.js";
export { recoverSymbols, RECOVERY_DEFAULTS, type Recovered, type RecoveryOptions } from "./pskQamRecovery.js";
export { recoveryFloorPercent } from "./recoveryFloor.js";
export { fskFigures, FSK_FIGURES_DEFAULTS, type FskFigures, type FskFiguresOptions, type FrequencyHistogram } from "./fskFigures.js";
export { ookFigures, type OokFigures, type OokFiguresOptions } from "./ookFigures.js";
export { burstSamples, burstSpans, gatherBursts, type BurstSpans, type Bursts } from "./burstGate.js";
export { transitionTiming, type TransitionTiming, type Segments } from "./transitionTiming.js";
export { bandLimit } from "./bandLimit.js";
