import { describe, expect, it } from "vitest";
import { noiseFloor } from "../../src/dsp/index.js";
import { channelPower, occupiedBandwidth } from "../../src/measure/index.js";
import { tone } from "../../src/scenario/index.js";
import { addNoise, bandNoise, meanPower, psdOf } from "./emissionStimuli.js";

describe("channelPower(psd, { lowerHz, upperHz })", () => {
  it("over the whole band equals the time-domain mean power (Parseval; REFERENCES.md §10, ±0.1 dB)", () => {
    const fs = 48000;
    const iq = bandNoise(1 << 17, fs, -3000, 9000, 0.05, 2e-8, 4);
    const psd = psdOf(iq, 1024, fs);
    const r = channelPower(psd, { lowerHz: -fs / 2, upperHz: fs / 2 });
    expect(Math.abs((r.channelDbfs.value as number) - 10 * Math.log10(meanPower(iq)))).toBeLessThan(0.1);
  });

  it("over a sub-band holding a tone is the tone's power plus the noise in the sub-band (±0.1 dB, REFERENCES.md §10)", () => {
    const fs = 48000;
    const n = 1 << 17;
    const noisePower = 0.01; // white over fs
    const iq = addNoise(tone(n, fs, 5123.4, { amplitude: 0.5 }), noisePower, 8);
    const psd = psdOf(iq, 1024, fs);
    const r = channelPower(psd, { lowerHz: 4000, upperHz: 6000 });
    const expected = 0.25 + (noisePower / fs) * r.channelWidthHz;
    expect(Math.abs((r.channelDbfs.value as number) - 10 * Math.log10(expected))).toBeLessThan(0.1);
  });

  it("gives the in-channel SNR S/(N0·OBW) of band noise at a known density (interface.md definition)", () => {
    const fs = 48000;
    const w = 8000;
    const n0 = 1e-6;
    const s = 0.1; // S/(N0·W) = 12.5 → S/(N0·0.99W) = 11.0 dB
    const iq = bandNoise(1 << 18, fs, -w / 2, w / 2, s, n0, 12);
    const psd = psdOf(iq, 1024, fs);
    const floor = noiseFloor(psd).densityPerHz;
    const obw = occupiedBandwidth(psd, { lowerHz: -8000, upperHz: 8000, noiseFloorPerHz: floor });
    const r = channelPower(psd, { lowerHz: -8000, upperHz: 8000, noiseFloorPerHz: floor, occupiedHz: obw.occupiedHz.value });
    // Expected from the stimulus: 10·log10(S/(N0·0.99·W)). Tolerance 0.2 dB: the floor estimate
    // (±1 %) and the noise removed over the 16 kHz channel (±2 % of S at this density).
    expect(Math.abs((r.snrDb.value as number) - 10 * Math.log10(s / (n0 * 0.99 * w)))).toBeLessThan(0.2);
  });

  it("has a null SNR with a reason when nothing stands above the floor", () => {
    const fs = 1000;
    const iq = bandNoise(1 << 14, fs, 0, 1, 0, 1e-3, 2);
    const psd = psdOf(iq, 256, fs);
    const floor = noiseFloor(psd).densityPerHz;
    const r = channelPower(psd, { lowerHz: -500, upperHz: 500, noiseFloorPerHz: floor * 1.2, occupiedHz: 100 });
    expect(r.snrDb.value).toBeNull();
    expect(r.snrDb.warnings[0]).toMatch(/noise floor/);
  });
});
