// Report folders for the archive tests, written as `measure -o` and `check -o` write them: a
// manifest (report.json or check.json) whose `files` lists every other file with its SHA-256.
// The figures are chosen per test so that each filter's expected entries are known exactly.
import { createHash } from "node:crypto";
import { mkdirSync, writeFileSync } from "node:fs";
import { join } from "node:path";

export interface FolderFigures {
  readonly frequencyHz: number;
  readonly modulationClass: string;
  readonly designator: string;
  readonly errorPpm: number;
  readonly errorPpmU?: number;
  readonly datetime?: string | null;
  readonly captureSha256?: string;
  /** Makes the folder's bytes distinct. */
  readonly salt?: string;
  /** A check folder with this decision (and its measure report inside). */
  readonly checkDecision?: "pass" | "conditional-pass" | "conditional-fail" | "fail";
}

const sha = (b: Uint8Array | string): string => createHash("sha256").update(b).digest("hex");

export function measureReport(f: FolderFigures): Record<string, unknown> {
  return {
    schema: "iqaudit/report/1",
    tool: { name: "iqaudit", version: "0.1.0" },
    measuredAt: "2026-12-03T10:00:00.000Z",
    capture: { path: `capture-${f.salt ?? ""}.wav`, sha256: f.captureSha256 ?? sha(`capture${f.salt ?? ""}`), container: "wav", format: "ci16_le", sampleRateHz: 48_000, centerHz: f.frequencyHz - 1000, datetime: f.datetime ?? null, samples: 192_000 },
    carrier: { offsetHz: 1000, frequencyHz: f.frequencyHz, errorPpm: f.errorPpm, nominalHz: f.frequencyHz },
    bandwidth: { occupiedHz: 11_000, resolutionHz: 60 },
    modulation: { class: f.modulationClass, order: null, confidence: 0.95, features: { kappa: 0.01 } },
    fm: f.modulationClass === "fm" ? { peakDeviationHz: 2200, positiveDeviationHz: 2200, negativeDeviationHz: 2100 } : null,
    digital: { evmRmsPercent: null },
    emission: { designator: f.designator },
    uncertainty: { "carrier.errorPpm": f.errorPpmU ?? 0.01, "fm.peakDeviationHz": 20, "bandwidth.occupiedHz": 120 },
    warnings: [],
  };
}

/** Writes the folder; returns its path. */
export function writeReportFolder(dir: string, name: string, f: FolderFigures): string {
  const folder = join(dir, name);
  mkdirSync(folder, { recursive: true });
  const png = Buffer.from(`\u0089PNG figure of ${name} ${f.salt ?? ""}`);
  writeFileSync(join(folder, "spectrum.png"), png);
  const files = [{ path: "spectrum.png", sha256: sha(png) }];
  const report = measureReport(f);
  if (f.checkDecision === undefined) {
    writeFileSync(join(folder, "report.json"), `${JSON.stringify({ ...report, files }, null, 2)}\n`);
    return folder;
  }
  const inner = `${JSON.stringify({ ...report, files }, null, 2)}\n`;
  writeFileSync(join(folder, "report.json"), inner);
  const all = [...files, { path: "report.json", sha256: sha(inner) }];
  const check = {
    schema: "iqaudit/check/1", verdict: f.checkDecision.endsWith("pass") ? "pass" : "fail", decision: f.checkDecision,
    checks: [{ name: "frequency", unit: "ppm", limit: 2.5, measured: f.errorPpm, uncertainty: f.errorPpmU ?? 0.01, margin: 2.5 - Math.abs(f.errorPpm), marginPercent: 10, pass: true, decision: f.checkDecision }],
    report, files: all,
  };
  writeFileSync(join(folder, "check.json"), `${JSON.stringify(check, null, 2)}\n`);
  return folder;
}
