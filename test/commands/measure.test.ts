// The measure command end to end on synthetic captures with known parameters: the contract's
// fields are all present (null where they do not apply), the figures agree with the closed
// forms they were made from, and the report folder is complete.
import { existsSync, mkdtempSync, readFileSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { PNG } from "pngjs";
import { describe, expect, it } from "vitest";
import { encodeSamples } from "../../src/capture/index.js";
import { measureCommand } from "../../src/commands/measure.js";
import { measureText } from "../../src/report/measureText.js";
import { measureMarkdown } from "../../src/report/measureMarkdown.js";
import { SeededRandom, amFromAudio, burstGate, complexNoise, fmFromAudio, frequencyShift, nrzLevels, randomSymbols, rrcPsk, toneAudio } from "../../src/scenario/index.js";
import { runCli } from "../helpers/runCli.js";

const dir = mkdtempSync(join(tmpdir(), "iqaudit-measure-"));
const fs = 250_000;
const n = 500_000; // 2 s

function withNoise(iq: Float64Array, variance: number, seed: number): Float64Array {
  const noise = new Float64Array(iq.length);
  complexNoise(new SeededRandom(seed), noise, variance);
  for (let k = 0; k < iq.length; k++) iq[k] = (iq[k] as number) + (noise[k] as number);
  return iq;
}

/** Tone FM: 1 kHz at 5 kHz peak deviation, amplitude 0.3, at +40 kHz from the capture centre. */
function toneFmCapture(): string {
  const audio = toneAudio(0, n, fs, 1000);
  const { iq } = fmFromAudio(audio, fs, 5000, 0, 0.3);
  const shifted = frequencyShift(iq, fs, 40_000);
  // Noise of total variance 1e-6 over 250 kHz: about 40 dB SNR in a 16 kHz channel.
  const p = join(dir, "tonefm_250ksps.cf32");
  writeFileSync(p, encodeSamples("cf32_le", withNoise(shifted, 1e-6, 11)));
  return p;
}

const REPORT_FIELDS: Record<string, readonly string[]> = {
  capture: ["path", "sha256", "container", "format", "sampleRateHz", "centerHz", "samples", "fileSamples", "durationS"],
  quality: ["clippingPercent", "dcOffsetDbfs", "iqGainImbalanceDb", "iqPhaseImbalanceDeg", "imageRejectionDb", "noiseFloorDbfsPerHz", "nonFiniteSamples"],
  carrier: ["offsetHz", "frequencyHz", "errorPpm"],
  bandwidth: ["occupiedHz", "lowerEdgeHz", "upperEdgeHz", "xDbHz", "xDb", "resolutionHz"],
  power: ["channelDbfs", "snrDb"],
  modulation: ["class", "order", "confidence"],
  digital: ["symbolRateBd", "evmRmsPercent", "evmPeakPercent", "merDb", "symbols"],
  fsk: ["shiftHz", "modulationIndex"],
  ook: ["onOffRatioDb", "dutyCyclePercent"],
  emission: ["designator", "necessaryBandwidthHz"],
};

describe("measureCommand(path, options)", () => {
  const fmPath = toneFmCapture();

  it("reports every field of the contract (interface.md, report fields), null where it does not apply", async () => {
    const { report } = await measureCommand(fmPath, { capture: { centerHz: 156.8e6 } });
    const r = report as unknown as Record<string, Record<string, unknown>>;
    expect(r.schema).toBe("iqaudit/report/1");
    for (const [section, fields] of Object.entries(REPORT_FIELDS)) {
      for (const field of fields) expect(r[section], `${section}.${field}`).toHaveProperty(field);
    }
    expect(r.fm).not.toBeNull();
    expect(r.am).toBeNull();
    // The x-dB bandwidth's reference by default: the max-hold maximum (docs/cli.md, `--xdb-reference`).
    expect(report.bandwidth.xDbReference).toBe("peak-hold");
    expect(report.methods["bandwidth.xDbHz"]).toMatch(/max-hold/);
    expect(typeof report.uncertainty).toBe("object");
  });

  it("measures tone FM: carrier, deviation, index, Carson, designator (theory; Carson's rule; RR Appendix 1)", async () => {
    const { report } = await measureCommand(fmPath, { capture: { centerHz: 156.8e6 }, nominalHz: 156.84e6 });
    expect(report.modulation.class).toBe("fm");
    // Carrier at +40 kHz exactly: error 0 ppm within a few Hz (0.05 ppm at 156.84 MHz = 7.8 Hz).
    expect(Math.abs((report.carrier.offsetHz as number) - 40_000)).toBeLessThan(5);
    expect(Math.abs(report.carrier.errorPpm as number)).toBeLessThan(0.05);
    // Peak deviation 5 kHz within 1 % (issue 3), modulating frequency 1 kHz, beta = 5.
    expect(report.fm?.peakDeviationHz).toBeGreaterThan(4950);
    expect(report.fm?.peakDeviationHz).toBeLessThan(5050);
    expect(Math.abs((report.fm?.modulatingFrequencyHz as number) - 1000)).toBeLessThan(5);
    expect(Math.abs((report.fm?.modulationIndex as number) - 5)).toBeLessThan(0.05);
    // Carson: 2 (5000 + 1000) = 12 kHz (REFERENCES.md §2).
    expect(Math.abs((report.fm?.carsonBandwidthHz as number) - 12_000)).toBeLessThan(120);
    // 99 % OBW of tone FM with beta = 5: ±6 lines hold 99.36 % (REFERENCES.md §1) → about 12 kHz,
    // within one line spacing (1 kHz).
    expect(Math.abs((report.bandwidth.occupiedHz as number) - 12_000)).toBeLessThan(1000);
    // F3E: frequency modulation, analogue, telephony (RR Appendix 1 §4); 4-character bandwidth code.
    expect(report.emission.designator).toMatch(/^[1-9][0-9HKMG]{3}F3E$/);
    // The text summary names the channel used, the nominal frequency and the necessary
    // bandwidth, absolute frequencies in MHz grouped in threes (SI Brochure 9th ed. §5.4.4).
    const text = measureText(report, []);
    // The channel found is the located region (centred within a few pass-1 bins of +40 kHz).
    expect(text).toMatch(/channel\s+(39|40)\.\d{3} kHz offset, \d+\.\d{3} kHz wide \(found\)/);
    expect(text).toMatch(/nominal frequency\s+156\.840 000 MHz/);
    expect(text).toMatch(/carrier frequency\s+156\.840 0\d\d MHz/);
    // Necessary bandwidth of tone FM, 47 CFR 2.202(g): 2M + 2D = 2·1000 + 2·5000 = 12 kHz.
    expect(text).toMatch(/necessary bandwidth\s+1[12]\.\d{3} kHz/);
    // report.md too: the carrier frequency in MHz, grouped, to the decimal place of its uncertainty.
    expect(measureMarkdown(report, [])).toMatch(/\| Carrier frequency \| 156\.8(39 9|40 0)[\d ]* MHz \| ± [\d.]+ Hz \|/);
  });

  it("writes a complete report folder: report.json last, report.md, PNGs that decode (pngjs)", async () => {
    const out = join(dir, "fm-report");
    const { files } = await measureCommand(fmPath, { capture: {}, outDir: out });
    expect(files[files.length - 1]).toBe(join(out, "report.json"));
    for (const name of ["report.json", "report.md", "spectrum.png", "spectrogram.png", "deviation.png"]) {
      expect(existsSync(join(out, name)), name).toBe(true);
    }
    const md = readFileSync(join(out, "report.md"), "utf8");
    expect(md).toMatch(/SHA-256/);
    expect(md).toMatch(/accredited/);
    const png = PNG.sync.read(readFileSync(join(out, "spectrum.png")));
    expect(png.width).toBeGreaterThan(400);
  });

  it("measures AM depth (theory: m = (Vmax − Vmin)/(Vmax + Vmin))", async () => {
    const audio = toneAudio(0, n, fs, 1000);
    const am = frequencyShift(amFromAudio(audio, 70, 0.2), fs, -30_000);
    const p = join(dir, "am70_250ksps.cf32");
    writeFileSync(p, encodeSamples("cf32_le", withNoise(am, 1e-7, 5)));
    const { report } = await measureCommand(p, { capture: {} });
    expect(report.modulation.class).toBe("am");
    expect(Math.abs((report.am?.modulationDepthPercent as number) - 70)).toBeLessThan(1);
    expect(report.emission.designator).toMatch(/A3E$/);
  });
});

describe("measureCommand with --ppm", () => {
  it("removes a receiver clock error: offset + p·1e-6·fc (REFERENCES.md §10, common practice; ±1 Hz)", async () => {
    // An unmodulated carrier read at +10 kHz by a receiver whose reference is 2 ppm high at
    // 150 MHz: its true offset is 10 kHz + 300 Hz.
    const iq = new Float64Array(2 * 200_000);
    for (let k = 0; k < 200_000; k++) {
      iq[2 * k] = 0.2 * Math.cos((2 * Math.PI * 10_000 * k) / fs);
      iq[2 * k + 1] = 0.2 * Math.sin((2 * Math.PI * 10_000 * k) / fs);
    }
    const p = join(dir, "cwppm_250ksps.cf32");
    writeFileSync(p, encodeSamples("cf32_le", withNoise(iq, 1e-6, 9)));
    const plain = await measureCommand(p, { capture: { centerHz: 150e6 } });
    const corrected = await measureCommand(p, { capture: { centerHz: 150e6, ppm: 2 } });
    expect(plain.report.modulation.class).toBe("cw");
    expect(Math.abs((plain.report.carrier.offsetHz as number) - 10_000)).toBeLessThan(1);
    expect(Math.abs((corrected.report.carrier.offsetHz as number) - 10_300)).toBeLessThan(1);
    expect(Math.abs((corrected.report.carrier.frequencyHz as number) - 150_010_300)).toBeLessThan(1);
    // Unmodulated carrier (N0N, RR Appendix 1 §4): its OBW is set by the window, an upper bound,
    // so no bandwidth code is made (RR Appendix 1: the code states the necessary bandwidth).
    expect(plain.report.modulation.class).toBe("cw");
    expect(plain.report.emission.designator).toBeNull();
  });
});

describe("measure bad input (interface.md, exit codes)", () => {
  const p = join(dir, "cw_250ksps.cf32");
  const iq = new Float64Array(2 * 50_000);
  for (let k = 0; k < 50_000; k++) {
    iq[2 * k] = 0.2 * Math.cos((2 * Math.PI * 10_000 * k) / fs);
    iq[2 * k + 1] = 0.2 * Math.sin((2 * Math.PI * 10_000 * k) / fs);
  }
  writeFileSync(p, encodeSamples("cf32_le", iq));
  for (const [what, args, mentions] of [
    ["unknown --mode", ["--mode", "xyz"], "--mode"],
    ["malformed --channel", ["--channel", "12k"], "--channel"],
    ["non-numeric --channel", ["--channel", "a:b"], "--channel"],
    ["channel outside the capture", ["--channel", "200k:25k"], "--channel"],
  ] as const) {
    it(what, () => {
      const r = runCli(["measure", p, ...args]);
      expect(r.status, r.stderr).toBe(2);
      expect(r.stdout).toBe("");
      const lines = r.stderr.split("\n").filter((l) => l.length > 0);
      expect(lines).toHaveLength(1);
      expect(lines[0]).toMatch(/^iqaudit: /);
      expect(lines[0]).toContain(mentions);
    });
  }
});

describe("measureCommand on digital emissions", () => {
  it("measures QPSK blind: class, order, symbol rate, EVM near 1/sqrt(SNR), G1D (Shafik et al. 2006; RR Appendix 1)", async () => {
    const rs = 25_000;
    const count = 400_000; // 1.6 s at 250 kS/s, 40 000 symbols
    const symbols = randomSymbols(new SeededRandom(21), "qpsk", Math.ceil((count / fs) * rs) + 16);
    const x = frequencyShift(rrcPsk(symbols, 0, count, { symbolRateBd: rs, sampleRateHz: fs, rollOff: 0.35, amplitude: 0.2 }), fs, 20_000);
    // Es/N0 = (P/Rs)/(σ²/fs) = 30 dB with P = 0.04: σ² = 0.04·(fs/Rs)/1000.
    const p = join(dir, "qpsk_250ksps.cf32");
    writeFileSync(p, encodeSamples("cf32_le", withNoise(x, (0.04 * (fs / rs)) / 1000, 17)));
    const { report, files } = await measureCommand(p, { capture: {}, outDir: join(dir, "qpsk-report") });
    expect(report.modulation.class).toBe("psk");
    expect(report.modulation.order).toBe(4);
    // Symbol rate within 0.1 % (issue 4).
    expect(Math.abs((report.digital.symbolRateBd as number) - rs) / rs).toBeLessThan(1e-3);
    // EVM ≈ 1/sqrt(Es/N0) = 3.16 % at 30 dB, within 10 % relative (Shafik, Rahman & Islam 2006).
    expect(Math.abs((report.digital.evmRmsPercent as number) - 3.162) / 3.162).toBeLessThan(0.1);
    // MER = −20 log10(EVM) (ETSI TR 101 290; REFERENCES.md §6).
    expect(report.digital.merDb as number).toBeCloseTo(-20 * Math.log10((report.digital.evmRmsPercent as number) / 100), 1);
    // Carrier at +20 kHz.
    expect(Math.abs((report.carrier.offsetHz as number) - 20_000)).toBeLessThan(5);
    expect(report.emission.designator).toMatch(/G1D$/);
    expect(files.map((f) => f.split("/").pop())).toContain("constellation.png");
  });

  it("measures 2-FSK: shift, rate and index within 1 % (closed form of the keying), F1D", async () => {
    const rb = 4800;
    const shift = 3600;
    const count = 250_000;
    const bitsRng = new SeededRandom(5);
    const bits = Array.from({ length: Math.ceil((count / fs) * rb) + 2 }, () => bitsRng.integer(2));
    const levels = nrzLevels(bits, rb, fs, 0, count);
    const { iq } = fmFromAudio(levels, fs, shift / 2, 0, 0.3);
    const p = join(dir, "fsk_250ksps.cf32");
    writeFileSync(p, encodeSamples("cf32_le", withNoise(frequencyShift(iq, fs, -30_000), 1e-6, 3)));
    const { report } = await measureCommand(p, { capture: {} });
    expect(report.modulation.class).toBe("fsk");
    expect(Math.abs((report.fsk.shiftHz as number) - shift) / shift).toBeLessThan(0.01);
    expect(Math.abs((report.digital.symbolRateBd as number) - rb) / rb).toBeLessThan(0.01);
    expect(Math.abs((report.fsk.modulationIndex as number) - shift / rb) / (shift / rb)).toBeLessThan(0.01);
    expect(report.emission.designator).toMatch(/F1D$/);
  });

  /**
   * A bursty 2-FSK link: 4800 Bd, 3600 Hz shift, 10 ms bursts every 125 ms (8 % duty) with
   * 0.2 ms raised-cosine edges, each burst starting its symbol clock afresh at a fractional
   * sample, at −30 kHz + 137 Hz. The truth is the keying it was made from (closed form).
   */
  function burstyFskCapture(noisePower = 1e-6, name = "burstyfsk"): string {
    const rb = 4800;
    const schedule = { periodS: 0.125, onS: 0.01, firstStartS: 0.0173, rampS: 0.0002 };
    const rng = new SeededRandom(77);
    const levels = new Float64Array(n);
    for (let k = 0; ; k++) {
      const t0 = schedule.firstStartS + k * schedule.periodS - 0.001;
      if (t0 * fs >= n) break;
      const bits = Array.from({ length: 60 }, () => rng.integer(2));
      const start = Math.floor(t0 * fs);
      const run = nrzLevels(bits, rb, fs, start, Math.min(n - start, Math.ceil(0.0125 * fs)), t0);
      levels.set(run.subarray(0, Math.min(run.length, n - start)), start);
    }
    const { iq } = fmFromAudio(levels, fs, 1800, 0, 0.3);
    const gate = burstGate(0, n, fs, schedule);
    for (let k = 0; k < n; k++) { iq[2 * k] = (iq[2 * k] as number) * (gate[k] as number); iq[2 * k + 1] = (iq[2 * k + 1] as number) * (gate[k] as number); }
    const p = join(dir, `${name}_250ksps.cf32`);
    writeFileSync(p, encodeSamples("cf32_le", withNoise(frequencyShift(iq, fs, -30_000 + 137), noisePower, 8)));
    return p;
  }

  it("measures a bursty 2-FSK link inside its bursts: class, rate, shift and centre (closed form of the keying)", async () => {
    const p = burstyFskCapture();
    for (const channel of [undefined, { offsetHz: -30_000, widthHz: 25_000 }]) {
      const { report } = await measureCommand(p, { capture: {}, channel });
      expect(report.modulation.class, JSON.stringify(channel)).toBe("fsk");
      expect(report.modulation.order).toBe(2);
      const rate = report.digital.symbolRateBd as number;
      const uRate = report.uncertainty["digital.symbolRateBd"] as number;
      // Stated k = 2 uncertainty covers the true rate; and within 0.5 % (common practice for a data link's rate).
      expect(Math.abs(rate - 4800)).toBeLessThanOrEqual(Math.max(uRate, 1));
      expect(Math.abs(rate - 4800) / 4800).toBeLessThan(0.005);
      expect(Math.abs((report.fsk.shiftHz as number) - 3600) / 3600).toBeLessThan(0.01);
      // Centre of the two tones = the carrier; within 20 Hz (0.5 % of the shift).
      expect(Math.abs((report.carrier.offsetHz as number) - (-30_000 + 137))).toBeLessThan(20);
      expect(report.warnings.join(" ")).toMatch(/bursts/);
    }
  }, 60_000);

  it("bounds the class of a bursty link by its SNR while keyed on, not by the channel's average over the gaps", async () => {
    // 25 dB in the bursts over 2D + Rs = 8.4 kHz (47 CFR 2.202(g) F1D with K = 1): noise density
    // 0.09/(10^2.5 · 8400) per Hz over the 250 kHz band. At 8 % duty the channel's SNR averaged
    // over the record is 11 dB lower (10·log10(1/0.08)), about 14 dB, where measure caps a
    // confidence under 0.9; while keyed on it is 25 dB, over the 20 dB from which it does not.
    const n0 = 0.09 / (10 ** 2.5 * 8400);
    const p = burstyFskCapture(n0 * fs, "burstyfsk25");
    const { report } = await measureCommand(p, { capture: {} });
    expect([report.modulation.class, report.modulation.order]).toEqual(["fsk", 2]);
    expect(report.power.snrDb as number).toBeLessThan(20);
    expect(report.methods["modulation.class"]).not.toMatch(/capped/);
    expect(report.modulation.confidence).toBeGreaterThanOrEqual(0.9);
  }, 60_000);
});
