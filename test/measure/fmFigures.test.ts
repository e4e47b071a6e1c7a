import { describe, expect, it } from "vitest";
import { fmFigures } from "../../src/measure/index.js";
import {
  SeededRandom, complexNoise, fmFromAudio, frequencyShift, speechLikeAudio, toneAudio,
} from "../../src/scenario/index.js";
import { coverage } from "./coverage.js";

const FS = 62_500; // 2.5 × a 25 kHz channel
const CHANNEL_HZ = 25_000;

/**
 * Unit-power FM plus complex white noise whose power inside `CHANNEL_HZ` is 1/SNR, i.e. total
 * noise variance fs/(SNR·channel), as float32 samples.
 */
function withNoise(iq: Float64Array, snrDb: number, seed: number): Float32Array {
  const noise = new Float64Array(iq.length);
  complexNoise(new SeededRandom(seed), noise, (FS / CHANNEL_HZ) * 10 ** (-snrDb / 10));
  const out = new Float32Array(iq.length);
  for (let i = 0; i < iq.length; i++) out[i] = (iq[i] as number) + (noise[i] as number);
  return out;
}

function relErr(value: number | null, expected: number): number {
  return Math.abs((value as number) - expected) / expected;
}

describe("fmFigures(iq, fs) of tone FM", () => {
  // Δf = 5 kHz, fm = 1 kHz, β = 5 (47 CFR 80.205(b) maximum deviation for 25 kHz channels,
  // REFERENCES.md §4), carrier 1.2345 kHz off centre, 1 s.
  const n = FS;
  const clean = frequencyShift(fmFromAudio(toneAudio(0, n, FS, 1000), FS, 5000).iq, FS, 1234.5);
  const r30 = fmFigures(withNoise(clean, 30, 1), FS);
  const r40 = fmFigures(withNoise(clean, 40, 1), FS);

  it("reports peak, positive and negative deviation within 1 % of 5 kHz at 40 dB SNR (closed form of the modulator)", () => {
    // fmFromAudio's instantaneous frequency is exactly Δf·cos(2π fm t) (its contract). Post-
    // detection noise in the audio band is σ² = ∫ f²·N0/2 df over |f| < W_eff = N0·W_eff³/3
    // (Carson & Fry's FM noise result, any comms textbook): ≈ 7 Hz RMS at 40 dB in the 25 kHz
    // channel (W_eff ≈ 3.4 kHz), and the largest of ~1000 tone peaks reads ~3.3σ ≈ 0.5 % high.
    for (const m of [r40.peakDeviationHz, r40.positiveDeviationHz, r40.negativeDeviationHz]) {
      expect(relErr(m.value, 5000)).toBeLessThan(0.01);
    }
  });

  it("reports peak deviation within 2 % at 30 dB SNR (a peak reading carries the noise excursion)", () => {
    // Same closed form at 30 dB: σ ≈ 23 Hz, so the peak of ~1000 cycles reads ≈ +1.5 %. The
    // brief asked for 1 % here; a true peak cannot meet it at W = 3 kHz (see docs/methods.md).
    expect(relErr(r30.peakDeviationHz.value, 5000)).toBeLessThan(0.02);
    expect(r30.peakDeviationHz.value as number).toBeGreaterThan(5000);
  });

  it("reports the modulating frequency, the index β = Δf/fm = 5 within 1 % (40 dB), and RMS Δf/√2 (30 dB)", () => {
    expect(relErr(r30.modulatingFrequencyHz.value, 1000)).toBeLessThan(0.001);
    expect(relErr(r40.modulationIndex.value, 5)).toBeLessThan(0.01);
    expect(relErr(r30.modulationIndex.value, 5)).toBeLessThan(0.02);
    // RMS of a sinusoid is its peak over √2 (closed form); noise adds ~23 Hz in quadrature (0.005 %).
    expect(relErr(r30.rmsDeviationHz.value, 5000 / Math.SQRT2)).toBeLessThan(0.002);
  });

  it("reports the carrier offset as the mean instantaneous frequency (1234.5 Hz, ±1 Hz)", () => {
    // Whole periods of the tone: its own contribution to the mean is zero (closed form); the
    // noise contributes a phase walk of a few mrad over 1 s, i.e. ≪ 1 Hz.
    expect(Math.abs((r30.carrierOffsetHz.value as number) - 1234.5)).toBeLessThan(1);
  });

  it("finds no sub-audible tone when there is none", () => {
    expect(r30.toneHz.value).toBeNull();
    expect(r30.toneHz.warnings.length).toBeGreaterThan(0);
    expect(r30.standardToneHz).toBeNull();
  });

  it("says in its method lines that deviation is read after the audio low-pass, and gives a ≤ 2000-point trace", () => {
    const r = r30;
    expect(r.method.join(" ")).toMatch(/after an audio low-pass 0-3000 Hz/);
    expect(r.audioBandwidthHz).toBe(3000);
    expect(r.rawPeakDeviationHz.value as number).toBeGreaterThan(r.peakDeviationHz.value as number);
    expect(r.trace.timeS.length).toBeLessThanOrEqual(2000);
    expect(r.trace.timeS.length).toBeGreaterThan(1000);
    expect(Math.max(...r.trace.maxHz)).toBeCloseTo(r.positiveDeviationHz.value as number, 1);
    expect(Math.min(...r.trace.minHz)).toBeCloseTo(-(r.negativeDeviationHz.value as number), 1);
  });
});

