import { describe, expect, it } from "vitest";
import { analogFeatures, classifyAnalog, type AnalogClass, type AnalogFeatures } from "../../src/measure/index.js";
import {
  amFromAudio, fmFromAudio, frequencyShift, qpskSymbols, rrcPsk, SeededRandom, speechLikeAudio, tone, toneAudio,
} from "../../src/scenario/index.js";
import { addNoise, meanPower, psdOf } from "./emissionStimuli.js";

const FS = 16000;
const N = 1 << 17; // 8.2 s: several syllable cycles of the speech-like audio
const FFT = 512;

/**
 * Adds white noise so that the signal power over the noise in `referenceHz` is `snrDb`, and
 * returns the features of the result. The reference is the necessary bandwidth of the class
 * (47 CFR 2.202(g): 2M for AM, 2M + 2D for FM), 3 kHz (a voice channel) for CW and 1.35·Rs
 * for RRC QPSK (its absolute bandwidth (1 + α)·Rs, REFERENCES.md §7).
 */
function featuresAt(signal: Float64Array, snrDb: number, referenceHz: number, seed: number): AnalogFeatures {
  const s = meanPower(signal);
  const n0 = s / (10 ** (snrDb / 10) * referenceHz);
  const iq = addNoise(signal.slice(), n0 * FS, seed);
  return analogFeatures(Float32Array.from(iq), FS, psdOf(iq, FFT, FS));
}

function classOf(f: AnalogFeatures): AnalogClass {
  return classifyAnalog(f).class;
}

const SNRS_DB = [15, 20, 30];

