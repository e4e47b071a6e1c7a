/**
 * Where a folder is to be published, checked before any work: the parent is created, a killed
 * run's leftovers for the same name are cleared up (a previous folder it had moved aside is put
 * back when nothing took its place), and a folder already there must be one we may replace.
 */
import { lstat, mkdir, readdir, readFile, realpath, rename, stat } from "node:fs/promises";
import { basename, dirname, resolve, sep } from "node:path";
import { OutputError, ParameterError } from "../errors.js";
import { outputFailure } from "./outputFailure.js";
import { leftoversOf, removeLeftover, type Leftover } from "./temporaries.js";

/** What makes a folder ours, so that it may be replaced. */
export interface FolderSpec {
  /** The folder's manifest (report.json), written last: `{ "schema": "iqaudit/...", "files": [...] }`. */
  readonly manifest: string;
  /** Entries an earlier version wrote beside a manifest that had no `files` list. */
  readonly legacyEntry: (name: string) => boolean;
}

export interface FolderPlace {
  /** The folder as the user named it. */
  readonly target: string;
  /** Its absolute path (through a symbolic link, the folder the link points to). */
  readonly path: string;
  readonly parent: string;
  readonly name: string;
}

export async function prepareFolderPlace(target: string, spec: FolderSpec): Promise<FolderPlace> {
  if (target.trim() === "") throw new ParameterError("target", "is empty");
  const path = await throughLink(resolve(target), target);
  const cwd = process.cwd();
  if (cwd === path || cwd.startsWith(path.endsWith(sep) ? path : path + sep)) {
    throw new OutputError(target, "is the current folder or contains it; give a folder to create or replace");
  }
  const place = { target, path, parent: dirname(path), name: basename(path) };
  try {
    await mkdir(place.parent, { recursive: true });
    await clearLeftovers(place);
  } catch (e) {
    throw outputFailure(target, e, "nothing was written");
  }
  await folderExists(place, spec);
  return place;
}

/**
 * Whether the folder exists; throws when it exists but is not a folder we may replace: a file, or
 * a folder holding anything that its manifest does not list (or with no iqaudit manifest at all,
 * unless it is empty).
 */
export async function folderExists(place: FolderPlace, spec: FolderSpec): Promise<boolean> {
  const s = await lstat(place.path).catch((e: NodeJS.ErrnoException) => {
    if (e.code === "ENOENT") return null;
    throw outputFailure(place.target, e, "nothing was written");
  });
  if (s === null) return false;
  if (!s.isDirectory()) throw new OutputError(place.target, "is a file, not a folder; give a folder for the report");
  const entries = await readdir(place.path);
  if (entries.length === 0) return true;
  const manifest = await readManifest(place.path, spec.manifest);
  if (manifest === null) {
    throw new OutputError(place.target, `holds files but no iqaudit ${spec.manifest}: not replaced (empty it or choose another folder)`);
  }
  const stranger = entries.find((e) => e !== spec.manifest && !manifest.owns(e) && !(manifest.legacy && spec.legacyEntry(e)));
  if (stranger !== undefined) {
    throw new OutputError(place.target, `holds '${stranger}', which is not part of its iqaudit report: not replaced (move it or choose another folder)`);
  }
  return true;
}

interface Manifest {
  /** True when the manifest has no `files` list (written by an earlier version). */
  readonly legacy: boolean;
  owns(entry: string): boolean;
}

async function readManifest(dir: string, name: string): Promise<Manifest | null> {
  let doc: unknown;
  try {
    doc = JSON.parse(await readFile(`${dir}${sep}${name}`, "utf8"));
  } catch {
    return null;
  }
  if (typeof doc !== "object" || doc === null) return null;
  const { schema, files } = doc as { schema?: unknown; files?: unknown };
  if (typeof schema !== "string" || !schema.startsWith("iqaudit/")) return null;
  if (!Array.isArray(files)) return { legacy: true, owns: () => false };
  const heads = new Set(files.map((f) => String((f as { path?: unknown }).path ?? "").split("/")[0]));
  return { legacy: false, owns: (entry) => heads.has(entry) };
}

async function throughLink(path: string, target: string): Promise<string> {
  const s = await lstat(path).catch(() => null);
  if (s === null || !s.isSymbolicLink()) return path;
  try {
    const real = await realpath(path);
    if (!(await stat(real)).isDirectory()) throw new OutputError(target, "is a link to a file, not to a folder");
    return real;
  } catch (e) {
    throw outputFailure(target, e, "nothing was written");
  }
}

/** A dead run's previous folder is put back if nothing took its place; every other leftover is removed. */
async function clearLeftovers(place: FolderPlace): Promise<void> {
  const leftovers = await leftoversOf(place.parent, place.name);
  const present = await lstat(place.path).then(() => true, () => false);
  const aside = present ? undefined : await newest(leftovers.filter((l) => l.kind === "old"));
  if (aside !== undefined) await rename(aside.path, place.path);
  for (const l of leftovers) if (l !== aside) await removeLeftover(l);
}

async function newest(list: readonly Leftover[]): Promise<Leftover | undefined> {
  let best: { l: Leftover; t: number } | undefined;
  for (const l of list) {
    const t = (await stat(l.path)).mtimeMs;
    if (best === undefined || t > best.t) best = { l, t };
  }
  return best?.l;
}
