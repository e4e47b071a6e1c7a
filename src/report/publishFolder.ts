/**
 * Publishes a folder whole: its files are written into a hidden sibling folder, flushed to disk,
 * and moved into place by rename; a previous folder of the same name is moved aside just before
 * (the two renames run back to back, with nothing in between that a signal handler could see)
 * and deleted after. After a kill at any moment the place holds the previous complete folder or
 * the new complete one; the only exception is a kill -9 between the two renames, which leaves the
 * previous folder aside, and the next run into the same place puts it back before it starts. A
 * failure (a full disk, an unwritable place) removes everything of this run and leaves the place
 * as it was. Every report folder of iqaudit (measure, the demo's, and survey, check and archive
 * exports as they come) is written this way, with the manifest (report.json) written last: it
 * lists every other file with its SHA-256.
 */
import { renameSync } from "node:fs";
import { mkdir, rm } from "node:fs/promises";
import { join } from "node:path";
import { syncFolder } from "./durableWrite.js";
import { folderExists, prepareFolderPlace, type FolderPlace, type FolderSpec } from "./folderPlace.js";
import { stagingWriter, syncStaging, type FolderWriter, type StagingRecord } from "./folderWriter.js";
import { outputFailure } from "./outputFailure.js";
import { temporaryName, trackTemporary, untrackTemporary } from "./temporaries.js";

/**
 * Checks the place (before any work: a folder we may not replace fails here), then runs `build`
 * with a writer into the hidden staging folder, then publishes what it wrote. `build` must write
 * `spec.manifest`. Errors of `build` itself (a bad capture) pass through after the clean-up.
 */
export async function publishFolder<T>(target: string, spec: FolderSpec, build: (w: FolderWriter) => Promise<T>): Promise<T> {
  const place = await prepareFolderPlace(target, spec);
  const record: StagingRecord = { root: join(place.parent, temporaryName(place.name, "new")), files: [], folders: new Set() };
  const fail = (e: unknown): unknown => outputFailure(target, e, "nothing was written");
  trackTemporary(record.root);
  try {
    await mkdir(record.root).catch((e: unknown) => Promise.reject(fail(e)));
    const result = await build(stagingWriter(target, record, fail));
    if (!record.files.some((f) => f.path === spec.manifest)) throw new Error(`publishFolder: ${spec.manifest} was not written`);
    await syncStaging(record).catch((e: unknown) => Promise.reject(fail(e)));
    await moveIntoPlace(place, spec, record.root);
    return result;
  } finally {
    await rm(record.root, { recursive: true, force: true }).catch(() => undefined);
    untrackTemporary(record.root);
  }
}

async function moveIntoPlace(place: FolderPlace, spec: FolderSpec, staging: string): Promise<void> {
  // Checked again: the folder may have changed while the report was being made.
  const replacing = await folderExists(place, spec);
  const aside = join(place.parent, temporaryName(place.name, "old"));
  try {
    if (replacing) swap(place.path, staging, aside);
    else renameSync(staging, place.path);
  } catch (e) {
    throw outputFailure(place.target, e, "nothing was written");
  }
  await syncFolder(place.parent).catch(() => undefined);
  if (replacing) {
    await rm(aside, { recursive: true, force: true }).catch(() => undefined);
    untrackTemporary(aside);
  }
}

/** Synchronous on purpose: no signal handler can run between moving the old folder aside and the new one in. */
function swap(path: string, staging: string, aside: string): void {
  trackTemporary(aside);
  try {
    renameSync(path, aside);
  } catch (e) {
    untrackTemporary(aside);
    throw e;
  }
  try {
    renameSync(staging, path);
  } catch (e) {
    renameSync(aside, path);
    untrackTemporary(aside);
    throw e;
  }
}
