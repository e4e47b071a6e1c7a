// The whole-span stage: one read of a long span through the channel, every sample measured,
// memory fixed. The recordings are generated block by block in memory (never written to disk).
import { describe, expect, it } from "vitest";
import type { CaptureMeta, CaptureSource, SampleSpan } from "../../src/capture/index.js";
import { wholeSpanFigures, type HoldSpectra, type WholeSpanFigures, type WholeSpanOptions } from "../../src/analysis/index.js";
import { SeededRandom } from "../../src/scenario/index.js";

/** Fills `out` (interleaved I,Q) with samples n0 … n0 + out.length/2 − 1; called in order. */
type Generator = (n0: number, out: Float32Array) => void;

/** A CaptureSource whose samples are made on the fly, one reused block at a time. */
function generatedSource(sampleRateHz: number, fileSamples: number, generate: Generator): CaptureSource {
  const meta: CaptureMeta = {
    path: "generated.cf32", dataPath: "generated.cf32", container: "raw", format: "cf32_le", complex: true,
    sampleRateHz, centerHz: null, ppm: 0, datetime: null, fileSamples, frameBytes: 8, dataOffsetBytes: 0,
    fileBytes: 8 * fileSamples, trailingBytes: 0, swapIq: false,
    origin: { format: "flag", sampleRateHz: "flag", centerHz: "unknown" }, warnings: [], sigmf: null,
  };
  return {
    meta,
    async *blocks(span: SampleSpan, blockSamples = 65_536) {
      const buffer = new Float32Array(2 * blockSamples);
      for (let s = 0; s < span.sampleCount; s += blockSamples) {
        const n = Math.min(blockSamples, span.sampleCount - s);
        const block = buffer.subarray(0, 2 * n);
        generate(span.startSample + s, block);
        yield block;
      }
    },
    close: async () => {},
  };
}

/** The spectra of a run (kept by default). */
function holdOf(r: WholeSpanFigures): HoldSpectra {
  if (r.hold === null) throw new Error("the run kept no spectra");
  return r.hold;
}

async function run(fs: number, samples: number, generate: Generator, options: WholeSpanOptions): Promise<WholeSpanFigures> {
  const source = generatedSource(fs, samples, generate);
  return wholeSpanFigures(source, { startSample: 0, sampleCount: samples }, options);
}

/**
 * Tone FM at 48 kS/s: modulating tone 1 kHz (exactly 48 samples a period), deviation 2.5 kHz,
 * rising to 3.4 kHz over the word [start, start + length): raised-cosine ramps of RAMP samples
 * (20 ms) at each end, like a word's onset and decay, so that the deviation's envelope stays
 * within a few tens of hertz of the tone and inside the audio passband; plus a spur at `spur.hz`
 * over [spur.start, spur.end). The phase advances by 2π·f_i[k]/fs a sample, so the
 * discriminator reads f_i[k] exactly.
 */
function toneFm(fs: number, word: { start: number; length: number }, spur: { hz: number; amplitude: number; start: number; end: number }): Generator {
  const period = 48;
  const cosTable = new Float64Array(period);
  for (let k = 0; k < period; k++) cosTable[k] = Math.cos((2 * Math.PI * k) / period);
  let phase = 0;
  let spurPhase = 0;
  const spurStep = (2 * Math.PI * spur.hz) / fs;
  const twoPi = 2 * Math.PI;
  return (n0, out) => {
    const n = out.length >> 1;
    for (let i = 0; i < n; i++) {
      const k = n0 + i;
      let re = Math.cos(phase);
      let im = Math.sin(phase);
      if (k >= spur.start && k < spur.end) {
        re += spur.amplitude * Math.cos(spurPhase);
        im += spur.amplitude * Math.sin(spurPhase);
      }
      out[2 * i] = re;
      out[2 * i + 1] = im;
      const dev = 2500 + 900 * wordEnvelope(k - word.start, word.length);
      phase += (twoPi * dev * (cosTable[k % period] as number)) / fs;
      if (phase > Math.PI) phase -= twoPi;
      else if (phase < -Math.PI) phase += twoPi;
      spurPhase = (spurStep * (k + 1)) % twoPi;
    }
  };
}

const RAMP = 960;

/** 0 outside [0, length), raised-cosine ramps of RAMP samples at both ends, 1 between. */
function wordEnvelope(k: number, length: number): number {
  if (k < 0 || k >= length) return 0;
  const edge = Math.min(k, length - 1 - k);
  return edge >= RAMP ? 1 : 0.5 - 0.5 * Math.cos((Math.PI * edge) / RAMP);
}

