import { describe, expect, it } from "vitest";
import { SpectrogramAccumulator, type Spectrogram } from "../../src/dsp/index.js";
import { complexNoise, SeededRandom } from "../../src/scenario/index.js";
import { complexTone, FFT_IMPLEMENTATIONS, maxRelativeDifference, pushBlocks, randomPartition, useFftImplementation } from "./blocks.js";

function spectrogramOf(iq: Float32Array, fftLength: number, rowCount: number, sampleRateHz: number): Spectrogram {
  const acc = new SpectrogramAccumulator({ fftLength, rowCount, totalSamples: iq.length / 2, sampleRateHz });
  acc.push(iq, 0);
  return acc.finish();
}

// Every test runs on both fast-FFT implementations (fastFft.ts): the calibration must not depend on the engine.
describe.each(FFT_IMPLEMENTATIONS)("SpectrogramAccumulator on %s", (implementation) => {
  useFftImplementation(implementation);

  it("keeps the requested row count whatever the span length, and fewer only when frames run out", () => {
    for (const frames of [100, 1000, 12_345]) {
      const acc = new SpectrogramAccumulator({ fftLength: 64, rowCount: 50, totalSamples: frames * 64 + 13, sampleRateHz: 1 });
      expect(acc.rowCount).toBe(50);
      expect(acc.frameCount).toBe(frames);
    }
    expect(new SpectrogramAccumulator({ fftLength: 64, rowCount: 50, totalSamples: 64 * 20, sampleRateHz: 1 }).rowCount).toBe(20);
  });

  it("gives row r the frames k with floor(k·R/F) = r: counts, times and coverage follow from that rule", () => {
    const fs = 1000;
    const s = spectrogramOf(new Float32Array(2 * 16 * 100), 16, 7, fs);
    // Hand count for F = 100, R = 7: rows hold 15,14,14,15,14,14,14 frames (ceil(rF/R) boundaries 0,15,29,43,58,72,86,100).
    expect(Array.from(s.framesPerRow)).toEqual([15, 14, 14, 15, 14, 14, 14]);
    const frameS = 16 / fs;
    const bounds = [0, 15, 29, 43, 58, 72, 86, 100];
    for (let r = 0; r < 7; r++) {
      expect(s.rowStartS[r]).toBeCloseTo((bounds[r] as number) * frameS, 12);
      expect(s.rowStopS[r]).toBeCloseTo((bounds[r + 1] as number) * frameS, 12);
    }
  });

  it("a tone switched on half-way appears only in the later rows, at A² in spectrum scaling", () => {
    const fs = 64_000;
    const l = 256;
    const frames = 64;
    const iq = new Float32Array(2 * l * frames);
    complexNoise(new SeededRandom(3), iq, 1e-6);
    const tone = complexTone((l * frames) / 2, 0.5, 8000, fs); // 8000 Hz = bin +32 of 250 Hz bins
    for (let i = 0; i < tone.length; i++) iq[iq.length / 2 + i] = (iq[iq.length / 2 + i] as number) + (tone[i] as number);
    const s = spectrogramOf(iq, l, 8, fs);
    const bin = l / 2 + 8000 / s.binWidthHz;
    const enbwHz = 1.5 * s.binWidthHz; // Hann, Harris 1978 Table 1
    for (let r = 0; r < 8; r++) {
      const level = (s.meanPerHz[r * l + bin] as number) * enbwHz;
      // Rows 0-3 hold noise only: density 1e-6/fs, far below the tone's A² = 0.25.
      if (r < 4) expect(level).toBeLessThan(1e-4);
      // On-bin tone: A² exactly in spectrum scaling (REFERENCES §8), float32 output.
      else expect(level).toBeCloseTo(0.25, 4);
    }
  });

  it("white noise rows read σ²/fs (REFERENCES §8), within the spread of their frame count", () => {
    const fs = 1e6;
    const iq = new Float32Array(2 * 128 * 4000);
    complexNoise(new SeededRandom(4), iq, 0.5);
    const s = spectrogramOf(iq, 128, 4, fs);
    for (let r = 0; r < 4; r++) {
      let sum = 0;
      for (let i = 0; i < 128; i++) sum += s.meanPerHz[r * 128 + i] as number;
      // 1000 independent frames × 128 bins per row (half counted as independent for Hann):
      // relative spread 1/√(1000·64) = 0.4 %; 2 % is 5σ.
      expect(Math.abs(sum / 128 / (0.5 / fs) - 1)).toBeLessThan(0.02);
    }
  });

  it("one block, random blocks with prefixes, and two merged accumulators on alternate blocks agree", () => {
    const l = 128;
    const total = 128 * 300 + 77;
    const iq = new Float32Array(2 * total);
    complexNoise(new SeededRandom(9), iq, 1);
    const options = { fftLength: l, rowCount: 13, totalSamples: total, sampleRateHz: 1e5 };
    const one = new SpectrogramAccumulator(options);
    one.push(iq, 0);
    const ref = one.finish();
    const parts = randomPartition(total, 2000, 10);
    const many = new SpectrogramAccumulator(options);
    pushBlocks([many], iq, parts, 4 * l); // prefix P = 4L, as when the Welch FFT is longer
    const a = new SpectrogramAccumulator(options);
    const b = new SpectrogramAccumulator(options);
    pushBlocks([a, b], iq, parts, 4 * l);
    a.merge(structuredClone(b.snapshot()));
    // As pass 1 merges its workers: the released states (no copies) into an accumulator that
    // holds nothing yet, which takes the first one's arrays over.
    const c = new SpectrogramAccumulator(options);
    const d = new SpectrogramAccumulator(options);
    pushBlocks([c, d], iq, parts, 4 * l);
    const merged = new SpectrogramAccumulator(options);
    merged.merge(structuredClone(c.release()));
    merged.merge(structuredClone(d.release()));
    for (const s of [many.finish(), a.finish(), merged.finish()]) {
      expect(Array.from(s.framesPerRow)).toEqual(Array.from(ref.framesPerRow));
      expect(maxRelativeDifference(s.meanPerHz, ref.meanPerHz)).toBeLessThan(1e-6); // float32 output
      expect(maxRelativeDifference(s.maxPerHz, ref.maxPerHz)).toBe(0);
    }
  });

  it("a state of other settings or of the wrong size is refused, also by an accumulator that holds nothing yet", () => {
    const options = { fftLength: 64, rowCount: 4, totalSamples: 64 * 40, sampleRateHz: 1e5 };
    const other = new SpectrogramAccumulator({ ...options, rowCount: 5 });
    expect(() => new SpectrogramAccumulator(options).merge(other.release())).toThrow(RangeError);
    const short = { ...new SpectrogramAccumulator(options).release(), powerSum: new Float32Array(10) };
    expect(() => new SpectrogramAccumulator(options).merge(short)).toThrow(RangeError);
  });
});
