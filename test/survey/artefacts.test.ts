// Receiver artefacts through the real pass 1: a DC offset and an IQ imbalance (src/scenario
// receiver model) on one strong QPSK emission. The DC line and the image at −f are marked.
import { describe, expect, it } from "vitest";
import {
  SeededRandom, applyReceiver, complexNoise, frequencyShift, imageRejectionDb, randomSymbols, rrcPsk, type ReceiverModel,
} from "../../src/scenario/index.js";
import { detectEmissions } from "../../src/survey/index.js";
import { addInto, pass1Of } from "./surveyCaptures.js";

const fs = 1e6;
const n = 1 << 19; // 2 MiB as ci16; 1024-point frames, 64 rows of K = 8

describe("detectEmissions(pass 1) with a receiver's DC offset and IQ imbalance", async () => {
  const x = new Float64Array(2 * n);
  complexNoise(new SeededRandom(611), x, 1e-5);
  const symbols = randomSymbols(new SeededRandom(612), "qpsk", Math.ceil((n / fs) * 40_000) + 16);
  addInto(x, frequencyShift(rrcPsk(symbols, 0, n, { symbolRateBd: 40_000, sampleRateHz: fs, rollOff: 0.35, amplitude: 0.1 }), fs, 150_000));
  // IRR of 0.5 dB and 3°: 28.2 dB (receiver.ts formula); the image at −150 kHz about 15 dB over its floor.
  const model: ReceiverModel = { dcI: 0.003, dcQ: 0.003, gainImbalanceDb: 0.5, phaseImbalanceDeg: 3 };
  const pass1 = await pass1Of("receiver", applyReceiver(x, model), fs, 1024, 64);
  const d = detectEmissions(pass1);
  const list = d.emissions.map((e) => `${Math.round(e.offsetHz)} Hz ${e.artefact}`).join(", ");

  it("lists one emission, at +150 kHz; the DC line is marked dc (zero-IF practice)", () => {
    const real = d.emissions.filter((e) => e.artefact === null);
    expect(real.length, list).toBe(1);
    expect(Math.abs((real[0]?.offsetHz ?? 0) - 150_000)).toBeLessThan(pass1.spectrogram.binWidthHz);
    const dc = d.emissions.filter((e) => e.artefact === "dc");
    expect(dc.length, list).toBe(1);
    expect(Math.abs(dc[0]?.offsetHz ?? 1e9)).toBeLessThanOrEqual(pass1.spectrogram.binWidthHz);
  });

  it("marks the mirror at −150 kHz as the image of that emission, its level below it the IRR within 3 dB (receiver.ts: ½(1 − g·e^(−jφ)) at −f)", () => {
    const emission = d.emissions.find((e) => e.artefact === null);
    const image = d.emissions.filter((e) => e.artefact === "image");
    expect(image.length, list).toBe(1);
    expect(image[0]?.mirrorOfId).toBe(emission?.id);
    expect(Math.abs((image[0]?.offsetHz ?? 0) + 150_000)).toBeLessThan(2 * pass1.spectrogram.binWidthHz);
    const irr = imageRejectionDb(model);
    expect(irr).toBeCloseTo(28.2, 1); // hand computation of the formula: g = 1.0593, φ = 3°
    expect(Math.abs((emission?.powerDbfs ?? 0) - (image[0]?.powerDbfs ?? 0) - irr)).toBeLessThan(3);
    // The health figures' IRR, which detection uses, agrees with the model's (src/dsp/health.ts).
    expect(Math.abs(pass1.health.imageRejectionDb - irr)).toBeLessThan(1);
  });
});
