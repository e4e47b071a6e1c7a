/**
 * A report folder read for the archive: its manifest (check.json, survey.json or report.json,
 * whichever the folder is), every file the manifest lists, checked against the SHA-256 it gives
 * (a folder that is not whole is refused), and what the archive indexes: the capture, the
 * figures people search by, and every numeric figure of the report with its uncertainty.
 */
import { readFile } from "node:fs/promises";
import { join, posix } from "node:path";
import { ArchiveError } from "../errors.js";
import type { EntryRow, NewEntry, StoredEmission, StoredFigure } from "./database.js";
import { sha256Hex } from "./objects.js";

/** Manifests in the order they are looked for: a check folder also holds its measure report.json. */
const MANIFESTS: readonly [string, EntryRow["kind"]][] = [["check.json", "check"], ["survey.json", "survey"], ["report.json", "measure"]];

export interface ReadFolder {
  readonly entry: NewEntry;
  /** The bytes of every file, the manifest included, by path. */
  readonly contents: ReadonlyMap<string, Uint8Array>;
}

export interface AddOptions {
  readonly tags?: readonly string[] | undefined;
  readonly note?: string | undefined;
  /** When the capture was recorded (ISO 8601), where the capture file does not say. */
  readonly capturedAt?: string | undefined;
  /** ISO time of the addition (default now). */
  readonly addedAt?: string | undefined;
}

type Json = Record<string, unknown>;

export async function readReportFolder(folder: string, options: AddOptions = {}): Promise<ReadFolder> {
  const found = await findManifest(folder);
  const doc = parseManifest(folder, found.name, found.bytes);
  const listed = doc["files"];
  if (!Array.isArray(listed)) throw new ArchiveError(folder, `${found.name} lists no files: write the report with -o (or --out) to archive it`);
  const contents = new Map<string, Uint8Array>([[found.name, found.bytes]]);
  const files = [{ path: found.name, sha256: sha256Hex(found.bytes), bytes: found.bytes.length }];
  for (const f of listed as { path?: unknown; sha256?: unknown }[]) {
    if (typeof f.path !== "string" || typeof f.sha256 !== "string" || !safeRelative(f.path)) throw new ArchiveError(folder, `${found.name} lists a file entry that is not {path, sha256}`);
    const bytes = await readFile(join(folder, f.path)).catch(() => null);
    if (bytes === null) throw new ArchiveError(folder, `is not whole: ${f.path}, listed in ${found.name}, is missing`);
    const sha = sha256Hex(bytes);
    if (sha !== f.sha256.toLowerCase()) throw new ArchiveError(folder, `is not whole: ${f.path} does not match the SHA-256 ${found.name} gives for it`);
    contents.set(f.path, bytes);
    files.push({ path: f.path, sha256: sha, bytes: bytes.length });
  }
  const entry: NewEntry = {
    row: entryRow(found.kind, found.name, sha256Hex(found.bytes), doc, options),
    files,
    tags: [...new Set((options.tags ?? []).map((t) => t.trim()).filter((t) => t !== ""))],
    figures: figuresOf(found.kind, doc),
    emissions: found.kind === "survey" ? emissionsOf(doc) : [],
  };
  return { entry, contents };
}

async function findManifest(folder: string): Promise<{ name: string; kind: EntryRow["kind"]; bytes: Buffer }> {
  for (const [name, kind] of MANIFESTS) {
    const bytes = await readFile(join(folder, name)).catch((e: NodeJS.ErrnoException) => {
      if (e.code === "ENOENT") return null;
      throw new ArchiveError(folder, `cannot read ${name}: ${e.code ?? e.message}`);
    });
    if (bytes !== null) return { name, kind, bytes };
  }
  throw new ArchiveError(folder, "is not a report folder of iqaudit (no check.json, survey.json or report.json in it)");
}

function parseManifest(folder: string, name: string, bytes: Buffer): Json {
  try {
    const doc = JSON.parse(bytes.toString("utf8")) as unknown;
    if (typeof doc === "object" && doc !== null && !Array.isArray(doc) && typeof (doc as Json)["schema"] === "string") return doc as Json;
  } catch {
    // refused below
  }
  throw new ArchiveError(folder, `${name} is not an iqaudit report (JSON with a schema)`);
}

function safeRelative(p: string): boolean {
  const n = posix.normalize(p);
  return p !== "" && !n.startsWith("../") && n !== ".." && !n.startsWith("/");
}

/** The measure report inside a manifest: the manifest itself, or a check's `report`. */
function measureReportOf(kind: EntryRow["kind"], doc: Json): Json | null {
  if (kind === "measure") return doc;
  if (kind === "check") return obj(doc["report"]);
  return null;
}

