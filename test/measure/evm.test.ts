import { describe, expect, it } from "vitest";
import { decideSymbols, evmFigures } from "../../src/measure/index.js";
import { constellation } from "../../src/scenario/index.js";

describe("evmFigures(symbols, ideal, kind)", () => {
  it("matches hand-computed EVM, peak, MER and origin offset (3GPP TS 36.141 / ETSI TR 101 290 definitions)", () => {
    // Two QPSK reference points of energy 1; errors (0.1, 0) and (0, −0.2).
    // Hand: Σ|e|² = 0.05, Σ|s_ref|² = 2 → EVM = √0.025 = 15.811 %; peak 0.2/1 = 20 %;
    // MER = 10·log10(2/0.05) = 16.0206 dB; mean e = (0.05, −0.1) → 10·log10(0.0125) = −19.0309 dB.
    const r = Math.SQRT1_2;
    const ideal = Float64Array.from([r, r, -r, r]);
    const sym = Float64Array.from([r + 0.1, r, -r, r - 0.2]);
    const f = evmFigures(sym, ideal, "qpsk");
    expect(f.evmRmsPercent.value as number).toBeCloseTo(100 * Math.sqrt(0.025), 9);
    expect(f.evmPeakPercent.value as number).toBeCloseTo(20, 9);
    expect(f.merDb.value as number).toBeCloseTo(10 * Math.log10(40), 9);
    expect(f.iqOriginOffsetDb.value as number).toBeCloseTo(10 * Math.log10(0.0125), 9);
    expect(f.symbols).toBe(2);
  });

  it("is null with a reason for no symbols and throws for mismatched lengths", () => {
    expect(evmFigures(new Float64Array(0), new Float64Array(0), "qpsk").evmRmsPercent.value).toBeNull();
    expect(() => evmFigures(new Float64Array(4), new Float64Array(2), "qpsk")).toThrow(RangeError);
  });
});

describe("decideSymbols(symbols, kind)", () => {
  it("maps each ideal point to itself and a point nudged by less than half the spacing back to it", () => {
    // 16QAM minimum distance 2/√10 (odd grid spacing 2, scaled by √10, REFERENCES §6).
    const pts = constellation("16qam");
    const nudged = pts.map((v, k) => v + (k % 2 === 0 ? 0.9 : -0.9) / Math.sqrt(10));
    expect(decideSymbols(pts, "16qam")).toEqual(pts);
    expect(decideSymbols(nudged, "16qam")).toEqual(pts);
  });
});
