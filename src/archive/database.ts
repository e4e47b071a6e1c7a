/**
 * The storage module: every SQL statement of the archive is here, so another database can stand
 * in for SQLite behind this one interface. SQLite through better-sqlite3: WAL journal (readers do
 * not block the writer), `synchronous = FULL` (a committed entry survives a crash of the machine,
 * not only of the process), `busy_timeout` (a second writer waits instead of failing), foreign
 * keys on, every write one IMMEDIATE transaction (the write lock taken at its start, so two
 * writers never deadlock on a lock upgrade).
 */
import Database from "better-sqlite3";
import { mkdirSync } from "node:fs";
import { dirname } from "node:path";
import { ArchiveError } from "../errors.js";
import { MIGRATIONS, SCHEMA_VERSION } from "./schema.js";

/** The indexed columns of an entry. */
export interface EntryRow {
  readonly id: number;
  readonly contentSha256: string;
  readonly kind: "measure" | "check" | "survey";
  readonly manifest: string;
  readonly addedAt: string;
  readonly measuredAt: string | null;
  readonly capturedAt: string | null;
  readonly toolVersion: string | null;
  readonly captureSha256: string | null;
  readonly capturePath: string | null;
  readonly captureFormat: string | null;
  readonly sampleRateHz: number | null;
  readonly centreHz: number | null;
  readonly frequencyHz: number | null;
  readonly modulationClass: string | null;
  readonly designator: string | null;
  readonly occupiedBandwidthHz: number | null;
  readonly carrierErrorPpm: number | null;
  readonly peakDeviationHz: number | null;
  readonly evmRmsPercent: number | null;
  readonly checkVerdict: string | null;
  readonly checkDecision: string | null;
  readonly note: string | null;
}

export interface StoredFile { readonly path: string; readonly sha256: string; readonly bytes: number }
export interface StoredFigure { readonly field: string; readonly value: number; readonly uncertainty: number | null }
export interface StoredEmission { readonly emissionId: number; readonly frequencyHz: number | null; readonly modulationClass: string | null; readonly designator: string | null }

export interface NewEntry {
  readonly row: Omit<EntryRow, "id">;
  readonly files: readonly StoredFile[];
  readonly tags: readonly string[];
  readonly figures: readonly StoredFigure[];
  readonly emissions: readonly StoredEmission[];
}

/** Filters of `archive list`; every one given must hold. */
export interface EntryFilter {
  readonly minFrequencyHz?: number | undefined;
  readonly maxFrequencyHz?: number | undefined;
  readonly modulationClass?: string | undefined;
  readonly designator?: string | undefined;
  readonly tag?: string | undefined;
  /** ISO-8601 bounds on the entry's time (captured, else measured), inclusive. */
  readonly from?: string | undefined;
  readonly to?: string | undefined;
  readonly captureSha256?: string | undefined;
  readonly checkDecision?: string | undefined;
  readonly kind?: string | undefined;
}

const COLUMNS: readonly [keyof EntryRow, string][] = [
  ["id", "id"], ["contentSha256", "content_sha256"], ["kind", "kind"], ["manifest", "manifest"], ["addedAt", "added_at"],
  ["measuredAt", "measured_at"], ["capturedAt", "captured_at"], ["toolVersion", "tool_version"], ["captureSha256", "capture_sha256"],
  ["capturePath", "capture_path"], ["captureFormat", "capture_format"], ["sampleRateHz", "sample_rate_hz"], ["centreHz", "centre_hz"],
  ["frequencyHz", "frequency_hz"], ["modulationClass", "modulation_class"], ["designator", "designator"],
  ["occupiedBandwidthHz", "occupied_bandwidth_hz"], ["carrierErrorPpm", "carrier_error_ppm"], ["peakDeviationHz", "peak_deviation_hz"],
  ["evmRmsPercent", "evm_rms_percent"], ["checkVerdict", "check_verdict"], ["checkDecision", "check_decision"], ["note", "note"],
];
const SELECT_ENTRY = `SELECT ${COLUMNS.map(([k, c]) => `${c} AS "${k}"`).join(", ")} FROM entries`;
/** An entry's time: when the capture was recorded, else when it was measured. */
const ENTRY_TIME = "COALESCE(captured_at, measured_at)";

