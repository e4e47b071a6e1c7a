/**
 * Writes one file so that a reader never sees it half-written: the bytes go to a short temporary
 * name beside the target (same folder, so the rename stays on one file system), are flushed to
 * disk, and the temporary file is renamed over the target. A failure removes the temporary file
 * and leaves the target as it was; a killed run's temporary file is removed by the next write to
 * the same name (temporaries.ts). Errors name the target, never the temporary file.
 */
import { mkdir, rename, rm, stat } from "node:fs/promises";
import { basename, dirname, join } from "node:path";
import { OutputError, ParameterError } from "../errors.js";
import { syncFolder, writeNewFile } from "./durableWrite.js";
import { outputFailure } from "./outputFailure.js";
import { leftoversOf, removeLeftover, temporaryName, trackTemporary, untrackTemporary } from "./temporaries.js";

/**
 * Fails early, before any work, when `path` cannot be a file we replace: empty, or an existing
 * folder. Missing parent folders are fine (they are created).
 */
export async function checkFileTarget(path: string): Promise<void> {
  if (path === "") throw new ParameterError("path", "is empty");
  const s = await stat(path).catch(() => null);
  if (s?.isDirectory() === true) throw new OutputError(path, "is a folder; give the name of the file to write");
}

export async function writeFileAtomic(path: string, data: string | Uint8Array): Promise<void> {
  await checkFileTarget(path);
  const dir = dirname(path);
  const name = basename(path);
  const temp = join(dir, temporaryName(name, "tmp"));
  let renamed = false;
  try {
    await mkdir(dir, { recursive: true });
    for (const l of await leftoversOf(dir, name)) await removeLeftover(l);
    trackTemporary(temp);
    await writeNewFile(temp, data);
    await rename(temp, path);
    renamed = true;
    await syncFolder(dir);
  } catch (e) {
    await rm(temp, { force: true }).catch(() => undefined);
    throw outputFailure(path, e, renamed ? "it was written but may not be on the disk yet" : "nothing was written");
  } finally {
    untrackTemporary(temp);
  }
}
