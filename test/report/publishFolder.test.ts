// publishFolder and writeFileAtomic (src/report): a folder is published whole or not at all, its
// manifest lists every other file with a SHA-256 that node:crypto recomputes from the bytes read
// back, a failure leaves the place as it was with no temporary litter, and a killed run's
// leftovers are cleared by the next run into the same place.
import { createHash } from "node:crypto";
import { spawnSync } from "node:child_process";
import { existsSync, lstatSync, mkdirSync, mkdtempSync, readdirSync, readFileSync, symlinkSync, writeFileSync } from "node:fs";
import { open } from "node:fs/promises";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { afterEach, describe, expect, it, vi } from "vitest";
import { CaptureFormatError, OutputError } from "../../src/errors.js";
import { publishFolder, REPORT_FOLDER, writeFileAtomic, type FolderWriter } from "../../src/report/index.js";

const root = mkdtempSync(join(tmpdir(), "iqaudit-publish-"));
let serial = 0;

function place(): { parent: string; dir: string } {
  const parent = join(root, `case-${++serial}`);
  mkdirSync(parent);
  return { parent, dir: join(parent, "out") };
}

function sha256(bytes: Uint8Array): string {
  return createHash("sha256").update(bytes).digest("hex"); // node:crypto as the reference hash
}

/** A report folder of one run: two files and the manifest listing them, each file carrying `run`. */
async function build(w: FolderWriter, run: string, extra: readonly string[] = []): Promise<string> {
  await w.write("figure.png", `png of ${run}`);
  for (const name of extra) await w.write(name, `${name} of ${run}`);
  await w.write("report.md", `# ${run}`);
  await w.write("report.json", JSON.stringify({ schema: "iqaudit/report/1", run, files: w.files() }));
  return run;
}

/** The run of a whole folder; fails unless every entry is report.json or listed with a matching SHA-256. */
function wholeRun(dir: string): string {
  const manifest = JSON.parse(readFileSync(join(dir, "report.json"), "utf8")) as { run: string; files: { path: string; sha256: string }[] };
  for (const f of manifest.files) expect(sha256(readFileSync(join(dir, f.path))), f.path).toBe(f.sha256);
  expect(readdirSync(dir).sort()).toEqual(["report.json", ...manifest.files.map((f) => f.path)].sort());
  return manifest.run;
}

function litter(parent: string): string[] {
  return readdirSync(parent).filter((n) => n.startsWith(".iqaudit-"));
}

/** A process id that no process has any more: a child that has exited and been reaped. */
function deadPid(): number {
  return spawnSync(process.execPath, ["-e", ""]).pid as number;
}

/** The temporary-name scheme of docs/cli.md: `.iqaudit-<first 8 hex of SHA-256 of the name>-<pid>-<6 hex>.<kind>`. */
function temporary(name: string, pid: number, kind: string): string {
  return `.iqaudit-${createHash("sha256").update(name).digest("hex").slice(0, 8)}-${pid}-abc123.${kind}`;
}

async function diskFullAfter(bytes: number): Promise<void> {
  const probe = await open(process.execPath, "r");
  const proto = Object.getPrototypeOf(probe) as { writeFile: (data: string | Uint8Array) => Promise<void> };
  await probe.close();
  const original = proto.writeFile;
  let used = 0;
  vi.spyOn(proto, "writeFile").mockImplementation(async function (this: unknown, data: string | Uint8Array) {
    const n = typeof data === "string" ? Buffer.byteLength(data) : data.byteLength;
    used += n;
    if (used > bytes) throw Object.assign(new Error("ENOSPC: no space left on device, write"), { code: "ENOSPC", errno: -28, syscall: "write" });
    return original.call(this, data);
  });
}

afterEach(() => {
  vi.restoreAllMocks();
});

