import { describe, expect, it } from "vitest";
import { binFrequencyHz, WelchAccumulator, type WelchPsd } from "../../src/dsp/index.js";
import { complexNoise, SeededRandom } from "../../src/scenario/index.js";
import { complexTone, FFT_IMPLEMENTATIONS, maxRelativeDifference, pushBlocks, randomPartition, useFftImplementation } from "./blocks.js";

function noise(n: number, variance: number, seed: number): Float32Array {
  const iq = new Float32Array(2 * n);
  complexNoise(new SeededRandom(seed), iq, variance);
  return iq;
}

function welchOf(iq: Float32Array, options: ConstructorParameters<typeof WelchAccumulator>[0]): WelchPsd {
  const acc = new WelchAccumulator(options);
  acc.push(iq, 0);
  return acc.finish();
}

function peakIndex(values: Float64Array): number {
  let best = 0;
  for (let i = 1; i < values.length; i++) if ((values[i] as number) > (values[best] as number)) best = i;
  return best;
}

// scipy 1.17.1 scipy.signal.welch(z, fs=1000, nperseg=16, detrend=False, return_onesided=False,
// scaling="density"), fftshift-ed, for z[n] = cos(0.3n²) + 0.5j·sin(0.7n) + 0.25·e^(j2π·3n/16),
// n = 0..63, each component rounded to float32 (another package's output).
const SCIPY_WELCH_HANN_NOVERLAP8 = [
  0.0004694364826820105, 0.0004976344910934079, 0.00040119953712884626, 0.0005134636012212546,
  0.0006348812294940589, 0.000331238833643196, 0.001197598311235069, 0.000782812426114538,
  0.0004362814214127808, 0.0005851857944064551, 0.0011109133331839809, 0.001718541336001248,
  0.0009172898383749071, 0.0005154677759563618, 0.0004020285380580972, 0.0004969807199160373,
];
const SCIPY_WELCH_BLACKMANHARRIS_NOVERLAP4 = [
  0.0001099459547034172, 0.00016448198559266143, 0.00030556503306782186, 0.0005294974889175217,
  0.0005803995890135948, 0.0009422223868360662, 0.0016067822707831927, 0.0013052894145735106,
  0.0008318016917945056, 0.0007456236893305029, 0.000765480777976601, 0.0008411287311108524,
  0.000580713041533704, 0.0004719061732267665, 0.0003032339816631503, 0.00016448012419249835,
];

