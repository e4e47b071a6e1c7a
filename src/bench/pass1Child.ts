/**
 * One benchmark run in its own process, so that its peak RSS is its own: pass 1 of a capture,
 * or the raw read of it, or its SHA-256 alone, or its FFTs alone. Prints one JSON line.
 */
import { createHash } from "node:crypto";
import { open } from "node:fs/promises";
import { openCapture, resolveSpan } from "../capture/index.js";
import { PASS1_DEFAULTS, runPass1 } from "../analysis/index.js";
import { measureEmission, pass2BesidePass1 } from "../analysis/measureEmission.js";
import { fastFft, fftImplementation } from "../dsp/index.js";
import { surveyCapture } from "../survey/index.js";
import { checkCommand } from "../commands/check.js";
import { BENCH_CHECK } from "./benchData.js";

async function main(): Promise<void> {
  const [mode, path, workersText] = process.argv.slice(2) as [string, string, string | undefined];
  const started = process.hrtime.bigint();
  let samples = 0;
  let extra: Record<string, number | string> = {};
  let implementation: string | undefined;
  if (mode === "pass1") {
    const source = await openCapture(path, {});
    const { span } = resolveSpan(source.meta);
    await source.close();
    samples = span.sampleCount;
    await runPass1(source.meta, span, { workers: workersText === undefined ? "auto" : Number(workersText) });
  } else if (mode === "measure") {
    // measure of the FM emission at +300 kHz (25 kHz channel): pass 1 with the channel's pass 2, then the figures.
    const source = await openCapture(path, {});
    const { span } = resolveSpan(source.meta);
    samples = span.sampleCount;
    // As `iqaudit measure --channel` does it: the channel extracted in pass 1's read.
    const options = { channel: { offsetHz: 300e3, widthHz: 25e3 } };
    const pass1 = await runPass1(source.meta, span, { channel: pass2BesidePass1(options, source.meta) });
    const afterPass1 = process.hrtime.bigint();
    await measureEmission(source, span, pass1, options);
    await source.close();
    const end = process.hrtime.bigint();
    extra = { pass1S: Number(afterPass1 - started) / 1e9, pass2S: Number(end - afterPass1) / 1e9 };
  } else if (mode === "measure-auto") {
    // measure of the strongest emission, found and classified blind.
    const source = await openCapture(path, {});
    const { span } = resolveSpan(source.meta);
    samples = span.sampleCount;
    const pass1 = await runPass1(source.meta, span, {});
    const afterPass1 = process.hrtime.bigint();
    const figures = await measureEmission(source, span, pass1, {});
    await source.close();
    extra = { pass1S: Number(afterPass1 - started) / 1e9, pass2S: Number(process.hrtime.bigint() - afterPass1) / 1e9 };
    process.stderr.write(`measured class ${figures.modulation.class}\n`);
  } else if (mode === "survey") {
    // survey: pass 1, then detection, one extraction read and the analyses.
    const source = await openCapture(path, {});
    const { span } = resolveSpan(source.meta);
    samples = span.sampleCount;
    const pass1 = await runPass1(source.meta, span, {});
    const afterPass1 = process.hrtime.bigint();
    const r = await surveyCapture(source, span, pass1, { workers: workersText === undefined ? undefined : Number(workersText) });
    await source.close();
    extra = {
      pass1S: Number(afterPass1 - started) / 1e9, detectionS: r.timingS.detection, extractionS: r.timingS.extraction,
      analysesS: r.timingS.analyses, emissions: r.detection.emissions.filter((e) => e.artefact === null).length,
    };
    process.stderr.write(`survey classes: ${r.measured.map((m) => `${m.figures.modulation.class}${m.figures.modulation.order ?? ""}`).join(" ")}\n`);
  } else if (mode === "check") {
    // check of the 10-minute recording against its licence: pass 1, then one read of both channels.
    const r = await checkCommand(path, { capture: { format: "ci16_le", sampleRateHz: BENCH_CHECK.rateHz, centerHz: BENCH_CHECK.centreHz }, licencePath: workersText });
    samples = r.report.report.capture.samples;
    const d = r.report.checks.find((c) => c.name === "deviation");
    extra = { peakDeviationHz: typeof d?.measured === "number" ? d.measured : NaN, peakTimeS: r.report.report.fm?.positiveDeviationTimeS ?? NaN };
    process.stderr.write(`check verdict ${r.report.verdict}; ${d?.notes[0] ?? ""}\n`);
  } else if (mode === "read") {
    const handle = await open(path, "r");
    const buffer = new Uint8Array(8 << 20);
    let bytes = 0;
    for (;;) {
      const { bytesRead } = await handle.read(buffer, 0, buffer.length, bytes);
      if (bytesRead === 0) break;
      bytes += bytesRead;
    }
    await handle.close();
    samples = bytes / 8;
  } else if (mode === "hash") {
    const r = await hashFile(path);
    samples = r.bytes / 8;
    extra = { sha256: r.sha256 };
  } else if (mode === "fft") {
    // The same transforms as pass 1 of `samples` samples: Welch 4096 at 50 % overlap and
    // spectrogram frames of 1024 without overlap, single thread, in the fast engine that
    // IQAUDIT_FFT chooses (transforms alone: no window, no power sums).
    samples = Number(path);
    const welch = fastFft(4096);
    const rows = fastFft(1024);
    welch.time().forEach((_, k, t) => { t[k] = Math.sin(k); });
    rows.time().forEach((_, k, t) => { t[k] = Math.cos(k); });
    const welchCount = Math.floor((samples - 4096) / 2048) + 1;
    const rowCount = Math.floor(samples / 1024);
    for (let k = 0; k < welchCount; k++) welch.forward();
    for (let k = 0; k < rowCount; k++) rows.forward();
    implementation = fftImplementation().implementation;
  }
  const seconds = Number(process.hrtime.bigint() - started) / 1e9;
  const maxRssMiB = process.resourceUsage().maxRSS / 1024;
  process.stdout.write(`${JSON.stringify({ mode, samples, seconds, maxRssMiB, ...extra, fft: fftImplementation().implementation, ...(implementation === undefined ? {} : { implementation }) })}\n`);
}

/**
 * SHA-256 of the file read in pass 1's block size (cf32: 8 bytes a sample), the next read
 * started before the current block is hashed, as pass 1's sweep does: what hashing alone costs.
 */
async function hashFile(path: string): Promise<{ bytes: number; sha256: string }> {
  const handle = await open(path, "r");
  const hash = createHash("sha256");
  const size = PASS1_DEFAULTS.blockSamples * 8;
  const buffers = [new Uint8Array(size), new Uint8Array(size)] as const;
  let bytes = 0;
  let turn = 0;
  let next = handle.read(buffers[turn], 0, size, bytes);
  for (;;) {
    const { bytesRead, buffer } = await next;
    if (bytesRead === 0) break;
    bytes += bytesRead;
    turn ^= 1;
    next = handle.read(buffers[turn], 0, size, bytes);
    hash.update(buffer.subarray(0, bytesRead));
  }
  await handle.close();
  return { bytes, sha256: hash.digest("hex") };
}

main().catch((e: unknown) => {
  process.stderr.write(`${e instanceof Error ? (e.stack ?? e.message) : String(e)}\n`);
  process.exitCode = 1;
});
