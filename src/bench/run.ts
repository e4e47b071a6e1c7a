/**
 * `npm run bench`: how fast pass 1 is, and what bounds it. On cf32 captures of 256 MiB and 1 GiB
 * (generated outside the repository and reused), each run in its own process so that its peak
 * RSS is its own, and timed inside that process after start-up:
 * - the raw read of the file, and its SHA-256 alone (node:crypto, pass 1's block size): the
 *   floor that reading and hashing set;
 * - the FFTs alone (the transforms of pass 1, one thread), once per FFT implementation named in
 *   IQAUDIT_FFT (the child reports the one it used, when it says);
 * - pass 1 in one thread and with the automatic worker count, and measure of one FM emission;
 * - the same pass 1 as a plain numpy/scipy script (pass1Reference.py, one thread, scipy.fft with
 *   its default single worker), run in alternation with pass 1 (script, pass 1, script, pass 1)
 *   on the warm page cache, giving pass 1 / script and measure / script time ratios. Skipped,
 *   with one line saying why, when python3 cannot import numpy and scipy.
 * Then blind measure of a QPSK capture, survey of a ten-emission capture and check of a
 * 10-minute recording. Not a test: numbers for a person to read, targets printed beside them.
 *
 * Environment: IQAUDIT_BENCH_SIZES (MiB, default "256,1024"), IQAUDIT_BENCH_SURVEY_MIB (1024),
 * IQAUDIT_BENCH_REPEATS (alternated script/pass-1 pairs, 2), IQAUDIT_BENCH_PARTS (which sections,
 * default "pass1,qpsk,survey,check"; "pass1" alone is the quick run), IQAUDIT_BENCH_DIR.
 */
import { execFileSync } from "node:child_process";
import { fileURLToPath } from "node:url";
import { BENCH_CHECK, benchCapture, benchCheckCapture, benchDir, benchQpskCapture, benchSurveyCapture } from "./benchData.js";
import { referenceAvailability, runReference, type ReferenceAvailability, type ReferenceRun } from "./reference.js";
import { formatTable, type TableRow } from "./table.js";

interface RunResult {
  readonly pass1S?: number;
  readonly pass2S?: number;
  readonly detectionS?: number;
  readonly extractionS?: number;
  readonly analysesS?: number;
  readonly emissions?: number;
  readonly peakDeviationHz?: number;
  readonly peakTimeS?: number;
  /** The FFT implementation the `fft` mode used, when the child says. */
  readonly implementation?: string;
  readonly sha256?: string;
  readonly mode: string;
  readonly samples: number;
  readonly seconds: number;
  readonly maxRssMiB: number;
}

const CHILD = fileURLToPath(new URL("./pass1Child.js", import.meta.url));
/** The values of IQAUDIT_FFT the FFT-only rate is measured with. */
const FFT_IMPLEMENTATIONS = ["fftjs", "pffft"] as const;
const CF32_BYTES = 8;
const TARGETS = { pass1OverScript: 0.35, measureOverScript: 0.5, rssMiB: 150 } as const;

function run(args: readonly string[], env: Readonly<Record<string, string>> = {}): RunResult {
  const out = execFileSync(process.execPath, [CHILD, ...args], {
    encoding: "utf8",
    stdio: ["ignore", "pipe", "inherit"],
    env: { ...process.env, ...env },
  });
  return JSON.parse(out.trim().split("\n").pop() as string) as RunResult;
}

function msps(r: { samples: number; seconds: number }): number {
  return r.samples / r.seconds / 1e6;
}

/** A row for a run over a capture of `frameBytes` bytes a sample. */
function row(label: string, r: { samples: number; seconds: number; maxRssMiB: number }, note?: string, frameBytes = CF32_BYTES): TableRow {
  const base = { label, msps: msps(r), gbps: (r.samples * frameBytes) / r.seconds / 1e9, seconds: r.seconds, rssMiB: r.maxRssMiB };
  return note === undefined ? base : { ...base, note };
}

