// A modest number of mutated captures run through the built command line as a user would
// (`inspect --json`): the exit code is 0 or 2, never 70 (an internal error); exit 2 gives exactly
// one stderr line and nothing on stdout; exit 0 gives only warning lines on stderr and one JSON
// document on stdout; never a stack trace (interface.md, "Exit codes"). The reader functions
// themselves are fuzzed in-process, with many more cases, in test/capture/readerFuzz.test.ts.
// The samples are a tone with a little deterministic dither, so that only the header is odd.
import { mkdtempSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { encodeSamples, encodeWav } from "../../src/capture/index.js";
import { runCli } from "../helpers/runCli.js";

const dir = mkdtempSync(join(tmpdir(), "iqaudit-fuzz-"));
/** Far more than inspect needs on these few-KiB files; only a hang reaches it. */
const RUN_LIMIT_MS = 30_000;
const SEED = 20261202;
let count = 0;

const iq = Array.from({ length: 2 * 2048 }, (_, k) => 0.5 * Math.cos(0.3 * (k >> 1) + (k % 2) * (Math.PI / 2)) + 0.01 * (((k * 7919) % 13) / 13 - 0.5));
const SEEDS: readonly [string, Buffer][] = [
  ["pcm16.wav", encodeWav({ format: "ci16_le", sampleRateHz: 48000 }, iq)],
  ["float32.wav", encodeWav({ format: "cf32_le", sampleRateHz: 250000, extensible: true }, iq)],
  ["rf64.wav", encodeWav({ format: "ci16_le", sampleRateHz: 96000, rf64: true }, iq)],
];

function inspectOutcome(path: string, args: readonly string[] = []): void {
  const r = runCli(["inspect", path, "--json", ...args], undefined, { timeoutMs: RUN_LIMIT_MS });
  expect([0, 2], `exit ${r.status}: ${r.stderr}`).toContain(r.status);
  expect(r.stderr).not.toMatch(/internal error|\n\s+at /);
  const lines = r.stderr.split("\n").filter((l) => l.length > 0);
  if (r.status === 2) {
    expect(lines, r.stderr).toHaveLength(1);
    expect(lines[0]).toMatch(/^iqaudit: /);
    expect(r.stdout).toBe("");
  } else {
    for (const line of lines) expect(line).toMatch(/^iqaudit: warning: /);
    expect(() => JSON.parse(r.stdout)).not.toThrow();
  }
}

describe("inspect over mutated captures: exit 0 or 2, one line on error, no stack trace", () => {
  it("inspect(WAV / RF64 with random header fields and cuts)", { timeout: 300_000 }, () => {
    const u32 = fc.oneof(fc.constantFrom(0, 1, 300, 0xffffffff, 0x7fffffff), fc.nat({ max: 0xffffffff }));
    const wavCase = fc.record({
      seed: fc.nat({ max: SEEDS.length - 1 }),
      at: fc.nat(),
      value: u32,
      cut: fc.option(fc.nat(), { nil: undefined }),
    });
    fc.assert(
      fc.property(wavCase, ({ seed, at, value, cut }) => {
        const [name, wav] = SEEDS[seed] as [string, Buffer];
        const bytes = Buffer.from(wav);
        const head = bytes.indexOf("data", 12, "latin1") + 8;
        bytes.writeUInt32LE(value, at % (head - 3));
        const path = join(dir, `${++count}_${name}`);
        writeFileSync(path, cut === undefined ? bytes : bytes.subarray(0, cut % (bytes.byteLength + 1)));
        inspectOutcome(path);
      }),
      { seed: SEED, numRuns: 20 },
    );
  });

  it("inspect(SigMF with random values in the rate, centre and datatype)", { timeout: 300_000 }, () => {
    const value = fc.oneof(fc.constantFrom("1e400", "1e-300", "1e300", "500", "0", "-1", "null", '"1M"', "8000", "2.4e6"), fc.double({ noNaN: true, noDefaultInfinity: true }).map(String));
    const sigmfCase = fc.record({
      rate: value,
      frequency: value,
      datatype: fc.constantFrom("cf32_le", "ci16_le", "cu8", "cf64_le", "cf32", "ri8", "cu16_le"),
      bom: fc.boolean(),
    });
    const data = encodeSamples("cf32_le", iq);
    fc.assert(
      fc.property(sigmfCase, ({ rate, frequency, datatype, bom }) => {
        const stem = join(dir, `${++count}_rec`);
        writeFileSync(`${stem}.sigmf-data`, data);
        const text =
          `{"global": {"core:datatype": "${datatype}", "core:version": "1.2.0", "core:sample_rate": ${rate}},` +
          ` "captures": [{"core:sample_start": 0, "core:frequency": ${frequency}}], "annotations": []}`;
        writeFileSync(`${stem}.sigmf-meta`, bom ? `\uFEFF${text}` : text);
        inspectOutcome(`${stem}.sigmf-meta`);
      }),
      { seed: SEED, numRuns: 12 },
    );
  });

  it("inspect(raw captures with random names and --rate / --center text)", { timeout: 300_000 }, () => {
    const quantity = fc.oneof(fc.constantFrom("1", "300", "500", "1e-300", "1e300", "1e400", "8k", "2.4M", "0", "-5", "NaN", "1e-300M"), fc.double().map(String));
    const rawCase = fc.record({
      ext: fc.constantFrom("cu8", "cs8", "cs16", "cf32", "cf64"),
      token: fc.constantFrom("", "_1e-300sps", "_2.4Msps", "_300sps", "_1e400Hz"),
      rate: fc.option(quantity, { nil: undefined }),
      center: fc.option(quantity, { nil: undefined }),
    });
    const bytes: Record<string, Uint8Array> = {
      cu8: encodeSamples("cu8", iq), cs8: encodeSamples("ci8", iq), cs16: encodeSamples("ci16_le", iq),
      cf32: encodeSamples("cf32_le", iq), cf64: encodeSamples("cf64_le", iq),
    };
    fc.assert(
      fc.property(rawCase, ({ ext, token, rate, center }) => {
        const path = join(dir, `${++count}_raw${token}.${ext}`);
        writeFileSync(path, bytes[ext] as Uint8Array);
        const args = [...(rate === undefined ? [] : [`--rate=${rate}`]), ...(center === undefined ? [] : [`--center=${center}`])];
        inspectOutcome(path, args);
      }),
      { seed: SEED, numRuns: 12 },
    );
  });
});