function entryRow(kind: EntryRow["kind"], manifest: string, contentSha256: string, doc: Json, options: AddOptions): Omit<EntryRow, "id"> {
  const r = measureReportOf(kind, doc);
  const capture = obj(doc["capture"]) ?? obj(r?.["capture"]);
  const carrier = obj(r?.["carrier"]);
  const centre = num(capture?.["centerHz"]);
  const offset = num(carrier?.["offsetHz"]);
  return {
    contentSha256, kind, manifest,
    addedAt: options.addedAt ?? new Date().toISOString(),
    measuredAt: str(doc["measuredAt"]) ?? str(r?.["measuredAt"]),
    capturedAt: options.capturedAt ?? str(capture?.["datetime"]),
    toolVersion: str(obj(doc["tool"])?.["version"]) ?? str(obj(r?.["tool"])?.["version"]),
    captureSha256: str(capture?.["sha256"]),
    capturePath: str(capture?.["path"]),
    captureFormat: str(capture?.["format"]),
    sampleRateHz: num(capture?.["sampleRateHz"]),
    centreHz: centre,
    frequencyHz: num(carrier?.["frequencyHz"]) ?? (centre !== null && offset !== null ? centre + offset : null),
    modulationClass: str(obj(r?.["modulation"])?.["class"]),
    designator: str(obj(r?.["emission"])?.["designator"]),
    occupiedBandwidthHz: num(obj(r?.["bandwidth"])?.["occupiedHz"]),
    carrierErrorPpm: num(carrier?.["errorPpm"]),
    peakDeviationHz: num(obj(r?.["fm"])?.["peakDeviationHz"]),
    evmRmsPercent: num(obj(r?.["digital"])?.["evmRmsPercent"]),
    checkVerdict: kind === "check" ? str(doc["verdict"]) : null,
    checkDecision: kind === "check" ? str(doc["decision"]) : null,
    note: options.note ?? null,
  };
}

/** Report sections whose numbers are not figures of the emission. */
const SKIPPED = new Set(["uncertainty", "files", "methods", "unavailable", "tool", "features", "origin", "warnings"]);

/** Every finite number of the measure report by dotted path, with its uncertainty; a check's checks as checks.<name>.{measured,limit,margin}. */
function figuresOf(kind: EntryRow["kind"], doc: Json): StoredFigure[] {
  const out: StoredFigure[] = [];
  const r = measureReportOf(kind, doc);
  if (r !== null) {
    const u = obj(r["uncertainty"]) ?? {};
    walk(r, "", (path, value) => out.push({ field: path, value, uncertainty: num(u[path]) }));
  }
  if (kind === "check" && Array.isArray(doc["checks"])) {
    for (const c of doc["checks"] as Json[]) {
      const name = str(c["name"]);
      if (name === null) continue;
      for (const key of ["measured", "limit", "margin", "marginPercent"]) {
        const v = num(c[key]);
        if (v !== null) out.push({ field: `checks.${name}.${key}`, value: v, uncertainty: key === "measured" || key === "margin" ? num(c["uncertainty"]) : null });
      }
    }
  }
  if (kind === "survey" && Array.isArray(doc["emissions"])) {
    for (const e of doc["emissions"] as Json[]) {
      const id = num(e["id"]);
      if (id === null) continue;
      for (const key of ["offsetHz", "frequencyHz", "bandwidthHz", "powerDbfs", "peakDbfs", "snrDb", "startS", "endS", "dutyCyclePercent"]) {
        const v = num(e[key]);
        if (v !== null) out.push({ field: `emissions.${id}.${key}`, value: v, uncertainty: null });
      }
    }
  }
  return out;
}

function walk(node: unknown, path: string, visit: (path: string, value: number) => void): void {
  if (typeof node === "number") {
    if (Number.isFinite(node)) visit(path, node);
    return;
  }
  if (Array.isArray(node)) {
    node.forEach((v, i) => { if (typeof v === "number") walk(v, `${path}.${i}`, visit); });
    return;
  }
  const o = obj(node);
  if (o === null) return;
  for (const [k, v] of Object.entries(o)) {
    if (SKIPPED.has(k) || k === "report") continue;
    walk(v, path === "" ? k : `${path}.${k}`, visit);
  }
}

function emissionsOf(doc: Json): StoredEmission[] {
  const list = Array.isArray(doc["emissions"]) ? (doc["emissions"] as Json[]) : [];
  return list.flatMap((e) => {
    const id = num(e["id"]);
    return id === null ? [] : [{ emissionId: id, frequencyHz: num(e["frequencyHz"]), modulationClass: str(e["class"]), designator: str(e["designator"]) }];
  });
}

function obj(v: unknown): Json | null {
  return typeof v === "object" && v !== null && !Array.isArray(v) ? (v as Json) : null;
}

function num(v: unknown): number | null {
  return typeof v === "number" && Number.isFinite(v) ? v : null;
}

function str(v: unknown): string | null {
  return typeof v === "string" ? v : null;
}