function median(values: readonly number[]): number {
  const s = [...values].sort((a, b) => a - b);
  const m = s.length >> 1;
  return s.length % 2 === 1 ? (s[m] as number) : ((s[m - 1] as number) + (s[m] as number)) / 2;
}

/** Runs with the median time, the largest peak RSS, and each time in the note. */
function medianRow(label: string, runs: readonly { samples: number; seconds: number; maxRssMiB: number }[], note = ""): TableRow {
  const seconds = median(runs.map((r) => r.seconds));
  const rss = Math.max(...runs.map((r) => r.maxRssMiB));
  const each = runs.length > 1 ? `median of ${runs.length} (${runs.map((r) => r.seconds.toFixed(2)).join(", ")} s), largest RSS` : "";
  const notes = [each, note].filter((s) => s !== "").join("; ");
  return row(label, { samples: (runs[0] as RunResult).samples, seconds, maxRssMiB: rss }, notes === "" ? undefined : notes);
}

/** Pass 1 and the script in alternation, so that both see the same page cache and machine load. */
function alternate(path: string, reference: ReferenceAvailability, repeats: number): { pass1: RunResult[]; script: ReferenceRun[] } {
  const pass1: RunResult[] = [];
  const script: ReferenceRun[] = [];
  for (let k = 0; k < repeats; k++) {
    if (reference.available) script.push(runReference(path));
    pass1.push(run(["pass1", path]));
  }
  return { pass1, script };
}

function fftRow(name: string, samples: number): TableRow {
  const r = run(["fft", String(samples)], { IQAUDIT_FFT: name });
  const note = r.implementation === undefined ? "the child did not say which implementation ran" : `implementation: ${r.implementation}`;
  return { label: `FFTs only, IQAUDIT_FFT=${name}`, msps: msps(r), seconds: r.seconds, rssMiB: r.maxRssMiB, note };
}

function verdict(value: number, limit: number): string {
  return value <= limit ? "met" : "NOT met";
}

/** The lines comparing pass 1 and measure with the script. */
function comparison(reference: ReferenceAvailability, pass1: RunResult[], script: ReferenceRun[], measure: RunResult, hash: RunResult): string {
  if (!reference.available) return `  numpy/scipy comparison skipped: ${reference.reason}\n`;
  const scriptS = median(script.map((r) => r.seconds));
  const pass1S = median(pass1.map((r) => r.seconds));
  const pass1Rss = Math.max(...pass1.map((r) => r.maxRssMiB));
  const t = TARGETS;
  const sameHash = script.every((r) => r.sha256 === hash.sha256) ? "the script's SHA-256 equals the hash run's" : "SHA-256 DIFFERS between the script and the hash run";
  return [
    `  against the numpy/scipy script (numpy ${reference.numpyVersion}, scipy ${reference.scipyVersion}; one thread, scipy.fft default single worker),`,
    `  runs alternated script, pass 1 (x${script.length}), medians:`,
    `    pass 1 / script    ${(pass1S / scriptS).toFixed(2)} x  (${pass1S.toFixed(2)} s / ${scriptS.toFixed(2)} s)  target <= ${t.pass1OverScript} x: ${verdict(pass1S / scriptS, t.pass1OverScript)}`,
    `    measure / script   ${(measure.seconds / scriptS).toFixed(2)} x  (${measure.seconds.toFixed(2)} s / ${scriptS.toFixed(2)} s)  target <= ${t.measureOverScript} x: ${verdict(measure.seconds / scriptS, t.measureOverScript)}`,
    `    peak RSS           pass 1 ${pass1Rss.toFixed(0)} MiB, measure ${measure.maxRssMiB.toFixed(0)} MiB  target <= ${t.rssMiB} MiB: ` +
      `${verdict(Math.max(pass1Rss, measure.maxRssMiB), t.rssMiB)}  (script ${Math.max(...script.map((r) => r.maxRssMiB)).toFixed(0)} MiB)`,
    `    ${sameHash}`,
    "",
  ].join("\n");
}

