// The workboat capture (scenario.ts): an FM voice at ±2.2 kHz with one shouted word that reaches
// ±3.4 kHz. Its true deviation is found here without the modulator's arithmetic: from the phase
// of the synthesised baseband, unwrapped and differentiated, f[n] = (φ[n] − φ[n−1])·fs/2π
// (instantaneous frequency, definition), less the carrier's offset from the capture centre.
import { describe, expect, it } from "vitest";
import { captureStream, emissionOffsetHz, SCENARIO_CAPTURES, scenarioTransmitter } from "../../src/scenario/index.js";
import { peakAbs, unwrappedDeviationHz } from "./lines.js";

const capture = SCENARIO_CAPTURES.find((c) => c.id === "workboat")!;
const tx = scenarioTransmitter("workboat");

describe("the workboat capture, synthesised without noise", () => {
  // −400 dBFS/Hz: noise variance 1e-40·fs, far below float64 rounding of the samples.
  const iq = captureStream({ ...capture, noiseDbfsPerHz: -400 }).next(capture.sampleCount);
  const fs = capture.sampleRateHz;
  const deviation = unwrappedDeviationHz(iq, fs, emissionOffsetHz(capture, tx));
  const word = { from: Math.round(12.5 * fs), to: Math.round(13.3 * fs) };

  it("is 15 s at 32 kS/s, centred on the workboat's nominal 165.1375 MHz (as the scenario states)", () => {
    expect(capture.sampleRateHz).toBe(32_000);
    expect(capture.sampleCount / capture.sampleRateHz).toBe(15);
    expect(capture.centerHz).toBe(tx.nominalFrequencyHz);
    expect(iq.length).toBe(2 * capture.sampleCount);
  });

  it("reaches a peak deviation of 3.4 kHz inside the word at 12.5–13.3 s", () => {
    // Float64 phase arithmetic over 15 s: errors of order 1e-9 Hz; 1e-6 Hz allows for them.
    expect(peakAbs(deviation, word.from, word.to).valueHz).toBeCloseTo(3400, 6);
    expect(peakAbs(deviation, word.from, word.to).valueHz).toBeGreaterThan(2500); // over the 12.5 kHz trade limit (REFERENCES.md §4, CP)
  });

  it("stays within ±2.2 kHz outside the word and reaches +2.2 kHz at 0.5 s and −2.2 kHz at 1.0 s (audio.ts contract)", () => {
    expect(peakAbs(deviation, 1, word.from - 1).valueHz).toBeLessThanOrEqual(2200 + 1e-6);
    expect(peakAbs(deviation, word.to + 1, capture.sampleCount - 1).valueHz).toBeLessThanOrEqual(2200 + 1e-6);
    expect(deviation[0.5 * fs]).toBeCloseTo(2200, 6);
    expect(deviation[1.0 * fs]).toBeCloseTo(-2200, 6);
  });
});
