// Bad input of every kind the contract names (interface.md, "Exit codes"): exit code 2, exactly
// one line on stderr "iqaudit: <file or option>: <problem>", no stack trace, nothing on stdout,
// and no output file left behind.
import { existsSync, mkdtempSync, readdirSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { describe, expect, it } from "vitest";
import { encodeSamples, encodeWav } from "../../src/capture/index.js";
import { expectOneErrorLine, runCli } from "../helpers/runCli.js";

const dir = mkdtempSync(join(tmpdir(), "iqaudit-bad-"));

function tone(n: number, cyclesPerSample = 0.05, amplitude = 0.5): Float64Array {
  const iq = new Float64Array(2 * n);
  for (let k = 0; k < n; k++) {
    iq[2 * k] = amplitude * Math.cos(2 * Math.PI * cyclesPerSample * k);
    iq[2 * k + 1] = amplitude * Math.sin(2 * Math.PI * cyclesPerSample * k);
  }
  return iq;
}

function file(name: string, bytes: Uint8Array | string): string {
  const p = join(dir, name);
  writeFileSync(p, bytes);
  return p;
}

function expectOneLineError(args: string[], mentions: string): void {
  const png = join(dir, `out-${Math.random().toString(36).slice(2)}.png`);
  for (const command of [["inspect", ...args], ["spectrogram", ...args, "-o", png]]) {
    expect(expectOneErrorLine(runCli(command))).toContain(mentions);
    expect(existsSync(png)).toBe(false);
  }
}

describe("bad input gives exit 2 and one line (interface.md, exit codes)", () => {
  const good = file("good_1Msps.cf32", encodeSamples("cf32_le", tone(8192)));

  it("missing file", () => expectOneLineError([join(dir, "nope.cf32"), "--rate", "1M"], "nope.cf32"));
  it("empty file", () => expectOneLineError([file("empty.cf32", new Uint8Array(0)), "--rate", "1M"], "empty.cf32"));
  it("unknown format", () => expectOneLineError([file("mystery.bin", new Uint8Array(4096)), "--rate", "1M"], "mystery.bin"));
  it("raw file without --rate", () => expectOneLineError([file("norate.cf32", encodeSamples("cf32_le", tone(4096)))], "--rate"));
  it("zero rate", () => expectOneLineError([good, "--rate", "0"], "--rate"));
  it("negative rate", () => expectOneLineError([good, "--rate", "-48k"], "--rate"));
  it("non-numeric rate", () => expectOneLineError([good, "--rate", "fast"], "--rate"));
  it("unknown --format value", () => expectOneLineError([good, "--format", "cf16"], "--format"));
  it("--start past the end", () => expectOneLineError([good, "--start", "10"], "--start"));

  const wav = encodeWav({ format: "ci16_le", sampleRateHz: 48000 }, tone(4096));
  it("truncated WAV header", () => expectOneLineError([file("short.wav", wav.subarray(0, 30))], "short.wav"));
  it("corrupt WAV magic", () => {
    const bad = Buffer.from(wav);
    bad.write("RIFX", 0, "latin1");
    expectOneLineError([file("magic.wav", bad)], "magic.wav");
  });
  it("unsupported WAV encoding (A-law, format tag 6)", () => {
    // Microsoft mmreg.h: WAVE_FORMAT_ALAW = 0x0006 (from memory).
    const alaw = Buffer.from(wav);
    const fmt = alaw.indexOf("fmt ", 0, "latin1");
    alaw.writeUInt16LE(6, fmt + 8);
    expectOneLineError([file("alaw.wav", alaw)], "alaw.wav");
  });
  it("1-channel WAV without --real", () => {
    const mono = encodeWav({ format: "ri16_le", sampleRateHz: 48000 }, tone(4096));
    expectOneLineError([file("mono.wav", mono)], "mono.wav");
  });
  it("malformed .sigmf-meta", () => {
    file("broken.sigmf-data", encodeSamples("cf32_le", tone(4096)));
    const meta = file("broken.sigmf-meta", '{"global": {"core:datatype": "cf32_le", ');
    expectOneLineError([meta], "broken.sigmf-meta");
  });
  it("leaves no partial or temporary file behind", () => {
    const leftovers = readdirSync(dir).filter((n) => n.startsWith("out-") || n.startsWith(".iqaudit-"));
    expect(leftovers).toEqual([]);
  });
});

describe("awkward but readable input", () => {
  it("a file ending in a partial sample is read to its last whole sample, with a warning naming the trailing bytes (interface.md)", () => {
    const whole = encodeSamples("cf32_le", tone(4096));
    const p = file("partial_1Msps.cf32", Buffer.concat([whole, Buffer.from([1, 2, 3])]));
    const r = runCli(["inspect", p, "--json"]);
    expect(r.status, r.stderr).toBe(0);
    expect(r.stderr).toMatch(/^iqaudit: warning: .*3 .*byte/m);
    expect(JSON.parse(r.stdout).capture.fileSamples).toBe(4096);
  });

  it("NaN and Inf samples are counted with a warning, and the JSON holds no NaN (interface.md)", () => {
    const iq = tone(8192);
    iq[100] = Number.NaN;
    iq[201] = Number.POSITIVE_INFINITY;
    iq[302] = Number.NEGATIVE_INFINITY;
    const p = file("nan_1Msps.cf32", encodeSamples("cf32_le", iq));
    const r = runCli(["inspect", p, "--json"]);
    expect(r.status, r.stderr).toBe(0);
    expect(r.stderr).toMatch(/^iqaudit: warning: .*(non-finite|NaN)/im);
    expect(r.stdout).not.toMatch(/:\s*(NaN|-?Infinity)\b/); // JSON has no NaN; a value must never be one
    const report = JSON.parse(r.stdout);
    expect(report.quality.nonFiniteSamples).toBe(3);
    // Every health figure is a number; only the DC spike level may be null (no spike found).
    for (const [k, v] of Object.entries(report.quality)) {
      if (k !== "dcSpikeDbfs") expect(typeof v, k).toBe("number");
    }
  });

  it("--duration past the end is clamped with a warning", () => {
    const p = file("clamp_1Msps.cf32", encodeSamples("cf32_le", tone(8192)));
    const r = runCli(["inspect", p, "--duration", "5", "--json"]);
    expect(r.status, r.stderr).toBe(0);
    expect(r.stderr).toMatch(/^iqaudit: warning: /m);
    expect(JSON.parse(r.stdout).capture.samples).toBe(8192);
  });
});

describe("a bad FFT engine setting (docs/architecture.md, FFT engines)", () => {
  it("IQAUDIT_FFT with an unknown value stops before any work: exit 2, one line naming the setting", () => {
    const good = file("fftsetting_1Msps.cf32", encodeSamples("cf32_le", tone(4096)));
    const r = runCli(["inspect", good], undefined, { env: { IQAUDIT_FFT: "fastest" } });
    expect(expectOneErrorLine(r)).toContain("IQAUDIT_FFT=fastest");
  });

  it("IQAUDIT_FFT=fftjs runs on the fallback", () => {
    const good = file("fftjs_1Msps.cf32", encodeSamples("cf32_le", tone(4096)));
    const r = runCli(["inspect", good, "--json"], undefined, { env: { IQAUDIT_FFT: "fftjs" } });
    expect(r.status).toBe(0);
    expect(JSON.parse(r.stdout).capture.samples).toBe(4096);
  });
});
