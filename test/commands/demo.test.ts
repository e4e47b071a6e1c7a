// demoCommand publishes each capture folder whole (docs/cli.md, "Report folders"): its
// inspect.json lists every other file of the folder, those of its measure-* report folders
// included, and each measure-* folder's report.json lists its own; every hash is recomputed here
// with node:crypto (the reference), and nothing else is in the folders.
import { createHash } from "node:crypto";
import { mkdtempSync, readdirSync, readFileSync, statSync } from "node:fs";
import { tmpdir } from "node:os";
import { join, relative } from "node:path";
import { describe, expect, it } from "vitest";
import { demoCommand } from "../../src/commands/demo.js";
import { SCENARIO_CAPTURES } from "../../src/scenario/index.js";
import { Archive } from "../../src/archive/index.js";
import { PNG } from "pngjs";

/** Every file below `dir`, as paths relative to it with `/`. */
function filesBelow(dir: string, base = dir): string[] {
  return readdirSync(dir).flatMap((n) => {
    const p = join(dir, n);
    return statSync(p).isDirectory() ? filesBelow(p, base) : [relative(base, p).split("\\").join("/")];
  });
}

function expectWhole(dir: string, manifest: string): void {
  const doc = JSON.parse(readFileSync(join(dir, manifest), "utf8")) as { files: { path: string; sha256: string }[] };
  for (const f of doc.files) expect(createHash("sha256").update(readFileSync(join(dir, f.path))).digest("hex"), f.path).toBe(f.sha256);
  expect(filesBelow(dir).sort()).toEqual([manifest, ...doc.files.map((f) => f.path)].sort());
}

