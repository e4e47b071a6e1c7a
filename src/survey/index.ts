// The public surface of src/survey (issue 9): re-exports only.
export { detectEmissions, DETECT_EMISSIONS_DEFAULTS } from "./detectEmissions.js";
export type { Detection, DetectEmissionsOptions, RowThreshold, SurveyInput } from "./detectEmissions.js";
export type { DetectedEmission } from "./detectedEmission.js";
export { noiseFloorPerBin, NOISE_FLOOR_PER_BIN_DEFAULTS } from "./noiseFloorPerBin.js";
export type { NoiseFloorPerBin, NoiseFloorPerBinOptions } from "./noiseFloorPerBin.js";
export {
  rowThresholdFactor, falseAlarmProbability, rowMeanTail, rowMeanQuantile, rowMeanDensity, logGammaTail,
} from "./rowThreshold.js";
export type { FloorError } from "./rowThreshold.js";
export { surveyCapture, SURVEY_DEFAULTS, type SurveyOptions, type SurveyResult, type SurveyedEmission } from "./surveyCapture.js";
export { annotatedSigmfMeta, surveySigmfMetaPath, SIGMF_VERSION, SIGMF_LABEL_MAX, type AnnotatedSigmfInput, type SurveyAnnotation } from "./sigmfAnnotations.js";
