/**
 * `npm run bench`: pass-1 throughput on cf32 captures of 256 MiB and 1 GiB (generated outside the
 * repository and reused), beside the raw read rate of the same file and the FFT-only rate of the
 * same transforms, with peak RSS of each run (each run is its own process). Not a test: numbers
 * for a person to read. Targets (1 GiB, this 2-core machine): pass 1 ≥ 25 MS/s, RSS ≤ 150 MiB.
 */
import { execFileSync } from "node:child_process";
import { fileURLToPath } from "node:url";
import { BENCH_CHECK, benchCapture, benchCheckCapture, benchDir, benchQpskCapture, benchSurveyCapture } from "./benchData.js";

interface RunResult {
  readonly pass1S?: number;
  readonly pass2S?: number;
  readonly detectionS?: number;
  readonly extractionS?: number;
  readonly analysesS?: number;
  readonly emissions?: number;
  readonly peakDeviationHz?: number;
  readonly peakTimeS?: number;
  readonly mode: string;
  readonly samples: number;
  readonly seconds: number;
  readonly maxRssMiB: number;
}

const CHILD = fileURLToPath(new URL("./pass1Child.js", import.meta.url));

function run(...args: string[]): RunResult {
  const out = execFileSync(process.execPath, [CHILD, ...args], { encoding: "utf8", stdio: ["ignore", "pipe", "inherit"] });
  return JSON.parse(out.trim().split("\n").pop() as string) as RunResult;
}

function msps(r: RunResult): number {
  return r.samples / r.seconds / 1e6;
}

