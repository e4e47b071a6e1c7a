import { createHash } from "node:crypto";
import { mkdtemp, readdir, readFile, rm, stat } from "node:fs/promises";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { fileURLToPath } from "node:url";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import WavDecoder from "wav-decoder";
import { decodeSamples } from "../../src/capture/index.js";
import { emissionOffsetHz, SCENARIO_CAPTURES, scenarioTransmitter, writeScenario, writeScenarioLicences } from "../../src/scenario/index.js";
import { parseLicence } from "../../src/licence/index.js";
import type { ScenarioCapture, ScenarioFile } from "../../src/scenario/index.js";
import { instantaneousFrequencyHz, pauseWindows, peakAbs, unwrappedDeviationHz } from "./lines.js";

const sha256 = async (p: string) => createHash("sha256").update(await readFile(p)).digest("hex");
const capture = (id: string) => SCENARIO_CAPTURES.find((c) => c.id === id)!;
/** The committed sample files (samples/, kept in git). */
const SAMPLES_DIR = fileURLToPath(new URL("../../samples/", import.meta.url));

/** A WAV file read by wav-decoder (the independent reader), as interleaved I,Q. */
async function wavIq(path: string): Promise<{ sampleRateHz: number; iq: Float64Array }> {
  const wav = await WavDecoder.decode(await readFile(path));
  const n = wav.channelData[0].length;
  const iq = new Float64Array(2 * n);
  for (let k = 0; k < n; k++) {
    iq[2 * k] = wav.channelData[0][k] as number;
    iq[2 * k + 1] = wav.channelData[1][k] as number;
  }
  return { sampleRateHz: wav.sampleRate, iq };
}

/**
 * Noise on the instantaneous frequency of a capture's one emission, Hz, per sample step: a carrier
 * A with complex noise of variance σn² has phase noise of variance σn²/(2A²) per sample, so the
 * difference of two samples σf = (fs/2π)·σn/A (small-noise approximation, common practice).
 * σn² = receiver noise 10^(N/10)·fs plus 16-bit rounding 2·q²/12 (q = 1/32768).
 */
function frequencyNoiseHz(c: ScenarioCapture): number {
  const amplitude = 10 ** (c.emissions[0]!.powerDbfs / 20);
  const q = 1 / 32_768;
  const sigmaN = Math.sqrt(10 ** (c.noiseDbfsPerHz / 10) * c.sampleRateHz + (2 * q * q) / 12);
  return (c.sampleRateHz / (2 * Math.PI)) * (sigmaN / amplitude);
}

