import { describe, expect, it } from "vitest";
import { qpskSymbols, rrcPsk, rrcPulse, SeededRandom } from "../../src/scenario/index.js";
import { meanPower } from "./lines.js";

// Closed forms of the unit-energy root-raised-cosine pulse (x = t/T), as in Proakis & Salehi,
// "Communication Systems Engineering" (square-root raised cosine; from memory), evaluated by hand:
//   p(0) = 1 − α + 4α/π                         α = 0.35 → 0.65 + 1.4/π
//   p(1/(4α)) = (α/√2)[(1 + 2/π) sin(π/4α) + (1 − 2/π) cos(π/4α)]
const RRC_P0_ALPHA035_CLOSED_FORM = 0.65 + 1.4 / Math.PI; // 1.0956338407
const RRC_EDGE_ALPHA035_CLOSED_FORM =
  (0.35 / Math.SQRT2) * ((1 + 2 / Math.PI) * Math.sin(Math.PI / 1.4) + (1 - 2 / Math.PI) * Math.cos(Math.PI / 1.4)); // 0.2606034609

// Raised cosine (Proakis, Nyquist pulses): h(x) = sinc(x)·cos(παx)/(1 − (2αx)²); at x = 1/2,
// α = 0.35: (2/π)·cos(0.175π)/(1 − 0.1225).
const RC_HALF_ALPHA035_CLOSED_FORM = ((2 / Math.PI) * Math.cos(0.175 * Math.PI)) / (1 - 0.1225); // 0.6185841451

/** ∫ f(x) dx over [−limit, limit] by the trapezoid rule with step h. */
function integrate(f: (x: number) => number, limit: number, h: number): number {
  let s = 0;
  for (let x = -limit; x <= limit + h / 2; x += h) s += f(x);
  return s * h;
}

describe("rrcPulse(x, rollOff)", () => {
  it("p(0) = 1 − α + 4α/π and p(±1/(4α)) has the closed form (Proakis & Salehi)", () => {
    expect(rrcPulse(0, 0.35)).toBeCloseTo(RRC_P0_ALPHA035_CLOSED_FORM, 12);
    expect(rrcPulse(1 / 1.4, 0.35)).toBeCloseTo(RRC_EDGE_ALPHA035_CLOSED_FORM, 12);
    expect(rrcPulse(-1 / 1.4, 0.35)).toBeCloseTo(RRC_EDGE_ALPHA035_CLOSED_FORM, 12);
  });

  it("is continuous at the removable singularities x = 0 and x = ±1/(4α)", () => {
    // The general expression next to the special points must approach the special values; the
    // slope of p is O(1), so 1e-6 away the difference is below 1e-5.
    for (const alpha of [0.2, 0.35, 0.5, 1]) {
      const edge = 1 / (4 * alpha);
      expect(Math.abs(rrcPulse(edge + 1e-6, alpha) - rrcPulse(edge, alpha))).toBeLessThan(1e-5);
      expect(Math.abs(rrcPulse(1e-6, alpha) - rrcPulse(0, alpha))).toBeLessThan(1e-5);
    }
  });

  it.each([0.2, 0.35, 0.5, 1])("with α = %s has unit energy ∫p² dx = 1 (the normalisation)", (alpha) => {
    // Trapezoid rule on a smooth decaying integrand, step 1/64; the tail beyond |x| = 40 holds
    // about 1/(24π²α²·40³) < 2e-6 (p ~ 1/(4παx²) far out). Tolerance 1e-5.
    expect(Math.abs(integrate((x) => rrcPulse(x, alpha) ** 2, 40, 1 / 64) - 1)).toBeLessThan(1e-5);
  });

  it("convolved with itself gives the raised cosine: 1 at 0, 0 at ±kT, closed form at T/2 (Proakis)", () => {
    const alpha = 0.35;
    const rc = (tau: number) => integrate((x) => rrcPulse(x, alpha) * rrcPulse(x - tau, alpha), 40, 1 / 64);
    // Truncation at ±40 symbols leaves products of tails of order 1e-6: tolerance 1e-4.
    expect(Math.abs(rc(0) - 1)).toBeLessThan(1e-4);
    for (const k of [1, 2, 3, 5]) expect(Math.abs(rc(k))).toBeLessThan(1e-4);
    expect(Math.abs(rc(0.5) - RC_HALF_ALPHA035_CLOSED_FORM)).toBeLessThan(1e-4);
  });
});

