import { describe, expect, it } from "vitest";
import { burstGate, dutyCyclePercent, fmFromAudio, nrzLevels, ookFromBits } from "../../src/scenario/index.js";
import { instantaneousFrequencyHz } from "./lines.js";

describe("nrzLevels + fmFromAudio (continuous-phase 2-FSK)", () => {
  it("has instantaneous frequency +shift/2 for a 1 and −shift/2 for a 0 (definition of 2-FSK, D = shift/2)", () => {
    const fs = 48_000;
    const rb = 1200;
    const shiftHz = 1000;
    const bits = [1, 0, 0, 1, 1, 0, 1, 0];
    const audio = nrzLevels(bits, rb, fs, 0, (bits.length * fs) / rb);
    const f = instantaneousFrequencyHz(fmFromAudio(audio, fs, shiftHz / 2).iq, fs);
    const sps = fs / rb;
    for (let j = 0; j < bits.length; j++) {
      const mid = j * sps + sps / 2;
      expect(f[mid - 1]).toBeCloseTo(bits[j] ? shiftHz / 2 : -shiftHz / 2, 6);
    }
  });

  it("is 0 outside the bit sequence", () => {
    const levels = nrzLevels([1, 1], 100, 1000, 0, 40, 0.01);
    expect(levels[5]).toBe(0);
    expect(levels[15]).toBe(1);
    expect(levels[35]).toBe(0);
  });
});

describe("ookFromBits(bits, …)", () => {
  it("is on for exactly (number of ones) × samples per bit (rectangular OOK)", () => {
    const bits = [1, 0, 1, 1, 0, 0, 1, 0];
    const x = ookFromBits(bits, 1000, 10_000, 0, 80);
    let on = 0;
    for (let k = 0; k < 80; k++) if (x[2 * k] === 1) on++;
    expect(on).toBe(4 * 10);
  });
});

describe("burstGate(start, count, fs, schedule)", () => {
  it("is at or above ½ for onS/periodS of the time (duty cycle definition), with ramps", () => {
    const schedule = { periodS: 0.125, onS: 0.01, firstStartS: 0.0205, rampS: 0.0002 };
    expect(dutyCyclePercent(schedule)).toBeCloseTo(8, 12);
    const fs = 1_000_000;
    // Ten whole periods starting at the first burst: on time is 10 × 10 ms = 100 000 samples,
    // ±1 sample per edge for where the half-amplitude point falls between samples.
    const start = 20_500;
    const g = burstGate(start, 1_250_000, fs, schedule);
    let on = 0;
    for (let k = 0; k < g.length; k++) if ((g[k] as number) >= 0.5) on++;
    expect(Math.abs(on - 10 * 10_000)).toBeLessThanOrEqual(20);
    expect(on / g.length).toBeCloseTo(0.08, 4);
    // Before the first burst's ramp the gate is closed.
    expect(burstGate(0, 20_000, fs, schedule).every((v) => v === 0)).toBe(true);
  });
});
