// `check` end to end on synthetic transmitters whose true parameters are known by construction
// (checkCaptures.ts): one inside every term passes; each term broken on purpose fails that term
// alone. Limits from REFERENCES.md §4 (47 CFR 90.209, 90.210 masks C and D, 90.213).
import { existsSync, mkdtempSync, readFileSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { describe, expect, it } from "vitest";
import { checkCommand, type CheckOptions } from "../../src/commands/check.js";
import type { CheckEntry } from "../../src/licence/index.js";
import { CENTRE_HZ, CHECK_FS, LICENCE_12K5, LICENCE_25K, transmitterIq, writeTransmitter } from "./checkCaptures.js";
import { expectOneErrorLine, runCli } from "../helpers/runCli.js";

const dir = mkdtempSync(join(tmpdir(), "iqaudit-check-"));
const capture = { format: "cf32_le" as const, sampleRateHz: CHECK_FS, centerHz: CENTRE_HZ };

function licenceFile(name: string, licence: object): string {
  const p = join(dir, `${name}.json`);
  writeFileSync(p, JSON.stringify(licence));
  return p;
}

async function run(path: string, licence: object, extra: Partial<CheckOptions> = {}) {
  return checkCommand(path, { capture, licencePath: licenceFile(`l${Math.random().toString(36).slice(2)}`, licence), ...extra });
}

function entry(checks: readonly CheckEntry[], name: string): CheckEntry {
  const c = checks.find((x) => x.name === name);
  if (c === undefined) throw new Error(`no ${name} check in ${checks.map((x) => x.name).join(", ")}`);
  return c;
}

function failing(checks: readonly CheckEntry[]): string[] {
  return checks.filter((c) => c.pass === false).map((c) => c.name);
}

describe("check", () => {
  // Inside every term: +100 Hz (0.625 ppm), ±2.0 kHz speech-like FM, at −6 dBFS, noise −125 dBFS/Hz.
  const good = writeTransmitter(dir, "good", { carrierErrorHz: 100, modulation: { kind: "fm", deviationHz: 2000 } });

  it("passes a transmitter inside every term of a 25 kHz-class licence, each figure within U of the truth", async () => {
    const { report } = await run(good, LICENCE_25K);
    expect(failing(report.checks)).toEqual([]);
    expect(report.verdict).toBe("pass");
    expect(report.schema).toBe("iqaudit/check/1");
    const f = entry(report.checks, "frequency");
    // Error 100 Hz at 160 MHz = 0.625 ppm (REFERENCES.md §10: ppm = Δf/f × 1e6).
    expect(f.unit).toBe("ppm");
    expect(Math.abs((f.measured as number) - 0.625)).toBeLessThanOrEqual(Math.max(f.uncertainty as number, 0.01));
    const d = entry(report.checks, "deviation");
    // Speech-like audio reaches ±1 exactly, so the peak deviation is the modulator's 2.0 kHz (audio.ts).
    expect(Math.abs((d.measured as number) - 2000)).toBeLessThanOrEqual(Math.max(d.uncertainty as number, 20));
    expect(entry(report.checks, "designator").pass).toBe(true);
    expect(entry(report.checks, "mask").pass).toBe(true);
    expect(entry(report.checks, "adjacentChannel").kind).toBe("information");
    for (const c of report.checks.filter((x) => x.kind === "upper")) {
      expect(c.uncertainty, c.name).not.toBeNull();
      expect(c.uncertainty as number, c.name).toBeGreaterThan(0);
      expect(c.marginPercent as number, c.name).toBeGreaterThan(0);
    }
  });

  it("fails the frequency term alone at 9 ppm against 5 ppm (47 CFR 90.213: 5 ppm), margin −4 ppm", async () => {
    // 9 ppm of 160 MHz = 1440 Hz.
    const p = writeTransmitter(dir, "offfreq", { carrierErrorHz: 1440, modulation: { kind: "fm", deviationHz: 2000 } });
    const { report } = await run(p, LICENCE_25K);
    expect(failing(report.checks)).toEqual(["frequency"]);
    const f = entry(report.checks, "frequency");
    expect(Math.abs((f.measured as number) - 9)).toBeLessThanOrEqual(Math.max(f.uncertainty as number, 0.01));
    expect(Math.abs((f.margin as number) + 4)).toBeLessThanOrEqual(Math.max(f.uncertainty as number, 0.01));
    expect(f.decision).toBe("fail");
    expect(report.verdict).toBe("fail");
  });

  it("fails the deviation term alone at ±3.4 kHz against 2.5 kHz", async () => {
    const p = writeTransmitter(dir, "overdev", { carrierErrorHz: 100, modulation: { kind: "fm", deviationHz: 3400 } });
    const { report } = await run(p, LICENCE_25K);
    expect(failing(report.checks)).toEqual(["deviation"]);
    const d = entry(report.checks, "deviation");
    expect(Math.abs((d.measured as number) - 3400)).toBeLessThanOrEqual(Math.max(d.uncertainty as number, 34));
    // Margin percent: (2500 − 3400)/2500 = −36 %.
    expect(Math.abs((d.marginPercent as number) + 36)).toBeLessThan(2);
  });

  it("fails the mask term alone for a spur 10 dB above mask D at 8 kHz (47 CFR 90.210(d): 7.27(fd − 2.88 kHz) dB)", async () => {
    // Mask D at 8 kHz: 7.27 × (8 − 2.88) = 37.2 dB below the reference; the spur at −27.2 dBc is 10 dB above it.
    const allowed = -7.27 * (8 - 2.88);
    const p = writeTransmitter(dir, "spur", { carrierErrorHz: 100, modulation: { kind: "fm", deviationHz: 2000 }, spur: { offsetHz: 8000, levelDbc: allowed + 10 } });
    const { report } = await run(p, LICENCE_12K5);
    expect(failing(report.checks)).toEqual(["mask"]);
    const m = report.mask;
    if (m === null || m.worst === null) throw new Error("no mask result");
    expect(Math.abs(m.worst.offsetHz - 8000)).toBeLessThanOrEqual(2 * m.resolutionHz);
    // 10 dB outside, to the point's uncertainty (scallop of the Hann frame plus the reference).
    expect(Math.abs(m.worst.marginDb + 10)).toBeLessThanOrEqual(m.uncertaintyDb);
    expect(m.violations.length).toBeGreaterThanOrEqual(1);
  });

  it("fails the bandwidth term alone when the 99 % OBW exceeds the authorised bandwidth (ITU-R SM.328; OBW computed independently here)", async () => {
    const obw = independentObwHz(transmitterIq({ carrierErrorHz: 100, modulation: { kind: "fm", deviationHz: 2000 } }));
    const authorised = Math.round(0.8 * obw);
    // Without the mask: mask C is defined for authorised bandwidths of 25 kHz equipment (90.210 Table 1), not this narrow one.
    const { mask: _m, maskReference: _r, ...noMask } = LICENCE_25K;
    const { report } = await run(good, { ...noMask, authorisedBandwidthHz: authorised });
    expect(failing(report.checks)).toEqual(["bandwidth"]);
    const b = entry(report.checks, "bandwidth");
    expect(Math.abs((b.measured as number) - obw)).toBeLessThanOrEqual(Math.max(b.uncertainty as number, 0.02 * obw));
    expect(b.limit).toBe(authorised);
  });

  it("fails the designator term alone for an AM emission against an F3E licence (RR Appendix 1: A3E vs F3E)", async () => {
    const p = writeTransmitter(dir, "am", { carrierErrorHz: 100, modulation: { kind: "am", depthPercent: 70 } });
    const { report } = await run(p, LICENCE_25K);
    expect(failing(report.checks)).toEqual(["designator"]);
    const d = entry(report.checks, "designator");
    expect(String(d.measured)).toMatch(/A3E$/);
    expect(d.limit).toBe("16K0F3E");
  });

  it("finds an over-deviated word late in a recording longer than the channel record (whole-span streaming)", async () => {
    // 30 s at 96 kS/s: the record of 2^20 channel samples ends near 11 s at the check channel's rate; the word at 27.2 s reaches ±3.4 kHz.
    const p = writeTransmitter(dir, "lateword", { seconds: 30, carrierErrorHz: 100, modulation: { kind: "fm", deviationHz: 2000 }, loudWord: { startS: 27.2, deviationHz: 3400 } });
    const { report } = await run(p, { maxDeviationHz: 2500, assignedFrequencyHz: LICENCE_25K.assignedFrequencyHz });
    const d = entry(report.checks, "deviation");
    expect(d.pass).toBe(false);
    expect(Math.abs((d.measured as number) - 3400)).toBeLessThanOrEqual(Math.max(d.uncertainty as number, 34));
    // When: the word's +1 at 27.35 s or its −1 at 27.85 s.
    const when = d.notes.join(" ");
    expect(/at 27\.[3-8]\d\d s/.test(when)).toBe(true);
    expect(report.report.fm?.peaksOver).toBe("whole span");
  });

  it("writes check.json last, listing check.md, mask.png and the measure report with their SHA-256", async () => {
    const out = join(dir, "out");
    const { report } = await run(good, LICENCE_12K5, { outDir: out });
    const names = report.files.map((f) => f.path).sort();
    expect(names).toEqual(expect.arrayContaining(["check.md", "mask.png", "report.json", "report.md", "spectrum.png"]));
    const json = JSON.parse(readFileSync(join(out, "check.json"), "utf8")) as { files: { path: string }[] };
    expect(json.files.length).toBe(report.files.length);
    const md = readFileSync(join(out, "check.md"), "utf8");
    expect(md).toMatch(/\| check \| limit \| measured/);
    expect(md).toMatch(/accredited/);
    expect(existsSync(join(out, "mask.png"))).toBe(true);
  });
});

describe("check on the command line", () => {
  const good = join(dir, "good_96ksps.cf32");
  const flags = ["--format", "cf32_le", "--rate", String(CHECK_FS), "--center", String(CENTRE_HZ), "-q"];

  it("exits 0 when every check passes and 1 when one fails (interface.md exit codes)", () => {
    expect(runCli(["check", good, ...flags, "--licence", licenceFile("cli-ok", LICENCE_25K), "--json"]).status).toBe(0);
    const r = runCli(["check", good, ...flags, "--licence", licenceFile("cli-fail", { ...LICENCE_25K, maxDeviationHz: 1500 })]);
    expect(r.status).toBe(1);
    expect(r.stdout).toMatch(/FAIL/);
  });

  it.each([
    ["an unknown field", { ...LICENCE_25K, colour: "red" }, "colour"],
    ["a wrong type", { ...LICENCE_25K, maxDeviationHz: "5 kHz" }, "maxDeviationHz"],
    ["a negative tolerance", { ...LICENCE_25K, frequencyTolerancePpm: -5 }, "frequencyTolerancePpm"],
    ["mask offsets that do not increase", { ...LICENCE_25K, mask: [[0, 0], [10_000, -25], [8000, -35]] }, "mask"],
    ["a designator that does not parse", { ...LICENCE_25K, emissionDesignator: "16KF3E" }, "emissionDesignator"],
  ])("refuses a licence with %s: exit 2, one line naming the field", (_what, licence, field) => {
    const r = runCli(["check", good, ...flags, "--licence", licenceFile(`bad-${field}`, licence)]);
    const line = expectOneErrorLine(r);
    expect(line).toContain(field);
    expect(r.stdout).toBe("");
  });

  it("refuses a template whose mask needs a field the licence does not give, naming it", () => {
    const r = runCli(["check", good, ...flags, "--template", "maritime-vhf", "--assigned", String(160_000_000)]);
    const line = expectOneErrorLine(r);
    expect(line).toContain("authorisedBandwidthHz");
  });

  it("lists the templates with their sources", () => {
    const r = runCli(["check", "--list-templates"]);
    expect(r.status).toBe(0);
    expect(r.stdout).toMatch(/vhf-land-mobile-12k5/);
    expect(r.stdout).toMatch(/90\.210/);
  });
});

/**
 * The 99 % occupied bandwidth straight from the definition (ITU-R SM.328, 0.5 % of the power
 * beyond each edge), on one periodogram of the whole noiseless-in-effect record (its noise
 * −125 dBFS/Hz holds 1e-7 of the power): cumulative power from below, edges where it crosses
 * 0.5 % and 99.5 %. Independent of the tool's Welch estimate and noise removal.
 */
function independentObwHz(iq: Float64Array): number {
  const n = iq.length / 2;
  let size = 1;
  while (size < n) size *= 2;
  const re = new Float64Array(size);
  const im = new Float64Array(size);
  for (let k = 0; k < n; k++) { re[k] = iq[2 * k] as number; im[k] = iq[2 * k + 1] as number; }
  fftInPlace(re, im);
  const p = new Float64Array(size);
  let total = 0;
  for (let k = 0; k < size; k++) { const j = (k + size / 2) % size; p[k] = (re[j] as number) ** 2 + (im[j] as number) ** 2; total += p[k] as number; }
  let acc = 0;
  let lo = 0;
  let hi = 0;
  for (let k = 0; k < size; k++) {
    const before = acc;
    acc += p[k] as number;
    if (before < 0.005 * total && acc >= 0.005 * total) lo = k;
    if (before < 0.995 * total && acc >= 0.995 * total) hi = k;
  }
  return ((hi - lo + 1) * CHECK_FS) / size;
}

/** Radix-2 decimation-in-time FFT (textbook Cooley–Tukey), for the independent OBW. */
function fftInPlace(re: Float64Array, im: Float64Array): void {
  const n = re.length;
  for (let i = 1, j = 0; i < n; i++) {
    let bit = n >> 1;
    for (; j & bit; bit >>= 1) j ^= bit;
    j ^= bit;
    if (i < j) { [re[i], re[j]] = [re[j] as number, re[i] as number]; [im[i], im[j]] = [im[j] as number, im[i] as number]; }
  }
  for (let len = 2; len <= n; len <<= 1) {
    const ang = (-2 * Math.PI) / len;
    for (let i = 0; i < n; i += len) {
      for (let k = 0; k < len / 2; k++) {
        const wr = Math.cos(ang * k);
        const wi = Math.sin(ang * k);
        const a = i + k;
        const b = a + len / 2;
        const xr = (re[b] as number) * wr - (im[b] as number) * wi;
        const xi = (re[b] as number) * wi + (im[b] as number) * wr;
        re[b] = (re[a] as number) - xr; im[b] = (im[a] as number) - xi;
        re[a] = (re[a] as number) + xr; im[a] = (im[a] as number) + xi;
      }
    }
  }
}
