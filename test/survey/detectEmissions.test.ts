// detectEmissions on real pass-1 figures of synthetic wideband captures: completeness on a band of
// known emissions, no false emission in noise (flat or sloped), and receiver artefacts marked.
import { describe, expect, it } from "vitest";
import { WelchAccumulator } from "../../src/dsp/index.js";
import { ParameterError } from "../../src/errors.js";
import { occupiedBandwidth } from "../../src/measure/index.js";
import {
  SeededRandom, amFromAudio, applyReceiver, burstGate, complexNoise, fmFromAudio, frequencyShift, imageRejectionDb,
  nrzLevels, randomSymbols, rrcPsk, toneAudio, type ConstellationKind,
} from "../../src/scenario/index.js";
import { detectEmissions, type DetectedEmission } from "../../src/survey/index.js";
import { addInto, pass1Of } from "./surveyCaptures.js";

const fs = 1e6;

function psk(seed: number, kind: ConstellationKind, n: number, symbolRateBd: number, rollOff: number, powerDbfs: number, offsetHz: number): Float64Array {
  const symbols = randomSymbols(new SeededRandom(seed), kind, Math.ceil((n / fs) * symbolRateBd) + 16);
  // randomSymbols has unit mean energy, so the mean power is amplitude² (rrcPsk doc comment).
  const x = rrcPsk(symbols, 0, n, { symbolRateBd, sampleRateHz: fs, rollOff, amplitude: 10 ** (powerDbfs / 20) });
  return frequencyShift(x, fs, offsetHz);
}

/** The 99 % bandwidth of a noise-free emission measured alone (independent check where no closed form applies). */
function isolatedObwHz(x: Float64Array): number {
  const w = new WelchAccumulator({ fftLength: 4096, sampleRateHz: fs });
  w.push(Float32Array.from(x), 0);
  const psd = w.finish();
  return occupiedBandwidth(psd, { lowerHz: -fs / 2, upperHz: fs / 2, noiseFloorPerHz: 0 }).occupiedHz.value as number;
}

interface Truth {
  readonly name: string;
  readonly offsetHz: number;
  readonly bandwidthHz: number;
  readonly startS: number;
  readonly endS: number;
  readonly dutyCyclePercent: number;
  readonly burstCount: number;
  readonly powerDbfs: number;
}

