// The robustness cases of the readers run as a user would (interface.md, "Exit codes"): bad
// input exits 2 with exactly one line on stderr naming the file or option and the field, no
// stack trace and nothing on stdout; repairable input exits 0 with a warning. Each run is killed
// after RUN_LIMIT_MS, so a case that hangs fails instead of stalling the suite. Accepted ranges:
// docs/formats.md (ours).
import { spawnSync } from "node:child_process";
import { mkdtempSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { describe, expect, it } from "vitest";
import { encodeSamples, encodeWav } from "../../src/capture/index.js";
import { expectOneErrorLine, runCli, type CliResult } from "../helpers/runCli.js";

const dir = mkdtempSync(join(tmpdir(), "iqaudit-robust-"));
/** Far more than inspect needs on these few-KiB files; only a hang reaches it. */
const RUN_LIMIT_MS = 30_000;

function file(name: string, bytes: Uint8Array | string): string {
  const p = join(dir, name);
  writeFileSync(p, bytes);
  return p;
}

function tone(n: number): Float64Array {
  const iq = new Float64Array(2 * n);
  for (let k = 0; k < n; k++) {
    iq[2 * k] = 0.5 * Math.cos(0.3 * k);
    iq[2 * k + 1] = 0.5 * Math.sin(0.3 * k);
  }
  return iq;
}

function inspect(args: readonly string[]): CliResult {
  return runCli(["inspect", ...args], undefined, { timeoutMs: RUN_LIMIT_MS });
}

function expectRefused(args: readonly string[], pattern: RegExp): void {
  expect(expectOneErrorLine(inspect(args))).toMatch(pattern);
}

function expectRead(args: readonly string[]): { report: { capture: Record<string, unknown>; quality: Record<string, unknown> }; warnings: string[] } {
  const r = inspect([...args, "--json"]);
  expect(r.status, r.stderr).toBe(0);
  const lines = r.stderr.split("\n").filter((l) => l.length > 0);
  for (const line of lines) expect(line).toMatch(/^iqaudit: warning: /);
  return { report: JSON.parse(r.stdout), warnings: lines };
}

const samples = encodeSamples("cf32_le", tone(4096));

describe("absurd rates and centres are refused naming the field (docs/formats.md, accepted ranges)", () => {
  const raw = file("plain.cf32", samples);
  for (const rate of ["1", "300", "500", "1e-300"]) {
    it(`inspect --rate ${rate}: exit 2, below 1 kS/s`, () => expectRefused([raw, "--rate", rate], /^iqaudit: --rate: \S+ is below 1 kS\/s/));
  }
  it("inspect --rate 1e300: exit 2, above 1 TS/s", () => expectRefused([raw, "--rate", "1e300"], /^iqaudit: --rate: 1e300 is above 1 TS\/s/));
  it("inspect --rate 1e400: exit 2, not finite", () => expectRefused([raw, "--rate", "1e400"], /^iqaudit: --rate: .*not a finite number/));
  it("inspect --center 1e300: exit 2", () => expectRefused([raw, "--rate", "1M", "--center", "1e300"], /^iqaudit: --center: 1e300 is outside 0 Hz to 3 THz/));
  it("inspect --rate 8k (audio-rate IQ) reads the file", () => {
    expect(expectRead([raw, "--rate", "8k"]).report.capture["sampleRateHz"]).toBe(8000);
  });

  const sigmf = (stem: string, rate: string, frequency: string): string => {
    file(`${stem}.sigmf-data`, samples);
    const text =
      `{"global": {"core:datatype": "cf32_le", "core:version": "1.2.0", "core:sample_rate": ${rate}},` +
      ` "captures": [{"core:sample_start": 0, "core:frequency": ${frequency}}], "annotations": []}`;
    return file(`${stem}.sigmf-meta`, text);
  };
  it("inspect SigMF core:sample_rate 1e400: exit 2 naming the field", () => {
    expectRefused([sigmf("rate_inf", "1e400", "1.5e8")], /rate_inf\.sigmf-meta: has global core:sample_rate Infinity/);
  });
  it("inspect SigMF core:sample_rate 1e-300: exit 2 naming the field", () => {
    expectRefused([sigmf("rate_tiny", "1e-300", "1.5e8")], /rate_tiny\.sigmf-meta: has global core:sample_rate 1e-300, which is below 1 kS\/s/);
  });
  it("inspect SigMF core:sample_rate 1e300: exit 2 naming the field", () => {
    expectRefused([sigmf("rate_huge", "1e300", "1.5e8")], /rate_huge\.sigmf-meta: has global core:sample_rate 1e\+300, which is above 1 TS\/s/);
  });
  it("inspect SigMF core:frequency 1e400: exit 2 naming the field (was exit 0)", () => {
    expectRefused([sigmf("freq_inf", "1e6", "1e400")], /freq_inf\.sigmf-meta: has captures\[0\] core:frequency Infinity/);
  });
  it("inspect x_1e-300sps.cf32: exit 2, the whole token is read (never 300 S/s)", () => {
    expectRefused([file("x_1e-300sps.cf32", samples)], /x_1e-300sps\.cf32: the file-name rate token 1e-300sps \(1e-300 S\/s\) is below 1 kS\/s/);
  });
  it("inspect a WAV whose fmt rate is 300: exit 2 naming the fmt chunk", () => {
    const wav = encodeWav({ format: "ci16_le", sampleRateHz: 300 }, tone(512));
    expectRefused([file("slow.wav", wav)], /slow\.wav: has a sample rate of 300 in its fmt chunk, which is below 1 kS\/s/);
  });
});

describe("inputs that are read", () => {
  it("inspect a .sigmf-meta that starts with a UTF-8 byte-order mark (RFC 8259 §8.1; from memory)", () => {
    file("bom.sigmf-data", samples);
    const text = '{"global": {"core:datatype": "cf32_le", "core:version": "1.2.0", "core:sample_rate": 48000}, "captures": [{"core:sample_start": 0}], "annotations": []}';
    const meta = file("bom.sigmf-meta", Buffer.concat([Buffer.from([0xef, 0xbb, 0xbf]), Buffer.from(text)]));
    const { report } = expectRead([meta]);
    expect(report.capture["sampleRateHz"]).toBe(48000);
    expect(report.capture["fileSamples"]).toBe(4096);
  });
});

describe("a WAV whose data chunk declares more than the file holds is read with a warning", () => {
  // encodeWav writes plain PCM16 stereo with a 44-byte header (RIFF 12, fmt 8 + 16, data 8: the
  // RIFF/WAVEFORMATEX layout), so the data size field is at byte 40 and a frame is 4 bytes.
  const wav = encodeWav({ format: "ci16_le", sampleRateHz: 48000 }, tone(4096));
  it("inspect a WAV cut short mid-sample: exit 0, floor((size − 44) / 4) samples, warnings", () => {
    const cut = file("crashed.wav", wav.subarray(0, wav.byteLength - 1002));
    const { report, warnings } = expectRead([cut]);
    expect(report.capture["fileSamples"]).toBe(Math.floor((4 * 4096 - 1002) / 4));
    expect(warnings.join("\n")).toMatch(/data chunk of .*crashed\.wav declares 16384 bytes but the file holds only 15382/);
  });
  it("inspect a WAV whose data size is 0xFFFFFFFF: exit 0, every sample", () => {
    const streamed = Buffer.from(wav);
    streamed.writeUInt32LE(0xffffffff, 40);
    const { report, warnings } = expectRead([file("streamed.wav", streamed)]);
    expect(report.capture["fileSamples"]).toBe(4096);
    expect(warnings.join("\n")).toMatch(/declares 0xFFFFFFFF bytes/);
  });
});

describe("non-finite samples are counted and warned, never a crash (formats.md: a NaN or infinite frame is read as 0)", () => {
  for (const format of ["cf32_le", "cf64_le"] as const) {
    it(`inspect a ${format} capture where 9 samples in 10 have a NaN or infinite component: exit 0, each counted`, () => {
      const iq = tone(8192);
      let bad = 0;
      for (let k = 0; k < 8192; k++) {
        if (k % 10 === 0) continue;
        bad++;
        // I NaN; Q +Inf; both −Inf and NaN: every kind counts once per sample (frame).
        if (k % 3 === 0) iq[2 * k] = Number.NaN;
        else if (k % 3 === 1) iq[2 * k + 1] = Number.POSITIVE_INFINITY;
        else [iq[2 * k], iq[2 * k + 1]] = [Number.NEGATIVE_INFINITY, Number.NaN];
      }
      const ext = format === "cf32_le" ? "cf32" : "cf64";
      const { report, warnings } = expectRead([file(`mostly_nan_1Msps.${ext}`, encodeSamples(format, iq))]);
      expect(report.quality["nonFiniteSamples"]).toBe(bad);
      expect(warnings.join("\n")).toContain(`${bad} samples with a NaN or infinite component were counted and read as 0`);
    });
  }
});

describe("a named pipe as input (docs/formats.md: only a regular file is read)", () => {
  it("inspect a FIFO: exit 2 at once, naming the pipe (it used to wait for a writer forever)", (ctx) => {
    const path = join(dir, "stream.cf32");
    if (spawnSync("mkfifo", [path]).status !== 0) return ctx.skip(); // mkfifo(1), POSIX
    expectRefused([path, "--rate", "1M"], /stream\.cf32: is a named pipe \(FIFO\), not a regular file/);
  });
});