async function main(): Promise<void> {
  const sizes = (process.env.IQAUDIT_BENCH_SIZES ?? "256,1024").split(",").map(Number);
  process.stdout.write(`iqaudit benchmark: pass 1 (Welch 4096 @ 50 %, spectrogram 1024, health, SHA-256)\ncaptures in ${benchDir()}\n\n`);
  const rows: string[] = [];
  for (const mib of sizes) {
    process.stderr.write(`preparing ${mib} MiB capture...\n`);
    const path = await benchCapture(mib);
    const read = run("read", path);
    const fft = run("fft", String(read.samples));
    const pass1 = run("pass1", path);
    const pass1Inline = run("pass1", path, "0");
    const measure = run("measure", path);
    rows.push(
      [
        `${mib} MiB cf32 (${(read.samples / 1e6).toFixed(1)} MS)`,
        `  raw read            ${msps(read).toFixed(1).padStart(7)} MS/s  ${read.seconds.toFixed(2)} s  RSS ${read.maxRssMiB.toFixed(0)} MiB`,
        `  FFTs only, 1 thread ${msps(fft).toFixed(1).padStart(7)} MS/s  ${fft.seconds.toFixed(2)} s`,
        `  pass 1, 1 thread    ${msps(pass1Inline).toFixed(1).padStart(7)} MS/s  ${pass1Inline.seconds.toFixed(2)} s  RSS ${pass1Inline.maxRssMiB.toFixed(0)} MiB`,
        `  pass 1, auto        ${msps(pass1).toFixed(1).padStart(7)} MS/s  ${pass1.seconds.toFixed(2)} s  RSS ${pass1.maxRssMiB.toFixed(0)} MiB`,
        `  measure (FM, 25 kHz) ${msps(measure).toFixed(1).padStart(7)} MS/s  ${measure.seconds.toFixed(2)} s  RSS ${measure.maxRssMiB.toFixed(0)} MiB` +
          `  (pass 1 ${(measure.pass1S ?? 0).toFixed(2)} s, pass 2 + figures ${(measure.pass2S ?? 0).toFixed(2)} s, ratio ${((measure.pass2S ?? 0) / (measure.pass1S ?? 1)).toFixed(2)})`,
        `  ratios: pass1/read ${(msps(pass1) / msps(read)).toFixed(3)}, pass1/FFT-only ${(msps(pass1) / msps(fft)).toFixed(2)}, ` +
          `auto/1-thread ${(msps(pass1) / msps(pass1Inline)).toFixed(2)}`,
        "",
      ].join("\n"),
    );
    process.stdout.write(`${rows[rows.length - 1]}\n`);
  }
  process.stderr.write("preparing the 64 MiB QPSK capture...\n");
  const qpsk = run("measure-auto", await benchQpskCapture(64));
  process.stdout.write(
    `64 MiB cf32 QPSK 50 kBd at 1 MS/s (${(qpsk.samples / 1e6).toFixed(1)} MS)\n` +
      `  measure (blind)     ${msps(qpsk).toFixed(1).padStart(7)} MS/s  ${qpsk.seconds.toFixed(2)} s  RSS ${qpsk.maxRssMiB.toFixed(0)} MiB` +
      `  (pass 1 ${(qpsk.pass1S ?? 0).toFixed(2)} s, pass 2 + figures ${(qpsk.pass2S ?? 0).toFixed(2)} s)\n\n`,
  );
  const surveyMiB = Number(process.env.IQAUDIT_BENCH_SURVEY_MIB ?? "1024");
  process.stderr.write(`preparing the ${surveyMiB} MiB survey capture (ten emissions)...\n`);
  const surveyPath = await benchSurveyCapture(surveyMiB);
  const inspect = run("pass1", surveyPath);
  const survey = run("survey", surveyPath);
  const surveyOne = run("survey", surveyPath, "1");
  const line = (label: string, r: RunResult): string =>
    `  ${label.padEnd(19)} ${r.seconds.toFixed(2)} s  RSS ${r.maxRssMiB.toFixed(0)} MiB  (${r.emissions ?? 0} emissions; ` +
    `pass 1 ${(r.pass1S ?? 0).toFixed(2)} s, detection ${(r.detectionS ?? 0).toFixed(2)} s, extraction ${(r.extractionS ?? 0).toFixed(2)} s, ` +
    `analyses ${(r.analysesS ?? 0).toFixed(2)} s; ${(r.seconds / inspect.seconds).toFixed(2)} x inspect)\n`;
  process.stdout.write(
    `${surveyMiB} MiB cf32 survey capture, ten emissions at 2.4 MS/s (${(survey.samples / 1e6).toFixed(1)} MS)\n` +
      `  inspect (pass 1)    ${inspect.seconds.toFixed(2)} s  RSS ${inspect.maxRssMiB.toFixed(0)} MiB\n` +
      line("survey, 2 threads", survey) + line("survey, 1 thread", surveyOne) + "\n",
  );
  process.stderr.write("preparing the 10-minute 48 kS/s check recording...\n");
  const long = await benchCheckCapture();
  const check = run("check", long.path, long.licencePath);
  process.stdout.write(
    `10-minute ci16 recording at 48 kS/s, FM at ±2.2 kHz with one word at ±3.4 kHz at ${BENCH_CHECK.wordStartS} s (${(check.samples / 1e6).toFixed(1)} MS)\n` +
      `  check               ${check.seconds.toFixed(2)} s  RSS ${check.maxRssMiB.toFixed(0)} MiB  (peak deviation ${(check.peakDeviationHz ?? NaN).toFixed(0)} Hz at ${(check.peakTimeS ?? NaN).toFixed(3)} s)\n\n`,
  );
  process.stdout.write(
    "targets (1 GiB on 2 cores): pass 1 >= 25 MS/s, peak RSS <= 150 MiB, RSS of 256 MiB within a few MiB of 1 GiB;\n" +
      "measure: pass 2 at most a quarter of pass 1, peak RSS <= 150 MiB; survey within 2.5 x inspect, peak RSS <= 300 MiB;\n" +
      "check of 10 minutes: the word found at 540-541 s, peak RSS <= 150 MiB\n",
  );
}

main().catch((e: unknown) => {
  process.stderr.write(`${e instanceof Error ? (e.stack ?? e.message) : String(e)}\n`);
  process.exitCode = 1;
});
