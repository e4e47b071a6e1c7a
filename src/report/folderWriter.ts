/** Writes the files of a folder being built (the hidden staging folder) and records each file's SHA-256. */
import { createHash } from "node:crypto";
import { mkdir } from "node:fs/promises";
import { dirname, isAbsolute, join, posix } from "node:path";
import { ParameterError } from "../errors.js";
import { syncFolder, writeNewFile } from "./durableWrite.js";

/** One file of a published folder: its path relative to the folder (with `/`) and its SHA-256 (hex). */
export interface PublishedFile {
  readonly path: string;
  readonly sha256: string;
}

export interface FolderWriter {
  /** Where the folder will be once published, as the user named it. */
  readonly target: string;
  /** Writes a new file, `relPath` relative to this folder (sub-folders are created). */
  write(relPath: string, data: string | Uint8Array): Promise<void>;
  /** The files written so far under this folder, paths relative to it, in the order written. */
  files(): PublishedFile[];
  /** A writer for a sub-folder: its files are part of this folder too. */
  sub(relPath: string): FolderWriter;
}

/** The shared state of one staging folder: every file written (paths from its root) and every folder made. */
export interface StagingRecord {
  readonly root: string;
  readonly files: PublishedFile[];
  readonly folders: Set<string>;
}

export function stagingWriter(target: string, record: StagingRecord, fail: (e: unknown) => unknown, prefix = ""): FolderWriter {
  return {
    target: prefix === "" ? target : join(target, prefix),
    async write(relPath, data) {
      const path = posix.join(prefix, checkedRelative(relPath));
      const full = join(record.root, path);
      try {
        await mkdir(dirname(full), { recursive: true });
        record.folders.add(dirname(full));
        await writeNewFile(full, data);
      } catch (e) {
        throw fail(e);
      }
      record.files.push({ path, sha256: createHash("sha256").update(data).digest("hex") });
    },
    files() {
      if (prefix === "") return record.files.slice();
      const head = `${prefix}/`;
      return record.files.filter((f) => f.path.startsWith(head)).map((f) => ({ path: f.path.slice(head.length), sha256: f.sha256 }));
    },
    sub(relPath) {
      return stagingWriter(target, record, fail, posix.join(prefix, checkedRelative(relPath)));
    },
  };
}

/** Flushes every folder of the staging tree, deepest first, so that all entries are on disk before the rename. */
export async function syncStaging(record: StagingRecord): Promise<void> {
  const folders = [...record.folders, record.root].sort((a, b) => b.length - a.length);
  for (const f of new Set(folders)) await syncFolder(f);
}

function checkedRelative(relPath: string): string {
  const p = posix.normalize(relPath);
  if (relPath === "" || isAbsolute(p) || p === ".." || p.startsWith("../")) {
    throw new ParameterError("relPath", `'${relPath}' is not a path inside the folder`);
  }
  return p;
}