async function pass1Section(mib: number, reference: ReferenceAvailability, repeats: number): Promise<string> {
  process.stderr.write(`preparing ${mib} MiB capture...\n`);
  const path = await benchCapture(mib);
  const read = run(["read", path]);
  const hash = run(["hash", path]);
  const ffts = FFT_IMPLEMENTATIONS.map((name) => fftRow(name, read.samples));
  const pass1Inline = run(["pass1", path, "0"]);
  const { pass1, script } = alternate(path, reference, repeats);
  const measure = run(["measure", path]);
  const pass1S = median(pass1.map((r) => r.seconds));
  const rows: TableRow[] = [
    row("raw read (8 MiB reads)", read),
    row("SHA-256 alone (node:crypto)", hash, "pass 1's block size, next read overlapped"),
    ...ffts,
    row("pass 1, 1 thread", pass1Inline),
    medianRow("pass 1, auto", pass1),
    row("measure (FM, 25 kHz)", measure,
      `pass 1 ${(measure.pass1S ?? 0).toFixed(2)} s, pass 2 + figures ${(measure.pass2S ?? 0).toFixed(2)} s, ratio ${((measure.pass2S ?? 0) / (measure.pass1S ?? 1)).toFixed(2)}`),
  ];
  if (script.length > 0) rows.push(medianRow("numpy/scipy script, 1 thread", script, "python3 src/bench/pass1Reference.py"));
  const fftJs = ffts[0] as TableRow;
  const ratios = `  rate ratios: pass 1/read ${(read.seconds / pass1S).toFixed(3)}, pass 1/SHA-256 ${(hash.seconds / pass1S).toFixed(2)}, ` +
    `pass 1/FFT-only (${FFT_IMPLEMENTATIONS[0]}) ${((fftJs.seconds as number) / pass1S).toFixed(2)}, auto/1-thread ${(pass1Inline.seconds / pass1S).toFixed(2)}\n`;
  return `${mib} MiB cf32 (${(read.samples / 1e6).toFixed(1)} MS)\n${formatTable(rows)}\n${ratios}${comparison(reference, pass1, script, measure, hash)}\n`;
}

async function qpskSection(): Promise<string> {
  process.stderr.write("preparing the 64 MiB QPSK capture...\n");
  const qpsk = run(["measure-auto", await benchQpskCapture(64)]);
  const note = `pass 1 ${(qpsk.pass1S ?? 0).toFixed(2)} s, pass 2 + figures ${(qpsk.pass2S ?? 0).toFixed(2)} s`;
  return `64 MiB cf32 QPSK 50 kBd at 1 MS/s (${(qpsk.samples / 1e6).toFixed(1)} MS)\n${formatTable([row("measure (blind)", qpsk, note)])}\n\n`;
}

async function surveySection(): Promise<string> {
  const [surveyMiB = 1024] = envIntegers("IQAUDIT_BENCH_SURVEY_MIB", "1024");
  process.stderr.write(`preparing the ${surveyMiB} MiB survey capture (ten emissions)...\n`);
  const surveyPath = await benchSurveyCapture(surveyMiB);
  const inspect = run(["pass1", surveyPath]);
  const survey = run(["survey", surveyPath]);
  const surveyOne = run(["survey", surveyPath, "1"]);
  const note = (r: RunResult): string =>
    `${r.emissions ?? 0} emissions; pass 1 ${(r.pass1S ?? 0).toFixed(2)} s, detection ${(r.detectionS ?? 0).toFixed(2)} s, ` +
    `extraction ${(r.extractionS ?? 0).toFixed(2)} s, analyses ${(r.analysesS ?? 0).toFixed(2)} s; ${(r.seconds / inspect.seconds).toFixed(2)} x inspect`;
  const rows = [row("inspect (pass 1)", inspect), row("survey, 2 threads", survey, note(survey)), row("survey, 1 thread", surveyOne, note(surveyOne))];
  return `${surveyMiB} MiB cf32 survey capture, ten emissions at 2.4 MS/s (${(survey.samples / 1e6).toFixed(1)} MS)\n${formatTable(rows)}\n\n`;
}