describe("publishFolder(target, spec, build)", () => {
  it("publishes a new folder whose report.json lists every other file with its SHA-256", async () => {
    const { parent, dir } = place();
    expect(await publishFolder(dir, REPORT_FOLDER, (w) => build(w, "first", ["extra.png"]))).toBe("first");
    expect(wholeRun(dir)).toBe("first");
    expect(litter(parent)).toEqual([]);
  });

  it("replaces a previous complete folder as a whole: no file of the old run stays beside the new", async () => {
    const { parent, dir } = place();
    await publishFolder(dir, REPORT_FOLDER, (w) => build(w, "old", ["only-old.png"]));
    await publishFolder(dir, REPORT_FOLDER, (w) => build(w, "new"));
    expect(wholeRun(dir)).toBe("new");
    expect(existsSync(join(dir, "only-old.png"))).toBe(false);
    expect(litter(parent)).toEqual([]);
  });

  it("leaves the previous folder as it was when the build fails, and passes its error through", async () => {
    const { parent, dir } = place();
    await publishFolder(dir, REPORT_FOLDER, (w) => build(w, "old"));
    const bad = new CaptureFormatError("x.cf32", "broken");
    await expect(
      publishFolder(dir, REPORT_FOLDER, async (w) => {
        await w.write("figure.png", "half");
        throw bad;
      }),
    ).rejects.toBe(bad);
    expect(wholeRun(dir)).toBe("old");
    expect(litter(parent)).toEqual([]);
  });

  it("turns a full disk into one OutputError naming the folder, and keeps the previous folder", async () => {
    const { parent, dir } = place();
    await publishFolder(dir, REPORT_FOLDER, (w) => build(w, "old"));
    await diskFullAfter(12);
    const e = await publishFolder(dir, REPORT_FOLDER, (w) => build(w, "new")).catch((x: unknown) => x);
    vi.restoreAllMocks();
    expect(e).toBeInstanceOf(OutputError);
    expect((e as OutputError).message).toBe(`${dir}: no space left on the device; nothing was written`);
    expect(wholeRun(dir)).toBe("old");
    expect(litter(parent)).toEqual([]);
  });

  it("refuses, before building, a folder holding a file its report does not list, and a file in its place", async () => {
    const { dir } = place();
    await publishFolder(dir, REPORT_FOLDER, (w) => build(w, "old"));
    writeFileSync(join(dir, "notes.txt"), "mine");
    const never = vi.fn(async (w: FolderWriter) => build(w, "new"));
    await expect(publishFolder(dir, REPORT_FOLDER, never)).rejects.toThrow(/'notes\.txt', which is not part of its iqaudit report/);
    const plain = join(place().parent, "plain");
    writeFileSync(plain, "a file");
    await expect(publishFolder(plain, REPORT_FOLDER, never)).rejects.toThrow(/is a file, not a folder/);
    const foreign = join(place().parent, "photos");
    mkdirSync(foreign);
    writeFileSync(join(foreign, "a.png"), "a photo");
    await expect(publishFolder(foreign, REPORT_FOLDER, never)).rejects.toThrow(/holds files but no iqaudit report\.json/);
    expect(never).not.toHaveBeenCalled();
    expect(readFileSync(join(dir, "notes.txt"), "utf8")).toBe("mine");
    expect(readFileSync(join(foreign, "a.png"), "utf8")).toBe("a photo");
  });

  it("replaces an empty folder and a folder of an earlier version (report.json without files)", async () => {
    const { dir } = place();
    mkdirSync(dir);
    await publishFolder(dir, REPORT_FOLDER, (w) => build(w, "into-empty"));
    expect(wholeRun(dir)).toBe("into-empty");
    const legacy = join(place().parent, "legacy");
    mkdirSync(legacy);
    writeFileSync(join(legacy, "report.json"), JSON.stringify({ schema: "iqaudit/report/1" }));
    writeFileSync(join(legacy, "report.md"), "old");
    writeFileSync(join(legacy, "spectrum.png"), "old");
    await publishFolder(legacy, REPORT_FOLDER, (w) => build(w, "over-legacy"));
    expect(wholeRun(legacy)).toBe("over-legacy");
  });

  it("follows a symbolic link to a folder and keeps the link; refuses the current folder and its parents", async () => {
    const { parent, dir } = place();
    await publishFolder(dir, REPORT_FOLDER, (w) => build(w, "old"));
    const link = join(parent, "link");
    symlinkSync(dir, link);
    await publishFolder(link, REPORT_FOLDER, (w) => build(w, "through-link"));
    expect(lstatSync(link).isSymbolicLink()).toBe(true);
    expect(wholeRun(dir)).toBe("through-link");
    const cwd = vi.spyOn(process, "cwd").mockReturnValue(join(dir, "sub"));
    await expect(publishFolder(dir, REPORT_FOLDER, (w) => build(w, "x"))).rejects.toThrow(/is the current folder or contains it/);
    await expect(publishFolder(parent, REPORT_FOLDER, (w) => build(w, "x"))).rejects.toThrow(/is the current folder or contains it/);
    cwd.mockRestore();
    expect(wholeRun(dir)).toBe("through-link");
  });

  it("removes a dead run's leftovers, and puts back a previous folder it had moved aside", async () => {
    const { parent, dir } = place();
    await publishFolder(dir, REPORT_FOLDER, (w) => build(w, "old"));
    const pid = deadPid();
    // Killed between its two renames: the previous folder aside, its new one complete but not in place.
    const aside = join(parent, temporary("out", pid, "old"));
    const staged = join(parent, temporary("out", pid, "new"));
    spawnSync("mv", [dir, aside]);
    mkdirSync(staged);
    writeFileSync(join(staged, "figure.png"), "half");
    writeFileSync(join(parent, temporary("out", pid, "tmp")), "half");
    expect(existsSync(dir)).toBe(false);
    await expect(publishFolder(dir, REPORT_FOLDER, () => Promise.reject(new CaptureFormatError("x", "bad")))).rejects.toThrow("bad");
    expect(wholeRun(dir)).toBe("old");
    expect(litter(parent)).toEqual([]);
  });

  it("leaves a live run's temporary folder alone", async () => {
    const { parent, dir } = place();
    const sleeper = spawnSync("sh", ["-c", "sleep 30 >/dev/null 2>&1 & echo $!"], { encoding: "utf8" });
    const pid = Number(sleeper.stdout.trim());
    const live = join(parent, temporary("out", pid, "new"));
    mkdirSync(live);
    try {
      await publishFolder(dir, REPORT_FOLDER, (w) => build(w, "mine"));
      expect(existsSync(live)).toBe(true);
    } finally {
      process.kill(pid);
    }
  });

  it("lists the files of a sub-folder relative to it, and relative to the outer folder in the outer manifest", async () => {
    const { dir } = place();
    await publishFolder(dir, { manifest: "index.json", legacyEntry: () => false }, async (w) => {
      await build(w.sub("measure-a"), "inner");
      await w.write("index.json", JSON.stringify({ schema: "iqaudit/demo", files: w.files() }));
    });
    expect(wholeRun(join(dir, "measure-a"))).toBe("inner");
    const outer = JSON.parse(readFileSync(join(dir, "index.json"), "utf8")) as { files: { path: string }[] };
    expect(outer.files.map((f) => f.path)).toEqual(["measure-a/figure.png", "measure-a/report.md", "measure-a/report.json"]);
  });

  it("publishes a folder whose name is 255 bytes long, the most most file systems allow (POSIX NAME_MAX, Linux ext4/tmpfs)", async () => {
    const { parent } = place();
    const dir = join(parent, "r".repeat(255));
    await publishFolder(dir, REPORT_FOLDER, (w) => build(w, "long"));
    expect(wholeRun(dir)).toBe("long");
    expect(litter(parent)).toEqual([]);
  });
});

