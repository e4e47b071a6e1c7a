// Pass 1 as a whole: one read of the file gives the hash, the PSD, the spectrogram and the health
// figures; results do not depend on how the span is cut into blocks or spread over threads.
import { createHash } from "node:crypto";
import { mkdtempSync, readFileSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { describe, expect, it } from "vitest";
import { encodeSamples, encodeWav, openCapture, resolveSpan } from "../../src/capture/index.js";
import { runPass1, type Pass1Options } from "../../src/analysis/index.js";
import { SeededRandom, complexNoise } from "../../src/scenario/index.js";

const dir = mkdtempSync(join(tmpdir(), "iqaudit-pass1-"));

/** Complex white noise of variance `noiseVariance` plus a complex tone at `toneHz`. */
function capture(n: number, fs: number, toneHz: number, toneAmplitude: number, noiseVariance: number, seed = 1): Float64Array {
  const iq = new Float64Array(2 * n);
  complexNoise(new SeededRandom(seed), iq, noiseVariance);
  for (let k = 0; k < n; k++) {
    iq[2 * k] = (iq[2 * k] as number) + toneAmplitude * Math.cos((2 * Math.PI * toneHz * k) / fs);
    iq[2 * k + 1] = (iq[2 * k + 1] as number) + toneAmplitude * Math.sin((2 * Math.PI * toneHz * k) / fs);
  }
  return iq;
}

async function pass1(path: string, options: Pass1Options, startS?: number, durationS?: number) {
  const source = await openCapture(path, {});
  const { span } = resolveSpan(source.meta, startS, durationS);
  await source.close();
  return runPass1(source.meta, span, options);
}

/** Workers run the compiled worker script: the built modules (dist/, made by `npm test`), not the sources. */
async function builtModules() {
  const load = (rel: string): Promise<unknown> => import(new URL(`../../dist/${rel}`, import.meta.url).href);
  return {
    built: (await load("analysis/index.js")) as typeof import("../../src/analysis/index.js"),
    builtPass2: (await load("analysis/pass2.js")) as typeof import("../../src/analysis/pass2.js"),
    cap: (await load("capture/index.js")) as typeof import("../../src/capture/index.js"),
  };
}

describe("runPass1(meta, span)", () => {
  const fs = 1e6;
  const n = 300_000;
  const wavPath = join(dir, "noise_tone.wav");
  writeFileSync(wavPath, encodeWav({ format: "ci16_le", sampleRateHz: fs }, capture(n, fs, 125_000, 0.25, 1e-3)));

  it("hashes the whole data file as stored, headers included, even for a part of it (interface.md; node:crypto as reference)", async () => {
    const expected = createHash("sha256").update(readFileSync(wavPath)).digest("hex");
    const whole = await pass1(wavPath, {});
    const part = await pass1(wavPath, {}, 0.05, 0.1);
    expect(whole.sha256).toBe(expected);
    expect(part.sha256).toBe(expected);
    expect(part.span.sampleCount).toBe(100_000);
  });

  it("gives the same figures whatever the block size (block contract of dsp/frameGrid.ts)", async () => {
    const big = await pass1(wavPath, { blockSamples: 1 << 20 });
    const small = await pass1(wavPath, { blockSamples: 4_999 });
    expect(small.psd.segmentCount).toBe(big.psd.segmentCount);
    // Welch (1967): K = floor((n - L)/H) + 1 segments of L = 4096 at hop H = 2048.
    expect(big.psd.segmentCount).toBe(Math.floor((n - 4096) / 2048) + 1);
    for (let i = 0; i < big.psd.densityPerHz.length; i += 37) {
      expect(small.psd.densityPerHz[i]).toBeCloseTo(big.psd.densityPerHz[i] as number, 15);
    }
    expect(small.health.dcOffsetDbfs).toBeCloseTo(big.health.dcOffsetDbfs, 6);
    expect(small.spectrogram.framesPerRow).toEqual(big.spectrogram.framesPerRow);
  });

  it("finds the noise density s²/fs and the tone at its frequency (Welch 1967; REFERENCES.md §8)", async () => {
    const r = await pass1(wavPath, {});
    // Noise of total variance 1e-3 at 1 MS/s: density 1e-9 FS²/Hz = -90 dBFS/Hz. ci16 rounding adds
    // 2·q²/12 with q = 1/32768 (uniform quantisation noise, common practice), 68 dB below: negligible.
    // Tolerance 0.5 dB: the percentile estimator's bias correction is approximate (Wilson–Hilferty)
    // and 145 averages leave about ±0.4 dB of scatter per bin.
    expect(r.noiseFloor.dbfsPerHz).toBeGreaterThan(-90.5);
    expect(r.noiseFloor.dbfsPerHz).toBeLessThan(-89.5);
    // Tone at +125 kHz: within one bin (244 Hz) after interpolation.
    expect(Math.abs(r.peak.offsetHz - 125_000)).toBeLessThan(r.psd.binWidthHz);
    // A complex tone of amplitude 0.25 has power 0.0625 = -12.04 dBFS; read through one ENBW at
    // the peak bin, within the Hann scallop loss of 1.42 dB (Harris 1978, Table 1).
    expect(r.peak.dbfs).toBeLessThanOrEqual(-12.04 + 0.1);
    expect(r.peak.dbfs).toBeGreaterThan(-12.04 - 1.42 - 0.1);
  });

  it("gives the same result in two worker threads as in one (compiled build; merging of accumulator states)", async () => {
    const { built, cap } = await builtModules();
    const rawPath = join(dir, "noise_1Msps.cf32");
    writeFileSync(rawPath, encodeSamples("cf32_le", capture(1_200_000, fs, -200_000, 0.1, 1e-4, 7)));
    const source = await cap.openCapture(rawPath, {});
    const { span } = cap.resolveSpan(source.meta);
    await source.close();
    const inline = await built.runPass1(source.meta, span, { workers: 0, blockSamples: 65_536 });
    const threaded = await built.runPass1(source.meta, span, { workers: 2, blockSamples: 65_536 });
    expect(threaded.workers).toBe(2);
    expect(threaded.sha256).toBe(inline.sha256);
    expect(threaded.psd.segmentCount).toBe(inline.psd.segmentCount);
    for (let i = 0; i < inline.psd.densityPerHz.length; i += 13) {
      const a = inline.psd.densityPerHz[i] as number;
      expect(Math.abs((threaded.psd.densityPerHz[i] as number) - a)).toBeLessThan(1e-12 * Math.max(a, 1e-30) + 1e-300);
      expect(threaded.psd.maxHoldPerHz[i]).toBe(inline.psd.maxHoldPerHz[i]);
    }
    expect(threaded.spectrogram.framesPerRow).toEqual(inline.spectrogram.framesPerRow);
    expect(threaded.health.samples).toBe(inline.health.samples);
    expect(threaded.health.iqGainImbalanceDb).toBeCloseTo(inline.health.iqGainImbalanceDb, 9);
  });

  it("extracts a channel given before it in the same read: what a pass 2 of its own gives, to the bit, in one thread or two", async () => {
    // The reference is runPass2's own read through one continuous ChannelExtractor; pass 1's
    // blocks are extracted apart (ChannelExtractor.pushOwned) and put end to end.
    const { built, builtPass2, cap } = await builtModules();
    const rawPath = join(dir, "tone_channel_1Msps.cf32");
    writeFileSync(rawPath, encodeSamples("cf32_le", capture(1_100_000, fs, -200_300, 0.1, 1e-4, 9)));
    const source = await cap.openCapture(rawPath, {});
    const { span } = cap.resolveSpan(source.meta);
    const request = { offsetHz: -200_000, bandwidthHz: 25_000, maxSamples: 30_000, wholeSpan: { audioBandwidthHz: 3000, hold: false } };
    const alone = await builtPass2.runPass2(source, span, request);
    await source.close();
    expect(alone.complete).toBe(false);
    for (const workers of [0, 2]) {
      const r = await built.runPass1(source.meta, span, { workers, blockSamples: 65_536, channel: request });
      expect(r.workers).toBe(workers);
      const beside = r.pass2 as NonNullable<typeof r.pass2>;
      expect(beside.iq).toEqual(alone.iq);
      expect(beside.inputSamples).toBe(span.sampleCount);
      expect(beside.wholeSpan).toEqual(alone.wholeSpan);
      expect(beside.warnings).toEqual(alone.warnings);
      expect(beside.startS).toBe(alone.startS);
    }
    const without = await built.runPass1(source.meta, span, { workers: 0 });
    expect(without.pass2).toBeNull();
  });

  it("shortens an FFT longer than the span, with a warning (repairable setting, STYLE.md §6)", async () => {
    const p = join(dir, "short_1Msps.cf32");
    writeFileSync(p, encodeSamples("cf32_le", capture(3000, fs, 0, 0.1, 1e-4)));
    const r = await pass1(p, {});
    expect(r.psd.fftLength).toBe(2048);
    expect(r.warnings.join(" ")).toMatch(/4096/);
  });
});
