import { describe, expect, it } from "vitest";
import {
  CONSTELLATION_KINDS, CONSTELLATION_ORDER, constellation, qamGrid, randomSymbols, SeededRandom,
} from "../../src/scenario/index.js";

function energies(pts: Float64Array): number[] {
  const e: number[] = [];
  for (let k = 0; k < pts.length; k += 2) e.push((pts[k] as number) ** 2 + (pts[k + 1] as number) ** 2);
  return e;
}
const mean = (a: number[]): number => a.reduce((s, v) => s + v, 0) / a.length;

// REFERENCES.md §6 (Proakis, QAM section; status C): the square M-QAM grid on the odd integers
// has mean |s|² = 2(M − 1)/3.
const SQUARE_QAM_MEAN_ENERGY_PROAKIS = { 4: 2, 16: 10, 64: 42 } as const;
// REFERENCES.md §6: peak-to-average power of the 16QAM constellation 18/10 = 1.800; 64QAM 98/42.
const PAPR_16QAM_REFERENCES = 1.8;
const PAPR_64QAM_REFERENCES = 98 / 42;
// The 32-point cross constellation (6 × 6 odd grid minus the four (±5, ±5) corners) has mean
// energy (840 − 200)/32 = 20, a hand sum (Proakis, cross constellations; from memory).
const CROSS32_MEAN_ENERGY_HAND_SUM = 20;

describe("constellation(kind)", () => {
  it("qamGrid(M) of square QAM has mean energy 2(M − 1)/3 (REFERENCES §6, Proakis)", () => {
    for (const m of [4, 16, 64] as const) {
      expect(qamGrid(m).length).toBe(2 * m);
      expect(mean(energies(qamGrid(m)))).toBeCloseTo(SQUARE_QAM_MEAN_ENERGY_PROAKIS[m], 12);
    }
    expect(qamGrid(32).length).toBe(64);
    expect(mean(energies(qamGrid(32)))).toBeCloseTo(CROSS32_MEAN_ENERGY_HAND_SUM, 12);
  });

  it("every kind has M distinct points and unit mean energy", () => {
    for (const kind of CONSTELLATION_KINDS) {
      const pts = constellation(kind);
      expect(pts.length).toBe(2 * CONSTELLATION_ORDER[kind]);
      expect(mean(energies(pts))).toBeCloseTo(1, 12);
      const keys = new Set<string>();
      for (let k = 0; k < pts.length; k += 2) keys.add(`${(pts[k] as number).toFixed(6)},${(pts[k + 1] as number).toFixed(6)}`);
      expect(keys.size).toBe(CONSTELLATION_ORDER[kind]);
    }
  });

  it("16QAM peak-to-average power is 1.8 and 64QAM 98/42 (REFERENCES §6)", () => {
    const e16 = energies(constellation("16qam"));
    expect(Math.max(...e16) / mean(e16)).toBeCloseTo(PAPR_16QAM_REFERENCES, 12);
    const e64 = energies(constellation("64qam"));
    expect(Math.max(...e64) / mean(e64)).toBeCloseTo(PAPR_64QAM_REFERENCES, 12);
  });

  it("PSK points lie on the unit circle, QPSK on the diagonals (±1 ± j)/√2 (Proakis)", () => {
    for (const kind of ["bpsk", "qpsk", "8psk"] as const) {
      for (const e of energies(constellation(kind))) expect(e).toBeCloseTo(1, 12);
    }
    const q = constellation("qpsk");
    for (const v of q) expect(Math.abs(v)).toBeCloseTo(Math.SQRT1_2, 12);
  });
});

describe("randomSymbols(rng, kind, count)", () => {
  it("draws only constellation points, about equally often, and repeats for one seed", () => {
    const pts = constellation("16qam");
    const s = randomSymbols(new SeededRandom(7), "16qam", 16000);
    const counts = new Array<number>(16).fill(0);
    for (let k = 0; k < s.length; k += 2) {
      let hit = -1;
      for (let m = 0; m < 16; m++) {
        if (Math.abs((pts[2 * m] as number) - (s[k] as number)) < 1e-12 && Math.abs((pts[2 * m + 1] as number) - (s[k + 1] as number)) < 1e-12) hit = m;
      }
      expect(hit).toBeGreaterThanOrEqual(0);
      counts[hit] = (counts[hit] as number) + 1;
    }
    // Binomial(16000, 1/16): mean 1000, σ ≈ 30.6; ±5σ.
    for (const c of counts) expect(Math.abs(c - 1000)).toBeLessThan(153);
    expect(randomSymbols(new SeededRandom(7), "16qam", 16000)).toEqual(s);
  });
});
