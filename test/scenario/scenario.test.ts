import { describe, expect, it } from "vitest";
import {
  emissionEdgesHz, emissionOffsetHz, emissionTransmitter, SCENARIO_CAPTURES, scenarioTransmitter, TRANSMITTERS,
} from "../../src/scenario/index.js";

// CTCSS standard tones, Hz (EIA/TIA-603 list as in REFERENCES.md §10).
const CTCSS_STANDARD_TONES_HZ = [
  67.0, 69.3, 71.9, 74.4, 77.0, 79.7, 82.5, 85.4, 88.5, 91.5, 94.8, 97.4, 100.0, 103.5, 107.2, 110.9,
  114.8, 118.8, 123.0, 127.3, 131.8, 136.5, 141.3, 146.2, 151.4, 156.7, 162.2, 167.9, 173.8, 179.9,
  186.2, 192.8, 203.5, 210.7, 218.1, 225.7, 233.6, 241.8, 250.3,
];

describe("the scenario's transmitters", () => {
  it("are a licensable site on 25 kHz channels: FM peak deviation ≤ 5 kHz (47 CFR 90.209 / 80.205, REFERENCES.md §4)", () => {
    const wide = TRANSMITTERS.filter((t) => t.modulation.kind === "fm" && t.modulation.overDeviation === null);
    expect(wide.length).toBe(2);
    for (const t of wide) {
      if (t.modulation.kind !== "fm") continue;
      expect(t.channelSpacingHz).toBe(25_000);
      expect(t.modulation.peakDeviationHz).toBeLessThanOrEqual(5000);
      expect(t.modulation.voicePeakDeviationHz + (t.modulation.ctcssDeviationHz ?? 0)).toBe(t.modulation.peakDeviationHz);
    }
  });

  it("have one 12.5 kHz FM channel whose voice keeps to ±2.5 kHz but one word goes over (trade practice for 12.5 kHz channels, REFERENCES.md §4, CP)", () => {
    const narrow = TRANSMITTERS.filter((t) => t.channelSpacingHz === 12_500);
    expect(narrow.map((t) => t.id)).toEqual(["workboat"]);
    const m = narrow[0]!.modulation;
    expect(m.kind).toBe("fm");
    if (m.kind !== "fm" || m.overDeviation === null) throw new Error("the workboat has no over-deviated word");
    expect(m.ctcssToneHz).toBeNull();
    expect(m.voicePeakDeviationHz).toBeLessThanOrEqual(2500);
    expect(m.overDeviation.peakDeviationHz).toBeGreaterThan(2500);
    // The stated total peak is the word's, the higher of the two.
    expect(m.peakDeviationHz).toBe(m.overDeviation.peakDeviationHz);
    // 12.5 kHz nominal on the 12.5 kHz raster (an invented channel, 165.1375 MHz).
    expect(narrow[0]!.nominalFrequencyHz % 12_500).toBe(0);
  });

  it("use a standard CTCSS tone at 500–750 Hz deviation (REFERENCES.md §10; deviation common practice)", () => {
    const coded = TRANSMITTERS.filter((t) => t.modulation.kind === "fm" && t.modulation.ctcssToneHz !== null);
    expect(coded.length).toBe(1);
    for (const t of coded) {
      if (t.modulation.kind !== "fm") continue;
      expect(CTCSS_STANDARD_TONES_HZ).toContain(t.modulation.ctcssToneHz);
      expect(t.modulation.ctcssDeviationHz).toBeGreaterThanOrEqual(500);
      expect(t.modulation.ctcssDeviationHz).toBeLessThanOrEqual(750);
    }
  });

  it("are within 5 ppm of their nominal frequency (47 CFR 90.213, 150–174 MHz fixed stations, REFERENCES.md §4)", () => {
    for (const t of TRANSMITTERS) {
      expect(t.nominalFrequencyHz).toBeGreaterThanOrEqual(150e6);
      expect(t.nominalFrequencyHz).toBeLessThanOrEqual(174e6);
      expect(Math.abs(t.carrierErrorHz / t.nominalFrequencyHz) * 1e6).toBeLessThan(5);
      expect(t.frequencyHz).toBe(t.nominalFrequencyHz + t.carrierErrorHz);
      // 12.5 kHz equipment, 150–174 MHz: 2.5 ppm for fixed/base stations, its tightest figure (47 CFR 90.213 Table 1 and notes, REFERENCES.md §4).
      if (t.channelSpacingHz === 12_500) expect(Math.abs(t.carrierErrorHz / t.nominalFrequencyHz) * 1e6).toBeLessThan(2.5);
    }
  });

  it("cover the six kinds of emission asked for, FM three times (launch, pilot, workboat)", () => {
    expect(TRANSMITTERS.map((t) => t.modulation.kind).sort()).toEqual(["am", "cw", "fm", "fm", "fm", "fsk", "psk"]);
  });

  it("annotate the QPSK link with its absolute band (1 + α)·Rs (REFERENCES.md §7)", () => {
    const link = scenarioTransmitter("quaylink");
    const e = emissionEdgesHz(link);
    expect(e.upperHz - e.lowerHz).toBeCloseTo(1.35 * 19_200, 6);
    expect((e.upperHz + e.lowerHz) / 2).toBeCloseTo(link.frequencyHz, 6);
  });
});

