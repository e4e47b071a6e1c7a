import { describe, expect, it } from "vitest";
import { ChannelExtractor, fftPlan } from "../../src/dsp/index.js";
import { complexNoise, SeededRandom } from "../../src/scenario/index.js";
import { complexTone, randomPartition } from "./blocks.js";

const FS = 2_400_000;
const OFFSET = 317_000;
const B = 25_000;

function extract(ex: ChannelExtractor, x: Float32Array, seed: number): Float32Array {
  const parts: number[] = [];
  for (const [a, b] of randomPartition(x.length / 2, 50_000, seed)) parts.push(...ex.push(x.subarray(2 * a, 2 * b)));
  return Float32Array.from(parts);
}

/**
 * Complex amplitude of y at frequency fHz: (1/M)·Σ y[m]·e^(−j2πf·m/fsOut) over m ≥ skip. For a
 * single tone of that frequency this is its amplitude exactly (closed form); the other terms of a
 * finite sum vanish only for the tone being projected on, so each test has one tone.
 */
function project(y: Float32Array, fHz: number, fsOut: number, skip: number): { amp: number; phase: number } {
  let re = 0;
  let im = 0;
  let m = 0;
  for (let i = skip; i < y.length / 2; i++, m++) {
    const a = (-2 * Math.PI * fHz * i) / fsOut;
    re += (y[2 * i] as number) * Math.cos(a) - (y[2 * i + 1] as number) * Math.sin(a);
    im += (y[2 * i] as number) * Math.sin(a) + (y[2 * i + 1] as number) * Math.cos(a);
  }
  return { amp: Math.hypot(re, im) / m, phase: Math.atan2(im, re) };
}

/** f folded into [−fs/2, fs/2): where a tone at f lands after sampling at fs. */
function alias(fHz: number, fsHz: number): number {
  return fHz - fsHz * Math.round(fHz / fsHz);
}

