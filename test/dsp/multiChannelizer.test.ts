import { describe, expect, it } from "vitest";
import { ChannelExtractor, designLowpass, fftPlan, MultiChannelizer, type ChannelInfo, type ChannelSpec } from "../../src/dsp/index.js";
import { complexNoise, SeededRandom } from "../../src/scenario/index.js";
import { complexTone, randomPartition } from "./blocks.js";

const FS = 2_400_000;
const A_DB = 80;
const DELTA = 10 ** (-A_DB / 20);

/** Pushes x in random sizes 1..maxPush (or whole), then flushes; each channel's outputs concatenated. */
function run(mc: MultiChannelizer, x: Float32Array, seed: number | null, maxPush = 40_000): Float32Array[] {
  const parts: number[][] = mc.channels.map(() => []);
  const take = (outs: Float32Array[]): void => outs.forEach((o, i) => { for (const v of o) (parts[i] as number[]).push(v); });
  const ranges = seed === null ? [[0, x.length / 2] as [number, number]] : randomPartition(x.length / 2, maxPush, seed);
  for (const [a, b] of ranges) take(mc.push(x.subarray(2 * a, 2 * b)));
  take(mc.flush());
  return parts.map((p) => Float32Array.from(p));
}

/** The taps the channel states, designed here from its figures (firDesign, Kaiser window). */
function tapsOf(c: ChannelInfo): Float64Array {
  return designLowpass({ cutoffHz: c.passbandHz, transitionHz: c.stopbandEdgeHz - c.passbandHz, stopbandDb: c.designStopbandDb, sampleRateHz: FS });
}

/**
 * Direct computation of eq. (1): mix down by an exact complex exponential of the absolute index
 * (phase reduced mod 1 cycle in double), filter with h by direct convolution at the kept
 * instants only, decimate: y[m] = Σ_n h[n]·x[mD − n]·e^(−j2π·f·(mD − n)/fs), x = 0 before 0.
 */
function direct(x: Float32Array, c: ChannelInfo): Float64Array {
  const h = tapsOf(c);
  const T = x.length / 2;
  const mixed = new Float64Array(2 * T);
  const r = c.offsetHz / FS;
  for (let n = 0; n < T; n++) {
    const cycles = r * n - Math.round(r * n);
    const cr = Math.cos(-2 * Math.PI * cycles);
    const ci = Math.sin(-2 * Math.PI * cycles);
    mixed[2 * n] = (x[2 * n] as number) * cr - (x[2 * n + 1] as number) * ci;
    mixed[2 * n + 1] = (x[2 * n] as number) * ci + (x[2 * n + 1] as number) * cr;
  }
  const M = Math.ceil(T / c.decimation);
  const y = new Float64Array(2 * M);
  for (let m = 0; m < M; m++) {
    let re = 0;
    let im = 0;
    const t = m * c.decimation;
    for (let n = 0; n < h.length && n <= t; n++) {
      re += (h[n] as number) * (mixed[2 * (t - n)] as number);
      im += (h[n] as number) * (mixed[2 * (t - n) + 1] as number);
    }
    y[2 * m] = re;
    y[2 * m + 1] = im;
  }
  return y;
}

/**
 * (1/N)·Σ_k |X[k]| for a unit tone half-way between bins of an N-point DFT (the worst case): the
 * ℓ1 norm of the Dirichlet kernel, by an FFT of the tone here (Oppenheim & Schafer §10.2).
 */
function leakageByFft(N: number): number {
  const plan = fftPlan(N);
  const input = plan.createBuffer();
  const out = plan.createBuffer();
  for (let n = 0; n < N; n++) {
    input[2 * n] = Math.cos((Math.PI * n) / N);
    input[2 * n + 1] = Math.sin((Math.PI * n) / N);
  }
  plan.forward(out, input);
  let sum = 0;
  for (let k = 0; k < N; k++) sum += Math.hypot(out[2 * k] as number, out[2 * k + 1] as number);
  return sum / N;
}

