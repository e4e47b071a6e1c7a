/**
 * The archive: a database of entries (database.ts) and the entries' files, stored by content
 * (objects.ts). `add` stores a report folder's files first, then its row in one transaction: an
 * entry is whole or absent whatever moment a crash comes at. The same folder added again (the
 * same manifest bytes, so the same files) is recognised by its SHA-256 and only gains new tags.
 */
import { ArchiveError } from "../errors.js";
import { publishFolder, type FolderSpec } from "../report/index.js";
import { ArchiveDatabase, type EntryFilter, type EntryRow, type StoredFigure, type StoredFile } from "./database.js";
import { readReportFolder, type AddOptions } from "./entry.js";
import { objectsDirectory } from "./location.js";
import { checkObject, putObject, readObject, sha256Hex } from "./objects.js";

export interface EntryDetail {
  readonly entry: EntryRow;
  readonly tags: readonly string[];
  readonly files: readonly StoredFile[];
  readonly figures: readonly StoredFigure[];
}

export interface ComparedFigure {
  readonly field: string;
  readonly first: number;
  readonly second: number;
  /** second − first. */
  readonly change: number;
  readonly firstUncertainty: number | null;
  readonly secondUncertainty: number | null;
  /** √(U1² + U2²), null unless both are known. */
  readonly combinedUncertainty: number | null;
  /** |change| > combined U; null when it is not known. */
  readonly significant: boolean | null;
}

export interface HistoryPoint {
  readonly id: number;
  /** ISO time: when the capture was recorded, else when it was measured. */
  readonly time: string;
  readonly value: number;
  readonly uncertainty: number | null;
  readonly kind: EntryRow["kind"];
}

export interface VerifyResult {
  readonly entries: number;
  readonly files: number;
  /** One line a problem: a missing or altered file, or the database's own check. */
  readonly problems: readonly string[];
}

export class Archive {
  private constructor(private readonly db: ArchiveDatabase, readonly path: string, readonly objectsDir: string) {}

  static open(path: string): Archive {
    return new Archive(new ArchiveDatabase(path), path, objectsDirectory(path));
  }

  close(): void {
    this.db.close();
  }

  /** Stores a report folder (module comment); `added` false when it was there already. */
  async add(folder: string, options: AddOptions = {}): Promise<{ id: number; added: boolean; kind: EntryRow["kind"] }> {
    const read = await readReportFolder(folder, options);
    for (const f of read.entry.files) await putObject(this.objectsDir, read.contents.get(f.path) as Uint8Array, f.sha256);
    const { id, added } = this.db.insert(read.entry);
    return { id, added, kind: read.entry.row.kind };
  }

  list(filter: EntryFilter = {}): (EntryRow & { readonly tags: readonly string[] })[] {
    return this.db.list(filter).map((e) => ({ ...e, tags: this.db.tags(e.id) }));
  }

  show(id: number): EntryDetail {
    const entry = this.entry(id);
    return { entry, tags: this.db.tags(id), files: this.db.files(id), figures: this.db.figures(id) };
  }

  /** Writes the entry's files into `outDir`, byte-identical to what was added, published whole (manifest last). */
  async export(id: number, outDir: string): Promise<string[]> {
    const entry = this.entry(id);
    const files = this.db.files(id);
    const spec: FolderSpec = { manifest: entry.manifest, legacyEntry: () => false };
    const blobs = new Map<string, Buffer>();
    for (const f of files) {
      const bytes = await readObject(this.objectsDir, f.sha256).catch(() => null);
      if (bytes === null || sha256Hex(bytes) !== f.sha256) throw new ArchiveError(this.path, `entry ${id}: the stored ${f.path} is ${bytes === null ? "missing" : "altered"} (run iqaudit archive verify)`);
      blobs.set(f.path, bytes);
    }
    return publishFolder(outDir, spec, async (w) => {
      for (const f of files) if (f.path !== entry.manifest) await w.write(f.path, blobs.get(f.path) as Buffer);
      await w.write(entry.manifest, blobs.get(entry.manifest) as Buffer);
      return files.map((f) => `${outDir}/${f.path}`);
    });
  }

