import { describe, expect, it } from "vitest";
import { amFromAudio, fmFromAudio, toneAudio } from "../../src/scenario/index.js";
import { instantaneousFrequencyHz, lineAmplitude, maxOf, meanPower, minOf } from "./lines.js";

// Bessel functions J0..J3 at β = 1 and β = 2: Abramowitz & Stegun Table 9.1, as listed in
// REFERENCES.md §1 (status V / V to 6 d.p.).
const BESSEL_J0_TO_J3_AT_1_AS_TABLE_9_1 = [0.7651976866, 0.4400505857, 0.1149034849, 0.019563354];
const BESSEL_J0_TO_J3_AT_2_AS_TABLE_9_1 = [0.2238907791, 0.5767248078, 0.3528340286, 0.1289432495];

describe("fmFromAudio(audio, fs, deviationHz)", () => {
  const fs = 1_000_000;
  const fmHz = 1000;
  const n = 100_000; // 100 whole periods of the tone

  it("of a tone has instantaneous frequency Δf·cos(2π fm t): peak +Δf and −Δf (closed form)", () => {
    const dev = 5000;
    const { iq } = fmFromAudio(toneAudio(0, n, fs, fmHz), fs, dev);
    const f = instantaneousFrequencyHz(iq, fs);
    // The tone is sampled exactly at its peaks (fs/fm = 1000 samples per period), so the peak
    // instantaneous frequency is Δf to rounding; 1e-6 Hz allows for float64 phase arithmetic.
    expect(maxOf(f)).toBeCloseTo(dev, 6);
    expect(minOf(f)).toBeCloseTo(-dev, 6);
  });

  it.each([
    [1, BESSEL_J0_TO_J3_AT_1_AS_TABLE_9_1],
    [2, BESSEL_J0_TO_J3_AT_2_AS_TABLE_9_1],
  ])("of a tone with β = %d has line amplitudes |J_n(β)| at ±n·fm (Jacobi–Anger, A&S 9.1.41)", (beta, table) => {
    const { iq } = fmFromAudio(toneAudio(0, n, fs, fmHz), fs, beta * fmHz);
    for (let order = 0; order <= 3; order++) {
      const expected = table[order] as number;
      // Summing instead of integrating scales β by (ω/2)/sin(ω/2) = 1 + 1.6e-6 at ω = 2π·1e-3,
      // which moves J_n by < 4e-6; the lines are read over whole periods, so exactly. 1e-5 abs.
      expect(Math.abs(lineAmplitude(iq, fs, order * fmHz).abs - expected)).toBeLessThan(1e-5);
      // J_{−n} = (−1)^n J_n: the lower line has the same magnitude (A&S 9.1.5).
      expect(Math.abs(lineAmplitude(iq, fs, -order * fmHz).abs - expected)).toBeLessThan(1e-5);
    }
  });

  it("is a constant envelope: mean power = amplitude² (definition of angle modulation)", () => {
    const { iq } = fmFromAudio(toneAudio(0, 4800, 48_000, 700), 48_000, 3000, 0, 0.3);
    expect(meanPower(iq)).toBeCloseTo(0.09, 12);
  });

  it("gives the same samples in blocks as in one call when the phase is carried over", () => {
    const audio = toneAudio(0, 3000, 48_000, 1234.5);
    const whole = fmFromAudio(audio, 48_000, 4000).iq;
    const a = fmFromAudio(audio.subarray(0, 1111), 48_000, 4000);
    const b = fmFromAudio(audio.subarray(1111), 48_000, 4000, a.endPhaseRad);
    const joined = [...a.iq, ...b.iq];
    for (let k = 0; k < whole.length; k++) expect(joined[k]).toBeCloseTo(whole[k] as number, 10);
  });
});

describe("amFromAudio(audio, depthPercent, amplitude)", () => {
  const fs = 48_000;
  const fmHz = 1000;
  const n = 48_000; // 1000 whole periods; fs/fm = 48 samples, so the tone peaks are sampled

  it("of a tone at 70 % has envelope A(1 ± m), so (Vmax − Vmin)/(Vmax + Vmin) = m (REFERENCES.md §5)", () => {
    const iq = amFromAudio(toneAudio(0, n, fs, fmHz), 70, 0.5);
    const env = new Float64Array(n);
    for (let k = 0; k < n; k++) env[k] = Math.hypot(iq[2 * k] as number, iq[2 * k + 1] as number);
    const vmax = maxOf(env);
    const vmin = minOf(env);
    expect(vmax).toBeCloseTo(0.5 * 1.7, 12);
    expect(vmin).toBeCloseTo(0.5 * 0.3, 12);
    expect((vmax - vmin) / (vmax + vmin)).toBeCloseTo(0.7, 12);
  });

  it("of a tone at 50 % has sidebands at −12.04 dBc and mean power A²(1 + m²/2) (REFERENCES.md §5)", () => {
    const a = 0.4;
    const iq = amFromAudio(toneAudio(0, n, fs, fmHz), 50, a);
    const carrier = lineAmplitude(iq, fs, 0).abs;
    const upper = lineAmplitude(iq, fs, fmHz).abs;
    const lower = lineAmplitude(iq, fs, -fmHz).abs;
    // REFERENCES.md §5 gives −12.04 dB to two decimals: ±0.005 dB.
    expect(Math.abs(20 * Math.log10(upper / carrier) - -12.04)).toBeLessThan(0.005);
    expect(Math.abs(20 * Math.log10(lower / carrier) - -12.04)).toBeLessThan(0.005);
    expect(meanPower(iq)).toBeCloseTo(a * a * (1 + 0.25 / 2), 12);
  });
});
