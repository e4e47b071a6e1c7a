// `iqaudit survey` as a user runs it (issue 9, "Output"): the folder with survey.json (every
// other file listed with its SHA-256), survey.md (one row per emission), survey.png and one
// sub-folder per emission, and the SigMF annotations beside the capture (field rules of SigMF
// v1.2.2). The capture is the bundled site capture, whose truth is the scenario's definition.
import { createHash } from "node:crypto";
import { copyFileSync, existsSync, mkdtempSync, readFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { fileURLToPath } from "node:url";
import { describe, expect, it } from "vitest";
import { SCENARIO_CAPTURES } from "../../src/scenario/index.js";
import { expectOneErrorLine, runCli } from "../helpers/runCli.js";

const capture = SCENARIO_CAPTURES.find((c) => c.id === "survey")!;
const dir = mkdtempSync(join(tmpdir(), "iqaudit-survey-"));
const input = join(dir, capture.fileName);
copyFileSync(fileURLToPath(new URL(`../../samples/${capture.fileName}`, import.meta.url)), input);

describe("iqaudit survey", () => {
  const out = join(dir, "site-survey");
  const r = runCli(["survey", input, "-o", out, "--sigmf-annotations"]);

  it("exits 0 and prints the table of the six transmitters", () => {
    expect(r.status, r.stderr).toBe(0);
    const rows = r.stdout.split("\n").filter((l) => /^\| \d+ \|/.test(l));
    expect(rows).toHaveLength(capture.emissions.length);
  });

  it("writes survey.json listing every other file of the folder with its SHA-256, JSON last", () => {
    const s = JSON.parse(readFileSync(join(out, "survey.json"), "utf8")) as { schema: string; emissions: { artefact: string | null; report: unknown }[]; files: { path: string; sha256: string }[] };
    expect(s.schema).toBe("iqaudit/survey/1");
    const real = s.emissions.filter((e) => e.artefact === null);
    expect(real).toHaveLength(capture.emissions.length);
    expect(real.every((e) => e.report !== null)).toBe(true);
    for (const f of s.files) {
      // FIPS 180-4 SHA-256 through Node's crypto, independent of the writer's hashing.
      expect(createHash("sha256").update(readFileSync(join(out, f.path))).digest("hex"), f.path).toBe(f.sha256);
    }
    const paths = s.files.map((f) => f.path);
    expect(paths).toContain("survey.png");
    expect(paths).toContain("survey.md");
    for (let i = 1; i <= real.length; i++) expect(paths).toContain(`emission-${String(i).padStart(2, "0")}/report.json`);
  });

  it("writes the SigMF annotations beside the capture, one per emission, sorted, both edges, the data file named", () => {
    const meta = JSON.parse(readFileSync(`${input}.survey.sigmf-meta`, "utf8")) as { global: Record<string, unknown>; annotations: Record<string, unknown>[] };
    expect(meta.global["core:datatype"]).toBe("cu8");
    expect(meta.global["core:dataset"]).toBe(capture.fileName);
    expect(meta.annotations).toHaveLength(capture.emissions.length);
    const starts = meta.annotations.map((a) => a["core:sample_start"] as number);
    expect([...starts].sort((a, b) => a - b)).toEqual(starts);
    for (const a of meta.annotations) {
      expect(Number.isInteger(a["core:sample_start"]) && Number.isInteger(a["core:sample_count"])).toBe(true);
      expect(a["core:freq_lower_edge"] as number).toBeLessThan(a["core:freq_upper_edge"] as number);
      expect((a["core:label"] as string).length).toBeLessThanOrEqual(20);
    }
    expect(existsSync(join(dir, "site-survey.sigmf-meta"))).toBe(false);
  });

  it("--json gives the same survey on stdout; a bad --pfa is one error line", () => {
    const j = runCli(["survey", input, "--json"]);
    expect(j.status).toBe(0);
    expect((JSON.parse(j.stdout) as { emissions: unknown[] }).emissions.length).toBeGreaterThanOrEqual(capture.emissions.length);
    expect(expectOneErrorLine(runCli(["survey", input, "--pfa", "2"]))).toContain("--pfa");
  });

  it("--threads 0 (everything in the main thread) prints the same table; a fractional --threads is one error line", () => {
    const rows = (s: string): string[] => s.split("\n").filter((l) => /^\| \d+ \|/.test(l));
    const one = runCli(["survey", input, "--threads", "0"]);
    expect(one.status, one.stderr).toBe(0);
    expect(rows(one.stdout)).toEqual(rows(r.stdout));
    expect(expectOneErrorLine(runCli(["survey", input, "--threads", "1.5"]))).toContain("--threads");
  });
});
