import { describe, expect, it } from "vitest";
import { ookFigures } from "../../src/measure/index.js";
import { ookEmission } from "./digitalStimuli.js";

const N = 1 << 16;
const FS = 16000;

describe("ookFigures(iq, fs)", () => {
  it("gives the keying rate within 0.5 %, the duty cycle of the generated bits and the closed-form on/off ratio", () => {
    for (const [rb, leak, noise, seed] of [[1000, 0.1, 1e-3, 1], [500, 0.05, 1e-4, 2], [1600, 0, 1e-3, 3]] as const) {
      const { iq, bits } = ookEmission(N, FS, rb, leak, 120, noise, seed);
      const fig = ookFigures(iq, FS);
      expect(Math.abs((fig.symbolRateBd.value as number) / rb - 1), `rb ${rb}`).toBeLessThan(0.005);
      // Duty cycle (closed form): the share of the record's time covered by 1 bits.
      let onSamples = 0;
      for (let k = 0; k < N; k++) if (bits[Math.floor((k / FS) * rb)]) onSamples++;
      const duty = (100 * onSamples) / N;
      expect(Math.abs((fig.dutyCyclePercent.value as number) - duty), `rb ${rb}`).toBeLessThan(1);
      // On/off ratio (closed form): (1 + N)/(ε² + N), on amplitude 1, leakage ε, noise power N.
      const want = 10 * Math.log10((1 + noise) / (leak * leak + noise));
      expect(Math.abs((fig.onOffRatioDb.value as number) - want), `rb ${rb}`).toBeLessThan(0.5);
      // On level: 10·log10(1 + N) dBFS.
      expect(Math.abs((fig.onLevelDbfs.value as number) - 10 * Math.log10(1 + noise))).toBeLessThan(0.05);
    }
  });

  it("rejects bad parameters", () => {
    const { iq } = ookEmission(4096, FS, 1000, 0, 0, 1e-3, 1);
    expect(() => ookFigures(iq, -1)).toThrow(RangeError);
    expect(() => ookFigures(iq.subarray(1), FS)).toThrow(RangeError);
    expect(() => ookFigures(iq, FS, { symbolRateBd: 0 })).toThrow(RangeError);
  });
});