describe("fmFigures(iq, fs) of asymmetric modulation", () => {
  it("reports +4 kHz / −3 kHz within 1 % for audio whose positive peak is 4/3 of its negative", () => {
    // a(θ) = (cos θ + cos 2θ / 7)·7/8 has mean 0, maximum a(0) = 1 and minimum a(π) = −3/4
    // (closed form: a' = 0 only at 0 and π since 4·(1/7) < 1), so Δf = 4 kHz gives +4 / −3 kHz.
    const n = FS;
    const t1 = toneAudio(0, n, FS, 1000);
    const t2 = toneAudio(0, n, FS, 2000);
    const audio = new Float64Array(n);
    for (let i = 0; i < n; i++) audio[i] = ((t1[i] as number) + (t2[i] as number) / 7) * (7 / 8);
    const r = fmFigures(withNoise(fmFromAudio(audio, FS, 4000).iq, 40, 2), FS);
    expect(relErr(r.positiveDeviationHz.value, 4000)).toBeLessThan(0.01);
    expect(relErr(r.negativeDeviationHz.value, 3000)).toBeLessThan(0.01);
    expect(relErr(r.peakDeviationHz.value, 4000)).toBeLessThan(0.01);
  });
});

describe("fmFigures(iq, fs): Carson's rule", () => {
  it("gives 2(Δf + fm) = 16 kHz for Δf = 5 kHz, fm = 3 kHz (REFERENCES.md §2, textbook example)", () => {
    const r = fmFigures(Float32Array.from(fmFromAudio(toneAudio(0, FS, FS, 3000), FS, 5000).iq), FS);
    // The 3 kHz tone sits on the passband edge of the 3 kHz audio filter (ripple ±0.1 %).
    expect(relErr(r.carsonBandwidthHz.value, 16_000)).toBeLessThan(0.005);
    expect(relErr(r.modulationIndex.value, 5 / 3)).toBeLessThan(0.005);
  });
});

describe("fmFigures(iq, fs): sub-audible tone", () => {
  it("finds a 123.0 Hz CTCSS tone at 600 Hz deviation under speech-like audio within ±0.1 Hz over 2.5 s", () => {
    // Tone list and the ±0.1 Hz over ≥ 2 s test tolerance: REFERENCES.md §10 (EIA/TIA-603 list).
    // 600 Hz is within the usual 0.5–0.75 kHz CTCSS deviation on 25 kHz channels (same table, CP).
    const n = Math.round(2.5 * FS);
    const voice = speechLikeAudio(0, n, FS);
    const ctcss = toneAudio(0, n, FS, 123.0);
    const audio = new Float64Array(n);
    for (let i = 0; i < n; i++) audio[i] = 3000 * (voice[i] as number) + 600 * (ctcss[i] as number);
    const r = fmFigures(withNoise(fmFromAudio(audio, FS, 1).iq, 30, 3), FS);
    expect(Math.abs((r.toneHz.value as number) - 123.0)).toBeLessThan(0.1);
    expect(relErr(r.toneDeviationHz.value, 600)).toBeLessThan(0.1);
    expect(r.standardToneHz).toBe(123.0);
    // speechLikeAudio reaches +1 and −1 at 0.5 s and 1.0 s (its contract), where the tone adds
    // 600·cos(2π·123·t): +600·cos(2π·61.5) = −600 … so the peaks are 3000 ± 600 at most.
    expect(r.peakDeviationHz.value as number).toBeGreaterThan(3000 * 0.99);
    expect(r.peakDeviationHz.value as number).toBeLessThan(3600 * 1.01);
  });
});

describe("fmFigures at an audio-rate capture too slow for the sub-audible tone filter", () => {
  it("at 600 S/s (W = 200 Hz) gives the deviation and no tone, with the reason, instead of throwing", () => {
    // The tone low-pass has its stopband at 400 Hz, which a 600 S/s record cannot reach (Nyquist 300 Hz).
    const fs = 600;
    const n = 3 * fs;
    const r = fmFigures(Float32Array.from(fmFromAudio(toneAudio(0, n, fs, 50), fs, 100).iq), fs, { audioBandwidthHz: 200 });
    expect(r.toneHz.value).toBeNull();
    expect(r.toneHz.warnings.join(" ")).toMatch(/400 Hz stopband/);
    // Tone FM of 100 Hz deviation, noiseless: the peak within 1 % (closed form of the modulator).
    expect(relErr(r.peakDeviationHz.value, 100)).toBeLessThan(0.01);
  });
});

