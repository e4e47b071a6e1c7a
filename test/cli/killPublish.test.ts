// A report folder is whole or absent (issue 8; docs/cli.md, "Report folders"): `measure -o DIR`
// over an existing complete folder, killed with SIGKILL (no clean-up possible) at random moments
// of the run, 50 times. After each kill DIR is a whole folder of one run: every entry is
// report.json or listed in its `files` with a SHA-256 that node:crypto recomputes. After the next
// run, DIR holds that run and no temporary litter is left beside it. The runs alternate --xdb, so
// that two consecutive runs differ in report.md, spectrum.png and report.json, and a folder that
// mixed them would fail the hashes. This checks the folder's state, not speed.
import { existsSync, mkdtempSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { describe, expect, it } from "vitest";
import { SeededRandom } from "../../src/scenario/index.js";
import { finished, runCli, startCli } from "../helpers/runCli.js";
import { litter, wholeReport, writeFmCapture } from "./outputCapture.js";

const root = mkdtempSync(join(tmpdir(), "iqaudit-kill-"));
const capture = writeFmCapture(root);
const KILLS = 50;

/**
 * Whole after a kill. The one state that is not DIR itself: a kill between the two renames of the
 * swap (microseconds) leaves the previous folder aside, whole; the next run puts it back first.
 */
function wholeAfterKill(parent: string, dir: string): void {
  if (existsSync(dir)) {
    wholeReport(dir);
    return;
  }
  const aside = litter(parent).filter((n) => n.endsWith(".old"));
  expect(aside, "DIR is missing and no previous folder is aside").toHaveLength(1);
  wholeReport(join(parent, aside[0] as string));
}

/** One place, `kills` times: a run killed at a random moment, then a complete run. */
async function killAndRerun(parent: string, kills: number, runMs: number, rng: SeededRandom): Promise<void> {
  const dir = join(parent, "report");
  for (let i = 0; i < kills; i++) {
    const child = startCli(["measure", capture, "-o", dir, "--xdb", "26"]);
    const done = finished(child);
    await new Promise((r) => setTimeout(r, rng.uniform() * runMs));
    child.kill("SIGKILL");
    await done;
    wholeAfterKill(parent, dir);
    const next = await finished(startCli(["measure", capture, "-o", dir, "--xdb", "20"]));
    expect(next.status, next.stderr).toBe(0);
    expect(wholeReport(dir).bandwidth.xDb).toBe(20);
    expect(litter(parent)).toEqual([]);
  }
}

describe("measure -o DIR killed with SIGKILL at random moments", () => {
  it(`leaves DIR whole after each of ${KILLS} kills, and no litter after the next run`, async () => {
    const places = [join(root, "place-a"), join(root, "place-b")];
    const startedMs = Date.now();
    for (const p of places) expect(runCli(["measure", capture, "-o", join(p, "report"), "--xdb", "20"]).status).toBe(0);
    const runMs = (Date.now() - startedMs) / places.length; // measured once: kills fall anywhere from start to end
    // Two places side by side, half the kills each, to use both cores of a small machine.
    await Promise.all(places.map((p, i) => killAndRerun(p, KILLS / places.length, runMs, new SeededRandom(8 + i))));
  }, 900_000);
});
