// Picking the emission to measure (issue "Everyday use"): `--channel` as an absolute frequency
// when the capture's centre is known (docs/cli.md, `measure`), and `--nominal` without
// `--channel` measuring the emission nearest the nominal, not the strongest elsewhere. The
// capture is the bundled site survey; its transmitters and their offsets are the ground truth of
// samples/README.md ("Captures": launch −224 820 Hz −14 dBFS, talkback −149 960 Hz −20 dBFS,
// tidegauge −350 210 Hz, centre 165.2 MHz).
import { mkdtempSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { describe, expect, it } from "vitest";
import { expectOneErrorLine, runCli } from "../helpers/runCli.js";
import { writeFmCapture } from "./outputCapture.js";

const SURVEY = "samples/ostrel-bay-survey_165.2MHz_1Msps.cu8";
const CENTRE_HZ = 165.2e6; // samples/README.md, "Captures"
const TALKBACK_OFFSET_HZ = -149_960; // samples/README.md: talkback 165.050 040 MHz, AM
const LAUNCH_OFFSET_HZ = -224_820; // samples/README.md: launch 164.975 180 MHz, FM, the strongest
const TIDEGAUGE_RF_HZ = 164_849_790; // samples/README.md: tidegauge 164.849 790 MHz, 2-FSK

interface Report {
  measuredAt: string;
  channel: { offsetHz: number; widthHz: number; givenByUser: boolean };
  carrier: { offsetHz: number | null; frequencyHz: number | null; errorPpm: number | null };
  modulation: { class: string; order: number | null };
  warnings: string[];
}

/** Deep equality, numbers within 1e-9 relative (or 1e-12 absolute near 0). */
function expectSameFigures(a: unknown, b: unknown, path: string): void {
  if (typeof a === "number" && typeof b === "number") {
    expect(Math.abs(a - b), path).toBeLessThanOrEqual(Math.max(1e-12, 1e-9 * Math.abs(b)));
  } else if (typeof a === "object" && a !== null && typeof b === "object" && b !== null) {
    expect(Object.keys(a).sort(), path).toEqual(Object.keys(b).sort());
    for (const k of Object.keys(a)) expectSameFigures((a as Record<string, unknown>)[k], (b as Record<string, unknown>)[k], `${path}.${k}`);
  } else expect(a, path).toEqual(b);
}

function measure(args: readonly string[]): { report: Report; stderr: string } {
  const r = runCli(["-q", "measure", SURVEY, ...args, "--json"]);
  expect(r.status, r.stderr).toBe(0);
  return { report: JSON.parse(r.stdout) as Report, stderr: r.stderr };
}

describe("measure --channel with an absolute frequency", () => {
  const absolute = measure(["--channel", "165.05M:12.5k"]);
  const offset = measure(["--channel", "-150k:12.5k"]);

  it("is the channel at 165.05 MHz − 165.2 MHz = −150 kHz from the centre (arithmetic)", () => {
    expect(absolute.report.channel.offsetHz).toBe(165.05e6 - CENTRE_HZ);
    expect(absolute.report.channel.widthHz).toBe(12_500);
    expect(absolute.report.channel.givenByUser).toBe(true);
  });

  it("gives the same report as the offset form (every number to 1e-9 relative: the runs differ only in summation order)", () => {
    expectSameFigures({ ...absolute.report, measuredAt: "" }, { ...offset.report, measuredAt: "" }, "report");
  });

  it("measures the talk-back there: AM, carrier at −149 960 Hz (samples/README.md; ±5 Hz, far above its stated uncertainty)", () => {
    expect(absolute.report.modulation.class).toBe("am");
    expect(Math.abs((absolute.report.carrier.offsetHz as number) - TALKBACK_OFFSET_HZ)).toBeLessThan(5);
  });

  it("needs the capture's centre: without it, exit 2 naming --channel and --center", () => {
    const capture = writeFmCapture(mkdtempSync(join(tmpdir(), "iqaudit-chan-")));
    const line = expectOneErrorLine(runCli(["measure", capture, "--channel", "165.05M:12.5k"]));
    expect(line).toMatch(/^iqaudit: --channel: /);
    expect(line).toContain("--center");
  });

  it("outside the capture is exit 2 naming --channel", () => {
    // 165.8 MHz is 600 kHz above the centre, beyond the ±500 kHz of 1 MS/s.
    expect(expectOneErrorLine(runCli(["measure", SURVEY, "--channel", "165.8M:12.5k"]))).toMatch(/^iqaudit: --channel: /);
  });

  it("keeps the offset form for small values, with no centre needed", () => {
    const capture = writeFmCapture(mkdtempSync(join(tmpdir(), "iqaudit-chan-")));
    const r = runCli(["-q", "measure", capture, "--channel", "10k:8k", "--json"]);
    expect(r.status, r.stderr).toBe(0);
    expect((JSON.parse(r.stdout) as Report).channel.offsetHz).toBe(10_000);
  });
});

describe("measure --nominal without --channel", () => {
  it("measures the emission at the nominal (the AM talk-back at 165.05 MHz), not the stronger launch channel", () => {
    const { report, stderr } = measure(["--nominal", "165.05M"]);
    expect(report.modulation.class).toBe("am");
    expect(Math.abs((report.carrier.offsetHz as number) - TALKBACK_OFFSET_HZ)).toBeLessThan(5);
    // +40 Hz on 165.05 MHz (samples/README.md): +0.242 ppm; ±0.03 ppm is ±5 Hz.
    expect(report.carrier.errorPpm as number).toBeCloseTo((40 / 165.05e6) * 1e6, 1);
    expect(stderr).not.toMatch(/no emission within/);
  });

  it("without --nominal measures the strongest, the FM launch channel (the contrast of the case above)", () => {
    const { report } = measure([]);
    expect(report.modulation.class).toBe("fm");
    expect(Math.abs((report.carrier.offsetHz as number) - LAUNCH_OFFSET_HZ)).toBeLessThan(50);
  });

  it("with nothing within ±12.5 kHz, measures the nearest (the tide gauge, 150 kHz away) and warns once", () => {
    const { report, stderr } = measure(["--nominal", "164.7M"]);
    // Nearest to 164.7 MHz: the tide gauge at 164.849 790 MHz (150 kHz); the launch is 275 kHz away.
    expect(report.modulation.class).toBe("fsk");
    expect(Math.abs((report.carrier.frequencyHz as number) - TIDEGAUGE_RF_HZ)).toBeLessThan(100);
    const lines = stderr.split("\n").filter((l) => l.includes("no emission within ±12.5 kHz of the nominal 164.7 MHz"));
    expect(lines, stderr).toHaveLength(1);
    expect(lines[0]).toMatch(/measured the nearest, at 164\.84\d* MHz/);
    expect(report.warnings.filter((w) => w.startsWith("no emission within"))).toHaveLength(1);
  });
});
