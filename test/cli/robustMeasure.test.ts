// The measurement side of robustness (issue 8): captures with no signal or mostly non-finite
// samples, channels too narrow to measure, symbol-rate hints the capture cannot hold, and the
// one-line error for awkward file names. Each run ends with exit 0 (a measurement, possibly of
// nothing, with its warnings) or exit 2 with one line naming the option or file: never exit 70
// (interface.md, "Exit codes").
import { mkdtempSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { describe, expect, it } from "vitest";
import { encodeSamples } from "../../src/capture/index.js";
import { measureCommand } from "../../src/commands/measure.js";
import { clearProgressLine, createProgress } from "../../src/cli/progress.js";
import { oneLine } from "../../src/cli/errorLine.js";
import { SeededRandom, complexNoise, fmFromAudio, toneAudio } from "../../src/scenario/index.js";
import { runCli } from "../helpers/runCli.js";

const dir = mkdtempSync(join(tmpdir(), "iqaudit-robust-"));
const FS = 50_000;

function write(name: string, iq: Float64Array | Float32Array): string {
  const p = join(dir, name);
  writeFileSync(p, encodeSamples("cf32_le", iq instanceof Float64Array ? iq : Float64Array.from(iq)));
  return p;
}

/** Tone FM (1 kHz at 3 kHz deviation) in noise 30 dB down, 3 s at 50 kS/s. */
function fmCapture(): string {
  const n = 3 * FS;
  const { iq } = fmFromAudio(toneAudio(0, n, FS, 1000), FS, 3000, 0, 0.3);
  const noise = new Float64Array(iq.length);
  complexNoise(new SeededRandom(81), noise, 0.09e-3);
  for (let k = 0; k < iq.length; k++) iq[k] = (iq[k] as number) + (noise[k] as number);
  return write("fm_50ksps.cf32", iq);
}

function expectExit2OneLine(args: string[], mentions: string): void {
  const r = runCli(args);
  expect(r.status, r.stderr).toBe(2);
  const lines = r.stderr.split("\n").filter((l) => l.length > 0);
  expect(lines, r.stderr).toHaveLength(1);
  expect(lines[0]).toContain(mentions);
  expect(r.stderr).not.toMatch(/\n\s+at /);
}

function expectMeasured(args: string[]): string {
  const r = runCli(args);
  expect(r.status, r.stderr).toBe(0);
  expect(r.stderr).not.toMatch(/internal error|\n\s+at /);
  return r.stderr;
}

describe("captures with no signal", () => {
  const zero = write("zero_48ksps.cf32", new Float64Array(2 * 48_000));

  it("an all-zero capture is measured as no emission, under every --mode, and inspected", () => {
    // The contract: an all-zero capture is a valid, empty measurement (issue 8).
    for (const mode of [[], ["--mode", "cw"], ["--mode", "am"], ["--mode", "fm"], ["--mode", "fsk"], ["--mode", "ook"], ["--mode", "psk"], ["--mode", "qam"]]) {
      const stderr = expectMeasured(["measure", zero, ...mode, "--json"]);
      expect(stderr).toMatch(/holds no signal/);
    }
    expect(expectMeasured(["inspect", zero])).toMatch(/holds no signal/);
  }, 60_000);

  it("a capture whose samples are mostly NaN is measured, the non-finite samples counted in a warning", () => {
    const iq = new Float32Array(2 * 48_000).fill(Number.NaN);
    for (let k = 0; k < iq.length; k += 20) { iq[k] = 0.1; iq[k + 1] = 0; }
    const p = join(dir, "nan_48ksps.cf32");
    writeFileSync(p, new Uint8Array(iq.buffer));
    expect(expectMeasured(["measure", p])).toMatch(/43200 samples with a NaN or infinite component/);
  });
});

describe("channels and symbol rates the capture cannot hold", () => {
  const fm = fmCapture();

  it("refuses a channel narrower than fs/1024 and 400/T with the rule in one line", () => {
    // 3 s at 50 kS/s: the narrowest channel is max(48.8, 133) = 133 Hz (docs/cli.md).
    for (const c of ["0:3p", "0:7n", "0:100"]) expectExit2OneLine(["measure", fm, `--channel=${c}`], "--channel");
  });

  it("measures narrow but legal channels without an internal error", () => {
    for (const c of ["0:200", "0:1k", "-3k:500", "4k:4k", "-8k:4k"]) expectMeasured(["measure", fm, `--channel=${c}`]);
  }, 60_000);

  it("refuses a symbol rate above fs/2 or one that leaves fewer than 64 symbols in the span", () => {
    expectExit2OneLine(["measure", fm, "--symbol-rate", "1"], "--symbol-rate");
    expectExit2OneLine(["measure", fm, "--symbol-rate", "49999"], "--symbol-rate");
    expectExit2OneLine(["measure", fm, "--mode", "psk", "--symbol-rate", "20"], "--symbol-rate");
  });

  it("gives no constellation, with the reason, for a rate the channel cannot carry", () => {
    // 24 kBd PSK forced on an 8 kHz channel, decimated to under 48 kS/s: under 2 samples a symbol.
    const stderr = expectMeasured(["measure", fm, "--channel", "0:8k", "--mode", "psk", "--symbol-rate", "24k"]);
    expect(stderr).toMatch(/no constellation: .*samples a symbol/);
    // A rate far below the channel's: refused by the recovery's bound, not computed for minutes.
    expect(expectMeasured(["measure", fm, "--mode", "qam", "--symbol-rate", "45"])).toMatch(/no constellation: .*narrow --channel/);
  }, 60_000);

  it("checks the options against the metadata before reading a sample (no pass-1 progress)", async () => {
    let progressCalls = 0;
    const onProgress = (): void => { progressCalls++; };
    await expect(measureCommand(fm, { capture: {}, channel: { offsetHz: 0, widthHz: 50 }, pass1: { onProgress } })).rejects.toThrow(/--channel/);
    await expect(measureCommand(fm, { capture: {}, symbolRateBd: 2, pass1: { onProgress } })).rejects.toThrow(/--symbol-rate/);
    await expect(measureCommand(fm, { capture: {}, nominalHz: 165e6, pass1: { onProgress } })).rejects.toThrow(/--nominal/);
    expect(progressCalls).toBe(0);
  });
});

describe("the one error line", () => {
  it("escapes control characters of a file name and names an empty path", () => {
    const p = join(dir, "two\nlines\u001b_48ksps.cf32");
    writeFileSync(p, new Uint8Array(3));
    const r = runCli(["inspect", p]);
    expect(r.status).toBe(2);
    expect(r.stderr.split("\n").filter((l) => l.length > 0)).toHaveLength(1);
    expect(r.stderr).toContain("two\\nlines\\x1b_48ksps.cf32");
    expectExit2OneLine(["inspect", ""], "(empty path)");
    expect(oneLine("iqaudit: a\tb\rc")).toBe("iqaudit: a\\tb\\rc");
  });

  it("clears a progress line on the terminal before an error is printed", () => {
    const written: string[] = [];
    const tty = { isTTY: true, write: (s: string) => { written.push(s); return true; } } as unknown as NodeJS.WriteStream;
    const progress = createProgress("pass 1", true, tty);
    progress.onProgress?.(10, 100);
    expect(written.join("")).toMatch(/pass 1 \[/);
    clearProgressLine();
    // Carriage return and erase-to-end-of-line (ECMA-48 EL, CSI K): the line is blank again.
    expect(written[written.length - 1]).toBe("\r\u001b[K");
  });
});