describe("writeScenario(dir)", () => {
  let dirA = "";
  let dirB = "";
  let files: ScenarioFile[] = [];

  beforeAll(async () => {
    dirA = await mkdtemp(join(tmpdir(), "iqaudit-scenario-a-"));
    dirB = await mkdtemp(join(tmpdir(), "iqaudit-scenario-b-"));
    files = await writeScenario(dirA);
    await writeScenario(dirB);
  }, 120_000); // two full generations (~9.2 MB each); a limit, not a timing check

  afterAll(async () => {
    await rm(dirA, { recursive: true, force: true });
    await rm(dirB, { recursive: true, force: true });
  });

  it("is deterministic: two runs write the same bytes", async () => {
    const names = (await readdir(dirA)).sort();
    expect(names).toEqual((await readdir(dirB)).sort());
    for (const n of names) expect(await sha256(join(dirA, n))).toBe(await sha256(join(dirB, n)));
  });

  it("writes the very bytes of the committed samples/ files (so a change to the scenario that moves them shows here)", async () => {
    const names = (await readdir(dirA)).sort();
    for (const n of names) expect(await sha256(join(dirA, n)), n).toBe(await sha256(join(SAMPLES_DIR, n)));
  });

  it("writes the licence files committed in samples/, and each is a valid licence (docs/licence.md)", async () => {
    const dir = await mkdtemp(join(tmpdir(), "iqaudit-licences-"));
    const written = await writeScenarioLicences(dir);
    expect(written.length).toBeGreaterThan(0);
    for (const p of written) {
      const name = p.slice(dir.length + 1);
      const text = await readFile(p, "utf8");
      expect(text, name).toBe(await readFile(join(SAMPLES_DIR, name), "utf8"));
      expect(() => parseLicence(text, name)).not.toThrow();
    }
    await rm(dir, { recursive: true, force: true });
  });

  it("leaves no temporary files and writes samples × frame bytes for raw data", async () => {
    const names = await readdir(dirA);
    expect(names.some((n) => n.includes(".tmp-"))).toBe(false);
    expect(names.length).toBe(7); // 5 single files and a SigMF pair
    for (const f of files) {
      const c = capture(f.captureId);
      const frame = { cu8: 2, ci16_le: 4, cf32_le: 8 }[c.format as "cu8" | "ci16_le" | "cf32_le"];
      if (f.container !== "wav") expect((await stat(f.dataPath)).size).toBe(c.sampleCount * frame);
    }
  });

  it("keeps files of the right size on a second run", async () => {
    const again = await writeScenario(dirA);
    expect(again.map((f) => f.written)).toEqual(SCENARIO_CAPTURES.map(() => false));
  });

  it("returns the flags a raw file needs (--format, --rate) and the centre", () => {
    const survey = files.find((f) => f.captureId === "survey")!;
    expect(survey.flags).toEqual(["--format", "cu8", "--rate", "1000000", "--center", "165200000"]);
    expect(survey.path).toMatch(/_1Msps\.cu8$/);
    const quay = files.find((f) => f.container === "sigmf")!;
    expect(quay.path).toMatch(/\.sigmf-meta$/);
    expect(quay.dataPath).toMatch(/\.sigmf-data$/);
  });

  it("survey (cu8): nothing clips, and the mean is the receiver's DC offset (zero-mean emissions and noise)", async () => {
    const c = capture("survey");
    const bytes = await readFile(files[0]!.dataPath);
    const out = new Float32Array(2 * c.sampleCount);
    const counts = decodeSamples("cu8", bytes, out);
    expect(counts.clippedComponents).toBe(0);
    let i = 0;
    let q = 0;
    for (let k = 0; k < c.sampleCount; k++) {
      i += out[2 * k] as number;
      q += out[2 * k + 1] as number;
    }
    // Noise σ per component ≈ 0.011 (−96 dBFS/Hz over 1 MHz) → spread of the mean 1e-5; the
    // emissions, offset by ≥ 124 kHz, contribute < 1e-6. Tolerance 1e-4.
    expect(Math.abs(i / c.sampleCount - c.receiver!.dcI)).toBeLessThan(1e-4);
    expect(Math.abs(q / c.sampleCount - c.receiver!.dcQ)).toBeLessThan(1e-4);
  });

  it("launch (WAV, read by wav-decoder): 2 channels at 48 kHz, mean power = FM power A² + noise (constant envelope)", async () => {
    const c = capture("launch");
    const wav = await WavDecoder.decode(await readFile(files[1]!.path));
    expect(wav.sampleRate).toBe(48_000);
    expect(wav.channelData.length).toBe(2);
    expect(wav.channelData[0].length).toBe(c.sampleCount);
    let p = 0;
    for (let k = 0; k < c.sampleCount; k++) p += wav.channelData[0][k] ** 2 + wav.channelData[1][k] ** 2;
    const expected = 10 ** (c.emissions[0]!.powerDbfs / 10) + 10 ** (c.noiseDbfsPerHz / 10) * c.sampleRateHz;
    // The cross term signal×noise averages to ~A·σ/√N ≈ 1e-6 of A²; 16-bit rounding adds 1e-10: 0.01 dB.
    expect(Math.abs(10 * Math.log10(p / c.sampleCount / expected))).toBeLessThan(0.01);
  });

  it("pilot (cf32): mean power = FM power + noise, within 0.01 dB (constant envelope)", async () => {
    const c = capture("pilot");
    const bytes = await readFile(files[2]!.path);
    const x = new Float32Array(bytes.buffer, bytes.byteOffset, bytes.byteLength / 4);
    let p = 0;
    for (const v of x) p += v * v;
    const expected = 10 ** (c.emissions[0]!.powerDbfs / 10) + 10 ** (c.noiseDbfsPerHz / 10) * c.sampleRateHz;
    expect(Math.abs(10 * Math.log10(p / c.sampleCount / expected))).toBeLessThan(0.01);
  });

  // The rates and durations samples/README.md states.
  it.each([
    ["workboat", 32_000, 480_000, 15],
    ["launch-revisit", 48_000, 192_000, 4],
  ])("%s (WAV, read by wav-decoder): 2 channels at %d Hz, %d frames = %d s", async (id, rateHz, frames, durationS) => {
    const wav = await WavDecoder.decode(await readFile(files.find((f) => f.captureId === id)!.path));
    expect(wav.sampleRate).toBe(rateHz);
    expect(wav.channelData.length).toBe(2);
    expect(wav.channelData[0].length).toBe(frames);
    expect(wav.channelData[0].length / wav.sampleRate).toBe(durationS);
    expect(capture(id).sampleCount).toBe(frames);
  });

  it("workboat: the peak deviation from the unwrapped phase of the file is 3.4 kHz in the word at 12.5–13.3 s and 2.2 kHz elsewhere", async () => {
    const c = capture("workboat");
    const { sampleRateHz: fs, iq } = await wavIq(files.find((f) => f.captureId === "workboat")!.path);
    const d = unwrappedDeviationHz(iq, fs, emissionOffsetHz(c, scenarioTransmitter("workboat")));
    // Frequency noise σf ≈ 14.4 Hz here (frequencyNoiseHz). Any one sample passes 6σf with
    // probability 2e-9, so the largest of the 25 600 samples in the word, or of the 454 400 outside
    // it (6.5σf: 8e-11 each), stays inside these bounds but for a chance of 1e-4.
    const sigmaF = frequencyNoiseHz(c);
    expect(sigmaF).toBeLessThan(15);
    const from = 12.5 * fs;
    const to = 13.3 * fs;
    const word = peakAbs(d, from, to).valueHz;
    expect(Math.abs(word - 3400)).toBeLessThanOrEqual(6 * sigmaF);
    const outside = Math.max(peakAbs(d, 1, from - 1).valueHz, peakAbs(d, to + 1, c.sampleCount - 1).valueHz);
    expect(outside).toBeLessThanOrEqual(2200 + 6.5 * sigmaF);
    expect(outside).toBeGreaterThanOrEqual(2200 - 6 * sigmaF);
  });

  it("launch-revisit: the mean phase advance of the file in the audio's pauses is the carrier, +260 Hz from the centre", async () => {
    const c = capture("launch-revisit");
    const { sampleRateHz: fs, iq } = await wavIq(files.find((f) => f.captureId === "launch-revisit")!.path);
    const f = instantaneousFrequencyHz(iq, fs);
    const windows = pauseWindows(fs, c.sampleCount / fs);
    let sumHz = 0;
    for (const w of windows) sumHz += f.subarray(w.from, w.to).reduce((s, x) => s + x, 0) / (w.to - w.from);
    const meanHz = sumHz / windows.length;
    // Each step is a few hundredths of a radian, so a window's steps add up to its end-to-end
    // phase: its mean is (φ_end − φ_start)·fs/(2π·N), of spread σf/N (frequencyNoiseHz: the two
    // ends' phase noise, not the N steps'). 16 windows of 1920 steps: σ ≈ 0.006 Hz for the pooled
    // mean; 6σ bounds it but for a chance of 2e-9.
    const steps = windows[0]!.to - windows[0]!.from;
    const sigmaMeanHz = frequencyNoiseHz(c) / steps / Math.sqrt(windows.length);
    expect(sigmaMeanHz).toBeLessThan(0.01);
    expect(Math.abs(meanHz - 260)).toBeLessThanOrEqual(6 * sigmaMeanHz);
  });

  it("quay (SigMF): the metadata has the core fields of SigMF v1.2.x (REFERENCES.md §9)", async () => {
    const c = capture("quay");
    const meta = JSON.parse(await readFile(files[3]!.path, "utf8"));
    expect(meta.global["core:datatype"]).toBe("ci16_le");
    expect(meta.global["core:sample_rate"]).toBe(250_000);
    expect(meta.global["core:version"]).toMatch(/^1\.2\.\d+$/);
    expect(typeof meta.global["core:description"]).toBe("string");
    expect(meta.captures[0]["core:sample_start"]).toBe(0);
    expect(meta.captures[0]["core:frequency"]).toBe(c.centerHz);
    // RFC 3339 with the Z offset only, as the schema requires.
    expect(meta.captures[0]["core:datetime"]).toMatch(/^\d{4}-\d\d-\d\dT\d\d:\d\d:\d\d(\.\d+)?Z$/);
    expect(meta.annotations.length).toBe(c.emissions.length);
    for (const a of meta.annotations) {
      expect(a["core:sample_start"]).toBe(0);
      expect(a["core:freq_lower_edge"]).toBeLessThan(a["core:freq_upper_edge"]);
      expect(typeof a["core:label"]).toBe("string");
    }
    expect((await stat(files[3]!.dataPath)).size).toBe(c.sampleCount * 4);
  });
});