describe("fmFigures(iq, fs, options) checks its parameters", () => {
  it("throws RangeError for a bad rate or an audio bandwidth too wide for the rate", () => {
    const iq = new Float32Array(2000);
    expect(() => fmFigures(iq, -1)).toThrow(RangeError);
    expect(() => fmFigures(iq, FS, { audioBandwidthHz: 30_000 })).toThrow(RangeError);
  });
});

/** Tone FM at a random carrier, tone (400–1500 Hz), deviation (2–4 kHz) and phase, 0.5 s at 48 kS/s, noise `cnrDb` below the carrier over 48 kHz; errors and stated uncertainties of 60 seeds. */
function toneFmRuns(cnrDb: number): { carrierErr: number; carrierU: number; peakErr: number; peakU: number; method: string }[] {
  const fs = 48_000;
  const n = 24_000;
  const runs: { carrierErr: number; carrierU: number; peakErr: number; peakU: number; method: string }[] = [];
  for (let seed = 1; seed <= 60; seed++) {
    const rng = new SeededRandom(1000 + seed);
    const fc = (rng.uniform() - 0.5) * 1000;
    const fm = 400 + 1100 * rng.uniform();
    const dev = 2000 + 2000 * rng.uniform();
    const ph = 2 * Math.PI * rng.uniform();
    const variance = 10 ** (-cnrDb / 10);
    const iq = new Float32Array(2 * n);
    const noise = new Float64Array(2 * n);
    complexNoise(rng, noise, variance);
    for (let k = 0; k < n; k++) {
      const t = k / fs;
      const phase = 2 * Math.PI * fc * t + (dev / fm) * Math.sin(2 * Math.PI * fm * t + ph);
      iq[2 * k] = Math.cos(phase) + (noise[2 * k] as number);
      iq[2 * k + 1] = Math.sin(phase) + (noise[2 * k + 1] as number);
    }
    const r = fmFigures(iq, fs, { noiseFloorPerHz: variance / fs });
    runs.push({
      carrierErr: (r.carrierOffsetHz.value as number) - fc,
      carrierU: r.carrierOffsetHz.uncertainty as number,
      peakErr: (r.peakDeviationHz.value as number) - dev,
      peakU: r.peakDeviationHz.uncertainty as number,
      method: r.peakDeviationHz.method,
    });
  }
  return runs;
}

describe("fmFigures: the stated uncertainties cover the errors (tone FM, 60 seeds)", () => {
  // Complex noise 30 dB below the carrier, N0 given as the pass-1 floor would be.
  const runs = toneFmRuns(30);

  it("carrier offset (mean instantaneous frequency): theory, the end-phase error β(sin a − sin b)/(2πT)", () => {
    const c = coverage(runs.map((x) => x.carrierErr), runs.map((x) => x.carrierU));
    expect(c.covered).toBeGreaterThanOrEqual(0.9);
    expect(c.ratio).toBeLessThan(5);
  });

  it("peak deviation: theory, noise raises the filtered peak by up to σ·√(2 ln M) (extreme-value law)", () => {
    const c = coverage(runs.map((x) => x.peakErr), runs.map((x) => x.peakU));
    expect(c.covered).toBeGreaterThanOrEqual(0.9);
    expect(c.ratio).toBeLessThan(5);
  });
});

describe("fmFigures below the FM threshold: discriminator clicks in the peak's uncertainty (tone FM, 60 seeds)", () => {
  // 8 dB over 48 kHz: Rice's click rate (B/2√3)·erfc(√ρ) + mean|δf|·e^(−ρ) gives several clicks
  // in 0.5 s (S. O. Rice 1963, from memory); each raises the filtered peak by up to 2W = 6 kHz
  // (a 2π slip is an impulse of one cycle, which the W = 3 kHz low-pass turns into a peak of 2W).
  const runs = toneFmRuns(8);

  it("peak deviation: the stated k = 2 uncertainty covers ≥ 90 % of the errors, and the method names the clicks", () => {
    const c = coverage(runs.map((x) => x.peakErr), runs.map((x) => x.peakU));
    expect(c.covered).toBeGreaterThanOrEqual(0.9);
    expect(runs.every((x) => /clicks/.test(x.method))).toBe(true);
    // 2W is a bound, not the typical raise: clicks come mostly against the deviation near its
    // peaks (Rice's modulated-carrier term), so the median error is well under it and the width
    // ratio exceeds the 5 of the high-SNR case. The interval is the bound plus the noise's part
    // and no more: the median U under 1.5 × 2W.
    const u = runs.map((x) => x.peakU).sort((p, q) => p - q);
    expect(u[u.length >> 1] as number).toBeLessThan(1.5 * 6000);
  });
});
