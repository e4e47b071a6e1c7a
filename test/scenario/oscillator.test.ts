import { describe, expect, it } from "vitest";
import { complexNoise, frequencyShift, SeededRandom, tone } from "../../src/scenario/index.js";
import { lineAmplitude, meanPower } from "./lines.js";

describe("tone(count, fs, offsetHz, options)", () => {
  it("is A·exp(j(2πfn/fs + φ0)): one line of amplitude A and phase φ0 at f, power A² (definition)", () => {
    const x = tone(48_000, 48_000, 1250, { amplitude: 0.3, phaseRad: 0.7 });
    // 1250 whole periods in 1 s, so the correlation reads the line exactly (to rounding).
    const line = lineAmplitude(x, 48_000, 1250);
    expect(line.abs).toBeCloseTo(0.3, 12);
    expect(Math.atan2(line.im, line.re)).toBeCloseTo(0.7, 10);
    expect(lineAmplitude(x, 48_000, -1250).abs).toBeLessThan(1e-12);
    expect(meanPower(x)).toBeCloseTo(0.09, 12);
  });

  it("continues across blocks: startSample = k gives samples k… of the whole", () => {
    const whole = tone(1000, 9000, 1234.567);
    const tail = tone(400, 9000, 1234.567, { startSample: 600 });
    for (let k = 0; k < tail.length; k++) expect(tail[k]).toBeCloseTo(whole[1200 + k] as number, 12);
  });
});

describe("frequencyShift(iq, fs, offsetHz, startSample)", () => {
  it("moves a tone at f1 to f1 + f2 (exp(ja)·exp(jb) = exp(j(a + b)))", () => {
    const shifted = frequencyShift(tone(5000, 50_000, 1100), 50_000, -3300, 0);
    const direct = tone(5000, 50_000, -2200);
    for (let k = 0; k < direct.length; k++) expect(shifted[k]).toBeCloseTo(direct[k] as number, 11);
  });
});

describe("complexNoise(rng, out, variance)", () => {
  it("has E|z|² = variance, I and Q each variance/2, uncorrelated (circular Gaussian)", () => {
    const n = 200_000;
    const variance = 0.01;
    const z = new Float64Array(2 * n);
    complexNoise(new SeededRandom(42), z, variance);
    let pi = 0;
    let pq = 0;
    let iq = 0;
    for (let k = 0; k < n; k++) {
      const i = z[2 * k] as number;
      const q = z[2 * k + 1] as number;
      pi += i * i;
      pq += q * q;
      iq += i * q;
    }
    // |z|² is exponential (std = mean): the mean over n has relative spread 1/√n; a component's
    // sample variance has relative spread √(2/n); E[IQ] has spread (variance/2)/√n. All 4σ.
    expect(Math.abs((pi + pq) / n / variance - 1)).toBeLessThan(4 / Math.sqrt(n));
    expect(Math.abs(pi / n / (variance / 2) - 1)).toBeLessThan(4 * Math.sqrt(2 / n));
    expect(Math.abs(pq / n / (variance / 2) - 1)).toBeLessThan(4 * Math.sqrt(2 / n));
    expect(Math.abs(iq / n)).toBeLessThan((4 * (variance / 2)) / Math.sqrt(n));
  });
});
