// Emission designators carry the necessary bandwidth (RR Appendix 1; 47 CFR 2.202(g)): the
// same transmitter recorded in different captures gets the same designator, and the 2.202(g)
// worked examples (16K0F3E, 6K00A3E) come out of signals made to their parameters.
import { mkdtempSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { describe, expect, it } from "vitest";
import { encodeSamples } from "../../src/capture/index.js";
import { measureCommand } from "../../src/commands/measure.js";
import { SeededRandom, amFromAudio, complexNoise, fmFromAudio, frequencyShift, speechLikeAudio, toneAudio } from "../../src/scenario/index.js";

const dir = mkdtempSync(join(tmpdir(), "iqaudit-designator-"));

/** Adds complex noise for an in-channel SNR of `snrDb` over `bandHz` (signal power amplitude²). */
function capture(name: string, iq: Float64Array, fs: number, amplitude: number, snrDb: number, bandHz: number, seed: number): string {
  const noise = new Float64Array(iq.length);
  complexNoise(new SeededRandom(seed), noise, (amplitude ** 2 / 10 ** (snrDb / 10)) * (fs / bandHz));
  for (let k = 0; k < iq.length; k++) iq[k] = (iq[k] as number) + (noise[k] as number);
  const p = join(dir, `${name}_${fs}sps.cf32`);
  writeFileSync(p, encodeSamples("cf32_le", iq));
  return p;
}

/** Speech-like FM at `deviationHz` peak (speechLikeAudio peaks at ±1), offset +3 kHz. */
function fmSpeech(fs: number, seconds: number, deviationHz: number, snrDb: number, seed: number): string {
  const n = Math.round(fs * seconds);
  const { iq } = fmFromAudio(speechLikeAudio(0, n, fs), fs, deviationHz, 0.4, 0.3);
  return capture(`fmspeech_${seconds}s_${snrDb}dB`, frequencyShift(iq, fs, 3000), fs, 0.3, snrDb, 16_000, seed);
}

describe("emission designator from the necessary bandwidth", () => {
  it("gives 16K0F3E for FM telephony at 5 kHz peak deviation (47 CFR 2.202(g): 2M + 2DK, M = 3000 Hz, K = 1)", async () => {
    const { report } = await measureCommand(fmSpeech(48_000, 2, 5000, 45, 1), { capture: {} });
    expect(report.modulation.class).toBe("fm");
    expect(report.emission.designator).toBe("16K0F3E");
    expect(report.emission.designatorBasis).toBe("necessary");
    // A modulation index applies to one tone only (2.202(g) M is the maximum modulating frequency).
    expect(report.fm?.modulationIndex).toBeNull();
  }, 60_000);

  it("gives 6K00A3E for AM telephony (47 CFR 2.202(g): 2M, M = 3000 Hz)", async () => {
    const fs = 48_000;
    const n = 2 * fs;
    const iq = amFromAudio(speechLikeAudio(0, n, fs), 80, 0.3);
    const { report } = await measureCommand(capture("amspeech", frequencyShift(iq, fs, -2000), fs, 0.3, 35, 6000, 2), { capture: {} });
    expect(report.modulation.class).toBe("am");
    expect(report.emission.designator).toBe("6K00A3E");
    expect(report.emission.designatorBasis).toBe("necessary");
  }, 60_000);

  it("takes M as the test tone for one tone: 1 kHz at 4 kHz deviation gives 2·1000 + 2·4000 = 10K0F3E and index 4 (2.202(g); β = Δf/fm)", async () => {
    const fs = 48_000;
    const n = 2 * fs;
    const { iq } = fmFromAudio(toneAudio(0, n, fs, 1000), fs, 4000, 0, 0.3);
    const { report } = await measureCommand(capture("fmtone", iq, fs, 0.3, 50, 16_000, 3), { capture: {} });
    expect(report.emission.designator).toBe("10K0F3E");
    // Index within 1 %: the deviation and tone are both measured to better than 0.5 % at 40 dB (theory).
    expect(Math.abs((report.fm?.modulationIndex as number) - 4)).toBeLessThan(0.04);
  }, 60_000);

  // At 20–25 dB the noise on the deviation peak moves the measured D by up to about 1 %, which
  // can move the third digit of the code (14K0 → 14K1): measured here and named in
  // docs/classification.md; the stability is asserted from 30 dB.
  it("gives one transmitter the same designator in captures of other rates, lengths and SNR ≥ 30 dB", async () => {
    // 2M + 2D = 2·3000 + 2·4000 = 14 000 Hz → 14K0F3E (RR Appendix 1 §2 bandwidth code).
    const captures = [
      fmSpeech(48_000, 2, 4000, 40, 11),
      fmSpeech(50_000, 3, 4000, 45, 12),
      fmSpeech(250_000, 1.5, 4000, 30, 13),
      fmSpeech(96_000, 2.5, 4000, 35, 14),
    ];
    const got: string[] = [];
    for (const p of captures) got.push(String((await measureCommand(p, { capture: {} })).report.emission.designator));
    expect(got).toEqual(["14K0F3E", "14K0F3E", "14K0F3E", "14K0F3E"]);
  }, 120_000);

  it("gives an unmodulated carrier no bandwidth digit from the window: the OBW is an upper bound (RR Appendix 1: necessary bandwidth)", async () => {
    const fs = 48_000;
    const n = fs;
    const iq = new Float64Array(2 * n);
    for (let k = 0; k < n; k++) { iq[2 * k] = 0.3 * Math.cos((2 * Math.PI * 1234.5 * k) / fs); iq[2 * k + 1] = 0.3 * Math.sin((2 * Math.PI * 1234.5 * k) / fs); }
    const { report } = await measureCommand(capture("cw", iq, fs, 0.3, 40, 1000, 4), { capture: {} });
    expect(report.modulation.class).toBe("cw");
    expect(report.emission.designator).toBeNull();
    expect(report.warnings.join(" ")).toMatch(/upper bound/);
  }, 60_000);
});
