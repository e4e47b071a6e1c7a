/**
 * Content-addressed files: each stored file is named by the SHA-256 of its bytes,
 * `<objects>/<first two hex digits>/<64 hex digits>`. A file is written to a temporary name in
 * the same folder, flushed to the disk (fsync), renamed into place and its folder flushed, so a
 * stored name always holds its whole content; a file already there is not written again (same
 * name, same bytes). Objects are written before the database row that names them commits, so a
 * crash leaves at most an unreferenced object, never a row without its file.
 */
import { createHash, randomBytes } from "node:crypto";
import { mkdir, readFile, rename, rm, stat } from "node:fs/promises";
import { join } from "node:path";
import { syncFolder, writeNewFile } from "../report/durableWrite.js";

export function sha256Hex(bytes: Uint8Array): string {
  return createHash("sha256").update(bytes).digest("hex");
}

export function objectPath(objectsDir: string, sha256: string): string {
  return join(objectsDir, sha256.slice(0, 2), sha256);
}

/** Stores `bytes` under their SHA-256 (module comment); returns the hash. */
export async function putObject(objectsDir: string, bytes: Uint8Array, expectedSha256?: string): Promise<string> {
  const sha = sha256Hex(bytes);
  if (expectedSha256 !== undefined && expectedSha256 !== sha) throw new Error(`object hash ${sha} is not the expected ${expectedSha256}`);
  const target = objectPath(objectsDir, sha);
  const present = await stat(target).catch(() => null);
  if (present !== null && present.size === bytes.length) return sha;
  const folder = join(objectsDir, sha.slice(0, 2));
  await mkdir(folder, { recursive: true });
  const temp = join(folder, `.tmp-${process.pid}-${randomBytes(6).toString("hex")}`);
  try {
    await writeNewFile(temp, bytes);
    await rename(temp, target);
  } catch (e) {
    await rm(temp, { force: true });
    throw e;
  }
  // The folder's fsync makes the rename durable on Linux; a platform that refuses to open a folder gets no more.
  await syncFolder(folder).catch(() => undefined);
  return sha;
}

export async function readObject(objectsDir: string, sha256: string): Promise<Buffer> {
  return readFile(objectPath(objectsDir, sha256));
}

/** "ok", "missing", or "altered" (the bytes no longer hash to the name). */
export async function checkObject(objectsDir: string, sha256: string): Promise<"ok" | "missing" | "altered"> {
  const bytes = await readFile(objectPath(objectsDir, sha256)).catch(() => null);
  if (bytes === null) return "missing";
  return sha256Hex(bytes) === sha256 ? "ok" : "altered";
}