// Every test runs on both fast-FFT implementations (fastFft.ts): the calibration must not depend on the engine.
describe.each(FFT_IMPLEMENTATIONS)("WelchAccumulator on %s", (implementation) => {
  useFftImplementation(implementation);

  it("matches scipy.signal.welch (density, two-sided) for Hann/50 % and Blackman-Harris/25 %", () => {
    const n = 64;
    const iq = new Float32Array(2 * n);
    for (let k = 0; k < n; k++) {
      iq[2 * k] = Math.cos(0.3 * k * k) + 0.25 * Math.cos((2 * Math.PI * 3 * k) / 16);
      iq[2 * k + 1] = 0.5 * Math.sin(0.7 * k) + 0.25 * Math.sin((2 * Math.PI * 3 * k) / 16);
    }
    const hann = welchOf(iq, { fftLength: 16, sampleRateHz: 1000 });
    expect(hann.segmentCount).toBe(7);
    // 1e-6 relative: float32 rounding of the two sides' signal construction, not of the PSD.
    expect(maxRelativeDifference(hann.densityPerHz, SCIPY_WELCH_HANN_NOVERLAP8)).toBeLessThan(1e-6);
    const bh = welchOf(iq, { fftLength: 16, overlapLength: 4, window: "blackman-harris", sampleRateHz: 1000 });
    expect(maxRelativeDifference(bh.densityPerHz, SCIPY_WELCH_BLACKMANHARRIS_NOVERLAP4)).toBeLessThan(1e-6);
  });

  it("complex white noise of variance σ² = 2 at 48 kHz has density σ²/fs = 4.167e-5 /Hz (REFERENCES §8)", () => {
    const fs = 48_000;
    const psd = welchOf(noise(256 * 1000, 2, 11), { fftLength: 256, sampleRateHz: fs });
    const expected = 2 / fs;
    const m = psd.segmentCount;
    expect(m).toBe(1999);
    // Per bin, the mean of M Hann/50 % periodograms has relative standard deviation
    // √(1.056/M) = 0.023 (Welch 1967 variance with overlap correlation 1/6). Each bin: 5σ.
    const sigma = Math.sqrt(1.056 / m);
    let sum = 0;
    for (const v of psd.densityPerHz) {
      expect(Math.abs(v / expected - 1)).toBeLessThan(5 * sigma);
      sum += v;
    }
    // Band average over 256 bins, counting only half as independent (Hann couples neighbours):
    // σ/√128 = 0.002; 1 % is 5σ.
    expect(Math.abs(sum / 256 / expected - 1)).toBeLessThan(0.01);
  });

  it("integrating the PSD gives the time-domain mean power (Parseval; Heinzel et al. 2002 §9)", () => {
    const rng = new SeededRandom(5);
    const iq = noise(4096 * 8, 0.3, 6);
    for (let i = 0; i < iq.length; i++) iq[i] = (iq[i] as number) + 0.2 * rng.uniform();
    let power = 0;
    for (let i = 0; i < iq.length; i++) power += (iq[i] as number) ** 2;
    power /= iq.length / 2;
    // Rectangular, no overlap: exact identity Σ_k P[k]·fs/N = (1/M)Σ_m (1/N)Σ_n |z|², to the
    // rounding of the float32 transform (relative ~2^−24·√(log2 N) a bin, averaging down over
    // 4096 bins and 8 frames): 5e-7 is far above it and far below any scaling error.
    const rect = welchOf(iq, { fftLength: 4096, overlapLength: 0, window: "rectangular", sampleRateHz: 1e6 });
    const integrated = rect.densityPerHz.reduce((a, v) => a + v, 0) * rect.binWidthHz;
    expect(integrated / power).toBeCloseTo(1, 6);
    // Hann, 50 %: the estimate is a w²-weighted mean of |z|² over the 32 768 samples, which for
    // Gaussian noise (|z|² of relative spread 1) has a spread of about 1/√(2·10⁴) = 0.7 %; 2 % is 3σ.
    const hann = welchOf(iq, { fftLength: 4096, sampleRateHz: 1e6 });
    const integratedHann = hann.densityPerHz.reduce((a, v) => a + v, 0) * hann.binWidthHz;
    expect(Math.abs(integratedHann / power - 1)).toBeLessThan(0.02);
  });

  for (const window of ["hann", "blackman-harris", "rectangular"] as const) {
    it(`an on-bin complex tone of amplitude A reads A² in spectrum scaling, density × ENBW (${window}; REFERENCES §8)`, () => {
      const fs = 8192;
      const psd = welchOf(complexTone(8192, 0.5, 1000, fs), { fftLength: 1024, window, sampleRateHz: fs });
      const i = peakIndex(psd.densityPerHz);
      expect(binFrequencyHz(psd, i)).toBe(1000);
      // Exact for an on-bin tone: |X|² = A²(Σw)², spectrum = density·fs·Σw²/(Σw)² = density·ENBW(Hz).
      expect((psd.densityPerHz[i] as number) * psd.enbwHz).toBeCloseTo(0.25, 6);
      expect((psd.maxHoldPerHz[i] as number) * psd.enbwHz).toBeCloseTo(0.25, 6);
    });
  }

  for (const f0 of [1234.5, -7777.7, 20_001]) {
    it(`a complex tone at ${f0} Hz peaks within half a bin of its frequency`, () => {
      const fs = 48_000;
      const psd = welchOf(complexTone(16_384, 1, f0, fs, 0.3), { fftLength: 1024, sampleRateHz: fs });
      expect(Math.abs(binFrequencyHz(psd, peakIndex(psd.densityPerHz)) - f0)).toBeLessThanOrEqual(psd.binWidthHz / 2);
    });
  }

  it("max hold keeps a tone present in 1 of 8 segments at A², the mean at A²/8 (closed form)", () => {
    const fs = 4096;
    const iq = new Float32Array(2 * 4096 * 8);
    iq.set(complexTone(4096, 1, 256, fs), 2 * 4096 * 3);
    const psd = welchOf(iq, { fftLength: 4096, overlapLength: 0, window: "rectangular", sampleRateHz: fs });
    const i = peakIndex(psd.maxHoldPerHz);
    expect(binFrequencyHz(psd, i)).toBe(256);
    expect((psd.maxHoldPerHz[i] as number) * psd.enbwHz).toBeCloseTo(1, 6);
    expect((psd.densityPerHz[i] as number) * psd.enbwHz).toBeCloseTo(1 / 8, 6);
  });

  it("one block, random blocks with prefixes, and two merged accumulators on alternate blocks agree", () => {
    const options = { fftLength: 512, sampleRateHz: 2e6 } as const;
    const total = 40_000;
    const iq = noise(total, 1, 21);
    const one = welchOf(iq, options);
    expect(one.segmentCount).toBe(Math.floor((total - 512) / 256) + 1);
    const parts = randomPartition(total, 3000, 22);
    const many = new WelchAccumulator(options);
    pushBlocks([many], iq, parts, 1024); // prefix P = 2L, as when a longer FFT shares the blocks
    const a = new WelchAccumulator(options);
    const b = new WelchAccumulator(options);
    pushBlocks([a, b], iq, parts, 1024);
    a.merge(structuredClone(b.snapshot()));
    for (const psd of [many.finish(), a.finish()]) {
      expect(psd.segmentCount).toBe(one.segmentCount);
      expect(maxRelativeDifference(psd.densityPerHz, one.densityPerHz)).toBeLessThan(1e-12);
      expect(maxRelativeDifference(psd.maxHoldPerHz, one.maxHoldPerHz)).toBe(0);
    }
  });

  it("refuses a bad overlap or rate, and a state of other settings", () => {
    expect(() => new WelchAccumulator({ fftLength: 256, overlapLength: 256, sampleRateHz: 1 })).toThrow(/overlapLength 256/);
    expect(() => new WelchAccumulator({ fftLength: 256, sampleRateHz: 0 })).toThrow(/sampleRateHz 0/);
    const a = new WelchAccumulator({ fftLength: 256, sampleRateHz: 1 });
    const b = new WelchAccumulator({ fftLength: 256, window: "rectangular", sampleRateHz: 1 });
    expect(() => a.merge(b.snapshot())).toThrow(RangeError);
  });
});
