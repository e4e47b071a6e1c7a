/**
 * What the command line prints on stdout goes through here, so that a failed write (stdout sent
 * to a full device) reaches main's error handling as one line with exit 2 instead of an uncaught
 * stream error. A reader that closes the pipe early (`| head`) is not an error: cli.ts ends quietly.
 */
import { OutputError, UsageError } from "../errors.js";
import { isSystemError, systemReason } from "../report/index.js";

export function writeStdout(text: string): Promise<void> {
  return new Promise((resolve, reject) => {
    process.stdout.write(text, (e) => {
      if (e == null || (isSystemError(e) && e.code === "EPIPE")) resolve();
      else reject(isSystemError(e) ? new OutputError("stdout", systemReason(e)) : e);
    });
  });
}

/** The output option's value: a path, never empty (an empty `-o ''` would write into the current folder). */
export function parseOutPath(option: string, value: string): string {
  if (value.trim() === "") throw new UsageError(option, "is empty: give the path to write");
  return value;
}
