/**
 * Writes a file so that a reader never sees it half-written: the bytes go to a temporary name
 * beside the target (same directory, so the rename stays on one file system), are flushed to
 * disk, and the temporary file is renamed over the target. An interrupted run leaves at most a
 * `*.tmp-*` file, never a truncated report.
 */
import { open, rename, rm, mkdir } from "node:fs/promises";
import { dirname, basename, join } from "node:path";
import { randomBytes } from "node:crypto";

export async function writeFileAtomic(path: string, data: string | Uint8Array): Promise<void> {
  const dir = dirname(path);
  await mkdir(dir, { recursive: true });
  const temp = join(dir, `.${basename(path)}.tmp-${process.pid}-${randomBytes(4).toString("hex")}`);
  const handle = await open(temp, "wx");
  try {
    await handle.writeFile(data);
    await handle.sync();
  } catch (e) {
    await handle.close().catch(() => undefined);
    await rm(temp, { force: true });
    throw e;
  }
  await handle.close();
  try {
    await rename(temp, path);
  } catch (e) {
    await rm(temp, { force: true });
    throw e;
  }
}