describe("classifyAnalog(analogFeatures(iq, fs, psd))", () => {
  it("calls an unmodulated carrier cw at 15–30 dB over 3 kHz, at several offsets", () => {
    const rng = new SeededRandom(1);
    for (const snr of SNRS_DB) {
      for (let seed = 0; seed < 3; seed++) {
        const sig = tone(N, FS, (rng.uniform() - 0.5) * 4000, { amplitude: 0.5, phaseRad: rng.uniform() * 6 });
        const f = featuresAt(sig, snr, 3000, 10 * snr + seed);
        expect(classOf(f), `snr ${snr} seed ${seed} ${JSON.stringify(f)}`).toBe("cw");
      }
    }
  });

  it("calls tone AM of depth 30–100 % am (REFERENCES.md §5: carrier share 1/(1 + m²/2), envelope varies)", () => {
    for (const depth of [30, 60, 100]) {
      for (const snr of [15, 30]) {
        const audio = toneAudio(0, N, FS, 1000);
        const sig = frequencyShift(amFromAudio(audio, depth, 0.5), FS, 1500);
        const f = featuresAt(sig, snr, 2000, depth + snr);
        expect(classOf(f), `depth ${depth} snr ${snr} ${JSON.stringify(f)}`).toBe("am");
        // The features against their closed forms (REFERENCES.md §5 and analogFeatures.ts):
        // carrier share 1/(1 + m²/2); κ = (2m² + m⁴/8)/(1 + m²/2)². Tolerances: 0.01 on the share
        // (residual noise above the floor over ~500 bins) and 0.01 on κ (the noise correction
        // rests on the floor estimate, ±1 %, times 2N/S ≈ 0.5 at 15 dB over 16 kHz).
        const m = depth / 100;
        expect(Math.abs((f.lineShare as number) - 1 / (1 + (m * m) / 2))).toBeLessThan(0.01);
        expect(Math.abs((f.envelopeExcessVariance as number) - (2 * m * m + m ** 4 / 8) / (1 + (m * m) / 2) ** 2)).toBeLessThan(0.01);
      }
    }
    // Voice-like AM at 100 % (speech-like audio with pauses, so a smaller κ than a tone).
    for (const snr of [15, 30]) {
      const sig = amFromAudio(speechLikeAudio(0, N, FS), 100, 0.5);
      const f = featuresAt(sig, snr, 6000, 300 + snr);
      expect(classOf(f), `voice AM snr ${snr} ${JSON.stringify(f)}`).toBe("am");
    }
  });

  it("calls tone FM (β = 3) and voice-like FM (±3 kHz) fm at 15–30 dB over 2M + 2D", () => {
    for (const snr of SNRS_DB) {
      const toneFm = fmFromAudio(toneAudio(0, N, FS, 1000), FS, 3000, 0, 0.5).iq;
      const ft = featuresAt(toneFm, snr, 2 * 1000 + 2 * 3000, snr);
      expect(classOf(ft), `tone FM snr ${snr} ${JSON.stringify(ft)}`).toBe("fm");
      // Tone FM: RMS instantaneous frequency D/√2 (closed form), constant envelope κ = 0.
      // ±3 %: the noise correction at 15 dB and the 1 % of power cut by the FFT band edges.
      expect(Math.abs(((ft.frequencySpread as number) * (ft.occupiedHz as number)) / (3000 / Math.SQRT2) - 1)).toBeLessThan(0.03);
      expect(Math.abs(ft.envelopeExcessVariance as number)).toBeLessThan(0.005);
      const voiceFm = fmFromAudio(speechLikeAudio(0, N, FS), FS, 3000, 0, 0.5).iq;
      const fv = featuresAt(voiceFm, snr, 2 * 3000 + 2 * 3000, 100 + snr);
      expect(classOf(fv), `voice FM snr ${snr} ${JSON.stringify(fv)}`).toBe("fm");
    }
  });

  it("calls FM whose audio is silent 95 % of the time fm, not cw, though its carrier line holds over 90 % of the power", () => {
    // A 1 kHz tone at 2 kHz peak deviation (β = 2) keyed on for 5 % of the time (0.1 s in every
    // 2 s): the carrier line holds 0.95 + 0.05·J0(2)² ≈ 0.953 of the power (A&S Table 9.1,
    // J0(2) = 0.2239), above the cw rule's 0.9; the frequency moves by D/√2 while the tone is on,
    // so its RMS over the record is (D/√2)·√0.05 = 316 Hz (theory), far above what noise gives.
    const audio = toneAudio(0, N, FS, 1000);
    for (let i = 0; i < N; i++) if (i % (2 * FS) >= 0.1 * FS) audio[i] = 0;
    const sig = frequencyShift(fmFromAudio(audio, FS, 2000, 0, 0.5).iq, FS, -1200);
    for (const snr of [20, 30]) {
      const f = featuresAt(sig, snr, 2 * 1000 + 2 * 2000, 500 + snr);
      expect(f.lineShare as number).toBeGreaterThan(0.9);
      expect(classOf(f), `snr ${snr} ${JSON.stringify(f)}`).toBe("fm");
      // Within 10 %: the record holds 4 whole on-periods and a part (4.1 of 82 at 5 %: the share
      // on is 5.0–5.1 %), the 3 kHz audio smoothing passes 1 kHz at 0.98, and the noise
      // correction is good to a few Hz at these SNRs.
      expect(Math.abs((f.audioFrequencyRmsHz as number) / ((2000 / Math.SQRT2) * Math.sqrt(0.05)) - 1)).toBeLessThan(0.1);
    }
  });

  it("calls noise alone noise, and RRC QPSK unknown (no analogue class fits)", () => {
    for (let seed = 0; seed < 3; seed++) {
      const iq = addNoise(new Float64Array(2 * N), 1e-3, 500 + seed);
      const f = analogFeatures(Float32Array.from(iq), FS, psdOf(iq, FFT, FS));
      expect(classOf(f), JSON.stringify(f)).toBe("noise");
    }
    for (const snr of [15, 30]) {
      const rng = new SeededRandom(snr);
      const rs = 4000;
      const symbols = qpskSymbols(rng, Math.ceil((N / FS) * rs) + 1);
      const sig = rrcPsk(symbols, 0, N, { symbolRateBd: rs, sampleRateHz: FS, rollOff: 0.35, amplitude: 0.5 });
      const f = featuresAt(sig, snr, 1.35 * rs, 700 + snr);
      expect(classOf(f), `qpsk snr ${snr} ${JSON.stringify(f)}`).toBe("unknown");
    }
  });
});
