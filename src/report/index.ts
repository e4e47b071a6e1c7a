export { writeFileAtomic, checkFileTarget } from "./writeAtomic.js";
export { publishFolder } from "./publishFolder.js";
export type { FolderSpec } from "./folderPlace.js";
export type { FolderWriter, PublishedFile } from "./folderWriter.js";
export { removeTemporaries } from "./temporaries.js";
export { systemReason, isSystemError } from "./outputFailure.js";
export { REPORT_FOLDER } from "./reportFolder.js";
export { surveyMarkdown } from "./surveyMarkdown.js";
export { buildSurveyReport, type SurveyDetected, type SurveyEmission, type SurveyReport } from "./surveyReport.js";