describe("demoCommand({ outDir })", () => {
  it("publishes each capture folder whole, with its measure-* report folders whole inside it", async () => {
    const out = mkdtempSync(join(tmpdir(), "iqaudit-demo-"));
    const summary = await demoCommand({ outDir: out });
    // Warnings only where they apply, once (docs/cli.md, "Warnings"): of the scenario's emissions
    // (samples/README.md) only the AM talk-back (its 6.25 kS/s channel narrows the 3 kHz audio
    // low-pass), the keyed tide-gauge bursts and the 14 Hz beacon (measured in two captures, no
    // bandwidth code at its resolution) have something to say: at most four lines, none repeated.
    expect(summary.warnings.length).toBeLessThanOrEqual(4);
    expect(new Set(summary.warnings).size).toBe(summary.warnings.length);
    for (const w of summary.warnings) expect(w).not.toMatch(/lowerEdgeHz|upperEdgeHz/);
    // Each measure folder's spectrogram is its channel's, not a copy of the whole capture's.
    const site = join(out, "ostrel-bay-survey_165.2MHz_1Msps");
    const whole = readFileSync(join(site, "spectrogram.png"));
    const launch = readFileSync(join(site, "measure-launch", "spectrogram.png"));
    expect(launch.equals(whole)).toBe(false);
    expect(launch.equals(readFileSync(join(site, "measure-pilot", "spectrogram.png")))).toBe(false);
    const folders = readdirSync(out).filter((n) => !["captures", "SUMMARY.txt", "site-survey", "archive", "launch-history.png"].includes(n));
    // One folder per capture of the sample scenario (samples/README.md), named after its file.
    expect(folders.sort()).toEqual(SCENARIO_CAPTURES.map((c) => c.fileName.replace(/\.[^.]+$/, "")).sort());
    // The blind survey of the site capture, published whole with survey.json as its manifest.
    expectWhole(join(out, "site-survey"), "survey.json");
    for (const f of folders) {
      expectWhole(join(out, f), "inspect.json");
      for (const m of readdirSync(join(out, f)).filter((n) => n.startsWith("measure-"))) expectWhole(join(out, f, m), "report.json");
      for (const c of readdirSync(join(out, f)).filter((n) => n.startsWith("check-"))) expectWhole(join(out, f, c), "check.json");
    }
    expect(readdirSync(out).filter((n) => n.startsWith(".iqaudit-"))).toEqual([]);
    // The workboat's shouted word shows in its licence-check measurement: the scenario's true peak
    // is 3.4 kHz at 12.5–13.3 s (samples/README.md). 2 % allows for the 3 kHz audio low-pass
    // (the speech lies within 443–2419 Hz) and the frequency noise, σ ≈ 14 Hz at 51 dB SNR.
    const workboat = JSON.parse(readFileSync(join(out, "workboat-channel_165.1375MHz", "measure-workboat", "report.json"), "utf8"));
    expect(Math.abs(workboat.fm.peakDeviationHz - 3400)).toBeLessThan(0.02 * 3400);
    expect(workboat.fm.positiveDeviationTimeS).toBeGreaterThanOrEqual(12.5);
    expect(workboat.fm.positiveDeviationTimeS).toBeLessThanOrEqual(13.3);
    // Licence checks (src/scenario/licences.ts): the launch channel is inside its licence, in its
    // own capture and in the wideband survey; the workboat fails its deviation term alone, 3.4 kHz
    // against the 2.5 kHz of 12.5 kHz channels (REFERENCES.md §4, trade practice).
    type Check = { verdict: string; checks: { name: string; pass: boolean | null }[] };
    const read = (dir: string, tx: string): Check => JSON.parse(readFileSync(join(out, dir, `check-${tx}`, "check.json"), "utf8")) as Check;
    expect(read("launch-channel_164.975MHz", "launch").verdict).toBe("pass");
    expect(read("ostrel-bay-survey_165.2MHz_1Msps", "launch").verdict).toBe("pass");
    // The second visit, six months on: the launch's carrier is +260 Hz (samples/README.md), or
    // 260/164.975e6 = +1.576 ppm, still inside the licence's 5 ppm (47 CFR 90.213, REFERENCES.md §4),
    // so the check passes. The measurement must find it within its own stated uncertainty (k = 2),
    // and that no looser than 0.01 ppm (1.6 Hz).
    type Measured = { carrier: { errorPpm: number; frequencyHz: number }; uncertainty: Record<string, number | undefined> };
    const launchReport = (dir: string): Measured => JSON.parse(readFileSync(join(out, dir, "measure-launch", "report.json"), "utf8")) as Measured;
    const revisit = launchReport("launch-channel-revisit_164.975MHz");
    const uPpm = revisit.uncertainty["carrier.errorPpm"] as number;
    expect(uPpm).toBeGreaterThan(0);
    expect(Math.abs(revisit.carrier.errorPpm - (260 / 164.975e6) * 1e6)).toBeLessThanOrEqual(Math.min(uPpm, 0.01));
    expect(read("launch-channel-revisit_164.975MHz", "launch").verdict).toBe("pass");
    // The drift between the visits, 260 − 180 = 80 Hz, within the two uncertainties in quadrature
    // (independent noise; the same audio in both, so what it does to the estimate cancels).
    const firstVisit = launchReport("launch-channel_164.975MHz");
    const uDriftHz = Math.hypot(revisit.uncertainty["carrier.frequencyHz"] as number, firstVisit.uncertainty["carrier.frequencyHz"] as number);
    expect(Math.abs(revisit.carrier.frequencyHz - firstVisit.carrier.frequencyHz - 80)).toBeLessThanOrEqual(uDriftHz);
    const wb = read("workboat-channel_165.1375MHz", "workboat");
    expect(wb.verdict).toBe("fail");
    expect(wb.checks.filter((c) => c.pass === false).map((c) => c.name)).toEqual(["deviation"]);
    // The demo's own archive (never the user's): it verifies clean, and the launch channel's history
    // holds its three checks (the survey's, the first visit's, the revisit's) in recorded order.
    const archive = Archive.open(join(out, "archive", "archive.sqlite"));
    try {
      expect((await archive.verify()).problems).toEqual([]);
      const h = archive.history("launch", "carrier.errorPpm");
      expect(h.map((p) => p.time)).toEqual([...h.map((p) => p.time)].sort());
      expect(h.length).toBe(3);
      // The revisit's oscillator: +260 Hz at 164.975 MHz = +1.576 ppm (samples/README.md).
      expect(Math.abs((h[2]?.value ?? 0) - (260 / 164.975e6) * 1e6)).toBeLessThan(0.01);
    } finally {
      archive.close();
    }
    expect(PNG.sync.read(readFileSync(join(out, "launch-history.png"))).width).toBe(1200);
    // SUMMARY.txt names the classes as a person reads them (displayClass; samples/README.md gives
    // the truth: the quay link is QPSK, the talk-back AM, the beacon an unmodulated carrier, CW).
    const text = readFileSync(join(out, "SUMMARY.txt"), "utf8");
    expect(text).toMatch(/^ {2}quay crane data link: QPSK, /m);
    expect(text).toMatch(/^ {2}crane-yard talk-back, test tone: AM, /m);
    expect(text).toMatch(/^ {2}breakwater light carrier beacon: CW, /m);
    expect(text).not.toMatch(/: (psk|fm|am|cw) \d?/);
  });
});
