import { describe, expect, it } from "vitest";
import {
  bandwidthCode, emissionDesignator, frequencyErrorPpm, frequencyErrorPpmOf, measurement,
  necessaryBandwidthAmHz, necessaryBandwidthFmHz,
} from "../../src/measure/index.js";

describe("bandwidthCode(hz)", () => {
  it("gives every official example of RR Appendix 1 §2 / 47 CFR 2.202(b)(3) exactly", () => {
    // REFERENCES.md §2 "official examples" (status V): the complete list.
    const OFFICIAL_EXAMPLES: Array<[number, string]> = [
      [0.002, "H002"], [0.1, "H100"], [25.3, "25H3"], [400, "400H"], [2.4e3, "2K40"], [6e3, "6K00"],
      [12.5e3, "12K5"], [180.4e3, "180K"], [180.5e3, "181K"], [180.7e3, "181K"], [1.25e6, "1M25"],
      [2e6, "2M00"], [10e6, "10M0"], [202e6, "202M"], [5.65e9, "5G65"],
    ];
    for (const [hz, code] of OFFICIAL_EXAMPLES) expect(bandwidthCode(hz), `${hz} Hz`).toBe(code);
  });

  it("follows the 3-significant-figure rule for codes not in the list (REFERENCES.md §2, rule CP)", () => {
    expect(bandwidthCode(100)).toBe("100H");
    expect(bandwidthCode(2700)).toBe("2K70");
    expect(bandwidthCode(16000)).toBe("16K0");
    expect(bandwidthCode(999.6)).toBe("1K00"); // rounds up into the next unit
  });

  it("throws RangeError for zero, negative, non-finite and out-of-range bandwidths", () => {
    for (const bad of [0, -5, Number.NaN, Infinity, 1e-5, 2e12]) expect(() => bandwidthCode(bad)).toThrow(RangeError);
  });
});

describe("necessaryBandwidthFmHz(M, D, K) and necessaryBandwidthAmHz(M)", () => {
  it("match 47 CFR 2.202(g) / ITU-R SM.1138: Bn = 2M + 2DK and Bn = 2M", () => {
    // REFERENCES.md §2: F3E M = 3000, D = 5000 → 16 000 Hz; FM broadcast M = 15 000, D = 75 000 → 180 kHz;
    // F1B M = 50, D = 85, K = 1.2 → 304 Hz (worked examples M, formula V2); A3E M = 3000 → 6 kHz.
    expect(necessaryBandwidthFmHz(3000, 5000)).toBe(16000);
    expect(necessaryBandwidthFmHz(15000, 75000)).toBe(180000);
    expect(necessaryBandwidthFmHz(50, 85, 1.2)).toBeCloseTo(304, 9);
    expect(necessaryBandwidthAmHz(3000)).toBe(6000);
    expect(() => necessaryBandwidthFmHz(-1, 5000)).toThrow(RangeError);
  });
});

describe("emissionDesignator({ class, bandwidthHz })", () => {
  it("gives 16K0F3E for 3 kHz voice at 5 kHz deviation and 6K00A3E for 3 kHz AM telephony (47 CFR 2.202)", () => {
    expect(emissionDesignator({ class: "fm", bandwidthHz: necessaryBandwidthFmHz(3000, 5000) }).designator).toBe("16K0F3E");
    expect(emissionDesignator({ class: "am", bandwidthHz: necessaryBandwidthAmHz(3000) }).designator).toBe("6K00A3E");
    // FM broadcast: 180KF3E (REFERENCES.md §2, designator V in public code tables).
    expect(emissionDesignator({ class: "fm", bandwidthHz: necessaryBandwidthFmHz(15000, 75000) }).designator).toBe("180KF3E");
  });

  it("uses N0N for an unmodulated carrier (RR Appendix 1 §4: N, 0, N) and null with a reason for noise/unknown", () => {
    expect(emissionDesignator({ class: "cw", bandwidthHz: 100 }).designator).toBe("100HN0N");
    for (const c of ["noise", "unknown"] as const) {
      const d = emissionDesignator({ class: c, bandwidthHz: 12500 });
      expect(d.designator).toBeNull();
      expect(d.reason).toMatch(/\w/);
    }
    expect(emissionDesignator({ class: "fm", bandwidthHz: null }).designator).toBeNull();
  });
});

describe("frequencyErrorPpm(measuredHz, assignedHz)", () => {
  it("gives the REFERENCES.md §10 examples: 750 Hz at 150 MHz = 5 ppm, 1150 Hz at 460 MHz = 2.5 ppm, 1568 Hz at 156.8 MHz = 10 ppm", () => {
    expect(frequencyErrorPpm(150e6 + 750, 150e6)).toBeCloseTo(5, 9);
    expect(frequencyErrorPpm(460e6 - 1150, 460e6)).toBeCloseTo(-2.5, 9);
    expect(frequencyErrorPpm(156.8e6 + 1568, 156.8e6)).toBeCloseTo(10, 9);
    expect(() => frequencyErrorPpm(1, 0)).toThrow(RangeError);
  });

  it("scales the uncertainty by 1e6/assigned (definition)", () => {
    const m = frequencyErrorPpmOf(measurement(150e6 + 750, "Hz", 15, "test"), 150e6);
    expect(m.value).toBeCloseTo(5, 9);
    expect(m.uncertainty).toBeCloseTo(0.1, 12);
  });
});

describe("emissionDesignator(digital classes)", () => {
  // ITU RR Appendix 1 §4 (REFERENCES.md §2): first symbol G phase, F frequency, D amplitude and
  // angle, A double-sideband amplitude; second 1 = one digital channel without sub-carrier;
  // third D = data, telemetry, telecommand.
  it("gives G1D for PSK data, F1D for FSK, D1D for QAM, A1D for on-off keying", () => {
    expect(emissionDesignator({ class: "psk", bandwidthHz: 22_400 }).designator).toBe("22K4G1D");
    expect(emissionDesignator({ class: "fsk", bandwidthHz: 304 }).designator).toBe("304HF1D");
    expect(emissionDesignator({ class: "qam", bandwidthHz: 1.25e6 }).designator).toBe("1M25D1D");
    expect(emissionDesignator({ class: "ook", bandwidthHz: 2400 }).designator).toBe("2K40A1D");
  });
});

describe("emissionDesignator outside what the code can state", () => {
  it("gives no designator, with the reason, below 0.001 Hz, from 999 GHz and for a non-finite bandwidth (RR Appendix 1: H001 … 999G)", () => {
    for (const hz of [1e-300, 0.0001, 1e12, 1e300, Number.POSITIVE_INFINITY]) {
      const d = emissionDesignator({ class: "fm", bandwidthHz: hz });
      expect(d.designator, String(hz)).toBeNull();
      expect(d.reason).toMatch(/outside the 0.001 Hz to 999 GHz/);
    }
    // The edges of the range still give a code: 0.001 Hz is H001, 999 GHz is 999G.
    expect(emissionDesignator({ class: "cw", bandwidthHz: 0.001 }).designator).toBe("H001N0N");
    expect(emissionDesignator({ class: "cw", bandwidthHz: 999e9 }).designator).toBe("999GN0N");
  });
});
