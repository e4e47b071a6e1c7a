// `iqaudit archive ...` as a user runs it (dist/cli.js): add and list --json, export byte for
// byte, compare and history (the PNG decoded by pngjs, the reference decoder), verify's exit
// code before and after a stored file is damaged, and --archive-add on measure.
import { createHash } from "node:crypto";
import { mkdtempSync, readdirSync, readFileSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { PNG } from "pngjs";
import { describe, expect, it } from "vitest";
import { writeReportFolder } from "../archive/reportFolders.js";
import { expectOneErrorLine, runCli } from "../helpers/runCli.js";

const dir = mkdtempSync(join(tmpdir(), "iqaudit-cli-archive-"));
const db = join(dir, "store", "archive.sqlite");
const sha = (p: string): string => createHash("sha256").update(readFileSync(p)).digest("hex");

describe("iqaudit archive", () => {
  const first = writeReportFolder(dir, "visit1", { frequencyHz: 164.975e6, modulationClass: "fm", designator: "16K0F3E", errorPpm: 1.09, salt: "v1", checkDecision: "pass" });
  const second = writeReportFolder(dir, "visit2", { frequencyHz: 164.975e6, modulationClass: "fm", designator: "16K0F3E", errorPpm: 1.58, salt: "v2", checkDecision: "pass" });

  it("adds folders, lists them as JSON with their ids and figures, and recognises a folder added twice", () => {
    const add = runCli(["archive", "add", first, "--tag", "launch", "--captured-at", "2024-09-17T07:05:00Z", "--archive", db]);
    expect(add.status, add.stderr).toBe(0);
    expect(add.stdout).toMatch(/added: entry 1 \(check\)/);
    expect(runCli(["archive", "add", second, "--tag", "launch", "--captured-at", "2025-03-18T09:20:00Z", "--archive", db]).status).toBe(0);
    expect(runCli(["archive", "add", first, "--archive", db]).stdout).toMatch(/already stored: entry 1/);
    const list = runCli(["archive", "list", "--tag", "launch", "--json", "--archive", db]);
    const entries = JSON.parse(list.stdout) as { id: number; carrierErrorPpm: number; capturedAt: string; tags: string[] }[];
    expect(entries.map((e) => [e.id, e.carrierErrorPpm])).toEqual([[1, 1.09], [2, 1.58]]);
    expect(entries[1]?.capturedAt).toBe("2025-03-18T09:20:00.000Z");
    expect(runCli(["archive", "list", "--since", "2025-01-01", "--json", "--archive", db]).stdout).toContain("\"id\": 2");
  });

  it("exports an entry byte for byte", () => {
    const out = join(dir, "exported");
    expect(runCli(["archive", "export", "2", "-o", out, "--archive", db]).status).toBe(0);
    expect(readdirSync(out).sort()).toEqual(readdirSync(second).sort());
    for (const f of readdirSync(second)) expect(sha(join(out, f)), f).toBe(sha(join(second, f)));
  });

  it("compares two entries and draws a history PNG with its limit", () => {
    const c = runCli(["archive", "compare", "1", "2", "--json", "--archive", db]);
    const figures = (JSON.parse(c.stdout) as { figures: { field: string; change: number; significant: boolean }[] }).figures;
    const e = figures.find((f) => f.field === "carrier.errorPpm");
    expect(e?.change).toBeCloseTo(0.49, 12);
    expect(e?.significant).toBe(true);
    const png = join(dir, "history.png");
    const h = runCli(["archive", "history", "--tag", "launch", "--field", "carrier.errorPpm", "-o", png, "--archive", db]);
    expect(h.status, h.stderr).toBe(0);
    expect(h.stdout).toMatch(/limit ±2\.5/);
    const image = PNG.sync.read(readFileSync(png));
    expect(image.width).toBe(1200);
    expect(image.height).toBe(700);
  });

  it("verifies clean (exit 0), and after a stored file is damaged names it (exit 1)", () => {
    const ok = runCli(["archive", "verify", "--archive", db]);
    expect(ok.status).toBe(0);
    expect(ok.stdout).toMatch(/nothing missing or altered/);
    const objects = `${db}.objects`;
    const sub = readdirSync(objects).find((d) => !d.startsWith("."));
    const file = join(objects, sub as string, readdirSync(join(objects, sub as string))[0] as string);
    writeFileSync(file, "damaged");
    const bad = runCli(["archive", "verify", "--archive", db]);
    expect(bad.status).toBe(1);
    expect(bad.stdout).toMatch(/altered/);
  });

  it("stores what measure -o just wrote with --archive-add, saying so on stderr only", () => {
    const sample = new URL("../../samples/pilot-channel_165.325MHz_50ksps.cf32", import.meta.url).pathname;
    const out = join(dir, "pilot-report");
    const r = runCli(["measure", sample, "-o", out, "--archive-add", "--tag", "pilot", "--archive", db, "--json", "-q"]);
    expect(r.status, r.stderr).toBe(0);
    expect(r.stderr).toMatch(/archived: entry \d+/);
    expect(() => JSON.parse(r.stdout) as unknown).not.toThrow();
    const list = JSON.parse(runCli(["archive", "list", "--tag", "pilot", "--json", "--archive", db]).stdout) as { kind: string; designator: string }[];
    expect(list.map((e) => e.kind)).toEqual(["measure"]);
  });

  it("refuses an unknown entry, a bad id and --archive-add without -o, each in one line (exit 2)", () => {
    expect(expectOneErrorLine(runCli(["archive", "show", "99", "--archive", db]))).toMatch(/entry 99/);
    expect(expectOneErrorLine(runCli(["archive", "show", "x", "--archive", db]))).toMatch(/<id>/);
    expect(expectOneErrorLine(runCli(["measure", "nothing.cf32", "--rate", "48k", "--archive-add", "--archive", db]))).toMatch(/--archive-add/);
  });
});
