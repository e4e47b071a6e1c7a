// The archive's store: a report folder added, shown and exported gives back the same bytes (SHA-256
// by node:crypto, the reference); each filter returns exactly the entries made to match it; the
// same folder is stored once; compare and history follow their definitions; verify finds a
// stored file that was altered; a damaged or newer database is refused in one line.
import { createHash } from "node:crypto";
import { mkdtempSync, readdirSync, readFileSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import Database from "better-sqlite3";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { Archive, SCHEMA_VERSION } from "../../src/archive/index.js";
import { ArchiveError } from "../../src/errors.js";
import { writeReportFolder } from "./reportFolders.js";
import { expectOneErrorLine, runCli } from "../helpers/runCli.js";

const dir = mkdtempSync(join(tmpdir(), "iqaudit-archive-"));
const sha = (p: string): string => createHash("sha256").update(readFileSync(p)).digest("hex");

describe("Archive", () => {
  const path = join(dir, "a", "archive.sqlite");
  let a: Archive;
  const folders = {
    launchOld: writeReportFolder(dir, "launch-old", { frequencyHz: 164.975e6, modulationClass: "fm", designator: "16K0F3E", errorPpm: 1.09, datetime: "2024-09-17T07:05:00Z", salt: "1" }),
    launchNew: writeReportFolder(dir, "launch-new", { frequencyHz: 164.975e6, modulationClass: "fm", designator: "16K0F3E", errorPpm: 1.58, datetime: "2025-03-18T09:20:00Z", salt: "2", checkDecision: "pass" }),
    quay: writeReportFolder(dir, "quay", { frequencyHz: 165.4e6, modulationClass: "psk", designator: "22K4G1D", errorPpm: -0.36, datetime: "2024-09-17T07:30:00Z", salt: "3" }),
    talkback: writeReportFolder(dir, "talkback", { frequencyHz: 165.05e6, modulationClass: "am", designator: "6K00A3E", errorPpm: 0.24, datetime: null, salt: "4", checkDecision: "fail" }),
  };
  const ids: Record<string, number> = {};

  beforeAll(async () => {
    a = Archive.open(path);
    ids["launchOld"] = (await a.add(folders.launchOld, { tags: ["launch"] })).id;
    ids["launchNew"] = (await a.add(folders.launchNew, { tags: ["launch", "revisit"] })).id;
    ids["quay"] = (await a.add(folders.quay, { tags: ["quay"], note: "crane link" })).id;
    ids["talkback"] = (await a.add(folders.talkback, { capturedAt: "2024-09-17T07:20:00.000Z" })).id;
  });
  afterAll(() => a.close());

  it("gives back the very bytes added: show lists each file's SHA-256, export writes them byte for byte", async () => {
    for (const [name, folder] of Object.entries(folders)) {
      const d = a.show(ids[name] as number);
      for (const f of d.files) expect(f.sha256, `${name}/${f.path}`).toBe(sha(join(folder, f.path)));
      const out = join(dir, `export-${name}`);
      await a.export(ids[name] as number, out);
      expect(readdirSync(out).sort()).toEqual(readdirSync(folder).sort());
      for (const f of readdirSync(folder)) expect(sha(join(out, f)), `${name}/${f}`).toBe(sha(join(folder, f)));
    }
  });

  it("stores the same folder once: added again it keeps its id and only gains the new tags", async () => {
    const again = await a.add(folders.quay, { tags: ["quay", "crane"] });
    expect(again).toEqual({ id: ids["quay"], added: false, kind: "measure" });
    expect(a.show(ids["quay"] as number).tags).toEqual(["crane", "quay"]);
    expect(a.list().length).toBe(4);
  });

  it.each([
    ["frequency range", { minFrequencyHz: 165.0e6, maxFrequencyHz: 165.1e6 }, ["talkback"]],
    ["class", { modulationClass: "fm" }, ["launchOld", "launchNew"]],
    ["designator", { designator: "22K4G1D" }, ["quay"]],
    ["tag", { tag: "launch" }, ["launchOld", "launchNew"]],
    ["time range (recorded, else measured)", { from: "2024-09-17T07:10:00Z", to: "2024-09-17T07:25:00Z" }, ["talkback"]],
    ["capture hash", { captureSha256: createHash("sha256").update("capture3").digest("hex") }, ["quay"]],
    ["check decision", { checkDecision: "fail" }, ["talkback"]],
    ["kind", { kind: "check" }, ["launchNew", "talkback"]],
  ] as const)("filters by %s, returning exactly the matching entries", (_what, filter, expected) => {
    expect(a.list(filter).map((e) => e.id).sort()).toEqual(expected.map((k) => ids[k]).sort());
  });

  it("compares two entries: the change, and whether it exceeds √(U1² + U2²) (both k = 2)", () => {
    const c = a.compare(ids["launchOld"] as number, ids["launchNew"] as number);
    const e = c.figures.find((f) => f.field === "carrier.errorPpm");
    expect(e?.change).toBeCloseTo(1.58 - 1.09, 12);
    expect(e?.combinedUncertainty).toBeCloseTo(Math.hypot(0.01, 0.01), 12);
    expect(e?.significant).toBe(true);
    const d = c.figures.find((f) => f.field === "fm.peakDeviationHz");
    expect(d?.change).toBe(0);
    expect(d?.significant).toBe(false);
  });

  it("draws a tag's history in recorded time order, with the limit of its latest check", () => {
    const h = a.history("launch", "carrier.errorPpm");
    expect(h.map((p) => p.value)).toEqual([1.09, 1.58]);
    expect(h.map((p) => p.time)).toEqual(["2024-09-17T07:05:00Z", "2025-03-18T09:20:00Z"]);
    expect(a.limitFor("launch", "carrier.errorPpm")).toEqual({ value: 2.5, check: "frequency", symmetric: true });
  });

  it("verifies a sound archive clean, and names a stored file whose bytes were altered", async () => {
    expect((await a.verify()).problems).toEqual([]);
    const f = a.show(ids["quay"] as number).files.find((x) => x.path === "spectrum.png");
    const stored = join(a.objectsDir, (f?.sha256 ?? "").slice(0, 2), f?.sha256 ?? "");
    const original = readFileSync(stored);
    writeFileSync(stored, Buffer.concat([original, Buffer.from("x")]));
    const v = await a.verify();
    expect(v.problems.length).toBe(1);
    expect(v.problems[0]).toMatch(/spectrum\.png .* altered/);
    writeFileSync(stored, original);
  });

  it("refuses a folder whose files do not match its manifest, naming the file", async () => {
    const broken = writeReportFolder(dir, "broken", { frequencyHz: 1e8, modulationClass: "cw", designator: "N0N", errorPpm: 0, salt: "9" });
    writeFileSync(join(broken, "spectrum.png"), "changed after the report was written");
    await expect(a.add(broken)).rejects.toThrow(/spectrum\.png/);
  });
});

describe("Archive.open(path)", () => {
  it("refuses an archive written by a newer schema without changing it", () => {
    const p = join(dir, "newer.sqlite");
    Archive.open(p).close();
    const db = new Database(p);
    db.prepare("UPDATE schema_info SET version = ?").run(SCHEMA_VERSION + 1);
    db.close();
    expect(() => Archive.open(p)).toThrow(ArchiveError);
    expect(() => Archive.open(p)).toThrow(/newer iqaudit/);
    const after = new Database(p);
    expect((after.prepare("SELECT version FROM schema_info").get() as { version: number }).version).toBe(SCHEMA_VERSION + 1);
    after.close();
  });

  it("gives one clear line, exit 2, for a damaged database file (the CLI, no stack trace)", () => {
    const p = join(dir, "damaged.sqlite");
    writeFileSync(p, Buffer.concat([Buffer.from("SQLite format 3\0"), Buffer.alloc(4096, 0x5a)]));
    const r = runCli(["archive", "list", "--archive", p]);
    const line = expectOneErrorLine(r);
    expect(line).toContain(p);
  });
});