describe("ChannelExtractor({ sampleRateHz: 2.4e6, offsetHz: 317e3, bandwidthHz: 25e3 })", () => {
  const ex0 = new ChannelExtractor({ sampleRateHz: FS, offsetHz: OFFSET, bandwidthHz: B });

  it("decimates by 36: fs/(2.5·B) = 38.4, and 38 = 2·19, 37 (prime) have factors above 8; 36 = 6·6", () => {
    expect(ex0.decimation).toBe(36);
    expect(ex0.outputRateHz).toBeCloseTo(FS / 36, 9);
    expect(ex0.outputRateHz).toBeGreaterThanOrEqual(2.5 * B);
    expect(ex0.passbandHz).toBe(B / 2);
  });

  for (const deltaHz of [0, 7_000, -12_000, 12_500]) {
    it(`passes a tone at offset ${deltaHz >= 0 ? "+" : ""}${deltaHz} Hz to ${deltaHz} Hz with gain within 0.1 dB and phase −2π·δ·delayS`, () => {
      const n = 400_000;
      const x = complexTone(n, 0.5, OFFSET + deltaHz, FS);
      const ex = new ChannelExtractor({ sampleRateHz: FS, offsetHz: OFFSET, bandwidthHz: B });
      const y = extract(ex, x, 5);
      const skip = Math.ceil(ex.delayS * ex.outputRateHz) + 2;
      const { amp, phase } = project(y, deltaHz, ex.outputRateHz, skip);
      // Passband: each stage is within ±2δ of 1 (firDesign tests), two stages: far inside 0.1 dB.
      expect(Math.abs(20 * Math.log10(amp / 0.5))).toBeLessThan(0.1);
      // Linear phase: output m at input time m·D, delayed by delayS (x was mixed by exactly −offset).
      const expected = -2 * Math.PI * deltaHz * ex.delayS;
      expect(Math.abs(Math.atan2(Math.sin(phase - expected), Math.cos(phase - expected)))).toBeLessThan(1e-3);
    });
  }

  for (const deltaHz of [ex0.stopbandEdgeHz, 60_000, 150_000, 380_000, -345_000, -900_000, 1_100_000]) {
    it(`attenuates a tone at offset + ${Math.round(deltaHz)} Hz (beyond the stop edge ${Math.round(ex0.stopbandEdgeHz)} Hz) by ≥ 80 dB − 0.1 dB`, () => {
      const n = 200_000;
      const x = complexTone(n, 1, OFFSET + deltaHz, FS);
      const ex = new ChannelExtractor({ sampleRateHz: FS, offsetHz: OFFSET, bandwidthHz: B });
      const y = extract(ex, x, 9);
      const skip = Math.ceil(ex.delayS * ex.outputRateHz) + 2;
      // Where the tone lands at the output rate; by the stage edges it has met ≥ 80 dB on its way there.
      const { amp } = project(y, alias(deltaHz, ex.outputRateHz), ex.outputRateHz, skip);
      // 0.1 dB margin: the other stage may add its passband/transition gain ≤ 1 + 2δ, and float32
      // rounding of the unit tone is ~−150 dB, far below.
      expect(20 * Math.log10(amp)).toBeLessThanOrEqual(-80 + 0.1);
    });
  }

  it("keeps the noise density: complex white noise of variance σ² (density σ²/fs) reads σ²/fs over the passband", () => {
    // Theory: y = decimated (h ∗ x); with |H| = 1 in the passband and aliases ≤ −80 dB, the output
    // density there is the input density σ²/fs (FS²/Hz), the output variance σ²·(noise bandwidth)/fs.
    const sigma2 = 0.01;
    const n = 1 << 21;
    const x = new Float32Array(2 * n);
    complexNoise(new SeededRandom(21), x, sigma2);
    const ex = new ChannelExtractor({ sampleRateHz: FS, offsetHz: OFFSET, bandwidthHz: B });
    const y = extract(ex, x, 13);
    const skip = Math.ceil(ex.delayS * ex.outputRateHz) + 2;
    // Hann-windowed periodograms averaged, density scaling |X|²/(fs·Σw²) (Heinzel et al. 2002, §9), computed here.
    const N = 256;
    const plan = fftPlan(N);
    const w = Array.from({ length: N }, (_, i) => 0.5 - 0.5 * Math.cos((2 * Math.PI * i) / N));
    const s2 = w.reduce((a, v) => a + v * v, 0);
    const input = plan.createBuffer();
    const out = plan.createBuffer();
    const psd = new Float64Array(N);
    let segments = 0;
    for (let start = skip; start + N <= y.length / 2; start += N / 2, segments++) {
      for (let i = 0; i < N; i++) {
        input[2 * i] = (w[i] as number) * (y[2 * (start + i)] as number);
        input[2 * i + 1] = (w[i] as number) * (y[2 * (start + i) + 1] as number);
      }
      plan.forward(out, input);
      for (let k = 0; k < N; k++) psd[k] = (psd[k] as number) + ((out[2 * k] as number) ** 2 + (out[2 * k + 1] as number) ** 2) / (ex.outputRateHz * s2);
    }
    // Bins well inside ±B/2 (|f| ≤ 0.8·B/2, so the window's main lobe stays in the passband).
    let sum = 0;
    let bins = 0;
    for (let k = 0; k < N; k++) {
      const f = (k < N / 2 ? k : k - N) * (ex.outputRateHz / N);
      if (Math.abs(f) <= 0.8 * (B / 2)) {
        sum += (psd[k] as number) / segments;
        bins++;
      }
    }
    const measured = sum / bins;
    // ~450 half-overlapped segments × ~76 bins: relative standard error below 1 %; 0.2 dB (4.7 %) is > 4σ.
    expect(Math.abs(10 * Math.log10(measured / (sigma2 / FS)))).toBeLessThan(0.2);
  });

  it("gives the same output for any block partition", () => {
    const x = new Float32Array(2 * 100_000);
    complexNoise(new SeededRandom(4), x, 1);
    const a = extract(new ChannelExtractor({ sampleRateHz: FS, offsetHz: OFFSET, bandwidthHz: B }), x, 1);
    const b = extract(new ChannelExtractor({ sampleRateHz: FS, offsetHz: OFFSET, bandwidthHz: B }), x, 2);
    expect(b).toEqual(a);
  });

  it("has the memory of its equivalent single filter: an impulse at input t moves the outputs at times t … t + M only", () => {
    // The noble identities make the cascade one filter of M + 1 taps, M = Σ (Li − 1)·∏_{j<i} Dj,
    // followed by ↓D (Crochiere & Rabiner 1983, §3.1.3): its impulse response ends at t + M.
    const ex = new ChannelExtractor({ sampleRateHz: FS, offsetHz: OFFSET, bandwidthHz: B });
    const [l1, l2] = ex.stageTapCounts as [number, number];
    expect(ex.memorySamples).toBe(l1 - 1 + 6 * (l2 - 1));
    const t = 36 * 50 + 7;
    const x = new Float32Array(2 * (t + ex.memorySamples + 400));
    x[2 * t] = 1;
    const y = ex.push(x);
    let last = -1;
    let first = -1;
    for (let m = 0; m < y.length / 2; m++) {
      if (y[2 * m] !== 0 || y[2 * m + 1] !== 0) {
        if (first < 0) first = m;
        last = m;
      }
    }
    expect(first * 36).toBeGreaterThanOrEqual(t);
    expect(last * 36).toBeLessThanOrEqual(t + ex.memorySamples);
    // The response reaches its end: the last output inside the memory is not zero (the end taps of
    // a Kaiser-window design are small but not zero).
    expect(last).toBe(Math.floor((t + ex.memorySamples) / 36));
  });

  it("extracts blocks apart (pushOwned) to the same samples, to the bit, as one stream", () => {
    const x = new Float32Array(2 * 300_000);
    complexNoise(new SeededRandom(8), x, 1);
    const stream = extract(new ChannelExtractor({ sampleRateHz: FS, offsetHz: OFFSET, bandwidthHz: B }), x, 5);
    const apart = new ChannelExtractor({ sampleRateHz: FS, offsetHz: OFFSET, bandwidthHz: B, reuseOutput: true });
    const warmup = apart.warmupSamples;
    const joined: number[] = [];
    let expectedFirst = 0;
    // Blocks in a shuffled order, each with just the warm-up before its own samples.
    const parts = randomPartition(x.length / 2, 40_000, 9);
    const order = parts.map((_, i) => i).sort((a, b) => ((a * 7919) % parts.length) - ((b * 7919) % parts.length));
    const outputs = new Map<number, Float32Array>();
    for (const i of order) {
      const [a, b] = parts[i] as [number, number];
      const dataStart = Math.max(0, a - warmup);
      const r = apart.pushOwned(x.subarray(2 * dataStart, 2 * b), dataStart, a);
      outputs.set(r.firstOutput, r.iq.slice());
    }
    for (const [a] of parts) {
      const chunk = outputs.get(Math.ceil(a / 36)) as Float32Array;
      expect(Math.ceil(a / 36)).toBe(expectedFirst);
      joined.push(...chunk);
      expectedFirst += chunk.length / 2;
    }
    expect(Float32Array.from(joined)).toEqual(stream);
    // A block without its warm-up is refused.
    expect(() => apart.pushOwned(x.subarray(2 * 1000, 2 * 5000), 1000, 1000)).toThrow(RangeError);
  });

  it("with reuseOutput hands out views of one array, with the same samples when each is copied at once", () => {
    const x = new Float32Array(2 * 100_000);
    complexNoise(new SeededRandom(6), x, 1);
    const options = { sampleRateHz: FS, offsetHz: OFFSET, bandwidthHz: B };
    const reused = new ChannelExtractor({ ...options, reuseOutput: true });
    expect(extract(reused, x, 3)).toEqual(extract(new ChannelExtractor(options), x, 3));
    const first = reused.push(x.subarray(0, 2 * 20_000));
    const second = reused.push(x.subarray(2 * 20_000, 2 * 40_000));
    expect(second.buffer).toBe(first.buffer);
    const flat = { sampleRateHz: 48_000, offsetHz: 1000, bandwidthHz: 12_000 };
    expect(extract(new ChannelExtractor({ ...flat, reuseOutput: true }), x, 4)).toEqual(extract(new ChannelExtractor(flat), x, 4));
  });

  it("uses factor 1 when fs < 5·B, and keeps the rate", () => {
    const ex = new ChannelExtractor({ sampleRateHz: 48_000, offsetHz: 1000, bandwidthHz: 12_000 });
    expect(ex.decimation).toBe(1);
    expect(ex.outputRateHz).toBe(48_000);
    expect(ex.push(new Float32Array(200)).length).toBe(200);
  });

  it("rejects bad parameters", () => {
    expect(() => new ChannelExtractor({ sampleRateHz: 0, offsetHz: 0, bandwidthHz: 1 })).toThrow(/sampleRateHz 0/);
    expect(() => new ChannelExtractor({ sampleRateHz: 1e6, offsetHz: 0, bandwidthHz: 2e6 })).toThrow(/bandwidthHz 2000000/);
    expect(() => new ChannelExtractor({ sampleRateHz: 1e6, offsetHz: Number.NaN, bandwidthHz: 1e3 })).toThrow(/offsetHz NaN/);
  });
});