export class ArchiveDatabase {
  private readonly db: Database.Database;

  /** Opens (creating when absent) the database at `path`; ArchiveError for a file that is not one, or one of a newer schema. */
  constructor(readonly path: string) {
    try {
      mkdirSync(dirname(path), { recursive: true });
      this.db = new Database(path, { timeout: 30_000 });
    } catch (e) {
      throw new ArchiveError(path, `cannot open the archive: ${reason(e)}`);
    }
    try {
      this.db.pragma("busy_timeout = 30000");
      this.db.pragma("journal_mode = WAL");
      this.db.pragma("synchronous = FULL");
      this.db.pragma("foreign_keys = ON");
      this.migrate();
    } catch (e) {
      this.db.close();
      if (e instanceof ArchiveError) throw e;
      throw new ArchiveError(path, `is not a usable archive: ${reason(e)}`);
    }
  }

  close(): void {
    this.db.close();
  }

  /** Takes the schema to SCHEMA_VERSION; refuses a newer one (written by a later iqaudit) without touching it. */
  private migrate(): void {
    const run = this.db.transaction(() => {
      this.db.exec("CREATE TABLE IF NOT EXISTS schema_info (version INTEGER NOT NULL)");
      const row = this.db.prepare("SELECT version FROM schema_info").get() as { version: number } | undefined;
      const version = row?.version ?? 0;
      if (version > SCHEMA_VERSION) {
        throw new ArchiveError(this.path, `was written by a newer iqaudit (archive schema ${version}; this version reads schema ${SCHEMA_VERSION} and older): upgrade iqaudit to use it`);
      }
      for (let v = version; v < SCHEMA_VERSION; v++) for (const sql of MIGRATIONS[v] ?? []) this.db.exec(sql);
      if (row === undefined) this.db.prepare("INSERT INTO schema_info (version) VALUES (?)").run(SCHEMA_VERSION);
      else if (version < SCHEMA_VERSION) this.db.prepare("UPDATE schema_info SET version = ?").run(SCHEMA_VERSION);
    });
    run.immediate();
  }

  /** Adds the entry in one transaction; an entry of the same content is kept and only gains the new tags. */
  insert(entry: NewEntry): { id: number; added: boolean } {
    const tx = this.db.transaction((): { id: number; added: boolean } => {
      const existing = this.db.prepare("SELECT id FROM entries WHERE content_sha256 = ?").get(entry.row.contentSha256) as { id: number } | undefined;
      if (existing !== undefined) {
        this.insertTags(existing.id, entry.tags);
        return { id: existing.id, added: false };
      }
      const cols = COLUMNS.filter(([k]) => k !== "id");
      const info = this.db.prepare(`INSERT INTO entries (${cols.map(([, c]) => c).join(", ")}) VALUES (${cols.map(() => "?").join(", ")})`)
        .run(...cols.map(([k]) => (entry.row as Record<string, unknown>)[k] ?? null));
      const id = Number(info.lastInsertRowid);
      const file = this.db.prepare("INSERT INTO entry_files (entry_id, path, sha256, bytes) VALUES (?, ?, ?, ?)");
      for (const f of entry.files) file.run(id, f.path, f.sha256, f.bytes);
      const figure = this.db.prepare("INSERT INTO entry_figures (entry_id, field, value, uncertainty) VALUES (?, ?, ?, ?)");
      for (const f of entry.figures) figure.run(id, f.field, f.value, f.uncertainty);
      const emission = this.db.prepare("INSERT INTO entry_emissions (entry_id, emission_id, frequency_hz, modulation_class, designator) VALUES (?, ?, ?, ?, ?)");
      for (const e of entry.emissions) emission.run(id, e.emissionId, e.frequencyHz, e.modulationClass, e.designator);
      this.insertTags(id, entry.tags);
      return { id, added: true };
    });
    return tx.immediate();
  }

  private insertTags(id: number, tags: readonly string[]): void {
    const has = this.db.prepare("SELECT 1 FROM entry_tags WHERE entry_id = ? AND tag = ?");
    const add = this.db.prepare("INSERT INTO entry_tags (entry_id, tag) VALUES (?, ?)");
    for (const t of new Set(tags)) if (has.get(id, t) === undefined) add.run(id, t);
  }

