// A receiver DC offset stronger than the one emission, in an 8-bit (cu8) capture, through pass 1
// and measureEmission (the measure command). Direct-conversion (zero-IF) receivers leave a line
// exactly at 0 Hz (LO leakage, ADC offset; common practice), and an 8-bit quantiser adds spurs
// (harmonics and intermodulation of the DC term and the carrier) when the noise dithers it
// little. The DC line is not an emission: the carrier elsewhere is the one measured.
import { mkdtempSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { describe, expect, it } from "vitest";
import { encodeSamples } from "../../src/capture/index.js";
import { measureCommand } from "../../src/commands/measure.js";
import { SeededRandom, complexNoise, fmFromAudio, frequencyShift, randomSymbols, rrcPsk, toneAudio } from "../../src/scenario/index.js";

const dir = mkdtempSync(join(tmpdir(), "iqaudit-dcspike-"));
const fs = 250_000;
const n = 400_000; // 1.6 s
const LSB = 1 / 127.5; // cu8 step (REFERENCES.md §9)
/** Carrier −30 dBFS, DC offset −20 dBFS: the DC line is 10 dB stronger than the emission. */
const CARRIER_AMPLITUDE = 10 ** (-30 / 20);
const DC_DBFS = -20;

/** Adds a DC offset of dcDbfs (equal on I and Q) and complex noise of σ per component in LSB. */
function withDcAndNoise(iq: Float64Array, sigmaLsb: number, seed: number): Float64Array {
  const a = Math.sqrt(10 ** (DC_DBFS / 10) / 2);
  const noise = new Float64Array(iq.length);
  complexNoise(new SeededRandom(seed), noise, 2 * (sigmaLsb * LSB) ** 2);
  for (let k = 0; k < iq.length; k += 2) {
    iq[k] = (iq[k] as number) + a + (noise[k] as number);
    iq[k + 1] = (iq[k + 1] as number) + a + (noise[k + 1] as number);
  }
  return iq;
}

/** REFERENCES.md §9: cu8 stores round(x·127.5 + 127.5). */
function cu8Capture(name: string, iq: Float64Array): string {
  const p = join(dir, `${name}_250ksps.cu8`);
  writeFileSync(p, encodeSamples("cu8", iq));
  return p;
}

function cw(offsetHz: number): Float64Array {
  const iq = new Float64Array(2 * n);
  for (let k = 0; k < n; k++) {
    iq[2 * k] = CARRIER_AMPLITUDE * Math.cos((2 * Math.PI * offsetHz * k) / fs);
    iq[2 * k + 1] = CARRIER_AMPLITUDE * Math.sin((2 * Math.PI * offsetHz * k) / fs);
  }
  return iq;
}

/**
 * The carrier error allowed: the reported expanded uncertainty, but not below 1 % of the
 * capture's Rayleigh resolution 1/T (6 mHz at T = 1.6 s): the 8-bit spurs are a bias that the
 * uncertainty model (noise only) does not cover. A DC line taken for the carrier misses by kHz.
 */
function allowedHz(u: number | undefined): number {
  return Math.max(u ?? 0, 0.01 * (fs / n));
}

describe("a cu8 capture whose DC offset is 10 dB stronger than its carrier (zero-IF practice)", () => {
  // σ = 0.5 LSB: a lightly dithered 8-bit capture; σ = 0.03 LSB: hardly dithered, the
  // quantiser's harmonics of the carrier (every 5 003 Hz, 15–30 dB above the floor) stand out.
  for (const [sigmaLsb, f0, seed] of [[0.5, 31_267, 7101], [0.03, 5_003, 7102]] as const) {
    it(`finds a CW carrier at +${f0} Hz, not the DC line (noise ${sigmaLsb} LSB)`, async () => {
      const p = cu8Capture(`cw_${sigmaLsb}`, withDcAndNoise(cw(f0), sigmaLsb, seed));
      const { report } = await measureCommand(p, { capture: {} });
      expect(report.modulation.class).toBe("cw");
      expect(Math.abs((report.carrier.offsetHz as number) - f0)).toBeLessThanOrEqual(allowedHz(report.uncertainty["carrier.offsetHz"]));
      // The spike is reported in the health figures; the measured channel (a few kHz about the
      // carrier) does not hold 0 Hz, so no warning names it (docs/cli.md, "Warnings").
      expect(report.quality.dcSpikeDbfs).not.toBeNull();
      expect(Math.abs(report.channel.offsetHz)).toBeGreaterThan(report.channel.widthHz / 2);
      expect(report.warnings.some((w) => /DC spike/.test(w))).toBe(false);
    });
  }

  it("finds a CW carrier at +1 201 Hz, 20 bins from the DC line, and the channel does not lock to the DC line", async () => {
    const f0 = 1201;
    const p = cu8Capture("cw_near", withDcAndNoise(cw(f0), 0.3, 7103));
    const { report } = await measureCommand(p, { capture: {} });
    expect(report.modulation.class).toBe("cw");
    expect(Math.abs((report.carrier.offsetHz as number) - f0)).toBeLessThanOrEqual(allowedHz(report.uncertainty["carrier.offsetHz"]));
  });

  it("measures tone FM at −40 kHz: class fm, carrier and deviation (theory: FM keeps its carrier frequency)", async () => {
    // 1 kHz tone at 3 kHz peak deviation.
    const { iq } = fmFromAudio(toneAudio(0, n, fs, 1000), fs, 3000, 0, CARRIER_AMPLITUDE);
    const p = cu8Capture("fm", withDcAndNoise(frequencyShift(iq, fs, -40_000), 0.5, 7104));
    const { report } = await measureCommand(p, { capture: {} });
    expect(report.modulation.class).toBe("fm");
    // The FM carrier estimate: allowed its uncertainty or 1 Hz (a third of a line spacing of 1 kHz / 300).
    expect(Math.abs((report.carrier.offsetHz as number) + 40_000)).toBeLessThanOrEqual(Math.max(report.uncertainty["carrier.offsetHz"] ?? 0, 1));
    // Peak deviation 3 kHz within 6 %: at the 29 dB SNR of this channel the peak of the
    // instantaneous frequency reads a few % high with or without the DC line (noise adds to the
    // tone's peak); a DC line taken into the channel would read as a deviation of 40 kHz.
    expect(Math.abs((report.fm?.peakDeviationHz as number) - 3000)).toBeLessThan(180);
  });

  it("measures QPSK at +25 kHz: class psk, order 4, symbol rate (Swami & Sadler 2000 cumulants; theory)", async () => {
    const rs = 10_000;
    const symbols = randomSymbols(new SeededRandom(7105), "qpsk", Math.ceil((n / fs) * rs) + 16);
    const x = frequencyShift(rrcPsk(symbols, 0, n, { symbolRateBd: rs, sampleRateHz: fs, rollOff: 0.35, amplitude: CARRIER_AMPLITUDE }), fs, 25_000);
    const p = cu8Capture("qpsk", withDcAndNoise(x, 0.5, 7106));
    const { report } = await measureCommand(p, { capture: {} });
    expect(report.modulation.class).toBe("psk");
    expect(report.modulation.order).toBe(4);
    // Symbol rate within 0.1 % (issue 4); carrier within 1 % of the symbol rate (a tenth of the
    // M-th power loop's pull-in range ±Rs/8, common practice).
    expect(Math.abs((report.digital.symbolRateBd as number) - rs) / rs).toBeLessThan(1e-3);
    expect(Math.abs((report.carrier.offsetHz as number) - 25_000)).toBeLessThan(0.01 * rs);
  });

  it("measures 8PSK at +70 kHz, where the DC line falls outside the decimated channel's Nyquist band: class psk, order 8", async () => {
    // The channel of a 20 kBd emission is decimated to a rate whose Nyquist band ends short of
    // 0 Hz; what the decimation filter lets through of the DC line folds into the channel's
    // edges and must not be read as part of the emission (Swami & Sadler 2000 cumulants; theory).
    const rs = 20_000;
    const symbols = randomSymbols(new SeededRandom(7109), "8psk", Math.ceil((n / fs) * rs) + 16);
    const x = frequencyShift(rrcPsk(symbols, 0, n, { symbolRateBd: rs, sampleRateHz: fs, rollOff: 0.25, amplitude: CARRIER_AMPLITUDE }), fs, 70_000);
    const p = cu8Capture("8psk", withDcAndNoise(x, 0.5, 7110));
    const { report } = await measureCommand(p, { capture: {} });
    expect([report.modulation.class, report.modulation.order]).toEqual(["psk", 8]);
    expect(Math.abs((report.digital.symbolRateBd as number) - rs) / rs).toBeLessThan(1e-3);
  });

  it("with --channel holding 0 Hz and a carrier at +1 201 Hz, measures the carrier and says the DC spike was set aside", async () => {
    const f0 = 1201;
    const p = cu8Capture("cw_channel", withDcAndNoise(cw(f0), 0.5, 7107));
    const { report } = await measureCommand(p, { capture: {}, channel: { offsetHz: 1000, widthHz: 4000 } });
    expect(report.modulation.class).toBe("cw");
    expect(Math.abs((report.carrier.offsetHz as number) - f0)).toBeLessThanOrEqual(allowedHz(report.uncertainty["carrier.offsetHz"]));
    expect(report.warnings.some((w) => /DC spike at 0 Hz .* not taken/.test(w))).toBe(true);
  });

  it("with --channel holding only the DC line, warns that the line at 0 Hz may be the receiver's", async () => {
    const p = cu8Capture("cw_far", withDcAndNoise(cw(60_000), 0.5, 7108));
    const { report } = await measureCommand(p, { capture: {}, channel: { offsetHz: 0, widthHz: 4000 } });
    expect(report.warnings.some((w) => /line at 0 Hz .* receiver's DC spike/.test(w))).toBe(true);
  });
});
