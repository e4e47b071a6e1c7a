/**
 * System errors met while writing output, as one line that names the user's path (never a
 * temporary name) and says what was left: an OutputError, which src/cli.ts prints with exit 2.
 */
import { OutputError } from "../errors.js";

const REASONS: Readonly<Record<string, string>> = {
  ENOSPC: "no space left on the device",
  EDQUOT: "disk quota exceeded",
  EIO: "input/output error on the device",
  EROFS: "read-only file system",
  EACCES: "permission denied",
  EPERM: "operation not permitted",
  ENOTDIR: "a part of the path is not a folder",
  ENAMETOOLONG: "the name is too long for the file system",
  EISDIR: "is a folder",
  ENOTEMPTY: "was created by another run meanwhile",
  EEXIST: "was created by another run meanwhile",
  EMFILE: "too many open files",
  EXDEV: "crosses file systems",
};

export function isSystemError(e: unknown): e is NodeJS.ErrnoException {
  return e instanceof Error && typeof (e as NodeJS.ErrnoException).code === "string" && /^E[A-Z]+$/.test((e as NodeJS.ErrnoException).code as string);
}

export function systemReason(e: NodeJS.ErrnoException): string {
  const code = e.code as string;
  return REASONS[code] ?? code;
}

/**
 * `e` as an OutputError about `target` when it is a system error (`left` says what the failure
 * left, e.g. "nothing was written"); any other error is returned unchanged.
 */
export function outputFailure(target: string, e: unknown, left: string): unknown {
  if (!isSystemError(e)) return e;
  return new OutputError(target, `${systemReason(e)}; ${left}`);
}