/** Samples m from which the filter has a full history, mD ≥ P − 1. */
function settled(c: ChannelInfo): number {
  return Math.ceil((c.tapCount - 1) / c.decimation);
}

const CHANNELS: ChannelSpec[] = [
  { offsetHz: 317_123.4, bandwidthHz: 25_000 }, // off the bin grid
  { offsetHz: -402_777.7, bandwidthHz: 12_500 },
  { offsetHz: 1_191_000, bandwidthHz: 40_000 }, // its band wraps past +fs/2
  { offsetHz: 3_300.3, bandwidthHz: 180_000 },
];

describe("MultiChannelizer: rate rule and parameters", () => {
  const mc = new MultiChannelizer({ sampleRateHz: FS, channels: CHANNELS });

  it("decimates each channel by the largest power of two leaving fs/D ≥ 2B, so fs/D is in [2B, 4B) (Nyquist for complex samples: B; common practice for the margin)", () => {
    const expected = [32, 64, 16, 4]; // 2.4e6/(2·25e3) = 48 → 32; /(2·12.5e3) = 96 → 64; /80e3 = 30 → 16; /360e3 = 6.7 → 4
    mc.channels.forEach((c, i) => {
      expect(c.decimation).toBe(expected[i]);
      expect(c.outputRateHz).toBe(FS / (expected[i] as number));
      expect(c.outputRateHz / c.bandwidthHz).toBeGreaterThanOrEqual(2);
      expect(c.outputRateHz / c.bandwidthHz).toBeLessThan(4);
    });
  });

  it("caps the decimation at 1024: a 1 kHz channel at 2.4 MS/s (fs/2B = 1200) leaves at fs/1024, still ≥ 2B", () => {
    const narrow = new MultiChannelizer({ sampleRateHz: FS, channels: [{ offsetHz: 1e5, bandwidthHz: 1_000 }, { offsetHz: 0, bandwidthHz: 100 }] });
    expect(narrow.channels.map((c) => c.decimation)).toEqual([1024, 1024]);
    expect(narrow.fftSize).toBeLessThanOrEqual(1 << 17);
  });

  it("uses blocks whose overlap holds the longest filter and whose kept part is a multiple of every D (overlap-save, Oppenheim & Schafer §8.7.3)", () => {
    const longest = Math.max(...mc.channels.map((c) => c.tapCount));
    expect(mc.overlapSamples).toBeGreaterThanOrEqual(longest - 1);
    for (const c of mc.channels) {
      expect(mc.blockSamples % c.decimation).toBe(0);
      expect(mc.overlapSamples % c.decimation).toBe(0);
    }
  });

  it("rejects bad parameters with the value named", () => {
    expect(() => new MultiChannelizer({ sampleRateHz: 0, channels: CHANNELS })).toThrow(/sampleRateHz 0/);
    expect(() => new MultiChannelizer({ sampleRateHz: FS, channels: [] })).toThrow(/channels is empty/);
    expect(() => new MultiChannelizer({ sampleRateHz: FS, channels: [{ offsetHz: 0, bandwidthHz: 2e6 }] })).toThrow(/bandwidthHz 2000000/);
    expect(() => new MultiChannelizer({ sampleRateHz: FS, channels: [{ offsetHz: Number.NaN, bandwidthHz: 1e3 }] })).toThrow(/offsetHz NaN/);
    expect(() => new MultiChannelizer({ sampleRateHz: FS, channels: CHANNELS, fftSize: 1000 })).toThrow(/fftSize 1000/);
    const ended = new MultiChannelizer({ sampleRateHz: FS, channels: CHANNELS });
    ended.flush();
    expect(() => ended.push(new Float32Array(2))).toThrow(/after flush/);
  });
});

