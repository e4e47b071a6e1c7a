/**
 * The benchmark's numpy/scipy pass 1 (src/bench/pass1Reference.py) against ours, and our Welch
 * PSD against scipy.signal.welch itself: an independent-library cross-check (scipy, float64 and
 * float32 transforms). Runs only where python3 can import numpy and scipy.
 */
import { spawnSync } from "node:child_process";
import { mkdtempSync, readFileSync, rmSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { fileURLToPath } from "node:url";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { decodeSamples } from "../../src/capture/index.js";
import { HealthAccumulator, SpectrogramAccumulator, WelchAccumulator } from "../../src/dsp/index.js";
import { complexNoise, SeededRandom } from "../../src/scenario/index.js";

const SCRIPT = fileURLToPath(new URL("../../src/bench/pass1Reference.py", import.meta.url));
const havePython = spawnSync("python3", ["-c", "import numpy, scipy"], { stdio: "ignore" }).status === 0;
const RATE_HZ = 2.4e6;
// Not a multiple of 1024 or 2048 (a partial frame and segment are dropped), and more than 1000
// frames, so that rows hold one or two frames (floor(k·R/F) with F = 1074, R = 1000).
const SAMPLES = 1_100_000;

/** Noise at −40 dBFS, a tone at +250 kHz and −20 dBFS, one NaN sample and two clipped components. */
function testCapture(): Float32Array {
  const iq = new Float32Array(2 * SAMPLES);
  complexNoise(new SeededRandom(13), iq, 1e-4);
  for (let n = 0; n < SAMPLES; n++) {
    const phase = (2 * Math.PI * 250e3 * n) / RATE_HZ;
    iq[2 * n] = (iq[2 * n] as number) + 0.1 * Math.cos(phase);
    iq[2 * n + 1] = (iq[2 * n + 1] as number) + 0.1 * Math.sin(phase);
  }
  iq[2 * 400_000] = Number.NaN;
  iq[2 * 500_000] = 1.5;
  iq[2 * 600_000 + 1] = -1;
  return iq;
}

interface ReferenceFigures {
  readonly welch: { readonly segmentCount: number; readonly densityPerHz: number[]; readonly maxHoldPerHz: number[] };
  readonly spectrogram: { readonly rowCount: number; readonly framesPerRow: number[]; readonly meanPerHz: number[]; readonly maxPerHz: number[] };
  readonly health: { readonly samples: number; readonly clippedComponents: number; readonly nonFiniteSamples: number };
}

/** Largest |a − b| over the largest |b|: errors of a float32 FFT scale with the spectrum's peak. */
function errorOverPeak(a: ArrayLike<number>, b: ArrayLike<number>): number {
  expect(a.length).toBe(b.length);
  let err = 0;
  let peak = 0;
  for (let k = 0; k < b.length; k++) {
    err = Math.max(err, Math.abs((a[k] as number) - (b[k] as number)));
    peak = Math.max(peak, Math.abs(b[k] as number));
  }
  return err / peak;
}

describe.skipIf(!havePython)("pass1Reference.py against iqaudit's pass 1 accumulators", () => {
  let dir = "";
  let path = "";
  let reference: ReferenceFigures;
  const decoded = new Float32Array(2 * SAMPLES);
  let counts = { clippedComponents: 0, nonFiniteSamples: 0 };

  beforeAll(() => {
    dir = mkdtempSync(join(tmpdir(), "iqaudit-reference-"));
    path = join(dir, "reference.cf32");
    const iq = testCapture();
    writeFileSync(path, new Uint8Array(iq.buffer));
    counts = decodeSamples("cf32_le", new Uint8Array(iq.buffer), decoded);
    // Small blocks (not a multiple of the hop) and odd batches: many segments and frames cross block edges.
    const out = join(dir, "figures.json");
    const run = spawnSync("python3", [SCRIPT, path, "--figures", out, "--rate", String(RATE_HZ), "--block-samples", "70001", "--batch-frames", "7"], { encoding: "utf8" });
    expect(run.status, run.stderr).toBe(0);
    reference = JSON.parse(readFileSync(out, "utf8")) as ReferenceFigures;
  });
  afterAll(() => rmSync(dir, { recursive: true, force: true }));

  it("WelchAccumulator(4096, 50 %) matches the script's mean PSD and max hold", () => {
    const acc = new WelchAccumulator({ fftLength: 4096, overlapLength: 2048, sampleRateHz: RATE_HZ });
    acc.push(decoded, 0);
    const psd = acc.finish();
    // floor((1 100 000 − 4096)/2048) + 1 whole segments (Welch 1967, no partial segment).
    expect(reference.welch.segmentCount).toBe(Math.floor((SAMPLES - 4096) / 2048) + 1);
    expect(psd.segmentCount).toBe(reference.welch.segmentCount);
    // The script's transforms are float32: error ≈ ε32·log2(N)·peak ≈ 1e-6 of the peak; 1e-5 leaves margin.
    expect(errorOverPeak(psd.densityPerHz, reference.welch.densityPerHz)).toBeLessThan(1e-5);
    expect(errorOverPeak(psd.maxHoldPerHz, reference.welch.maxHoldPerHz)).toBeLessThan(1e-5);
  });

  it("SpectrogramAccumulator(1024, 1000 rows) matches the script's rows", () => {
    const acc = new SpectrogramAccumulator({ fftLength: 1024, rowCount: 1000, totalSamples: SAMPLES, sampleRateHz: RATE_HZ });
    acc.push(decoded, 0);
    const rows = acc.finish();
    expect(rows.rowCount).toBe(reference.spectrogram.rowCount);
    expect([...rows.framesPerRow]).toEqual(reference.spectrogram.framesPerRow);
    for (const r of [0, 1, 372, 999]) {
      const span = (a: ArrayLike<number>): number[] => Array.from(a).slice(r * 1024, (r + 1) * 1024);
      expect(errorOverPeak(span(rows.meanPerHz), span(reference.spectrogram.meanPerHz))).toBeLessThan(1e-5);
      expect(errorOverPeak(span(rows.maxPerHz), span(reference.spectrogram.maxPerHz))).toBeLessThan(1e-5);
    }
  });

  it("the script counts samples, the NaN sample and the clipped components as the decoder does", () => {
    const health = new HealthAccumulator();
    health.addDecodeCounts(counts);
    health.push(decoded, 0);
    const ours = health.finish();
    expect(reference.health.samples).toBe(SAMPLES);
    expect(ours.nonFiniteSamples).toBe(1);
    expect(reference.health.nonFiniteSamples).toBe(1);
    expect(reference.health.clippedComponents).toBe(2);
    expect(ours.clippingPercent).toBeCloseTo((100 * 2) / (2 * SAMPLES), 12);
  });

  it("WelchAccumulator matches scipy.signal.welch (float64) to float32 rounding", () => {
    // scipy.signal.welch(z, fs, window="hann", nperseg=4096, noverlap=2048, detrend=False,
    // return_onesided=False, scaling="density"), fftshift-ed, on the decoded samples (NaN → 0).
    const samples = join(dir, "decoded.cf32");
    writeFileSync(samples, new Uint8Array(decoded.buffer));
    const code = [
      "import sys, json, numpy as np, scipy.signal",
      "z = np.fromfile(sys.argv[1], np.complex64).astype(np.complex128)",
      "f, p = scipy.signal.welch(z, float(sys.argv[2]), window='hann', nperseg=4096, noverlap=2048, detrend=False, return_onesided=False, scaling='density')",
      "print(json.dumps(np.fft.fftshift(p).tolist()))",
    ].join("\n");
    const run = spawnSync("python3", ["-c", code, samples, String(RATE_HZ)], { encoding: "utf8", maxBuffer: 1 << 24 });
    expect(run.status, run.stderr).toBe(0);
    const scipyPsd = JSON.parse(run.stdout) as number[];
    const acc = new WelchAccumulator({ fftLength: 4096, overlapLength: 2048, sampleRateHz: RATE_HZ });
    acc.push(decoded, 0);
    // scipy in float64, ours with float32 transforms (dsp/fastFft.ts): a power's relative error
    // about 2·2^−24·√(log2 N) ≈ 4e-7 at N = 4096, so of the peak at most that; 1e-5 leaves margin
    // and still fails on any error of window, scaling or bin order.
    expect(errorOverPeak(acc.finish().densityPerHz, scipyPsd)).toBeLessThan(1e-5);
  });
});