describe("the scenario's captures", () => {
  it("hear each transmitter within 5 ppm of nominal, where a capture gives its own carrier error too (47 CFR 90.213, REFERENCES.md §4)", () => {
    const own = SCENARIO_CAPTURES.flatMap((c) => c.emissions).filter((e) => e.carrierErrorHz !== undefined);
    expect(own.map((e) => e.transmitterId)).toEqual(["launch"]); // the second visit's drift alone
    for (const e of own) {
      const t = emissionTransmitter(e);
      expect(t.carrierErrorHz).toBe(e.carrierErrorHz);
      expect(t.frequencyHz).toBe(t.nominalFrequencyHz + t.carrierErrorHz);
      expect(Math.abs(t.carrierErrorHz / t.nominalFrequencyHz) * 1e6).toBeLessThan(5);
      if (t.channelSpacingHz === 12_500) expect(Math.abs(t.carrierErrorHz / t.nominalFrequencyHz) * 1e6).toBeLessThan(2.5);
    }
  });

  it("hold every emission inside 80 % of Nyquist, clear of 0 Hz (anti-alias roll-off and DC spike, common practice)", () => {
    for (const c of SCENARIO_CAPTURES) {
      for (const e of c.emissions) {
        const edges = emissionEdgesHz(emissionTransmitter(e));
        expect(Math.abs(edges.lowerHz - c.centerHz)).toBeLessThan(0.4 * c.sampleRateHz);
        expect(Math.abs(edges.upperHz - c.centerHz)).toBeLessThan(0.4 * c.sampleRateHz);
      }
    }
  });

  it("put no emission on another's IQ image at −f in the survey (so images stay identifiable)", () => {
    const survey = SCENARIO_CAPTURES.find((c) => c.id === "survey");
    expect(survey?.receiver).not.toBeNull();
    if (survey === undefined) return;
    const txs = survey.emissions.map((e) => scenarioTransmitter(e.transmitterId));
    for (const a of txs) {
      const image = -emissionOffsetHz(survey, a);
      for (const b of txs) {
        const eb = emissionEdgesHz(b);
        const ea = emissionEdgesHz(a);
        const halfA = (ea.upperHz - ea.lowerHz) / 2;
        expect(image + halfA < eb.lowerHz - survey.centerHz || image - halfA > eb.upperHz - survey.centerHz).toBe(true);
      }
    }
  });

  it("use the four containers/formats asked for and stay small (≤ 10 MB together, each WAV ≤ 2 MB)", () => {
    const kinds = SCENARIO_CAPTURES.map((c) => `${c.container}:${c.format}`).sort();
    expect(kinds).toEqual(["raw:cf32_le", "raw:cu8", "sigmf:ci16_le", "wav:ci16_le", "wav:ci16_le", "wav:ci16_le"]);
    const bytes = (c: (typeof SCENARIO_CAPTURES)[number]) => c.sampleCount * ({ cu8: 2, ci16_le: 4, cf32_le: 8 } as Record<string, number>)[c.format]!;
    expect(SCENARIO_CAPTURES.reduce((s, c) => s + bytes(c), 0)).toBeLessThanOrEqual(10e6);
    for (const c of SCENARIO_CAPTURES) if (c.container === "wav") expect(bytes(c)).toBeLessThanOrEqual(2e6);
  });
});
