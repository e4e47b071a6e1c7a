// xDbBandwidth(psd, { reference }): the 0 dB reference of an x-dB bandwidth. ITU-R SM.443-4
// Annex 2 defines it as x dB below the maximum of the spectrum (REFERENCES.md §3, status V);
// "peak-hold" takes the maximum of the max-hold spectrum over the Welch segments and finds the
// edges on that trace, "average" those of the mean PSD.
import { describe, expect, it } from "vitest";
import { transformInPlace, WelchAccumulator, type WelchPsd } from "../../src/dsp/index.js";
import { occupiedBandwidth, xDbBandwidth } from "../../src/measure/index.js";
import { complexNoise, fmFromAudio, SeededRandom, speechLikeAudio } from "../../src/scenario/index.js";

function welch(x: Float32Array, fs: number, fftLength: number): WelchPsd {
  const w = new WelchAccumulator({ fftLength, sampleRateHz: fs });
  w.push(x, 0);
  return w.finish();
}

/** Complex white noise of unit variance, band-limited to |f| ≤ halfWidthHz by zeroing FFT bins of the whole record (an ideal brick wall). */
function bandLimitedNoise(n: number, fs: number, halfWidthHz: number, seed: number): Float32Array {
  const x = new Float64Array(2 * n);
  complexNoise(new SeededRandom(seed), x, 1);
  transformInPlace(x, "forward");
  for (let k = 0; k < n; k++) {
    const f = (k < n / 2 ? k : k - n) * (fs / n);
    if (Math.abs(f) > halfWidthHz) { x[2 * k] = 0; x[2 * k + 1] = 0; }
  }
  transformInPlace(x, "inverse");
  return Float32Array.from(x);
}

describe("xDbBandwidth(psd, { reference }) of flat band-limited noise", () => {
  // Closed form: a brick-wall band of ±5 kHz is flat inside and falls to nothing outside, so the
  // 26 dB points on either trace are the band edges (REFERENCES.md §3 synthetic brick-wall check,
  // "definition"). The window smears the wall over its main lobe: Hann ±2 bins, and the 26 dB
  // point of a flat band convolved with the Hann kernel lies within one bin outside the edge
  // (Harris 1978, Hann main lobe), so the tolerance is 2 bins (2 × 11.7 Hz) each side.
  const fs = 48_000;
  const psd = welch(bandLimitedNoise(1 << 18, fs, 5000, 3), fs, 4096);
  for (const reference of ["average", "peak-hold"] as const) {
    it(`puts the ${reference} 26 dB edges at the band edges ±5 kHz within 2 bins`, () => {
      const r = xDbBandwidth(psd, { lowerHz: -10_000, upperHz: 10_000, xDb: 26, reference });
      expect(r.reference).toBe(reference);
      expect(Math.abs((r.lowerEdgeHz.value as number) + 5000)).toBeLessThan(2 * psd.binWidthHz);
      expect(Math.abs((r.upperEdgeHz.value as number) - 5000)).toBeLessThan(2 * psd.binWidthHz);
      expect(r.bandwidthHz.method).toMatch(reference === "peak-hold" ? /max-hold/ : /mean \(Welch\) PSD/);
    });
  }
});

describe("xDbBandwidth(psd, { reference }) of FM speech", () => {
  // Speech-like audio (src/scenario/audio.ts, partials 443–2419 Hz) at 4.5 kHz peak deviation, with
  // a noise floor 60 dB under the carrier. The mean PSD's maximum is the carrier line, which holds
  // most of the power while the speech is quiet, so its 26 dB points sit well inside the 99 % OBW.
  // The max-hold reaches where the deviation took the carrier: its 26 dB bandwidth is at least
  // 0.8 × the 99 % OBW, and no wider than Carson's rule 2(D + M) = 2(4500 + 3000) = 15 kHz
  // (REFERENCES.md §2, Carson's rule, V; M = 3 kHz the speech band's top).
  const fs = 48_000;
  const n = 4 * fs;
  const x = Float32Array.from(fmFromAudio(speechLikeAudio(0, n, fs), fs, 4500).iq);
  const noise = new Float32Array(2 * n);
  complexNoise(new SeededRandom(11), noise, 1e-6);
  for (let i = 0; i < x.length; i++) x[i] = (x[i] as number) + (noise[i] as number);
  const psd = welch(x, fs, 4096);
  const range = { lowerHz: -12_000, upperHz: 12_000, xDb: 26 };
  const obw = occupiedBandwidth(psd, { lowerHz: range.lowerHz, upperHz: range.upperHz, noiseFloorPerHz: 1e-6 / fs }).occupiedHz.value as number;
  const peak = xDbBandwidth(psd, { ...range, reference: "peak-hold" }).bandwidthHz.value as number;
  const average = xDbBandwidth(psd, { ...range, reference: "average" }).bandwidthHz.value as number;

  it("gives a peak-hold 26 dB bandwidth between 0.8 × the 99 % OBW and Carson's 2(D + M)", () => {
    expect(peak).toBeGreaterThanOrEqual(0.8 * obw);
    expect(peak).toBeLessThanOrEqual(2 * (4500 + 3000));
  });
  it("gives an average 26 dB bandwidth narrower than the peak-hold one and than the OBW", () => {
    expect(average).toBeLessThan(peak);
    expect(average).toBeLessThan(obw);
  });
});