describe("MultiChannelizer against direct computation (mix by an exact exponential, direct convolution, decimation)", () => {
  it("agrees on complex white noise within the bound of the dropped bins, rms error ≤ 2·δ_d/√(Σh²)", () => {
    const T = 150_000;
    const x = new Float32Array(2 * T);
    complexNoise(new SeededRandom(31), x, 1);
    const mc = new MultiChannelizer({ sampleRateHz: FS, channels: CHANNELS });
    const outs = run(mc, x, 7);
    mc.channels.forEach((c, i) => {
      const y = outs[i] as Float32Array;
      const ref = direct(x, c);
      expect(y.length).toBe(ref.length); // ⌈T/D⌉ outputs
      let err = 0;
      let pow = 0;
      for (let k = 0; k < ref.length; k++) {
        err += ((y[k] as number) - (ref[k] as number)) ** 2;
        pow += (ref[k] as number) ** 2;
      }
      const h = tapsOf(c);
      const sumH2 = h.reduce((a, v) => a + v * v, 0);
      const deltaD = 10 ** (-c.designStopbandDb / 20);
      // Theory (file comment of multiChannelizer.ts): mean error power ≤ σ²·δ_d² against output σ²·Σh²;
      // ×2 on the rms for the scatter of a finite record; 1e-6 for float32 output rounding (2^−24 relative).
      const bound = 2 * deltaD / Math.sqrt(sumH2) + 1e-6;
      expect(Math.sqrt(err / pow)).toBeLessThan(bound);
    });
  });
});

/**
 * (1/M)·Σ y[m]·e^(−j2πδ·(m/fsOut − delayS)) over m ≥ skip: the complex amplitude of a tone at δ
 * in y, referred to the input's time (the filter's delay taken off); exact for one tone.
 */
function amplitudeAt(y: Float32Array, deltaHz: number, fsOut: number, delayS: number, skip: number): [number, number] {
  let re = 0;
  let im = 0;
  let count = 0;
  for (let m = skip; m < y.length / 2; m++, count++) {
    const a = -2 * Math.PI * deltaHz * (m / fsOut - delayS);
    re += (y[2 * m] as number) * Math.cos(a) - (y[2 * m + 1] as number) * Math.sin(a);
    im += (y[2 * m] as number) * Math.sin(a) + (y[2 * m + 1] as number) * Math.cos(a);
  }
  return [re / count, im / count];
}

describe("MultiChannelizer against the single-channel ChannelExtractor (NCO and a cascade of Kaiser stages)", () => {
  for (const deltaHz of [0, 6_100, -11_900]) {
    it(`gives a tone at 317 123.4 + ${deltaHz} Hz the same complex amplitude, referred to input time, within both ripples`, () => {
      const T = 300_000;
      const x = complexTone(T, 0.5, 317_123.4 + deltaHz, FS, 0.3);
      const spec = { offsetHz: 317_123.4, bandwidthHz: 25_000 };
      const mc = new MultiChannelizer({ sampleRateHz: FS, channels: [spec] });
      const c = mc.channels[0] as ChannelInfo;
      const [y] = run(mc, x, 21) as [Float32Array];
      const ex = new ChannelExtractor({ sampleRateHz: FS, ...spec });
      const parts: number[] = [];
      for (const [a, b] of randomPartition(T, 30_000, 22)) parts.push(...ex.push(x.subarray(2 * a, 2 * b)));
      const z = Float32Array.from(parts);
      const [ar, ai] = amplitudeAt(y, deltaHz, c.outputRateHz, c.delayS, settled(c));
      const [br, bi] = amplitudeAt(z, deltaHz, ex.outputRateHz, ex.delayS, Math.ceil(ex.delayS * ex.outputRateHz) + 2);
      // Both are linear-phase: each gives 0.5·e^(j0.3)·|H(δ)|. Ours within ±δ of 1; the extractor's
      // two stages (6·6) each within ±2δ (firDesign): 5δ together, 1e-5 for float32 rounding.
      expect(ex.stageFactors.length).toBe(2);
      expect(Math.hypot(ar - br, ai - bi) / 0.5).toBeLessThan(5 * DELTA + 1e-5);
      expect(Math.hypot(ar - 0.5 * Math.cos(0.3), ai - 0.5 * Math.sin(0.3)) / 0.5).toBeLessThan(DELTA + 1e-5);
    });
  }
});

