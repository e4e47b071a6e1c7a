/**
 * `iqaudit archive add|list|show|export|compare|history|verify`: each opens the archive
 * (`--archive PATH`, else IQAUDIT_ARCHIVE, else the user's data directory; src/archive/location.ts),
 * does its one thing, and closes it. The text for a person is in src/report/archiveText.ts.
 */
import { ArchiveError, UsageError } from "../errors.js";
import { Archive, defaultArchivePath, type AddOptions, type ComparedFigure, type EntryDetail, type EntryFilter, type EntryRow, type HistoryPoint, type VerifyResult } from "../archive/index.js";
import { writeFileAtomic } from "../report/index.js";
import { historyFigure } from "../report/historyFigure.js";

export interface ArchiveLocation {
  /** The database file; default defaultArchivePath(). */
  readonly archivePath?: string | undefined;
}

function withArchive<T>(location: ArchiveLocation, use: (a: Archive) => Promise<T> | T): Promise<T> {
  const a = Archive.open(location.archivePath ?? defaultArchivePath());
  return Promise.resolve()
    .then(() => use(a))
    .finally(() => a.close());
}

export interface AddedEntry {
  readonly folder: string;
  readonly id: number;
  readonly added: boolean;
  readonly kind: EntryRow["kind"];
}

export async function archiveAdd(folders: readonly string[], options: ArchiveLocation & AddOptions): Promise<{ archive: string; entries: AddedEntry[] }> {
  if (folders.length === 0) throw new UsageError("<report-dir>", "give at least one report folder to add");
  if (options.capturedAt !== undefined && Number.isNaN(Date.parse(options.capturedAt))) {
    throw new UsageError("--captured-at", `'${options.capturedAt}' is not an ISO 8601 time, e.g. 2024-09-17T07:05:00Z`);
  }
  const capturedAt = options.capturedAt === undefined ? undefined : new Date(options.capturedAt).toISOString();
  return withArchive(options, async (a) => {
    const entries: AddedEntry[] = [];
    for (const folder of folders) entries.push({ folder, ...(await a.add(folder, { ...options, capturedAt })) });
    return { archive: a.path, entries };
  });
}

export function archiveList(filter: EntryFilter, location: ArchiveLocation): Promise<(EntryRow & { readonly tags: readonly string[] })[]> {
  return withArchive(location, (a) => a.list(filter));
}

export function archiveShow(id: number, location: ArchiveLocation): Promise<EntryDetail> {
  return withArchive(location, (a) => a.show(id));
}

export function archiveExport(id: number, outDir: string, location: ArchiveLocation): Promise<string[]> {
  return withArchive(location, (a) => a.export(id, outDir));
}

export function archiveCompare(first: number, second: number, location: ArchiveLocation): Promise<{ first: EntryRow; second: EntryRow; figures: ComparedFigure[] }> {
  return withArchive(location, (a) => a.compare(first, second));
}

export interface HistoryOptions extends ArchiveLocation {
  readonly tag: string;
  readonly field: string;
  /** A limit line; default the limit of the tag's latest check of that field. */
  readonly limit?: number | undefined;
  /** Where to write the PNG. */
  readonly outPath?: string | undefined;
}

export interface History {
  readonly tag: string;
  readonly field: string;
  readonly points: readonly HistoryPoint[];
  readonly limit: { readonly value: number; readonly source: string; readonly symmetric: boolean } | null;
  readonly files: readonly string[];
}

export function archiveHistory(options: HistoryOptions): Promise<History> {
  return withArchive(options, async (a) => {
    const points = a.history(options.tag, options.field);
    if (points.length === 0) {
      throw new ArchiveError(`--tag ${options.tag}`, `no entry of that tag has the field ${options.field} (iqaudit archive list --tag ${options.tag}; fields: iqaudit archive show <id>)`);
    }
    const fromCheck = options.limit === undefined ? a.limitFor(options.tag, options.field) : null;
    const limit = options.limit !== undefined
      ? { value: options.limit, source: "--limit", symmetric: false }
      : fromCheck === null ? null : { value: fromCheck.value, source: `the ${fromCheck.check} check of the latest check entry`, symmetric: fromCheck.symmetric };
    const history: History = { tag: options.tag, field: options.field, points, limit, files: [] };
    if (options.outPath === undefined) return history;
    await writeFileAtomic(options.outPath, historyFigure(history));
    return { ...history, files: [options.outPath] };
  });
}

export function archiveVerify(location: ArchiveLocation): Promise<VerifyResult & { readonly archive: string }> {
  return withArchive(location, async (a) => ({ archive: a.path, ...(await a.verify()) }));
}
