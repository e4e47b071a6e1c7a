// The survey room (issue 9): re-exports only.
export { annotatedSigmfMeta, surveySigmfMetaPath, SIGMF_VERSION, SIGMF_LABEL_MAX, type AnnotatedSigmfInput, type SurveyAnnotation } from "./sigmfAnnotations.js";