describe("MultiChannelizer: tones (closed form of a tone through a linear-phase filter)", () => {
  const cases = [
    [317_123.4, 40_000, 7_000, 400_000], [317_123.4, 40_000, -12_400, 400_000], [-402_777.7, 40_000, 3_210.5, 400_000],
    [1_191_000, 40_000, 19_000, 400_000],
    [-250_321.7, 1_000, 310, 1_000_000], // D = 1024 (the cap), N = 2^17 (the largest transform)
  ] as const;
  for (const [offsetHz, bandwidthHz, deltaHz, T] of cases) {
    it(`a tone at ${offsetHz} + ${deltaHz} Hz in a ${bandwidthHz} Hz channel leaves at ${deltaHz} Hz, amplitude and phase within δ(2 + leakage)·a of the closed form, continuous over blocks of random lengths`, () => {
      const a = 0.5;
      const phase0 = 0.7;
      const x = complexTone(T, a, offsetHz + deltaHz, FS, phase0);
      const mc = new MultiChannelizer({ sampleRateHz: FS, channels: [{ offsetHz, bandwidthHz }] });
      const c = mc.channels[0] as ChannelInfo;
      const [y] = run(mc, x, 11, 9_000) as [Float32Array];
      // Pushes of random lengths (1..9000 samples) straddle ≥ 10 block boundaries.
      expect(T / mc.blockSamples).toBeGreaterThan(10);
      // Theory: y[m] = a·H(δ)·e^(j(2πδ·mD/fs + φ0)), H(δ) = |H|·e^(−j2πδ·delayS) with |H| within 1 ± 2δ_d (firDesign),
      // plus the dropped bins ≤ δ_d·leakage·a; leakage computed here by an FFT; 1e-6 for float32 rounding.
      const deltaD = 10 ** (-c.designStopbandDb / 20);
      const promised = deltaD * (2 + leakageByFft(mc.fftSize));
      expect(promised).toBeLessThanOrEqual(DELTA * (1 + 1e-9)); // the stated ±δ at 80 dB holds (equality at N = 2^17)
      const tol = a * (promised + 1e-6);
      let worst = 0;
      for (let m = settled(c); m < y.length / 2; m++) {
        const ph = 2 * Math.PI * deltaHz * (m * c.decimation / FS - c.delayS) + phase0;
        worst = Math.max(worst, Math.hypot((y[2 * m] as number) - a * Math.cos(ph), (y[2 * m + 1] as number) - a * Math.sin(ph)));
      }
      expect(worst).toBeLessThan(tol);
    });
  }

  const probe = new MultiChannelizer({ sampleRateHz: FS, channels: [{ offsetHz: 317_123.4, bandwidthHz: 25_000 }] });
  const p = probe.channels[0] as ChannelInfo;
  const binHz = FS / probe.fftSize;
  for (const deltaHz of [p.stopbandEdgeHz, -p.stopbandEdgeHz, p.outputRateHz / 2 + 0.3 * binHz, p.outputRateHz, -p.outputRateHz, 150_000, -719_000, 882_876.6]) {
    it(`a tone at 317 123.4 + ${deltaHz.toFixed(1)} Hz (beyond the stop edge ${p.stopbandEdgeHz.toFixed(1)} Hz) leaves at least 80 dB down`, () => {
      const T = 200_000;
      const x = complexTone(T, 1, 317_123.4 + deltaHz, FS);
      const mc = new MultiChannelizer({ sampleRateHz: FS, channels: [{ offsetHz: 317_123.4, bandwidthHz: 25_000 }] });
      const [y] = run(mc, x, 5) as [Float32Array];
      let peak = 0;
      for (let m = settled(p); m < y.length / 2; m++) peak = Math.max(peak, Math.hypot(y[2 * m] as number, y[2 * m + 1] as number));
      // Theory: |H| ≤ δ_d beyond fst and the dropped bins add ≤ δ_d·leakage, together ≤ δ (80 dB);
      // the float32 tone's rounding (2^−24) through the passband is some −150 dB, far below.
      expect(20 * Math.log10(peak)).toBeLessThanOrEqual(-A_DB);
    });
  }
});

