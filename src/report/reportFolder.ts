/**
 * The report folder of `measure` (and of survey and check as they come): report.json is its
 * manifest, written last, whose `files` lists every other file of the folder with its SHA-256
 * (report.json cannot hold its own hash). Folders written before `files` existed held report.md
 * and PNG figures beside report.json, and may be replaced too.
 */
import type { FolderSpec } from "./folderPlace.js";

export const REPORT_FOLDER: FolderSpec = {
  manifest: "report.json",
  legacyEntry: (name) => name === "report.md" || name.endsWith(".png"),
};
