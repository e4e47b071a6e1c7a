// The public surface of src/measure: re-exports only.
export { measurement, notAvailable, type Measurement } from "./measurement.js";
export { detectDcSpike, mainLobeHalfWidthBins, DC_SPIKE_DEFAULTS, type DcSpike, type DcSpikeOptions } from "./detectDcSpike.js";
export {
  locateEmission, LOCATE_EMISSION_DEFAULTS, type EmissionRegion, type LocateEmissionOptions,
} from "./locateEmission.js";
export { toneFrequency, psdCentroidHz } from "./carrierFrequency.js";
export {
  occupiedBandwidth, OCCUPIED_BANDWIDTH_DEFAULTS, type OccupiedBandwidth, type OccupiedBandwidthOptions,
} from "./occupiedBandwidth.js";
export { xDbBandwidth, X_DB_BANDWIDTH_DEFAULTS, type XDbBandwidth, type XDbBandwidthOptions } from "./xDbBandwidth.js";
export { channelPower, type ChannelPower, type ChannelPowerOptions } from "./channelPower.js";
export { analogFeatures, type AnalogFeatures, type AnalogFeaturesOptions } from "./analogFeatures.js";
export {
  classifyAnalog, CLASSIFY_ANALOG_THRESHOLDS, type AnalogClass, type AnalogClassification,
} from "./classifyAnalog.js";
export { bandwidthCode, emissionDesignator, type EmissionDesignator } from "./designator.js";
export { necessaryBandwidthFmHz, necessaryBandwidthAmHz } from "./necessaryBandwidth.js";
export { frequencyErrorPpm, frequencyErrorPpmOf } from "./ppm.js";
