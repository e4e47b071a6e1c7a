/**
 * Reading a licence file from disk (`check --licence FILE`). A licence is read once, so a named
 * pipe is as good as a file; a directory or a device is refused before it is opened, and so is a
 * file too large to be a licence, so that a wrong path cannot make the tool read without end.
 */
import { stat } from "node:fs/promises";
import { createReadStream, type Stats } from "node:fs";
import { LicenceFileError } from "../errors.js";
import { parseLicence, type Licence } from "./licence.js";

/** The largest licence file read, bytes: a licence is a few hundred bytes of JSON. */
export const LICENCE_FILE_MAX_BYTES = 1 << 20;

/** The licence in the file at `path`; LicenceFileError (field "(file)") when it cannot be read, else as parseLicence. */
export async function readLicenceFile(path: string): Promise<Licence> {
  let s: Stats;
  try {
    s = await stat(path);
  } catch (e) {
    throw readError(path, e);
  }
  if (s.isDirectory()) throw new LicenceFileError(path, "(file)", "is a directory, not a licence file");
  if (!s.isFile() && !s.isFIFO()) throw new LicenceFileError(path, "(file)", "is not a regular file or a pipe");
  if (s.size > LICENCE_FILE_MAX_BYTES) throw new LicenceFileError(path, "(file)", `is ${s.size} bytes; a licence file is a small JSON object (at most ${LICENCE_FILE_MAX_BYTES} bytes)`);
  const bytes = await readCapped(path);
  let text: string;
  try {
    text = new TextDecoder("utf-8", { fatal: true }).decode(bytes);
  } catch {
    throw new LicenceFileError(path, "(file)", "is not UTF-8 text");
  }
  return parseLicence(text, path);
}

/** The bytes of `path`, stopping (LicenceFileError) once more than LICENCE_FILE_MAX_BYTES arrive, as a pipe may never end. */
async function readCapped(path: string): Promise<Buffer> {
  const chunks: Buffer[] = [];
  let total = 0;
  try {
    for await (const chunk of createReadStream(path)) {
      total += (chunk as Buffer).length;
      if (total > LICENCE_FILE_MAX_BYTES) break;
      chunks.push(chunk as Buffer);
    }
  } catch (e) {
    throw readError(path, e);
  }
  if (total > LICENCE_FILE_MAX_BYTES) throw new LicenceFileError(path, "(file)", `holds more than ${LICENCE_FILE_MAX_BYTES} bytes; a licence file is a small JSON object`);
  return Buffer.concat(chunks);
}

function readError(path: string, e: unknown): LicenceFileError {
  const code = (e as NodeJS.ErrnoException).code;
  if (code === "ENOENT") return new LicenceFileError(path, "(file)", "no such file");
  if (code === "EACCES" || code === "EPERM") return new LicenceFileError(path, "(file)", "cannot be read: permission denied");
  return new LicenceFileError(path, "(file)", `cannot be read (${code ?? "unknown error"})`);
}
