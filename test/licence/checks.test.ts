// evaluateLicence, checkMask and adjacentChannelPower on figures and spectra given directly, so
// that each value is known exactly: the four ILAC-G8 states through a whole check, ppm
// conversions, designator symbols, the mask's point-by-point verdict and adjacent power.
import { describe, expect, it } from "vitest";
import type { WelchPsd } from "../../src/dsp/index.js";
import {
  adjacentChannelPower, checkMask, evaluateLicence, pointMask, type CheckInputs, type Licence, type MaskReading,
} from "../../src/licence/index.js";

const none = { value: null, uncertainty: null, method: "not given" };

function inputs(over: Partial<CheckInputs>): CheckInputs {
  return {
    carrierFrequencyHz: none,
    positiveDeviationHz: { ...none, timeS: null },
    negativeDeviationHz: { ...none, timeS: null },
    occupiedBandwidthHz: none,
    emissionClass: "fm",
    designator: null,
    classConfidence: 1,
    classMethod: "given",
    maskSpectrum: null,
    adjacent: null,
    ...over,
  };
}

function deviation(hz: number, u: number): Partial<CheckInputs> {
  return { positiveDeviationHz: { value: hz, uncertainty: u, method: "given", timeS: 1 }, negativeDeviationHz: { value: hz - 100, uncertainty: u, method: "given", timeS: 2 } };
}

describe("evaluateLicence(licence, mask, inputs)", () => {
  const licence: Licence = { maxDeviationHz: 2500 };

  // ILAC-G8:09/2019 §4.2.3 with w = U = 50 Hz around the tolerance limit 2500 Hz.
  it.each([
    [2400, "pass", true, "pass"],
    [2470, "conditional-pass", true, "pass"],
    [2530, "conditional-fail", false, "fail"],
    [2600, "fail", false, "fail"],
  ] as const)("gives %d Hz against 2500 Hz with U = 50 Hz the decision %s (ILAC-G8:09/2019 §4.2.3)", (hz, decision, pass, verdict) => {
    const out = evaluateLicence(licence, null, inputs(deviation(hz, 50)));
    const c = out.checks[0];
    expect(c?.decision).toBe(decision);
    expect(c?.pass).toBe(pass);
    expect(out.verdict).toBe(verdict);
    expect(out.decision).toBe(decision);
    // margin = limit − measured; margin % = 100·margin/limit.
    expect(c?.margin).toBeCloseTo(2500 - hz, 9);
    expect(c?.marginPercent).toBeCloseTo((100 * (2500 - hz)) / 2500, 9);
  });

  it("judges the carrier error on its magnitude, in ppm of the assigned frequency (REFERENCES.md §10: 5 ppm at 150 MHz = 750 Hz)", () => {
    const l: Licence = { assignedFrequencyHz: 150e6, frequencyTolerancePpm: 5 };
    const below = evaluateLicence(l, null, inputs({ carrierFrequencyHz: { value: 150e6 - 760, uncertainty: 15, method: "given" } }));
    const c = below.checks[0];
    expect(c?.measured).toBeCloseTo((-760 / 150e6) * 1e6, 12);
    expect(c?.uncertainty).toBeCloseTo(0.1, 12);
    // |−5.0667| ppm is within U = 0.1 ppm above 5 ppm: conditional fail.
    expect(c?.decision).toBe("conditional-fail");
    const hz = evaluateLicence({ assignedFrequencyHz: 150e6, frequencyToleranceHz: 750 }, null, inputs({ carrierFrequencyHz: { value: 150e6 + 700, uncertainty: 15, method: "given" } }));
    expect(hz.checks[0]?.unit).toBe("Hz");
    expect(hz.checks[0]?.margin).toBeCloseTo(50, 9);
  });

  it("compares the designator's first two symbols, F and G alike (RR Appendix 1; 47 CFR 2.201 note), conditional below 0.9 confidence", () => {
    const l: Licence = { emissionDesignator: "16K0F3E" };
    expect(evaluateLicence(l, null, inputs({ designator: "14K0G3E" })).checks[0]?.pass).toBe(true);
    expect(evaluateLicence(l, null, inputs({ designator: "6K00A3E", emissionClass: "am" })).checks[0]?.decision).toBe("fail");
    expect(evaluateLicence(l, null, inputs({ designator: "16K0F1D" })).checks[0]?.pass).toBe(false);
    expect(evaluateLicence(l, null, inputs({ designator: "6K00A3E", classConfidence: 0.6 })).checks[0]?.decision).toBe("conditional-fail");
  });

  it("judges the OBW against the authorised bandwidth, else the designator's (47 CFR 2.202; RR Appendix 1: 11K2 = 11.2 kHz)", () => {
    const obw = { occupiedBandwidthHz: { value: 11_500, uncertainty: 100, method: "given" } };
    const byDesignator = evaluateLicence({ emissionDesignator: "11K2F3E" }, null, inputs(obw));
    expect(byDesignator.checks.find((c) => c.name === "bandwidth")?.limit).toBe(11_200);
    const byAuthorised = evaluateLicence({ emissionDesignator: "11K2F3E", authorisedBandwidthHz: 11_250 }, null, inputs(obw));
    expect(byAuthorised.checks.find((c) => c.name === "bandwidth")?.decision).toBe("fail");
  });

  it("names the terms it could not check instead of passing them", () => {
    const out = evaluateLicence({ maxDeviationHz: 5000, frequencyTolerancePpm: 5 }, null, inputs({}));
    expect(out.checks).toEqual([]);
    expect(out.skipped.join(" ")).toMatch(/assigned frequency/);
    expect(out.skipped.join(" ")).toMatch(/deviation/);
  });
});