  /** Every figure the two entries share, side by side, with the change and whether it exceeds √(U1² + U2²). */
  compare(firstId: number, secondId: number): { first: EntryRow; second: EntryRow; figures: ComparedFigure[] } {
    const first = this.entry(firstId);
    const second = this.entry(secondId);
    const b = new Map(this.db.figures(secondId).map((f) => [f.field, f]));
    const figures = this.db.figures(firstId).flatMap((fa): ComparedFigure[] => {
      const fb = b.get(fa.field);
      if (fb === undefined) return [];
      const combined = fa.uncertainty !== null && fb.uncertainty !== null ? Math.hypot(fa.uncertainty, fb.uncertainty) : null;
      const change = fb.value - fa.value;
      return [{
        field: fa.field, first: fa.value, second: fb.value, change,
        firstUncertainty: fa.uncertainty, secondUncertainty: fb.uncertainty, combinedUncertainty: combined,
        significant: combined === null ? null : Math.abs(change) > combined,
      }];
    });
    return { first, second, figures };
  }

  /** One numeric field over time for the entries of a tag (measure and check entries), oldest first. */
  history(tag: string, field: string): HistoryPoint[] {
    return this.db.list({ tag }).flatMap((e): HistoryPoint[] => {
      const f = this.db.figures(e.id).find((x) => x.field === field);
      const time = e.capturedAt ?? e.measuredAt;
      return f === undefined || time === null ? [] : [{ id: e.id, time, value: f.value, uncertainty: f.uncertainty, kind: e.kind }];
    });
  }

  /** The limit a tag's latest check entry gives for a field (the check that judges it), or null. */
  limitFor(tag: string, field: string): { value: number; check: string; symmetric: boolean } | null {
    const check = FIELD_CHECKS[field];
    if (check === undefined) return null;
    const checks = this.db.list({ tag, kind: "check" }).reverse();
    for (const e of checks) {
      const limit = this.db.figures(e.id).find((f) => f.field === `checks.${check}.limit`);
      if (limit !== undefined) return { value: limit.value, check, symmetric: check === "frequency" };
    }
    return null;
  }

  /** Re-hashes every stored file and runs the database's integrity check. */
  async verify(): Promise<VerifyResult> {
    const problems = this.db.integrity().map((p) => `database: ${p}`);
    const files = this.db.allFiles();
    for (const f of files) {
      const state = await checkObject(this.objectsDir, f.sha256);
      if (state !== "ok") problems.push(`entry ${f.entryId}: ${f.path} (${f.sha256.slice(0, 12)}…) is ${state}`);
    }
    const manifests = this.db.manifests();
    for (const m of manifests) {
      if (!files.some((f) => f.entryId === m.id && f.path === m.manifest && f.sha256 === m.contentSha256)) problems.push(`entry ${m.id}: its manifest ${m.manifest} is not among its files`);
    }
    return { entries: manifests.length, files: files.length, problems };
  }

  private entry(id: number): EntryRow {
    const e = this.db.get(id);
    if (e === null) throw new ArchiveError(`entry ${id}`, `is not in the archive ${this.path} (iqaudit archive list)`);
    return e;
  }
}

/** The check that judges a report field, for the limit line of a history. */
const FIELD_CHECKS: Readonly<Record<string, string>> = {
  "carrier.errorPpm": "frequency",
  "fm.peakDeviationHz": "deviation",
  "fm.positiveDeviationHz": "deviation",
  "fm.negativeDeviationHz": "deviation",
  "bandwidth.occupiedHz": "bandwidth",
  "checks.frequency.measured": "frequency",
  "checks.deviation.measured": "deviation",
  "checks.bandwidth.measured": "bandwidth",
};