/** A complex tone A·e^(j2πfn/fs) plus complex white noise of variance `noiseVariance`. */
function toneInNoise(fs: number, toneHz: number, amplitude: number, noiseVariance: number, seed: number): Generator {
  const rng = new SeededRandom(seed);
  const s = Math.sqrt(noiseVariance / 2);
  const step = (2 * Math.PI * toneHz) / fs;
  return (n0, out) => {
    const n = out.length >> 1;
    for (let i = 0; i < n; i++) {
      // The phase from the sample number (reduced mod the tone's period where exact), not accumulated.
      const phase = (step * (n0 + i)) % (2 * Math.PI);
      out[2 * i] = amplitude * Math.cos(phase) + (s > 0 ? s * rng.gaussian() : 0);
      out[2 * i + 1] = amplitude * Math.sin(phase) + (s > 0 ? s * rng.gaussian() : 0);
    }
  };
}

/** Index of the bin nearest `hz` on a centred grid. */
function binAt(frequencyHz: Float64Array, hz: number): number {
  let best = 0;
  for (let i = 0; i < frequencyHz.length; i++) if (Math.abs((frequencyHz[i] as number) - hz) < Math.abs((frequencyHz[best] as number) - hz)) best = i;
  return best;
}

const db = (p: number): number => 10 * Math.log10(p);

