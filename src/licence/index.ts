// The public surface of src/licence: re-exports only.
export {
  LICENCE_FIELDS, parseLicence, isLicenceField, type Licence, type MaskDetector, type MaskPoints, type MaskReference,
} from "./licence.js";
export { parseDesignator, type ParsedDesignator } from "./designator.js";
export {
  RULE_MASK_NAMES, licenceMask, pointMask, maskPointsProblem, ruleMaskReference,
  mask90210B, mask90210C, mask90210D, mask90210E, mask90210G, mask90210H, mask90210I, mask80211F, mask73317,
  type Mask,
} from "./masks.js";
export { jsonSyntaxProblem, type JsonSyntaxProblem } from "./jsonSyntax.js";
export { decide, worstDecision, type Decision, type DecisionResult } from "./decision.js";
export {
  listTemplates, findTemplate, templateLimits, parseTemplate, type Template, type TemplateValue, type TemplateStatus,
} from "./templates.js";
export { mergeLicences, type MergedLicence, type FieldOrigin, type Origin } from "./merge.js";
export { readLicenceFile, LICENCE_FILE_MAX_BYTES } from "./readLicenceFile.js";
export {
  evaluateLicence, type CheckEntry, type CheckInputs, type CheckName, type CheckOutcome, type Figure, type MaskReading, type PeakFigure,
} from "./checks.js";
export { checkMask, type MaskPoint, type MaskResult, type MaskSpan, type MaskSpectrum } from "./maskCheck.js";
export { adjacentChannelPower, type AdjacentChannelInput, type AdjacentChannelResult, type AdjacentSide } from "./adjacentChannel.js";
export { templateListText } from "./templateList.js";
