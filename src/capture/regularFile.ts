/**
 * Opening a capture file. Only a regular file is read: every command reads a capture more than
 * once (openCapture reads its header, pass 1 reads and hashes it all, pass 2 reads a span again),
 * and a named pipe, a device or a socket cannot be read twice. The kind is checked with stat
 * before the file is opened, since opening a named pipe blocks until a writer comes.
 */
import { open, stat, type FileHandle } from "node:fs/promises";
import type { Stats } from "node:fs";
import { CaptureFormatError } from "../errors.js";

/**
 * The size in bytes of the regular file `path`. Errors (CaptureFormatError naming `path`, with
 * `what` after the problem, e.g. " (the dataset of x.sigmf-meta)"): no such file (`missing`
 * replaces the default problem), permission denied, a directory, a pipe, a device, a socket.
 */
export async function statRegularFile(path: string, what = "", missing = `no such file${what}`): Promise<number> {
  let s: Stats;
  try {
    s = await stat(path);
  } catch (e) {
    throw openError(path, e, what, missing);
  }
  if (!s.isFile()) throw new CaptureFormatError(path, notRegular(s, what));
  return s.size;
}

/** Opens the regular file `path` for reading (checked first, as statRegularFile does). */
export async function openRegularFile(path: string, what = ""): Promise<{ handle: FileHandle; fileBytes: number }> {
  await statRegularFile(path, what);
  let handle: FileHandle;
  try {
    handle = await open(path, "r");
  } catch (e) {
    throw openError(path, e, what, `no such file${what}`);
  }
  const s = await handle.stat();
  if (!s.isFile()) {
    await handle.close();
    throw new CaptureFormatError(path, notRegular(s, what));
  }
  return { handle, fileBytes: s.size };
}

function openError(path: string, e: unknown, what: string, missing: string): CaptureFormatError {
  const code = (e as NodeJS.ErrnoException).code;
  if (code === "ENOENT") return new CaptureFormatError(path, missing);
  if (code === "EACCES" || code === "EPERM") return new CaptureFormatError(path, `cannot be read: permission denied${what}`);
  if (code === "EISDIR") return new CaptureFormatError(path, `is a directory, not a capture file${what}`);
  return new CaptureFormatError(path, `cannot be opened${what} (${code ?? "unknown error"})`);
}

function notRegular(s: Stats, what: string): string {
  if (s.isDirectory()) return `is a directory, not a capture file${what}`;
  const device = s.isCharacterDevice() || s.isBlockDevice();
  const kind = s.isFIFO() ? "a named pipe (FIFO)" : device ? "a device" : s.isSocket() ? "a socket" : "something";
  return (
    `is ${kind}, not a regular file${what}: iqaudit reads a capture more than once (its header, then the whole ` +
    "file for its hash and spectrum, then a span again), which a stream cannot give; save it to a file first"
  );
}
