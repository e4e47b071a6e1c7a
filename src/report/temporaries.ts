/**
 * The temporary files and folders of this run, and those left by killed runs. Every temporary
 * name is short (`.iqaudit-<key>-<pid>-<random>.<kind>`, under 40 bytes whatever the target's
 * name), sits beside its target (so the final rename stays on one file system), and carries the
 * target's key (8 hex digits of the SHA-256 of its name) and the writer's process id, so that the
 * next run into the same place can tell a dead run's leftovers from a live run's work.
 */
import { createHash, randomBytes } from "node:crypto";
import { rmSync } from "node:fs";
import { readdir, rm } from "node:fs/promises";
import { join } from "node:path";

/** `tmp`: a file being written; `new`: a folder being built; `old`: the previous folder, moved aside. */
export type TemporaryKind = "tmp" | "new" | "old";

const PATTERN = /^\.iqaudit-([0-9a-f]{8})-(\d+)-[0-9a-f]{6}\.(tmp|new|old)$/;

const live = new Set<string>();

function targetKey(name: string): string {
  return createHash("sha256").update(name).digest("hex").slice(0, 8);
}

/** A fresh temporary name for `name` (a file or folder name, no directory part). */
export function temporaryName(name: string, kind: TemporaryKind): string {
  return `.iqaudit-${targetKey(name)}-${process.pid}-${randomBytes(3).toString("hex")}.${kind}`;
}

/** Records a temporary path of this run, so that an interrupted run can remove it. */
export function trackTemporary(path: string): void {
  live.add(path);
}

export function untrackTemporary(path: string): void {
  live.delete(path);
}

/**
 * Removes every temporary file and folder of this run, synchronously: for a SIGINT or SIGTERM
 * handler (src/cli.ts), which exits straight after. Failures are ignored: the next run into the
 * same place removes what is left.
 */
export function removeTemporaries(): void {
  for (const path of live) {
    try {
      rmSync(path, { recursive: true, force: true });
    } catch {
      // left for the next run
    }
  }
  live.clear();
}

export interface Leftover {
  readonly path: string;
  readonly kind: TemporaryKind;
}

/** Temporaries for `name` in `dir` whose run has ended (killed, or crashed): the live ones are left alone. */
export async function leftoversOf(dir: string, name: string): Promise<Leftover[]> {
  const key = targetKey(name);
  const out: Leftover[] = [];
  for (const entry of await readdir(dir)) {
    const m = PATTERN.exec(entry);
    if (m === null || m[1] !== key) continue;
    const path = join(dir, entry);
    if (runHasEnded(Number(m[2]), path)) out.push({ path, kind: m[3] as TemporaryKind });
  }
  return out;
}

export async function removeLeftover(l: Leftover): Promise<void> {
  await rm(l.path, { recursive: true, force: true });
}

function runHasEnded(pid: number, path: string): boolean {
  if (pid === process.pid) return !live.has(path);
  try {
    process.kill(pid, 0);
    return false;
  } catch (e) {
    return (e as NodeJS.ErrnoException).code === "ESRCH";
  }
}