async function checkSection(): Promise<string> {
  process.stderr.write("preparing the 10-minute 48 kS/s check recording...\n");
  const long = await benchCheckCapture();
  const check = run(["check", long.path, long.licencePath]);
  const note = `peak deviation ${(check.peakDeviationHz ?? NaN).toFixed(0)} Hz at ${(check.peakTimeS ?? NaN).toFixed(3)} s`;
  return `10-minute ci16 recording at 48 kS/s, FM at ±2.2 kHz with one word at ±3.4 kHz at ${BENCH_CHECK.wordStartS} s ` +
    `(${(check.samples / 1e6).toFixed(1)} MS)\n${formatTable([row("check", check, note, 4)])}\n\n`;
}

const PARTS = ["pass1", "qpsk", "survey", "check"] as const;

/** A setting of the benchmark's environment that cannot be used: one line, exit code 2. */
class BenchSettingError extends Error {}

/** The positive whole numbers, comma-separated, of environment variable `name`. */
function envIntegers(name: string, fallback: string): number[] {
  const text = process.env[name] ?? fallback;
  const values = text.split(",").map(Number);
  if (values.some((v) => !Number.isInteger(v) || v < 1)) throw new BenchSettingError(`${name}: "${text}" is not a list of positive whole numbers`);
  return values;
}

/** The sections IQAUDIT_BENCH_PARTS asks for (all by default). */
function chosenParts(): Set<string> {
  const names = (process.env.IQAUDIT_BENCH_PARTS ?? PARTS.join(",")).split(",").map((s) => s.trim()).filter((s) => s !== "");
  const unknown = names.filter((n) => !(PARTS as readonly string[]).includes(n));
  if (unknown.length > 0) throw new BenchSettingError(`IQAUDIT_BENCH_PARTS: ${unknown.join(", ")} is not among ${PARTS.join(", ")}`);
  return new Set(names);
}

async function main(): Promise<void> {
  const parts = chosenParts();
  const sizes = envIntegers("IQAUDIT_BENCH_SIZES", "256,1024");
  const [repeats = 2] = envIntegers("IQAUDIT_BENCH_REPEATS", "2");
  const reference = referenceAvailability();
  process.stdout.write(
    "iqaudit benchmark: pass 1 (Welch 4096 @ 50 %, spectrogram 1024, health, SHA-256)\n" +
      `captures in ${benchDir()}; times measured inside each process, after start-up\n\n`,
  );
  if (parts.has("pass1")) for (const mib of sizes) process.stdout.write(await pass1Section(mib, reference, repeats));
  if (parts.has("qpsk")) process.stdout.write(await qpskSection());
  if (parts.has("survey")) process.stdout.write(await surveySection());
  if (parts.has("check")) process.stdout.write(await checkSection());
  process.stdout.write(
    "targets (1 GiB on 2 cores): pass 1 >= 25 MS/s and <= 0.35 x the numpy/scipy script's time, measure <= 0.5 x the script's time,\n" +
      "peak RSS <= 150 MiB, RSS of 256 MiB within a few MiB of 1 GiB; measure: pass 2 at most a quarter of pass 1;\n" +
      "survey within 2.5 x inspect, peak RSS <= 300 MiB; check of 10 minutes: the word found at 540-541 s, peak RSS <= 150 MiB\n",
  );
}

main().catch((e: unknown) => {
  if (e instanceof BenchSettingError) {
    process.stderr.write(`bench: ${e.message}\n`);
    process.exitCode = 2;
    return;
  }
  process.stderr.write(`${e instanceof Error ? (e.stack ?? e.message) : String(e)}\n`);
  process.exitCode = 1;
});
