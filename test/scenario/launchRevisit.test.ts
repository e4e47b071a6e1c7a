// The second visit to the harbour launch channel (scenario.ts, "launch-revisit"): the same
// transmitter six months later, its carrier +260 Hz from nominal instead of +180 Hz. The carrier
// is found here without the synthesis' arithmetic, from the phase of the noise-free baseband:
// the mean phase advance (φ[n] − φ[n−1])·fs/2π (instantaneous frequency, definition) where the
// speech-like audio is silent, and the beat of the two visits against each other.
import { describe, expect, it } from "vitest";
import { captureStream, emissionTransmitter, SCENARIO_CAPTURES, scenarioTransmitter } from "../../src/scenario/index.js";
import type { ScenarioCapture } from "../../src/scenario/index.js";
import { instantaneousFrequencyHz, maxOf, minOf, pauseWindows } from "./lines.js";

const revisit = SCENARIO_CAPTURES.find((c) => c.id === "launch-revisit")!;
const first = SCENARIO_CAPTURES.find((c) => c.id === "launch")!;
const launch = scenarioTransmitter("launch");
// −400 dBFS/Hz: noise variance 1e-40·fs, far below float64 rounding of the samples.
const noiseless = (c: ScenarioCapture) => captureStream({ ...c, noiseDbfsPerHz: -400 }).next(c.sampleCount);

describe("the launch channel's second visit, synthesised without noise", () => {
  const fs = revisit.sampleRateHz;
  const iq = noiseless(revisit);

  it("is 4 s at 48 kS/s, like the first visit, centred on the launch's nominal 164.975 MHz and recorded later", () => {
    expect(revisit.container).toBe("wav");
    expect(revisit.format).toBe("ci16_le");
    expect(revisit.sampleRateHz).toBe(48_000);
    expect(revisit.sampleCount / revisit.sampleRateHz).toBe(4);
    expect(revisit.sampleCount).toBe(first.sampleCount);
    expect(revisit.centerHz).toBe(launch.nominalFrequencyHz);
    expect(revisit.emissions.map((e) => e.transmitterId)).toEqual(["launch"]);
    expect(revisit.seed).not.toBe(first.seed);
    expect(iq.length).toBe(2 * revisit.sampleCount);
    // About six months (180 days) after the first visit: 182 days and 2 h 15 min.
    const days = (Date.parse(revisit.datetime) - Date.parse(first.datetime)) / 86_400_000;
    expect(days).toBeGreaterThan(150);
    expect(days).toBeLessThan(215);
  });

  it("has its carrier at +260 Hz: the mean phase advance in every pause of the audio", () => {
    const f = instantaneousFrequencyHz(iq, fs); // f[k] is the step into sample k + 1
    const windows = pauseWindows(fs, revisit.sampleCount / fs);
    expect(windows.length).toBe(16); // 4 pauses a second for 4 s
    for (const w of windows) {
      const pause = f.subarray(w.from, w.to);
      const meanHz = pause.reduce((s, x) => s + x, 0) / pause.length;
      // A silent audio moves no phase, so the step is the carrier's alone, the same at every
      // sample. Float64 phase arithmetic over 192 000 samples errs by ~1e-12 Hz; 1e-6 Hz allows it.
      expect(meanHz).toBeCloseTo(260, 6);
      expect(maxOf(pause) - minOf(pause)).toBeLessThan(1e-6);
    }
  });

  it("carries the first visit's FM audio 80 Hz higher: x_revisit·conj(x_first) is a pure +80 Hz tone of power A⁴", () => {
    const a = noiseless(first);
    const beat = new Float64Array(iq.length);
    for (let k = 0; k < iq.length; k += 2) {
      const [i1, q1, i0, q0] = [iq[k] as number, iq[k + 1] as number, a[k] as number, a[k + 1] as number];
      beat[k] = i1 * i0 + q1 * q0;
      beat[k + 1] = q1 * i0 - i1 * q0;
    }
    // Same audio, deviation and start phase: the FM phases cancel, leaving exp(j2π·80·n/fs)·A².
    const amplitude2 = 10 ** (revisit.emissions[0]!.powerDbfs / 10);
    const f = instantaneousFrequencyHz(beat, fs);
    expect(maxOf(f)).toBeCloseTo(80, 6);
    expect(minOf(f)).toBeCloseTo(80, 6);
    let worst = 0;
    for (let k = 0; k < beat.length; k += 2) worst = Math.max(worst, Math.abs(Math.hypot(beat[k] as number, beat[k + 1] as number) - amplitude2));
    expect(worst).toBeLessThan(1e-12); // float64 rounding of A²·(cos² + sin²) ≈ 0.16: ~1e-17
  });
});

describe("emissionTransmitter(emission)", () => {
  it("gives the capture's own carrier error where the emission has one, else the transmitter's", () => {
    const heard = emissionTransmitter(revisit.emissions[0]!);
    expect(heard.carrierErrorHz).toBe(260);
    expect(heard.frequencyHz).toBe(164_975_260);
    expect(heard.nominalFrequencyHz).toBe(launch.nominalFrequencyHz);
    expect(emissionTransmitter(first.emissions[0]!)).toBe(launch);
  });

  it("an emission that states the transmitter's own error synthesises the same samples as one that leaves it out", () => {
    const explicit = { ...first, emissions: [{ ...first.emissions[0]!, carrierErrorHz: launch.carrierErrorHz }] };
    const a = captureStream(first).next(4800);
    const b = captureStream(explicit).next(4800);
    expect(b).toEqual(a);
  });
});
