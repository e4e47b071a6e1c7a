// A small capture for the output tests (test/cli/output*.test.ts): FM, a 1 kHz tone at 3 kHz peak
// deviation, 10 kHz above the centre of a 50 kS/s cf32 capture, 0.2 s, 50 dB above its noise:
// clean enough that `measure` gives no warning, so that stderr holds only the line under test.
import { createHash } from "node:crypto";
import { readdirSync, readFileSync, writeFileSync } from "node:fs";
import { join } from "node:path";
import { expect } from "vitest";
import { encodeSamples } from "../../src/capture/index.js";
import { SeededRandom, complexNoise, fmFromAudio, frequencyShift, toneAudio } from "../../src/scenario/index.js";

export function writeFmCapture(dir: string): string {
  const fs = 50_000;
  const n = 10_000;
  const { iq } = fmFromAudio(toneAudio(0, n, fs, 1000), fs, 3000, 0, 0.3);
  const shifted = frequencyShift(iq, fs, 10_000);
  const noise = new Float64Array(shifted.length);
  complexNoise(new SeededRandom(5), noise, 1e-6);
  for (let k = 0; k < shifted.length; k++) shifted[k] = (shifted[k] as number) + (noise[k] as number);
  const path = join(dir, "fm_50ksps.cf32");
  writeFileSync(path, encodeSamples("cf32_le", shifted));
  return path;
}

/**
 * The report.json of a whole report folder: every entry of the folder is report.json or listed in
 * its `files`, each with the SHA-256 that node:crypto (the reference) computes from its bytes.
 */
export function wholeReport(dir: string): { measuredAt: string; bandwidth: { xDb: number } } {
  const report = JSON.parse(readFileSync(join(dir, "report.json"), "utf8")) as {
    measuredAt: string;
    bandwidth: { xDb: number };
    files: { path: string; sha256: string }[];
  };
  for (const f of report.files) {
    expect(createHash("sha256").update(readFileSync(join(dir, f.path))).digest("hex"), f.path).toBe(f.sha256);
  }
  expect(readdirSync(dir).sort()).toEqual(["report.json", ...report.files.map((f) => f.path)].sort());
  return report;
}

/** Temporary files or folders of iqaudit in `dir` (docs/cli.md: `.iqaudit-…`). */
export function litter(dir: string): string[] {
  return readdirSync(dir).filter((n) => n.startsWith(".iqaudit-"));
}

/** The lines of stderr other than warnings. */
export function errorLines(stderr: string): string[] {
  return stderr.split("\n").filter((l) => l !== "" && !l.startsWith("iqaudit: warning:"));
}
