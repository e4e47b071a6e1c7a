// `measure` over a span longer than the channel record it keeps: the carrier, the peak deviations
// (with when they happened) and the occupied bandwidth come from every sample of the span, so an
// over-deviating word late in the recording is found although the record ends long before it.
import { mkdtempSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { describe, expect, it } from "vitest";
import { encodeSamples } from "../../src/capture/index.js";
import { measureCommand } from "../../src/commands/measure.js";
import { SeededRandom, complexNoise, fmFromAudio, frequencyShift, toneAudio } from "../../src/scenario/index.js";

const dir = mkdtempSync(join(tmpdir(), "iqaudit-measure-whole-"));
const fs = 48_000;
const seconds = 30;
const n = fs * seconds;
const wordStartS = 26;
const wordS = 1;

/**
 * 1 kHz tone FM, 2.5 kHz peak deviation, rising to 3.4 kHz over one word at 26–27 s (20 ms
 * raised-cosine ramps), amplitude 0.5, noise for about 45 dB SNR; at +3.3 kHz from the centre (no Bessel line at 0 Hz, where it would pass for the receiver's DC spike).
 */
function lateWordCapture(): string {
  const audio = toneAudio(0, n, fs, 1000);
  const ramp = 0.02 * fs;
  for (let k = 0; k < n; k++) {
    const t = k - wordStartS * fs;
    let env = 0;
    if (t >= 0 && t < wordS * fs) env = Math.min(1, 0.5 - 0.5 * Math.cos((Math.PI * Math.min(t, wordS * fs - 1 - t)) / ramp));
    if (t >= ramp && t < wordS * fs - ramp) env = 1;
    audio[k] = (audio[k] as number) * (1 + (0.9 / 2.5) * env);
  }
  const iq = frequencyShift(fmFromAudio(audio, fs, 2500, 0, 0.5).iq, fs, 3300);
  const noise = new Float64Array(iq.length);
  complexNoise(new SeededRandom(5), noise, 1e-5);
  for (let k = 0; k < iq.length; k++) iq[k] = (iq[k] as number) + (noise[k] as number);
  const p = join(dir, "late-word_48ksps.cf32");
  writeFileSync(p, encodeSamples("cf32_le", iq));
  return p;
}

describe("measure over the whole span", () => {
  const path = lateWordCapture();

  it("finds a 3.4 kHz word at 26 s though the record keeps only the first seconds (the deviation is the generator's, by construction)", async () => {
    // The class is given (a single test tone's frequency histogram is two-peaked, like 2-FSK's).
    // A record of 2^15 channel samples: about 1 s at the channel rate, far short of the word.
    const { report } = await measureCommand(path, { capture: { format: "cf32_le" }, maxChannelSamples: 1 << 15, mode: "fm" });
    const fm = report.fm;
    if (fm === null) throw new Error("no FM figures");
    expect(fm.peaksOver).toBe("whole span");
    const u = report.uncertainty["fm.positiveDeviationHz"] as number;
    expect(u).toBeGreaterThan(0);
    // The generator's peak deviation: 2.5 kHz × (1 + 0.9/2.5) = 3.4 kHz, on both sides of the carrier.
    expect(Math.abs((fm.positiveDeviationHz as number) - 3400)).toBeLessThanOrEqual(Math.max(u, 15));
    expect(Math.abs((fm.negativeDeviationHz as number) - 3400)).toBeLessThanOrEqual(Math.max(report.uncertainty["fm.negativeDeviationHz"] as number, 15));
    // When: inside the word's flat top (26.02–26.98 s).
    expect(fm.positiveDeviationTimeS as number).toBeGreaterThan(wordStartS);
    expect(fm.positiveDeviationTimeS as number).toBeLessThan(wordStartS + wordS);
    // The carrier over the whole span: the +3.3 kHz the generator put it at.
    expect(Math.abs((report.carrier.offsetHz as number) - 3300)).toBeLessThanOrEqual(Math.max(report.uncertainty["carrier.offsetHz"] as number, 1));
    expect(report.warnings.some((w) => w.includes("cover the whole"))).toBe(true);
  });

  it("keeps the record's peaks when the record holds the whole span (the same word inside it)", async () => {
    const { report } = await measureCommand(path, { capture: { format: "cf32_le", startS: 25, durationS: 3 }, mode: "fm" });
    const fm = report.fm;
    if (fm === null) throw new Error("no FM figures");
    expect(fm.peaksOver).toBe("record");
    expect(Math.abs((fm.positiveDeviationHz as number) - 3400)).toBeLessThanOrEqual(Math.max(report.uncertainty["fm.positiveDeviationHz"] as number, 15));
    // Times from the start of the analysed span (--start 25 s): the word begins 1 s in.
    expect(fm.positiveDeviationTimeS as number).toBeGreaterThan(1);
    expect(fm.positiveDeviationTimeS as number).toBeLessThan(2);
  });
});
