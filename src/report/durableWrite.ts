/** The low-level steps of every output: a new file written and flushed to disk, a folder's entries flushed. */
import { open } from "node:fs/promises";

/** Creates `path` (it must not exist), writes `data` and flushes it to disk before closing. */
export async function writeNewFile(path: string, data: string | Uint8Array): Promise<void> {
  const handle = await open(path, "wx");
  try {
    await handle.writeFile(data);
    await handle.sync();
  } finally {
    await handle.close();
  }
}

/** Flushes a folder's entries (a rename into it, a new file) to disk. */
export async function syncFolder(dir: string): Promise<void> {
  const handle = await open(dir, "r");
  try {
    await handle.sync();
  } finally {
    await handle.close();
  }
}
