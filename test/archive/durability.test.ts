// The archive under crashes and concurrent writers. A child process adding report folders is
// killed with SIGKILL at random moments, again and again: the archive must always open, verify
// clean, and hold each entry whole (all its files, each matching its hash) or not at all. Two
// processes adding several hundred folders at once must lose none and surface no SQLITE_BUSY.
// (SQLite's guarantees under process death, WAL mode, are the design this checks; the counts are
// the issue's: at least 50 kills, several hundred concurrent adds.)
import { spawn } from "node:child_process";
import { randomBytes } from "node:crypto";
import { existsSync, mkdtempSync, rmSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { fileURLToPath } from "node:url";
import { afterAll, describe, expect, it } from "vitest";
import { Archive } from "../../src/archive/index.js";
import { SeededRandom } from "../../src/scenario/index.js";
import { writeReportFolder } from "./reportFolders.js";
import { CLI } from "../helpers/runCli.js";

const CHILD = fileURLToPath(new URL("../helpers/archiveChild.mjs", import.meta.url));
const dir = mkdtempSync(join(tmpdir(), "iqaudit-durability-"));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

/** `count` report folders; with `bigBytes` each figure carries that many random bytes more, which widens the moments a kill can land in. */
function folders(prefix: string, count: number, bigBytes = 0): string[] {
  return Array.from({ length: count }, (_, i) => {
    const salt = `${prefix}-${i}${bigBytes > 0 ? randomBytes(bigBytes).toString("base64") : ""}`;
    return writeReportFolder(dir, `${prefix}-${i}`, { frequencyHz: 160e6 + i, modulationClass: "fm", designator: "11K2F3E", errorPpm: i / 100, salt });
  });
}

function runChild(archive: string, list: readonly string[], killAfterMs?: number): Promise<{ code: number | null; signal: NodeJS.Signals | null; stderr: string; ids: number[] }> {
  return new Promise((resolve) => {
    const child = spawn(process.execPath, [CHILD, archive, ...list], { stdio: ["ignore", "pipe", "pipe"] });
    let out = "";
    let err = "";
    child.stdout.on("data", (d: Buffer) => { out += d.toString(); });
    child.stderr.on("data", (d: Buffer) => { err += d.toString(); });
    const timer = killAfterMs === undefined ? null : setTimeout(() => child.kill("SIGKILL"), killAfterMs);
    child.on("close", (code, signal) => {
      if (timer !== null) clearTimeout(timer);
      resolve({ code, signal, stderr: err, ids: out.split("\n").filter((l) => l !== "").map(Number) });
    });
  });
}

/** Every entry whole: its files all stored and matching (verify), and as many as its folder has (a manifest and one figure). */
async function expectWhole(archive: string, expectedFilesPerEntry: number): Promise<number> {
  const a = Archive.open(archive);
  try {
    const v = await a.verify();
    expect(v.problems).toEqual([]);
    for (const e of a.list()) expect(a.show(e.id).files.length, `entry ${e.id}`).toBe(expectedFilesPerEntry);
    return v.entries;
  } finally {
    a.close();
  }
}

describe("archive durability", () => {
  it("survives 50 SIGKILLs at random moments of add: always opens, verifies clean, every entry whole or absent", async () => {
    expect(existsSync(CLI), "the build (npm test's tsc step) must exist").toBe(true);
    const archive = join(dir, "crash", "archive.sqlite");
    const rng = new SeededRandom(42);
    let killed = 0;
    let stored = 0;
    // Rounds until 50 children were killed before they finished (at most 200, whatever this machine's speed).
    for (let round = 0; killed < 50 && round < 200; round++) {
      const list = folders(`crash${round}`, 8, 96 * 1024);
      // Node starts in about 100–300 ms here; kill anywhere from before it opens the archive to near its last add.
      const r = await runChild(archive, list, 50 + Math.floor(rng.uniform() * 350));
      if (r.signal === "SIGKILL") killed++;
      else expect(r.code, r.stderr).toBe(0);
      const entries = await expectWhole(archive, 2);
      expect(entries).toBeGreaterThanOrEqual(stored);
      stored = entries;
    }
    expect(killed).toBeGreaterThanOrEqual(50);
    expect(stored).toBeGreaterThan(0);
  }, 600_000);

  it("loses nothing with two processes adding 300 folders at once, and neither sees SQLITE_BUSY", async () => {
    const archive = join(dir, "concurrent", "archive.sqlite");
    const a = folders("left", 150);
    const b = folders("right", 150);
    const [ra, rb] = await Promise.all([runChild(archive, a), runChild(archive, b)]);
    expect(ra.code, ra.stderr).toBe(0);
    expect(rb.code, rb.stderr).toBe(0);
    expect(ra.stderr + rb.stderr).not.toMatch(/BUSY|locked/i);
    expect(new Set([...ra.ids, ...rb.ids]).size).toBe(300);
    expect(await expectWhole(archive, 2)).toBe(300);
  }, 600_000);
});