describe("ChannelExtractor's SIMD kernels (chainKernels.ts)", () => {
  // The kernels do the JavaScript loops' float64 operations in the same order: the outputs are
  // equal to the bit (IEEE 754 rounding of the same operations), for one stage or several, any
  // block partition.
  const cases = [
    { sampleRateHz: FS, offsetHz: OFFSET, bandwidthHz: B },
    { sampleRateHz: FS, offsetHz: -411_111.5, bandwidthHz: 12_500 },
    { sampleRateHz: 250_000, offsetHz: 20_000, bandwidthHz: 16_000 },
    { sampleRateHz: 48_000, offsetHz: 1000, bandwidthHz: 12_000 },
  ];
  it.each(cases)("give the JavaScript loops' outputs to the bit: %o", (options) => {
    const x = new Float32Array(2 * 150_000);
    complexNoise(new SeededRandom(11), x, 1);
    const simd = new ChannelExtractor({ ...options, kernels: true });
    const plain = new ChannelExtractor({ ...options, kernels: false });
    expect(simd.stageTapCounts).toEqual(plain.stageTapCounts);
    expect(extract(simd, x, 12)).toEqual(extract(plain, x, 13));
  });

  it("are checked above on one stage and several (even tap counts: polyphaseDecimator.test.ts)", () => {
    const counts = cases.map((o) => new ChannelExtractor(o).stageTapCounts);
    expect(counts.some((c) => c.length === 1)).toBe(true);
    expect(counts.some((c) => c.length >= 2)).toBe(true);
  });

  it("keep their outputs when the arena grows under a long block (views taken again)", () => {
    const x = new Float32Array(2 * 400_000);
    complexNoise(new SeededRandom(12), x, 1);
    const options = { sampleRateHz: FS, offsetHz: OFFSET, bandwidthHz: B, reuseOutput: true };
    const simd = new ChannelExtractor({ ...options, kernels: true });
    const plain = new ChannelExtractor({ ...options, kernels: false });
    const a = simd.push(x.subarray(0, 2 * 1000)).slice();
    const b = simd.push(x.subarray(2 * 1000)).slice();
    const c = plain.push(x.subarray(0, 2 * 1000)).slice();
    const d = plain.push(x.subarray(2 * 1000)).slice();
    expect(a).toEqual(c);
    expect(b).toEqual(d);
  });
});
