// The public surface of src/archive: re-exports only.
export { Archive, type ComparedFigure, type EntryDetail, type HistoryPoint, type VerifyResult } from "./archive.js";
export { defaultArchivePath, objectsDirectory, ARCHIVE_FILE_NAME } from "./location.js";
export type { EntryFilter, EntryRow, StoredFigure, StoredFile } from "./database.js";
export type { AddOptions } from "./entry.js";
export { SCHEMA_VERSION } from "./schema.js";