/** A spectrum on a 250 Hz grid from −30 to +30 kHz, flat at `levelDb` but where `at` says. */
function spectrum(levelDb: number, noiseDb: number, at: (f: number) => number | null = () => null): MaskReading {
  const offsetHz: number[] = [];
  const levels: number[] = [];
  for (let f = -30_000; f <= 30_000; f += 250) { offsetHz.push(f); levels.push(at(f) ?? levelDb); }
  return {
    offsetHz, levelDb: levels, timeS: offsetHz.map(() => 1.5), noiseDb, coveredHz: 30_000,
    method: "given", uncertaintyDb: 1, referenceDbfs: -10, reference: "carrier", detector: "peak-hold", resolutionHz: 300,
  };
}

describe("checkMask(mask, spectrum)", () => {
  // The contract's example mask (interface.md): linear in dB between points, held beyond the last.
  const mask = pointMask([[0, 0], [10_000, -25], [12_500, -35], [25_000, -60]]);

  it("finds where a flat −40 dB spectrum leaves the mask: beyond 15 kHz (−35 → −60 dB over 12.5–25 kHz reaches −40 at 15 kHz), worst −20 dB", () => {
    const r = checkMask(mask, spectrum(-40, -100));
    expect(r.worst?.marginDb).toBeCloseTo(-20, 9);
    expect(Math.abs(r.worst?.offsetHz ?? 0)).toBeGreaterThanOrEqual(25_000);
    // Two spans, one each side, from the first grid point past 15 kHz to the edge.
    expect(r.violations.length).toBe(2);
    const upper = r.violations.find((v) => v.fromHz > 0);
    expect(upper?.fromHz).toBe(15_250);
    expect(upper?.toHz).toBe(30_000);
  });

  it("does not judge the 0 dB zone (the reference itself), nor points where the limit is under the noise + 6 dB and the reading is noise", () => {
    const r = checkMask(mask, spectrum(-62, -62, (f) => (Math.abs(f) < 1000 ? 0 : null)));
    // Offset 0 allows 0 dB: not judged, so the carrier's 0 dB there is no margin of 0.
    expect(r.worst?.offsetHz).not.toBe(0);
    // Beyond 25 kHz the limit −60 dB is under −62 + 6: the noise there is not verifiable.
    expect(r.unverifiable.length).toBeGreaterThan(0);
    expect(r.unverifiable.every((s) => Math.abs(s.fromHz) >= 20_000 || Math.abs(s.toHz) >= 20_000)).toBe(true);
    // A spur well above the noise under such a limit is judged all the same.
    const spur = checkMask(mask, spectrum(-62, -62, (f) => (f === 27_000 ? -40 : null)));
    expect(spur.worst?.offsetHz).toBe(27_000);
    expect(spur.worst?.marginDb).toBeCloseTo(-20, 9);
  });

  it("says from where the mask sets limits the capture does not cover", () => {
    const narrow = { ...spectrum(-70, -100), coveredHz: 20_000 };
    expect(checkMask(mask, narrow).uncoveredFromHz).toBeGreaterThan(20_000);
  });
});

describe("adjacentChannelPower(input)", () => {
  it("integrates the PSD less the noise over B around ±S (REFERENCES.md §10 ACLR definition; channel power Σ PSD·Δf)", () => {
    // 100 Hz bins over ±51.2 kHz; 1e-4 FS²/Hz over ±4 kHz, 1e-9 in ±4 kHz around +25 kHz, noise 1e-12 everywhere.
    const n = 1024;
    const bin = 100;
    const density = new Float64Array(n);
    for (let i = 0; i < n; i++) {
      const f = (i - n / 2) * bin;
      density[i] = 1e-12 + (Math.abs(f) <= 4000 ? 1e-4 : 0) + (Math.abs(f - 25_000) <= 4000 ? 1e-9 : 0);
    }
    const psd = { fftLength: n, binWidthHz: bin, densityPerHz: density } as unknown as WelchPsd;
    const r = adjacentChannelPower({ psd, centreHz: 0, spacingHz: 25_000, bandwidthHz: 8000, noiseDensityPerHz: 1e-12 });
    // Same bins in both bands: the ratio is 1e-9/1e-4 = −50 dB exactly.
    expect(r?.upper?.relativeDb).toBeCloseTo(-50, 6);
    expect(r?.upper?.atMost).toBe(false);
    // The lower band holds only noise: at most the noise's power in it, 1e-12·8100 Hz over 1e-4·8100 Hz = −80 dB.
    expect(r?.lower?.atMost).toBe(true);
    expect(r?.lower?.relativeDb).toBeCloseTo(-80, 6);
  });
});