describe("qpskSymbols(rng, count)", () => {
  it("are (±1 ± j)/√2 with unit energy each, unit mean energy, equally likely (Gray QPSK)", () => {
    const count = 40_000;
    const s = qpskSymbols(new SeededRandom(11), count);
    const quadrants = [0, 0, 0, 0];
    let energy = 0;
    let worst = 0;
    for (let k = 0; k < count; k++) {
      const i = s[2 * k] as number;
      const q = s[2 * k + 1] as number;
      worst = Math.max(worst, Math.abs(Math.abs(i) - Math.SQRT1_2), Math.abs(Math.abs(q) - Math.SQRT1_2));
      energy += i * i + q * q;
      (quadrants as number[])[(i < 0 ? 2 : 0) + (q < 0 ? 1 : 0)]++;
    }
    expect(worst).toBeLessThan(1e-15);
    expect(energy / count).toBeCloseTo(1, 12);
    // Binomial spread of a quadrant count: sqrt(N·¼·¾) ≈ 87; allow 4σ.
    for (const c of quadrants) expect(Math.abs(c - count / 4)).toBeLessThan(4 * Math.sqrt(count * 0.25 * 0.75));
  });
});

describe("rrcPsk(symbols, start, count, options)", () => {
  const options = { symbolRateBd: 1000, sampleRateHz: 8000, rollOff: 0.35, spanSymbols: 8 };

  it("has mean energy per symbol E|s|² = 1: Σ|x|²/(N·sps) = 1 (zero ISI of RRC ⋆ RRC, Proakis)", () => {
    // Over the whole signal (tails included) Σ|x|² = Σ_k Σ_l s_k s_l* ·sps·RC(k − l) = N·sps for
    // |s_k| = 1, because the raised cosine vanishes at non-zero integer lags and the band-limited
    // product is summed exactly at 8 samples/symbol. Truncation to ±8 symbols changes the pulse
    // energy by ~1e-4 and leaves an ISI of order 1e-3 whose cross terms average out: tolerance 1e-3.
    const n = 5000;
    const symbols = qpskSymbols(new SeededRandom(5), n);
    const samples = (n + 2 * 8) * 8;
    const x = rrcPsk(symbols, 0, samples, { ...options, firstSymbolS: 8 / 1000 });
    expect(Math.abs(meanPower(x) * samples / (n * 8) - 1)).toBeLessThan(1e-3);
  });

  it("through the matched filter, sampled at the symbol centres, gives back the symbols", () => {
    // Matched filter: y_k = (1/sps)·Σ_n x[n]·p(n/sps − k) (discrete version of the RRC
    // autocorrelation); zero ISI up to truncation, so |y_k − s_k| < 0.01 (ISI of a ±8-symbol
    // truncated RRC pair is of order 1e-3, see above).
    const n = 200;
    const symbols = qpskSymbols(new SeededRandom(9), n);
    const x = rrcPsk(symbols, 0, n * 8, options);
    for (let k = 10; k < n - 10; k++) {
      let i = 0;
      let q = 0;
      for (let m = (k - 8) * 8; m <= (k + 8) * 8; m++) {
        const p = rrcPulse(m / 8 - k, 0.35);
        i += (x[2 * m] as number) * p;
        q += (x[2 * m + 1] as number) * p;
      }
      expect(Math.abs(i / 8 - (symbols[2 * k] as number))).toBeLessThan(0.01);
      expect(Math.abs(q / 8 - (symbols[2 * k + 1] as number))).toBeLessThan(0.01);
    }
  });

  it("is a function of the sample index: two blocks equal one call", () => {
    const symbols = qpskSymbols(new SeededRandom(3), 100);
    const whole = rrcPsk(symbols, 0, 700, { ...options, sampleRateHz: 7300 });
    const a = rrcPsk(symbols, 0, 333, { ...options, sampleRateHz: 7300 });
    const b = rrcPsk(symbols, 333, 367, { ...options, sampleRateHz: 7300 });
    expect([...a, ...b]).toEqual([...whole]);
  });
});
