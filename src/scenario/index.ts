export { SeededRandom, complexNoise } from "./random.js";
export { tone, frequencyShift } from "./oscillator.js";
export type { ToneOptions } from "./oscillator.js";
export { toneAudio, speechLikeAudio, SPEECH_LIKE_TONES } from "./audio.js";
export type { GlidingTone, SpeechLikeOptions } from "./audio.js";
export { fmFromAudio, amFromAudio } from "./analogModulation.js";
export { overDeviationEnvelope, overDeviationGain } from "./overDeviation.js";
export type { OverDeviation } from "./overDeviation.js";
export type { FmBlock } from "./analogModulation.js";
export { rrcPulse, rrcPsk, qpskSymbols } from "./pulseShaping.js";
export type { RrcPskOptions } from "./pulseShaping.js";
export { nrzLevels, ookFromBits, burstGate, burstStartS, dutyCyclePercent } from "./keying.js";
export type { BurstSchedule } from "./keying.js";
export { applyReceiver, imageRejectionDb } from "./receiver.js";
export type { ReceiverModel } from "./receiver.js";
export {
  SCENARIO_SITE, TRANSMITTERS, SCENARIO_CAPTURES, scenarioTransmitter, emissionTransmitter, emissionOffsetHz, captureDurationS,
} from "./scenario.js";
export type { Transmitter, TransmitterModulation, CaptureEmission, ScenarioCapture } from "./scenario.js";
export { captureStream } from "./captureSynthesis.js";
export type { SampleStream } from "./captureSynthesis.js";
export { SIGMF_VERSION, emissionEdgesHz, emissionComment, sigmfMetadata, sigmfMetadataText } from "./sigmfMeta.js";
export { writeScenario } from "./writeScenario.js";
export type { ScenarioFile } from "./writeScenario.js";
export {
  constellation, randomSymbols, qamGrid, CONSTELLATION_KINDS, CONSTELLATION_ORDER,
} from "./constellations.js";
export type { ConstellationKind } from "./constellations.js";
export { SCENARIO_LICENCES, scenarioLicenceText, writeScenarioLicences } from "./licences.js";
export type { ScenarioLicence } from "./licences.js";