  /** Entries matching every filter given, oldest first by their time (captured, else measured), then id. */
  list(filter: EntryFilter = {}): EntryRow[] {
    const where: string[] = [];
    const args: unknown[] = [];
    const either = (own: string, emission: string, value: unknown): void => {
      where.push(`(${own} OR EXISTS (SELECT 1 FROM entry_emissions em WHERE em.entry_id = entries.id AND ${emission}))`);
      args.push(value, value);
    };
    if (filter.minFrequencyHz !== undefined) either("frequency_hz >= ?", "em.frequency_hz >= ?", filter.minFrequencyHz);
    if (filter.maxFrequencyHz !== undefined) either("frequency_hz <= ?", "em.frequency_hz <= ?", filter.maxFrequencyHz);
    if (filter.modulationClass !== undefined) either("modulation_class = ?", "em.modulation_class = ?", filter.modulationClass);
    if (filter.designator !== undefined) either("designator = ?", "em.designator = ?", filter.designator);
    if (filter.tag !== undefined) { where.push("EXISTS (SELECT 1 FROM entry_tags t WHERE t.entry_id = entries.id AND t.tag = ?)"); args.push(filter.tag); }
    if (filter.from !== undefined) { where.push(`${ENTRY_TIME} >= ?`); args.push(filter.from); }
    if (filter.to !== undefined) { where.push(`${ENTRY_TIME} <= ?`); args.push(filter.to); }
    if (filter.captureSha256 !== undefined) { where.push("capture_sha256 = ?"); args.push(filter.captureSha256.toLowerCase()); }
    if (filter.checkDecision !== undefined) { where.push("check_decision = ?"); args.push(filter.checkDecision); }
    if (filter.kind !== undefined) { where.push("kind = ?"); args.push(filter.kind); }
    const sql = `${SELECT_ENTRY}${where.length === 0 ? "" : ` WHERE ${where.join(" AND ")}`} ORDER BY ${ENTRY_TIME}, id`;
    return this.db.prepare(sql).all(...args) as EntryRow[];
  }

  get(id: number): EntryRow | null {
    return (this.db.prepare(`${SELECT_ENTRY} WHERE id = ?`).get(id) as EntryRow | undefined) ?? null;
  }

  files(id: number): StoredFile[] {
    return this.db.prepare("SELECT path, sha256, bytes FROM entry_files WHERE entry_id = ? ORDER BY path").all(id) as StoredFile[];
  }

  tags(id: number): string[] {
    return (this.db.prepare("SELECT tag FROM entry_tags WHERE entry_id = ? ORDER BY tag").all(id) as { tag: string }[]).map((r) => r.tag);
  }

  figures(id: number): StoredFigure[] {
    return this.db.prepare("SELECT field, value, uncertainty FROM entry_figures WHERE entry_id = ? ORDER BY field").all(id) as StoredFigure[];
  }

  /** Every stored file of every entry, with its entry, for `verify`. */
  allFiles(): (StoredFile & { readonly entryId: number })[] {
    return this.db.prepare(`SELECT entry_id AS "entryId", path, sha256, bytes FROM entry_files ORDER BY entry_id, path`).all() as (StoredFile & { entryId: number })[];
  }

  /** The manifests' hashes by entry, for `verify`. */
  manifests(): { id: number; contentSha256: string; manifest: string }[] {
    return this.db.prepare(`SELECT id, content_sha256 AS "contentSha256", manifest FROM entries ORDER BY id`).all() as { id: number; contentSha256: string; manifest: string }[];
  }

  /** PRAGMA integrity_check and foreign_key_check: the problems found (empty when sound). */
  integrity(): string[] {
    const rows = this.db.pragma("integrity_check") as { integrity_check: string }[];
    const problems = rows.map((r) => r.integrity_check).filter((r) => r !== "ok");
    const fk = this.db.pragma("foreign_key_check") as unknown[];
    if (fk.length > 0) problems.push(`${fk.length} rows refer to entries that are not there`);
    return problems;
  }
}

function reason(e: unknown): string {
  const m = e instanceof Error ? e.message : String(e);
  return m.split("\n")[0] ?? m;
}