describe("detectEmissions(pass 1) on a 1 MS/s band of six emissions", async () => {
  const n = 1 << 20; // 1.048576 s, 4 MiB as ci16
  const spanS = n / fs;
  const noiseVariance = 1e-5; // −50 dBFS over 1 MHz: N0 = 1e-11 FS²/Hz
  const iq = new Float64Array(2 * n);
  complexNoise(new SeededRandom(501), iq, noiseVariance);
  const truths: Truth[] = [];

  // 1. QPSK, RRC 0.35, 40 kBd at +180 kHz, continuous: 99 % OBW 1.1667·Rs (REFERENCES.md §3, RC spectrum).
  addInto(iq, psk(502, "qpsk", n, 40_000, 0.35, -30, 180_000));
  truths.push({ name: "qpsk", offsetHz: 180_000, bandwidthHz: 1.1667 * 40_000, startS: 0, endS: spanS, dutyCyclePercent: 100, burstCount: 1, powerDbfs: -30 });

  // 2. 16QAM, RRC 0.2, 50 kBd at −300 kHz, weak: 10 dB SNR in its own 99 % band
  // (1.0731·Rs, REFERENCES.md §3), on from 0.2 s to 0.8 s.
  const weakObw = 1.0731 * 50_000;
  const weakDbfs = 10 * Math.log10(10 * (noiseVariance / fs) * weakObw);
  addInto(iq, psk(503, "16qam", n, 50_000, 0.2, weakDbfs, -300_000), burstGate(0, n, fs, { periodS: 10, onS: 0.6, firstStartS: 0.2, rampS: 0.001 }));
  truths.push({ name: "weak 16qam", offsetHz: -300_000, bandwidthHz: weakObw, startS: 0.2, endS: 0.8, dutyCyclePercent: 100, burstCount: 1, powerDbfs: weakDbfs });

  // 3. 8PSK, RRC 0.5, 25 kBd at −120 kHz in bursts of 30 ms every 100 ms (30 % duty), from 0.05 s:
  // 10 bursts, the last ending at 0.98 s; duty over the span 10·30/930 ms = 32.3 %. OBW 1.2680·Rs (REFERENCES.md §3).
  addInto(iq, psk(504, "8psk", n, 25_000, 0.5, -35, -120_000), burstGate(0, n, fs, { periodS: 0.1, onS: 0.03, firstStartS: 0.05, rampS: 0.001 }));
  truths.push({ name: "bursty 8psk", offsetHz: -120_000, bandwidthHz: 1.268 * 25_000, startS: 0.05, endS: 0.98, dutyCyclePercent: 100 * 0.3 / 0.93, burstCount: 10, powerDbfs: -35 });

  // 4. Tone FM, β = 2 (5 kHz tone, 10 kHz deviation) at +380 kHz: ±3 lines hold 99.76 %, so the
  // 99 % band is 2·3·fm = 30 kHz (REFERENCES.md §1, from Σ Jn²). Mean power A² (theory).
  addInto(iq, frequencyShift(fmFromAudio(toneAudio(0, n, fs, 5000), fs, 10_000, 0, 10 ** (-25 / 20)).iq, fs, 380_000));
  truths.push({ name: "tone fm", offsetHz: 380_000, bandwidthHz: 30_000, startS: 0, endS: spanS, dutyCyclePercent: 100, burstCount: 1, powerDbfs: -25 });

  // 5. Tone AM, 80 % at 20 kHz, at −440 kHz: each sideband holds 0.16/1.32 = 12 % > 0.5 %, so the
  // 99 % band is 2·fm = 40 kHz (REFERENCES.md §5 sideband levels m/2). Mean power A²(1 + m²/2).
  const amA = 10 ** (-30 / 20);
  addInto(iq, frequencyShift(amFromAudio(toneAudio(0, n, fs, 20_000), 80, amA), fs, -440_000));
  truths.push({ name: "tone am", offsetHz: -440_000, bandwidthHz: 40_000, startS: 0, endS: spanS, dutyCyclePercent: 100, burstCount: 1, powerDbfs: 10 * Math.log10(amA * amA * 1.32) });

  // 6. 2-FSK, 20 kHz shift, 10 kBd at +60 kHz: no closed form for its 99 % band, so the truth is
  // occupiedBandwidth (ITU-R SM.328) of the noise-free emission measured alone.
  const bitRng = new SeededRandom(505);
  const bits = Array.from({ length: Math.ceil(spanS * 10_000) + 1 }, () => bitRng.integer(2));
  const fsk = frequencyShift(fmFromAudio(nrzLevels(bits, 10_000, fs, 0, n), fs, 10_000, 0, 10 ** (-32 / 20)).iq, fs, 60_000);
  addInto(iq, fsk);
  truths.push({ name: "2-fsk", offsetHz: 60_000, bandwidthHz: isolatedObwHz(fsk), startS: 0, endS: spanS, dutyCyclePercent: 100, burstCount: 1, powerDbfs: -32 });

  // 1024-point frames, 128 rows: K = 8 frames a row, 8.19 ms a row, 977 Hz a bin.
  const pass1 = await pass1Of("band", iq, fs, 1024, 128);
  const detection = detectEmissions(pass1);
  const rowS = (pass1.spectrogram.rowStopS[0] as number) - (pass1.spectrogram.rowStartS[0] as number);
  const binHz = pass1.spectrogram.binWidthHz;

  it("forms rows of K = 8 frames that do not overlap (the premise of the 2K-degree chi-square law, src/dsp/spectrogram.ts)", () => {
    expect([...pass1.spectrogram.framesPerRow].every((k) => k === 8)).toBe(true);
    expect(pass1.spectrogram.rowStopS[0]).toBeCloseTo(8 * 1024 / fs, 12);
  });

  it("finds the six emissions and nothing else, none an artefact (no receiver model applied)", () => {
    const found = detection.emissions.map((e) => `${Math.round(e.offsetHz / 1000)} kHz ${e.powerDbfs.toFixed(1)} dBFS`);
    expect(detection.emissions.length, `found: ${found.join(", ")}`).toBe(6);
    expect(detection.emissions.every((e) => e.artefact === null)).toBe(true);
  });

  for (const t of truths) {
    it(`${t.name}: centre within max(1 bin, 2 % of the bandwidth), bandwidth within 10 %, span within one row, duty within 5 points (issue 9)`, () => {
      const e = nearest(detection.emissions, t.offsetHz);
      expect(Math.abs(e.offsetHz - t.offsetHz)).toBeLessThanOrEqual(Math.max(binHz, 0.02 * t.bandwidthHz));
      expect(Math.abs(e.bandwidthHz - t.bandwidthHz)).toBeLessThanOrEqual(0.1 * t.bandwidthHz);
      expect(Math.abs(e.startS - t.startS)).toBeLessThanOrEqual(rowS);
      expect(Math.abs(e.endS - t.endS)).toBeLessThanOrEqual(rowS);
      expect(Math.abs(e.dutyCyclePercent - t.dutyCyclePercent)).toBeLessThanOrEqual(5);
      expect(e.burstCount).toBe(t.burstCount);
      // Mean power while on within 1 dB of the built power (theory: the modulators' mean powers);
      // the detected bins hold all but the faint skirts.
      expect(Math.abs(e.powerDbfs - t.powerDbfs)).toBeLessThan(1);
      // Every figure carries a stated uncertainty, never zero (project rule); the duty cycle's bound covers the truth.
      expect(e.powerUncertaintyDb).toBeGreaterThan(0);
      expect(e.snrUncertaintyDb).toBeGreaterThan(e.powerUncertaintyDb);
      expect(Math.abs(e.dutyCyclePercent - t.dutyCyclePercent)).toBeLessThanOrEqual(e.dutyCycleUncertaintyPercent);
    });
  }

  it("drops what is on for less than minDurationS in all: 0.35 s leaves out the bursty 8PSK (10 × 30 ms on), keeps the 0.6 s 16QAM", () => {
    const kept = detectEmissions(pass1, { minDurationS: 0.35 }).emissions;
    expect(kept.length).toBe(5);
    expect(kept.some((e) => Math.abs(e.offsetHz + 120_000) < 10_000)).toBe(false);
    expect(kept.some((e) => Math.abs(e.offsetHz + 300_000) < 10_000)).toBe(true);
  });

  it("drops what is narrower than minBandwidthHz: 35 kHz leaves out the 30 kHz FM and the 31.7 kHz 8PSK (bandwidths from theory above)", () => {
    const kept = detectEmissions(pass1, { minBandwidthHz: 35_000 }).emissions;
    expect(kept.map((e) => Math.round(e.offsetHz / 10_000) * 10)).toEqual(
      truths.filter((t) => t.bandwidthHz > 35_000).map((t) => Math.round(t.offsetHz / 10_000) * 10).sort((a, b) => a - b),
    );
  });

  it("refuses a pfa outside (0, 1) with a one-line ParameterError", () => {
    expect(() => detectEmissions(pass1, { pfa: 0 })).toThrow(new ParameterError("pfa", "0 is not a probability between 0 and 1"));
    expect(() => detectEmissions(pass1, { pfa: 1e-6, growPfa: 1e-7 })).toThrow(/^growPfa: 1e-7 must lie in \[pfa 0.000001, 1\)$/);
  });

  it("states the weak emission's SNR in its own band as about 10 dB (built so; ±1.5 dB for the floor and the skirts)", () => {
    const e = nearest(detection.emissions, -300_000);
    expect(Math.abs(e.snrDb - 10)).toBeLessThan(1.5);
  });
});

function nearest(emissions: readonly DetectedEmission[], offsetHz: number): DetectedEmission {
  let best = emissions[0] as DetectedEmission;
  for (const e of emissions) if (Math.abs(e.offsetHz - offsetHz) < Math.abs(best.offsetHz - offsetHz)) best = e;
  return best;
}