describe("writeFileAtomic(path, data)", () => {
  it("names the user's path, not a temporary file, when the path is a folder", async () => {
    const { parent } = place();
    const png = join(parent, "picture.png");
    mkdirSync(png);
    await expect(writeFileAtomic(png, "x")).rejects.toThrow(new OutputError(png, "is a folder; give the name of the file to write"));
    expect(litter(parent)).toEqual([]);
  });

  it("keeps the previous file on a full disk, with no temporary file left", async () => {
    const { parent } = place();
    const file = join(parent, "a.png");
    await writeFileAtomic(file, "previous");
    await diskFullAfter(3);
    await expect(writeFileAtomic(file, "next, longer")).rejects.toThrow(`${file}: no space left on the device; nothing was written`);
    vi.restoreAllMocks();
    expect(readFileSync(file, "utf8")).toBe("previous");
    expect(litter(parent)).toEqual([]);
  });

  it("writes a name of 255 bytes, and removes a dead run's temporary file of the same name", async () => {
    const { parent } = place();
    const name = `${"p".repeat(251)}.png`;
    writeFileSync(join(parent, temporary(name, deadPid(), "tmp")), "half");
    await writeFileAtomic(join(parent, name), "whole");
    expect(readFileSync(join(parent, name), "utf8")).toBe("whole");
    expect(litter(parent)).toEqual([]);
  });
});
