// The truth of the evaluation set comes from theory.ts and the generator: checked here against
// published tables and closed forms, so that a miss in `npm run eval` is the tool's, not the truth's.
import { describe, expect, it } from "vitest";
import {
  besselJIntegral, evmComparable, expectedEvmPercent, generateCase, planCases, rrcObw99PerBaud, toneAmObw99Hz, toneFmObw99Hz,
  captureFileName, VARIANTS,
} from "../../src/eval/index.js";
import { fileNameTokens } from "../../src/capture/index.js";

describe("besselJIntegral(n, x)", () => {
  it("matches A&S Table 9.1 / 9.5 to 1e-9 (REFERENCES.md §1)", () => {
    // A&S Table 9.1: J0(1), J1(1), J2(2), J3(5); Table 9.5: first zero of J0.
    expect(besselJIntegral(0, 1)).toBeCloseTo(0.7651976866, 9);
    expect(besselJIntegral(1, 1)).toBeCloseTo(0.4400505857, 9);
    expect(besselJIntegral(2, 2)).toBeCloseTo(0.3528340286, 9);
    expect(besselJIntegral(3, 5)).toBeCloseTo(0.3648312306, 9);
    expect(Math.abs(besselJIntegral(0, 2.404825558))).toBeLessThan(1e-9);
  });
});

describe("toneFmObw99Hz(D, fm)", () => {
  it("is 2·N·fm with N the lines holding 99 % (REFERENCES.md §1, computed from Σ Jn²)", () => {
    // REFERENCES.md §1: β = 0.5 → ±1, 1 → ±2, 2 → ±3, 2.405 → ±3, 5 → ±6, 10 → ±12 lines.
    for (const [beta, lines] of [[0.5, 1], [1, 2], [2, 3], [2.405, 3], [5, 6], [10, 12]] as const) {
      expect(toneFmObw99Hz(beta * 1000, 1000), `beta ${beta}`).toBe(2 * lines * 1000);
    }
  });
});

describe("toneAmObw99Hz(m, fm)", () => {
  it("is 2·fm when each sideband holds over 0.5 % (m > 14.2 %), else null (REFERENCES.md §5 power split)", () => {
    // Sideband share m²/(4 + 2m²) each: m = 0.15 → 0.55 %, m = 0.14 → 0.48 % (definition of OBW, SM.328).
    expect(toneAmObw99Hz(15, 1000)).toBe(2000);
    expect(toneAmObw99Hz(14, 1000)).toBeNull();
  });
});

describe("rrcObw99PerBaud(α)", () => {
  it("matches REFERENCES.md §3 (99 % OBW of the RC power spectrum) to 1e-4", () => {
    // REFERENCES.md §3, computed from the RC power spectrum: 4-digit values.
    for (const [a, b] of [[0.2, 1.0731], [0.22, 1.0849], [0.25, 1.1031], [0.35, 1.1667], [0.5, 1.268], [1, 1.633]] as const) {
      expect(Math.abs(rrcObw99PerBaud(a) - b), `alpha ${a}`).toBeLessThan(1e-4);
    }
  });
});

describe("expectedEvmPercent(Es/N0) and evmComparable", () => {
  it("gives 1/sqrt(SNR): 17.5 % at 15.14 dB, 8 % at 21.94 dB (Shafik et al. 2006, REFERENCES.md §6)", () => {
    expect(expectedEvmPercent(15.14)).toBeCloseTo(17.5, 1);
    expect(expectedEvmPercent(21.94)).toBeCloseTo(8.0, 1);
  });
  it("compares decision-directed EVM only where decisions are safe (Mahmoud & Arslan 2009)", () => {
    // Half the minimum distance d/2 ≥ 3.5σ, σ = sqrt(1/(2·Es/N0)), so Es/N0 ≥ (3.5/(d/2))²/2:
    // 64-QAM d/2 = 1/sqrt(42) → 257 (24.1 dB); QPSK d/2 = 1/sqrt(2) → 12.25 (10.9 dB). Hand computation.
    expect(evmComparable("64qam", 24.5)).toBe(true);
    expect(evmComparable("64qam", 23.7)).toBe(false);
    expect(evmComparable("qpsk", 11.2)).toBe(true);
    expect(evmComparable("qpsk", 10.6)).toBe(false);
  });
});

describe("generateCase(spec)", () => {
  const specs = planCases(3, Object.fromEntries(VARIANTS.map((v) => [v, 1])), [2]);

  it("is the same capture for the same seed (SeededRandom, common practice for reproducible sets)", () => {
    const a = generateCase(specs[0]!);
    const b = generateCase(specs[0]!);
    expect(a.truth).toEqual(b.truth);
    expect(a.iq).toEqual(b.iq);
  });

  it("stays inside full scale, in its SNR band (cf32), and names rate and centre in the file name (docs/formats.md)", () => {
    for (const spec of specs) {
      const { iq, truth } = generateCase(spec);
      let peak = 0;
      for (const v of iq) peak = Math.max(peak, Math.abs(v));
      expect(peak, spec.id).toBeLessThanOrEqual(0.9 + 1e-12);
      // cf32 adds no quantisation noise: the reached SNR is the drawn one (15–20 dB band).
      if (truth.format === "cf32") expect(truth.snrDb, spec.id).toBeCloseTo(truth.drawnSnrDb, 9);
      expect(truth.snrDb, spec.id).toBeLessThan(20);
      expect(truth.centerHz).toBeGreaterThanOrEqual(150e6);
      expect(truth.centerHz).toBeLessThanOrEqual(170e6);
      const tokens = fileNameTokens(captureFileName(spec.id, truth));
      expect(tokens.sampleRateHz).toBe(truth.sampleRateHz);
      expect(tokens.centerHz).toBe(truth.centerHz);
    }
  });
});