describe("MultiChannelizer: streaming", () => {
  it("gives bit for bit the same output for pushes of random sizes as for one push (the blocks are the same transforms)", () => {
    const x = new Float32Array(2 * 120_000);
    complexNoise(new SeededRandom(8), x, 1);
    const whole = run(new MultiChannelizer({ sampleRateHz: FS, channels: CHANNELS }), x, null);
    for (const seed of [1, 2]) {
      const pieces = run(new MultiChannelizer({ sampleRateHz: FS, channels: CHANNELS }), x, seed, seed === 1 ? 300 : 50_000);
      pieces.forEach((y, i) => expect(y).toEqual(whole[i]));
    }
  });

  it("with reuseOutput hands out views of one array a channel, with the same samples when each is copied at once", () => {
    const x = new Float32Array(2 * 60_000);
    complexNoise(new SeededRandom(9), x, 1);
    const reused = new MultiChannelizer({ sampleRateHz: FS, channels: CHANNELS, reuseOutput: true });
    const fresh = run(new MultiChannelizer({ sampleRateHz: FS, channels: CHANNELS }), x, 6);
    run(reused, x, 6).forEach((y, i) => expect(y).toEqual(fresh[i]));
    const again = new MultiChannelizer({ sampleRateHz: FS, channels: CHANNELS, reuseOutput: true });
    const first = again.push(x.subarray(0, 2 * 20_000));
    const second = again.push(x.subarray(2 * 20_000, 2 * 40_000));
    expect((second[0] as Float32Array).buffer).toBe((first[0] as Float32Array).buffer);
  });

  it("cut at a block boundary into two parts, each through its own channelizer (resumeAt), gives bit for bit the samples of the whole (overlap-save: each block's transform sees the same N samples)", () => {
    const x = new Float32Array(2 * 150_000);
    complexNoise(new SeededRandom(14), x, 1);
    const whole = run(new MultiChannelizer({ sampleRateHz: FS, channels: CHANNELS }), x, null);
    const first = new MultiChannelizer({ sampleRateHz: FS, channels: CHANNELS });
    const cut = 3 * first.blockSamples;
    const V = first.overlapSamples;
    const head = first.channels.map(() => [] as number[]);
    first.push(x.subarray(0, 2 * cut)).forEach((o, i) => (head[i] as number[]).push(...o));
    const second = new MultiChannelizer({ sampleRateHz: FS, channels: CHANNELS, resumeAt: cut });
    const tail = run(second, x.subarray(2 * (cut - V)), 5);
    whole.forEach((y, i) => {
      expect((head[i] as number[]).length).toBe(2 * (cut / (first.channels[i] as ChannelInfo).decimation));
      expect(Float32Array.from([...(head[i] as number[]), ...(tail[i] as Float32Array)])).toEqual(y);
    });
    expect(() => new MultiChannelizer({ sampleRateHz: FS, channels: CHANNELS, resumeAt: cut + 1 })).toThrow(/resumeAt/);
  });

  it("gives ten channels from one stream that equal ten single-channel runs of the same transform length", () => {
    const rng = new SeededRandom(12);
    const channels: ChannelSpec[] = Array.from({ length: 10 }, (_, i) => ({
      offsetHz: -1.1e6 + i * 230_000 + 1000 * rng.uniform(),
      bandwidthHz: [5_000, 12_500, 25_000, 200_000, 8_000][i % 5] as number,
    }));
    const x = new Float32Array(2 * 100_000);
    complexNoise(new SeededRandom(13), x, 1);
    const multi = new MultiChannelizer({ sampleRateHz: FS, channels });
    const together = run(multi, x, 3);
    channels.forEach((c, i) => {
      const [alone] = run(new MultiChannelizer({ sampleRateHz: FS, channels: [c], fftSize: multi.fftSize }), x, 4) as [Float32Array];
      // Each channel reads only the shared spectrum of each block: nothing of one channel reaches another.
      expect(alone).toEqual(together[i]);
    });
  });
});
