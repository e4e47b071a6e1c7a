// Writing output, as a user meets it (issue 8, "Robustness"; interface.md, exit codes): a full
// disk or a full stdout is exit 2 with one line and nothing half-written; `-o ''` is a usage
// error; a name near the 255-byte limit works; a PNG path that is a folder is named as given;
// an interrupted run removes its temporary files.
import { spawnSync } from "node:child_process";
import { existsSync, mkdirSync, mkdtempSync, openSync, closeSync, readdirSync, readFileSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { describe, expect, it } from "vitest";
import { CLI, finished, runCli, startCli } from "../helpers/runCli.js";
import { errorLines, litter, wholeReport, writeFmCapture } from "./outputCapture.js";

const root = mkdtempSync(join(tmpdir(), "iqaudit-out-"));
const capture = writeFmCapture(root);
let serial = 0;

function freshDir(): string {
  const d = join(root, `case-${++serial}`);
  mkdirSync(d);
  return d;
}

function expectOneLine(r: { status: number | null; stderr: string }, line: string | RegExp): void {
  expect(r.status, r.stderr).toBe(2);
  const lines = errorLines(r.stderr);
  expect(lines, r.stderr).toHaveLength(1);
  if (typeof line === "string") expect(lines[0]).toBe(line);
  else expect(lines[0]).toMatch(line);
  expect(r.stderr).not.toMatch(/\n\s+at /); // no stack trace
}

/** A complete report folder of one run at `dir` (made by the CLI itself), and its report.json bytes. */
function previousRun(dir: string): string {
  const r = runCli(["measure", capture, "-o", dir]);
  expect(r.status, r.stderr).toBe(0);
  return readFileSync(join(dir, "report.json"), "utf8");
}

async function until(test: () => boolean, what: string): Promise<void> {
  for (let i = 0; i < 3000 && !test(); i++) await new Promise((r) => setTimeout(r, 10));
  if (!test()) throw new Error(`timed out waiting for ${what}`);
}

describe("the measure test capture", () => {
  it("gives no warning, so that stderr holds only the line under test", () => {
    const r = runCli(["measure", capture, "--json"]);
    expect(r.status, r.stderr).toBe(0);
    expect(r.stderr).toBe("");
  });
});

describe("-o '' (an empty output path)", () => {
  for (const command of [["measure", capture], ["spectrogram", capture], ["demo"]]) {
    it(`${command[0]} -o '' is a usage error and writes nothing into the current folder`, () => {
      const cwd = freshDir();
      expectOneLine(runCli([...command, "-o", ""], cwd), "iqaudit: --out: is empty: give the path to write");
      expect(readdirSync(cwd)).toEqual([]);
    });
  }
});

describe("names near the 255-byte limit of a file name (POSIX NAME_MAX on Linux file systems)", () => {
  it("measure -o with a 255-byte folder name publishes it whole", () => {
    const parent = freshDir();
    const dir = join(parent, "m".repeat(255));
    const r = runCli(["measure", capture, "-o", dir]);
    expect(r.status, r.stderr).toBe(0);
    wholeReport(dir);
    expect(litter(parent)).toEqual([]);
  });

  it("spectrogram -o with a 255-byte file name writes it", () => {
    const parent = freshDir();
    const png = join(parent, `${"s".repeat(251)}.png`);
    const r = runCli(["spectrogram", capture, "-o", png]);
    expect(r.status, r.stderr).toBe(0);
    expect(readFileSync(png).subarray(1, 4).toString("latin1")).toBe("PNG"); // PNG signature (ISO/IEC 15948)
    expect(litter(parent)).toEqual([]);
  });
});

describe("output places that cannot be used", () => {
  it("spectrogram -o naming an existing folder names the user's path, not a temporary file", () => {
    const parent = freshDir();
    const png = join(parent, "picture.png");
    mkdirSync(png);
    const r = runCli(["spectrogram", capture, "-o", png]);
    expectOneLine(r, `iqaudit: ${png}: is a folder; give the name of the file to write`);
    expect(litter(parent)).toEqual([]);
    expect(readdirSync(png)).toEqual([]);
  });

  it("measure -o naming a folder with files that are not its report refuses to replace it", () => {
    const dir = join(freshDir(), "mine");
    mkdirSync(dir);
    writeFileSync(join(dir, "notes.txt"), "keep me");
    const r = runCli(["measure", capture, "-o", dir]);
    expectOneLine(r, `iqaudit: ${dir}: holds files but no iqaudit report.json: not replaced (empty it or choose another folder)`);
    expect(readdirSync(dir)).toEqual(["notes.txt"]);
  });
});

/** The CLI on a disk with room for `bytes` more bytes (writeFaults.mjs), whose next write fails with `code`. */
function onFullDisk(args: readonly string[], bytes: number, code = "ENOSPC"): ReturnType<typeof runCli> {
  return runCli(args, undefined, { faults: true, env: { IQAUDIT_TEST_DISK_BYTES: String(bytes), IQAUDIT_TEST_DISK_ERROR: code } });
}

describe("a full disk (writeFaults.mjs: writes fail once the disk's bytes are used)", () => {
  const reasons: Record<string, string> = {
    ENOSPC: "no space left on the device",
    EDQUOT: "disk quota exceeded",
    EIO: "input/output error on the device",
  };
  for (const [code, reason] of Object.entries(reasons)) {
    it(`${code} while re-writing a report folder: exit 2, one line, the previous folder kept whole, no litter`, () => {
      const parent = freshDir();
      const dir = join(parent, "report");
      const before = previousRun(dir);
      // 40 kB: the first figure (the spectrogram, about 30 kB here) fits, the second does not.
      const r = onFullDisk(["measure", capture, "-o", dir], 40_000, code);
      expectOneLine(r, `iqaudit: ${dir}: ${reason}; nothing was written`);
      expect(readFileSync(join(dir, "report.json"), "utf8")).toBe(before);
      wholeReport(dir);
      expect(litter(parent)).toEqual([]);
    });
  }

  it("ENOSPC on a new report folder leaves no folder and no litter", () => {
    const parent = freshDir();
    const dir = join(parent, "new-report");
    const r = onFullDisk(["measure", capture, "-o", dir], 40_000);
    expectOneLine(r, `iqaudit: ${dir}: no space left on the device; nothing was written`);
    expect(readdirSync(parent)).toEqual([]);
  });

  it("ENOSPC while writing a spectrogram PNG leaves no file and no litter", () => {
    const parent = freshDir();
    const png = join(parent, "s.png");
    const r = onFullDisk(["spectrogram", capture, "-o", png], 1000);
    expectOneLine(r, `iqaudit: ${png}: no space left on the device; nothing was written`);
    expect(readdirSync(parent)).toEqual([]);
  });
});

/** Whether `unshare` may mount a tmpfs of our own here (root or user namespaces): a real full disk. */
function canMountTmpfs(): boolean {
  const r = spawnSync("unshare", ["-Urm", "sh", "-c", "mount -t tmpfs -o size=64k tmpfs /mnt"], { encoding: "utf8" });
  return r.status === 0;
}

describe("a real full disk: a 64 KiB tmpfs (Linux, where unshare may mount one)", () => {
  it.skipIf(!canMountTmpfs())("measure -o into it: exit 2, one line, nothing left on the tmpfs", () => {
    const mount = freshDir();
    const script = `mount -t tmpfs -o size=64k tmpfs "$1" && "$2" "$3" measure "$4" -o "$1/report"; echo "rc=$?"; ls -A "$1"`;
    const r = spawnSync("unshare", ["-Urm", "sh", "-c", script, "sh", mount, process.execPath, CLI, capture], { encoding: "utf8" });
    const [rc, ...entries] = r.stdout.trim().split("\n");
    expect(rc).toBe("rc=2");
    expect(entries).toEqual([]);
    expectOneLine({ status: 2, stderr: r.stderr }, `iqaudit: ${mount}/report: no space left on the device; nothing was written`);
  });
});

describe("stdout to a full device (/dev/full: every write fails with ENOSPC, Linux)", () => {
  const full = existsSync("/dev/full");
  for (const args of [["inspect", capture, "--json"], ["measure", capture, "--json"], ["measure", capture], ["spectrogram", capture, "--json", "-o", "PNG"]]) {
    it.skipIf(!full)(`${args.join(" ").replace(capture, "<capture>")} > /dev/full: exit 2 and one line`, () => {
      const cwd = freshDir();
      const fd = openSync("/dev/full", "w");
      try {
        const r = runCli(args.map((a) => (a === "PNG" ? join(cwd, "s.png") : a)), cwd, { stdout: fd });
        expectOneLine(r, "iqaudit: stdout: no space left on the device");
      } finally {
        closeSync(fd);
      }
    });
  }
});

describe("SIGINT and SIGTERM during -o (writes slowed by writeFaults.mjs so that the run is caught writing)", () => {
  const slow = { faults: true, env: { IQAUDIT_TEST_WRITE_DELAY_MS: "400" } } as const;

  for (const signal of ["SIGINT", "SIGTERM"] as const) {
    it(`${signal} while measure writes its folder: the temporary folder is removed, the previous folder kept whole`, async () => {
      const parent = freshDir();
      const dir = join(parent, "report");
      const before = previousRun(dir);
      const child = startCli(["measure", capture, "-o", dir], undefined, slow);
      const done = finished(child);
      await until(() => litter(parent).some((n) => n.endsWith(".new") && readdirSync(join(parent, n)).length > 0), "the run's first file");
      child.kill(signal);
      const r = await done;
      expect(r.signal, r.stderr).toBe(signal); // ends by the same signal, as a shell expects
      expect(litter(parent)).toEqual([]);
      expect(readFileSync(join(dir, "report.json"), "utf8")).toBe(before);
      wholeReport(dir);
    });
  }

  it("SIGTERM while spectrogram writes its PNG: no temporary file, no PNG", async () => {
    const parent = freshDir();
    const child = startCli(["spectrogram", capture, "-o", join(parent, "s.png")], undefined, slow);
    const done = finished(child);
    await until(() => litter(parent).some((n) => n.endsWith(".tmp")), "the temporary PNG");
    child.kill("SIGTERM");
    expect((await done).signal).toBe("SIGTERM");
    expect(readdirSync(parent)).toEqual([]);
  });
});
