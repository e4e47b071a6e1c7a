// SpectrumHoldAccumulator: the resolution bandwidth of its Hann frame, spectrum scaling, and
// the block contract of frameGrid.ts.
import { describe, expect, it } from "vitest";
import { SpectrumHoldAccumulator, holdFrameLength, wholeFrameCount, frameGrid } from "../../src/dsp/index.js";
import { complexNoise, SeededRandom } from "../../src/scenario/index.js";
import { complexTone, FFT_IMPLEMENTATIONS, maxRelativeDifference, pushBlocks, randomPartition, useFftImplementation } from "./blocks.js";

// Every test runs on both fast-FFT implementations (fastFft.ts): the calibration must not depend on the engine.
describe.each(FFT_IMPLEMENTATIONS)("SpectrumHoldAccumulator(options) on %s", (implementation) => {
  useFftImplementation(implementation);

  it("has ENBW 1.5·fs/L for Hann frames of holdFrameLength(RBW) (Harris 1978 Table 1: Hann ENBW 1.50 bins)", () => {
    const l = holdFrameLength(300, 48_000);
    expect(l).toBe(240);
    const h = new SpectrumHoldAccumulator({ frameLength: l, sampleRateHz: 48_000 }).finish();
    expect(h.resolutionHz).toBeCloseTo(300, 9);
    expect(h.fftLength).toBe(256);
  });

  it("reads an on-bin complex tone of amplitude A as A² in max hold and average, and white noise as density × ENBW (REFERENCES.md §8)", () => {
    const fs = 32_000;
    const n = 200_000;
    const iq = complexTone(n, 0.5, 20 * (fs / 256), fs);
    const acc = new SpectrumHoldAccumulator({ frameLength: 160, sampleRateHz: fs });
    acc.push(iq, 0);
    const h = acc.finish();
    const k = 128 + 20;
    expect(Math.abs(10 * Math.log10((h.maxHoldFs2[k] as number) / 0.25))).toBeLessThan(0.05);
    expect(Math.abs(10 * Math.log10((h.averageFs2[k] as number) / 0.25))).toBeLessThan(0.05);
    const noise = new Float32Array(2 * n);
    complexNoise(new SeededRandom(2), noise, 1);
    const accN = new SpectrumHoldAccumulator({ frameLength: 160, sampleRateHz: fs });
    accN.push(noise, 0);
    const hn = accN.finish();
    let mean = 0;
    for (const v of hn.averageFs2) mean += v;
    mean /= hn.fftLength;
    // Density σ²/fs times ENBW 1.5·fs/L = 1.5/L·σ²; the mean over 256 bins and 2499 frames is
    // within 1 % (spread per bin √(1.33/2499) = 2.3 %, over 256 bins about 0.2 %).
    expect(mean / ((1.5 / 160) * 1)).toBeGreaterThan(0.99);
    expect(mean / ((1.5 / 160) * 1)).toBeLessThan(1.01);
  });

  it("keeps the highest per-frame power within ±bandHz/2: a tone of amplitude A reads A² (Parseval over the frame), a louder frame-long burst is the maximum, a tone outside the band does not count", () => {
    const fs = 32_000;
    const n = 64_000;
    const l = 160;
    // Amplitude 0.5 at 1.3 kHz (off-bin), a burst of amplitude 1 over samples 40 000–41 600 (10 frames), a 0.9 tone at 9 kHz outside a 6 kHz band.
    const iq = complexTone(n, 0.5, 1300, fs);
    const loud = complexTone(n, 0.5, 1300, fs);
    const outside = complexTone(n, 0.9, 9000, fs);
    for (let k = 0; k < n; k++) {
      const burst = k >= 40_000 && k < 41_600 ? 2 : 1;
      iq[2 * k] = (loud[2 * k] as number) * burst + (outside[2 * k] as number);
      iq[2 * k + 1] = (loud[2 * k + 1] as number) * burst + (outside[2 * k + 1] as number);
    }
    const acc = new SpectrumHoldAccumulator({ frameLength: l, sampleRateHz: fs, bandHz: 6000 });
    acc.push(iq, 0);
    const h = acc.finish();
    // Σ_k |X_k|²/(N·Σw²) = Σ|x·w|²/Σw² = A² for a complex tone (Parseval; REFERENCES.md §8 spectrum scaling);
    // the Hann leakage of the 9 kHz tone 6 kHz away (over 30 bins at fs/L) into the band is below −100 dB.
    expect(Math.abs(10 * Math.log10(h.bandPeakFs2 / 1))).toBeLessThan(0.05);
    const startS = (h.bandPeakFrame * h.hopLength) / fs;
    expect(startS).toBeGreaterThanOrEqual(40_000 / fs);
    expect(startS + l / fs).toBeLessThanOrEqual(41_600 / fs);
    const quiet = new SpectrumHoldAccumulator({ frameLength: l, sampleRateHz: fs, bandHz: 6000 });
    quiet.push(iq.subarray(0, 2 * 30_000), 0);
    expect(Math.abs(10 * Math.log10(quiet.finish().bandPeakFs2 / 0.25))).toBeLessThan(0.05);
    expect(() => new SpectrumHoldAccumulator({ frameLength: l, sampleRateHz: fs, bandHz: -1 })).toThrow(RangeError);
  });

  it("gives the same spectra and maxima's frames whatever the blocks (block contract, frameGrid.ts)", () => {
    const fs = 8000;
    const n = 30_000;
    const iq = new Float32Array(2 * n);
    complexNoise(new SeededRandom(4), iq, 1);
    const whole = new SpectrumHoldAccumulator({ frameLength: 100, sampleRateHz: fs });
    whole.push(iq, 0);
    const parts = new SpectrumHoldAccumulator({ frameLength: 100, sampleRateHz: fs });
    pushBlocks([parts], iq, randomPartition(n, 900, 3), 100);
    const a = whole.finish();
    const b = parts.finish();
    expect(b.frameCount).toBe(wholeFrameCount(frameGrid(100, 50), n));
    expect(a.frameCount).toBe(b.frameCount);
    expect(maxRelativeDifference(a.maxHoldFs2, b.maxHoldFs2)).toBeLessThan(1e-12);
    expect(maxRelativeDifference(a.averageFs2, b.averageFs2)).toBeLessThan(1e-12);
    expect(Array.from(b.maxFrame)).toEqual(Array.from(a.maxFrame));
  });
});