describe("wholeSpanFigures(source, span, options)", () => {
  // A 10-minute FM recording at 48 kS/s (28.8 M samples), one over-deviating word at minute 9
  // and a spur for one second in minute 5.
  const fs = 48_000;
  const tenMinutes = 600 * fs;
  const wordStart = 540 * fs + 12; // a zero of cos(2π·1 kHz·t): 12 samples = a quarter period
  const wordLength = 14_400; // 0.3 s = 300 periods
  const spur = { hz: -9000, amplitude: 0.01, start: 300 * fs, end: 301 * fs };
  const fmOptions: WholeSpanOptions = { offsetHz: 0, bandwidthHz: 25_000 };
  let fm: WholeSpanFigures;

  it("reads the whole 10-minute span in one streaming pass", async () => {
    fm = await run(fs, tenMinutes, toneFm(fs, { start: wordStart, length: wordLength }, spur), fmOptions);
    // Everything after the extractor's start-up transient is measured: 600 s less a few samples.
    expect(fm.durationS).toBeGreaterThan(599.99);
    expect(fm.sampleRateHz).toBe(fs);
  }, 300_000);

  it("finds the 3.4 kHz word at minute 9 on both sides, at its time (tone FM: f_i − f_c = Δf·cos, peak exactly Δf)", () => {
    // The full 3.4 kHz holds between the ramps.
    const w0 = (wordStart + RAMP) / fs;
    const w1 = (wordStart + wordLength - RAMP) / fs;
    for (const peak of [fm.positivePeak, fm.negativePeak]) {
      // Theory: the discriminator reads Δf·cos(2πk/48), whose crest is sampled (k ≡ 0 mod 48),
      // so the unfiltered peak is Δf exactly; the tone and its slow envelope lie in the passband.
      // Tolerance 0.2 % (6.8 Hz): the audio low-pass's passband ripple ±0.1 % (Kaiser,
      // δ = 10^(−60/20)), the extractor's ±2e-4 (two 80 dB stages at most), the arctangent's
      // 3.2e-7·fs = 0.015 Hz, with a margin. 2.5 kHz outside the word is 26 % below.
      // (An abrupt step of the deviation instead makes the low-pass overshoot: 0.47 % in a trial.)
      expect(peak.deviationHz.value).toBeGreaterThan(3400 * 0.998);
      expect(peak.deviationHz.value).toBeLessThan(3400 * 1.002);
      // The stated uncertainty covers the difference (its ripple term alone is 3.4 Hz).
      expect(Math.abs((peak.deviationHz.value as number) - 3400)).toBeLessThanOrEqual(peak.deviationHz.uncertainty as number);
      expect(peak.timeS).toBeGreaterThanOrEqual(w0);
      expect(peak.timeS).toBeLessThanOrEqual(w1);
      expect(peak.deviationHz.uncertainty).toBeGreaterThan(0);
    }
    expect(fm.deviationReference).toBe("whole-span mean");
  });

  it("finds the FM carrier at 0 Hz within its uncertainty (tone FM with a symmetric deviation: arg Σ e^(jΔφ) = 2πf_c/fs exactly over whole periods)", () => {
    const c = fm.carrierOffsetHz;
    expect(c.value).not.toBeNull();
    // The power-weighted mean also weighs in the spur: power share B² = 1e-4 for 1 s of 600 at
    // −9 kHz pulls it by −9000·1e-4/600 = −1.5e-3 Hz (independent computation).
    const spurPull = (spur.hz * spur.amplitude ** 2) / 600;
    expect(Math.abs((c.value as number) - spurPull)).toBeLessThanOrEqual(c.uncertainty as number);
    expect(Math.abs(c.value as number)).toBeLessThanOrEqual(c.uncertainty as number);
    expect(c.uncertainty).toBeGreaterThan(0);
    expect(c.uncertainty).toBeLessThan(0.1);
  });

  it("keeps the one-second spur of minute 5 in the max hold at its level, and ~1/600 of it in the average (spectrum scaling, REFERENCES.md §8)", () => {
    const h = holdOf(fm);
    // Hann frame of round(1.5·48000/300) = 240 samples: ENBW 1.5·fs/L = 300 Hz (Harris 1978).
    expect(h.frameLength).toBe(240);
    expect(h.resolutionHz).toBeCloseTo(300, 6);
    const k = binAt(h.frequencyHz, spur.hz);
    expect(h.frequencyHz[k]).toBe(spur.hz); // −9 kHz = −48 bins of 187.5 Hz: on a bin
    const b2 = spur.amplitude ** 2;
    // On a bin, a complex tone of amplitude B reads B² (REFERENCES.md §8, ±0.05 dB).
    expect(Math.abs((h.maxHoldDbfs[k] as number) - db(b2))).toBeLessThan(0.05);
    expect(h.maxTimeS[k]).toBeGreaterThanOrEqual(300);
    expect(h.maxTimeS[k]).toBeLessThanOrEqual(301);
    // The average holds it in about (1 s)/(600 s) of the frames: about 398 of 239 998 frames lie
    // wholly inside the second, a few more in part; the band 500-700 covers both.
    const share = 10 ** ((h.averageDbfs[k] as number) / 10) / b2;
    expect(share).toBeGreaterThan(1 / 700);
    expect(share).toBeLessThan(1 / 500);
  });

  // A pure tone at +3.5 kHz from the capture centre at 96 kS/s, in a 12.5 kHz channel at +1 kHz
  // (decimated by 3 to 32 kS/s): +2.5 kHz in the channel, on the 125 Hz grid of the hold.
  const tone = { fs: 96_000, hz: 3500, amplitude: 0.5, noiseVariance: 1e-6 };
  const toneOptions: WholeSpanOptions = { offsetHz: 1000, bandwidthHz: 12_500 };
  let oneMinute: WholeSpanFigures;

  it("finds a pure tone's offset within its uncertainty (closed form: arg(x[n]·conj(x[n−1])) = 2πf/fs for every n)", async () => {
    oneMinute = await run(tone.fs, 60 * tone.fs, toneInNoise(tone.fs, tone.hz, tone.amplitude, tone.noiseVariance, 7), toneOptions);
    expect(oneMinute.sampleRateHz).toBe(32_000);
    const c = oneMinute.carrierOffsetHz;
    expect(Math.abs((c.value as number) - tone.hz)).toBeLessThanOrEqual(c.uncertainty as number);
    expect(c.uncertainty).toBeGreaterThan(0);
    // Far finer than a channel bin: the check's figure is a frequency error in ppm.
    expect(c.uncertainty).toBeLessThan(0.01);
  }, 120_000);

  it("reads a tone of amplitude A as A² at its bin in the max hold and the average (spectrum scaling, REFERENCES.md §8)", () => {
    const h = holdOf(oneMinute);
    const k = binAt(h.frequencyHz, tone.hz - toneOptions.offsetHz);
    expect(h.frequencyHz[k]).toBe(2500);
    const a2 = db(tone.amplitude ** 2);
    // ±0.05 dB for an on-bin tone (REFERENCES.md §8); the noise (−60 dB below the tone in a bin)
    // moves it by under 0.01 dB.
    expect(Math.abs((h.averageDbfs[k] as number) - a2)).toBeLessThan(0.05);
    expect(Math.abs((h.maxHoldDbfs[k] as number) - a2)).toBeLessThan(0.05);
    expect(h.peakFrequencyHz).toBe(2500);
  });

  it("reads an off-bin tone within the Hann scallop loss of A² (Harris 1978 Table 1: 1.42 dB at half a bin)", async () => {
    // 2560 Hz in the channel: 60 Hz from the nearest 125 Hz bin, 0.3 of the window's bin fs/L = 200 Hz.
    const r = await run(tone.fs, 10 * tone.fs, toneInNoise(tone.fs, 3560, tone.amplitude, 0, 1), toneOptions);
    const h = holdOf(r);
    const a2 = db(tone.amplitude ** 2);
    expect(h.peakDbfs).toBeLessThanOrEqual(a2 + 0.01);
    expect(h.peakDbfs).toBeGreaterThan(a2 - 1.42);
    // Closed form of the Hann response δ bins from its centre (bins of fs/L): sinc(δ)/(1 − δ²)
    // (Harris 1978, the Hann kernel); δ = 0.3 gives −0.51 dB. ±0.02 dB: the noise-free tone,
    // the extractor's ripple (2e-4, 0.002 dB), float32 rounding.
    const d = 0.3;
    const loss = 20 * Math.log10(Math.sin(Math.PI * d) / (Math.PI * d) / (1 - d * d));
    expect(Math.abs(h.peakDbfs - (a2 + loss))).toBeLessThan(0.02);
    expect(Math.abs(h.peakFrequencyHz - 2560)).toBeLessThanOrEqual(h.linear.binWidthHz / 2);
  }, 120_000);

  it("estimates the PSD of complex white noise of variance σ² as σ²/fs (Welch 1967; REFERENCES.md §8)", async () => {
    const variance = 2;
    const r = await run(fs, 60 * fs, toneInNoise(fs, 0, 0, variance, 3), fmOptions);
    const psd = r.psd;
    const expected = variance / fs; // 4.1667e-5 FS²/Hz (REFERENCES.md §8)
    // Bins well inside the extractor's ±12.5 kHz passband, where the noise passes unchanged.
    let sum = 0;
    let count = 0;
    const perBin = Math.sqrt(1.33 / psd.segmentCount); // Hann, 50 % overlap (Welch 1967)
    for (let i = 0; i < psd.fftLength; i++) {
      const f = (i - psd.fftLength / 2) * psd.binWidthHz;
      if (Math.abs(f) > 10_000) continue;
      const v = psd.densityPerHz[i] as number;
      // Each bin within 6 standard deviations (chance under 1e-6 for all 427 together).
      expect(Math.abs(v / expected - 1)).toBeLessThan(6 * perBin);
      sum += v;
      count++;
    }
    // The band mean: statistical spread about 0.1 %, passband ripple 1e-4; 1 % is ten times that.
    expect(Math.abs(sum / count / expected - 1)).toBeLessThan(0.01);
  }, 120_000);

  it("gives the same figures whatever the read block size, every whole frame counted once (block contract, dsp/frameGrid.ts)", async () => {
    const gen = (): Generator => toneFm(fs, { start: 4 * fs + 12, length: wordLength }, { ...spur, start: 2 * fs, end: 3 * fs });
    const big = await run(fs, 10 * fs, gen(), fmOptions);
    const small = await run(fs, 10 * fs, gen(), { ...fmOptions, blockSamples: 4999 });
    // Welch 1967: floor((n − L)/H) + 1 frames of the n samples measured.
    expect(holdOf(big).frameCount).toBe(Math.floor((big.samples - 240) / 120) + 1);
    expect(holdOf(small).frameCount).toBe(holdOf(big).frameCount);
    expect(small.psd.segmentCount).toBe(Math.floor((big.samples - big.psd.fftLength) / (big.psd.fftLength / 2)) + 1);
    for (let i = 0; i < holdOf(big).maxHoldDbfs.length; i++) expect(holdOf(small).maxHoldDbfs[i]).toBeCloseTo(holdOf(big).maxHoldDbfs[i] as number, 9);
    expect(small.positivePeak.deviationHz.value).toBeCloseTo(big.positivePeak.deviationHz.value as number, 6);
    expect(small.positivePeak.timeS).toBe(big.positivePeak.timeS);
    expect(small.carrierOffsetHz.value).toBeCloseTo(big.carrierOffsetHz.value as number, 9);
  }, 120_000);

  it("holds the same accumulator arrays for 1 minute as for 10 minutes (memory bound independent of the span)", async () => {
    const short = await run(fs, 60 * fs, toneFm(fs, { start: 30 * fs + 12, length: wordLength }, { ...spur, start: 10 * fs, end: 11 * fs }), fmOptions);
    expect(short.stateLengths.length).toBeGreaterThan(0);
    expect(short.stateLengths).toEqual(fm.stateLengths);
    expect(holdOf(short).frequencyHz.length).toBe(holdOf(fm).frequencyHz.length);
    expect(short.psd.fftLength).toBe(fm.psd.fftLength);
    // and the span was read through: ten times the samples measured.
    expect(fm.samples).toBeGreaterThan(9.99 * short.samples);
  }, 120_000);
});
