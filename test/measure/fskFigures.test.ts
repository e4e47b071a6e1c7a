import { describe, expect, it } from "vitest";
import { fskFigures } from "../../src/measure/index.js";
import { fskEmission } from "./digitalStimuli.js";

const N = 1 << 16;

describe("fskFigures(iq, fs, { order })", () => {
  it("of 2-FSK at 4800 Bd with a 3600 Hz shift gives shift, rate and h = 0.75 within 1 % (closed form of the generated keying)", () => {
    for (const [snr, seed] of [[15, 1], [25, 2], [30, 3]] as const) {
      const fig = fskFigures(fskEmission(2, N, 38400, 4800, 3600, 150, snr, seed).iq, 38400);
      expect(Math.abs((fig.shiftHz.value as number) / 3600 - 1), `snr ${snr}`).toBeLessThan(0.01);
      expect(Math.abs((fig.symbolRateBd.value as number) / 4800 - 1)).toBeLessThan(0.01);
      expect(Math.abs((fig.modulationIndex.value as number) / 0.75 - 1)).toBeLessThan(0.01);
      // Tones at centre ± shift/2 = 150 ± 1800 Hz; 1 % of the shift.
      expect(fig.toneFrequenciesHz.map((t) => t.value as number).map((f, i) => Math.abs(f - (150 + (i === 0 ? -1800 : 1800)))).every((e) => e < 36)).toBe(true);
    }
  });

  it("of the REFERENCES.md §4 fixture at baseband (tones ±400 Hz, 1200 Bd) gives shift 800 Hz, h = 2/3 within 1 %", () => {
    // ITU-R M.693 keys 1300/2100 Hz at 1200 Bd: an 800 Hz shift; here the tones sit at ±400 Hz.
    const fig = fskFigures(fskEmission(2, N, 9600, 1200, 800, 0, 20, 11).iq, 9600);
    expect(Math.abs((fig.shiftHz.value as number) / 800 - 1)).toBeLessThan(0.01);
    expect(Math.abs((fig.symbolRateBd.value as number) / 1200 - 1)).toBeLessThan(0.01);
    expect(Math.abs((fig.modulationIndex.value as number) / (800 / 1200) - 1)).toBeLessThan(0.01);
    expect(Math.abs((fig.toneFrequenciesHz[0]?.value as number) + 400)).toBeLessThan(8);
    expect(Math.abs((fig.toneFrequenciesHz[1]?.value as number) - 400)).toBeLessThan(8);
    // The histogram holds every discriminator output within its 0.1 %…99.9 % range.
    const total = fig.histogram.counts.reduce((a, b) => a + b, 0);
    expect(total).toBeGreaterThan(0.99 * (N - 1));
    expect(fig.histogram.binsHz.length).toBe(fig.histogram.counts.length);
  });

  it("of 4-FSK (1200 Bd, tones 1200 Hz apart) gives four tones and the mean spacing within 1 %", () => {
    const fig = fskFigures(fskEmission(4, N, 19200, 1200, 1200, -80, 25, 5).iq, 19200, { order: 4 });
    expect(fig.toneFrequenciesHz.length).toBe(4);
    expect(Math.abs((fig.shiftHz.value as number) / 1200 - 1)).toBeLessThan(0.01);
    const want = [-1800, -600, 600, 1800].map((f) => f - 80);
    fig.toneFrequenciesHz.forEach((t, i) => expect(Math.abs((t.value as number) - (want[i] as number))).toBeLessThan(12));
  });

  it("takes the caller's rate, and rejects bad parameters", () => {
    const iq = fskEmission(2, 1 << 14, 9600, 1200, 800, 0, null, 3).iq;
    expect(fskFigures(iq, 9600, { symbolRateBd: 1200 }).symbolRateBd.value).toBe(1200);
    expect(() => fskFigures(iq, 0)).toThrow(RangeError);
    expect(() => fskFigures(iq.subarray(1), 9600)).toThrow(RangeError);
    expect(() => fskFigures(iq, 9600, { symbolRateBd: -1 })).toThrow(RangeError);
  });
});
