import { describe, expect, it } from "vitest";
import {
  fastFft, fftImplementation, fftPlan, HealthAccumulator, pffftAvailable, sampleStore, setFftImplementation, slotsToNatural,
  transformInPlace, type FftImplementation,
} from "../../src/dsp/index.js";
import { decodeSamples } from "../../src/capture/sampleFormat.js";
import { SeededRandom } from "../../src/scenario/index.js";

/**
 * The fast engines (PFFFT SIMD and fft.js in float32) against double-precision references: the
 * direct DFT definition X[k] = Σ x[n]·e^(−j2πkn/N) (Oppenheim & Schafer, Discrete-Time Signal
 * Processing, eq. 8.11) for small N, and the double-precision radix-2 transform for every size.
 * Tolerance: relative ℓ2 error below 1e-5. A float32 FFT's rms relative error grows as about
 * ε·√(log2 N) with ε = 2^−24 ≈ 6e-8 (Higham, Accuracy and Stability of Numerical Algorithms,
 * 2nd ed., §24.1: the bound ε·log2 N·c for Cooley–Tukey; recalled from memory), so about 3e-7 at
 * N = 2^20: 1e-5 leaves a wide margin while a wrong twiddle, sign or order gives errors of order 1.
 */

const IMPLEMENTATIONS: FftImplementation[] = pffftAvailable() ? ["pffft-simd", "fftjs"] : ["fftjs"];
/** Every size the heavy paths use: pass 1 allows 16 … 2^20; the channelizers go to 2^17; small transforms from 2. */
const SIZES = Array.from({ length: 20 }, (_, i) => 2 ** (i + 1));

function randomFrame(n: number, seed: number): Float32Array {
  const rng = new SeededRandom(seed);
  const x = new Float32Array(2 * n);
  for (let i = 0; i < x.length; i++) x[i] = rng.gaussian();
  return x;
}

/** Double-precision DFT of a float32 frame (the same rounded input the engine sees). */
function referenceDft(x: Float32Array, direction: "forward" | "inverse"): Float64Array {
  const y = Float64Array.from(x);
  transformInPlace(y, direction);
  if (direction === "inverse") for (let i = 0; i < y.length; i++) y[i] = (y[i] as number) * (x.length / 2);
  return y;
}

/** The engine's spectrum in natural order, interleaved, through its layout. */
function naturalSpectrum(spectrum: Float32Array, realIndex: Uint32Array, imagOffset: number): Float64Array {
  const out = new Float64Array(spectrum.length);
  for (let k = 0; k < realIndex.length; k++) {
    out[2 * k] = spectrum[realIndex[k] as number] as number;
    out[2 * k + 1] = spectrum[(realIndex[k] as number) + imagOffset] as number;
  }
  return out;
}

function relativeError(a: ArrayLike<number>, b: ArrayLike<number>): number {
  let e = 0;
  let r = 0;
  for (let i = 0; i < b.length; i++) {
    e += ((a[i] as number) - (b[i] as number)) ** 2;
    r += (b[i] as number) ** 2;
  }
  return Math.sqrt(e / r);
}

describe.each(IMPLEMENTATIONS)("fastFft(size, %s)", (implementation) => {
  it("forward agrees with the double-precision DFT at every power of two 2 … 2^20 (relative error < 1e-5)", () => {
    for (const n of SIZES) {
      const engine = fastFft(n, implementation);
      const x = randomFrame(n, n);
      engine.time().set(x);
      engine.forward();
      const got = naturalSpectrum(engine.spectrum(), engine.layout.realIndex, engine.layout.imagOffset);
      expect(relativeError(got, referenceDft(x, "forward")), `N = ${n}`).toBeLessThan(1e-5);
    }
  });

  it("inverse is the unscaled inverse DFT, from a spectrum written through the layout, at every size", () => {
    for (const n of SIZES) {
      const engine = fastFft(n, implementation);
      const spectrum = randomFrame(n, 7 * n);
      const s = engine.spectrum();
      const { realIndex, imagOffset } = engine.layout;
      for (let k = 0; k < n; k++) {
        s[realIndex[k] as number] = spectrum[2 * k] as number;
        s[(realIndex[k] as number) + imagOffset] = spectrum[2 * k + 1] as number;
      }
      engine.inverse();
      expect(relativeError(engine.output(), referenceDft(spectrum, "inverse")), `N = ${n}`).toBeLessThan(1e-5);
    }
  });

  it("matches the direct DFT definition at N = 64 (independent of any FFT algorithm)", () => {
    const n = 64;
    const engine = fastFft(n, implementation);
    const x = randomFrame(n, 3);
    engine.time().set(x);
    engine.forward();
    const got = naturalSpectrum(engine.spectrum(), engine.layout.realIndex, engine.layout.imagOffset);
    const direct = new Float64Array(2 * n);
    for (let k = 0; k < n; k++) {
      for (let t = 0; t < n; t++) {
        const a = (-2 * Math.PI * k * t) / n;
        direct[2 * k] = (direct[2 * k] as number) + (x[2 * t] as number) * Math.cos(a) - (x[2 * t + 1] as number) * Math.sin(a);
        direct[2 * k + 1] = (direct[2 * k + 1] as number) + (x[2 * t] as number) * Math.sin(a) + (x[2 * t + 1] as number) * Math.cos(a);
      }
    }
    expect(relativeError(got, direct)).toBeLessThan(1e-5);
  });

  it("forward leaves time() as it was, and a tone at bin −3 lands at natural bin N − 3 with value N", () => {
    const n = 256;
    const engine = fastFft(n, implementation);
    const t = engine.time();
    for (let i = 0; i < n; i++) {
      t[2 * i] = Math.cos((-2 * Math.PI * 3 * i) / n);
      t[2 * i + 1] = Math.sin((-2 * Math.PI * 3 * i) / n);
    }
    const before = t.slice();
    engine.forward();
    expect(engine.time()).toEqual(before);
    const got = naturalSpectrum(engine.spectrum(), engine.layout.realIndex, engine.layout.imagOffset);
    expect(got[2 * (n - 3)]).toBeCloseTo(n, 3);
    expect(Math.abs(got[2 * 3] as number)).toBeLessThan(1e-3);
  });

  it("addPower sums |X|² per slot; mapped through slotBin it is the natural-order periodogram", () => {
    const n = 1024;
    const engine = fastFft(n, implementation);
    const sumStore = engine.createStore(n + 5);
    const maxStore = engine.createStore(n + 5);
    const frames = [randomFrame(n, 11), randomFrame(n, 12)];
    const expected = new Float64Array(n);
    const expectedMax = new Float64Array(n);
    for (const x of frames) {
      engine.time().set(x);
      engine.forward();
      engine.addPower(sumStore, maxStore, 5);
      const ref = referenceDft(x, "forward");
      for (let k = 0; k < n; k++) {
        const p = (ref[2 * k] as number) ** 2 + (ref[2 * k + 1] as number) ** 2;
        expected[k] = (expected[k] as number) + p;
        expectedMax[k] = Math.max(expectedMax[k] as number, p);
      }
    }
    const natural = new Float64Array(n);
    const naturalMax = new Float64Array(n);
    slotsToNatural(engine.layout, sumStore.view(), 5, natural, 0);
    slotsToNatural(engine.layout, maxStore.view(), 5, naturalMax, 0);
    expect(sumStore.view()[0]).toBe(0);
    expect(relativeError(natural, expected)).toBeLessThan(1e-5);
    expect(relativeError(naturalMax, expectedMax)).toBeLessThan(1e-5);
  });

  it("loadWindowed puts w[n]·z[start + n] in the frame, from a sample store or a plain array, and leaves the padding zero", () => {
    const n = 64;
    const engine = fastFft(n, implementation);
    const w = Float64Array.from({ length: 40 }, (_, i) => 0.5 - 0.5 * Math.cos((2 * Math.PI * i) / 40));
    const window = engine.prepareWindow(w);
    const samples = randomFrame(100, 51);
    const previous = fftImplementation().implementation;
    setFftImplementation(implementation);
    const store = sampleStore(samples.length);
    setFftImplementation(previous);
    store.view().set(samples);
    for (const source of [store.view(), samples]) {
      engine.loadWindowed(source, 7, window);
      const t = engine.time();
      for (let i = 0; i < 40; i++) {
        // Float32 product of float32 operands: within half an ulp of the double product.
        expect(t[2 * i]).toBeCloseTo((w[i] as number) * (samples[2 * (7 + i)] as number), 6);
        expect(t[2 * i + 1]).toBeCloseTo((w[i] as number) * (samples[2 * (7 + i) + 1] as number), 6);
      }
      for (let i = 80; i < 2 * n; i++) expect(t[i]).toBe(0);
    }
    expect(() => engine.loadWindowed(samples, 70, window)).toThrow(RangeError);
  });


  it("staged gives a plain array's samples where loadWindowed is fastest, and the same frames as from the array", () => {
    const n = 64;
    const engine = fastFft(n, implementation);
    const w = Float64Array.from({ length: 64 }, (_, i) => 0.5 - 0.5 * Math.cos((2 * Math.PI * i) / 64));
    const window = engine.prepareWindow(w);
    const samples = randomFrame(300, 52);
    const staged = engine.staged(samples);
    expect(staged).toEqual(samples);
    // A view already in the engine's memory (or any array, for fft.js) is handed back as it is.
    expect(engine.staged(staged)).toBe(staged);
    if (implementation === "fftjs") expect(staged).toBe(samples);
    for (const start of [0, 17, 236]) {
      engine.loadWindowed(samples, start, window);
      const plain = engine.time().slice();
      engine.loadWindowed(engine.staged(samples), start, window);
      // Both round the float32 × float32 product once to float32: the same values.
      expect(engine.time()).toEqual(plain);
    }
  });
  it("multiply then inverse is the circular convolution (direct sum), with the scale applied", () => {
    const n = 128;
    const engine = fastFft(n, implementation);
    const h = randomFrame(n, 21);
    const x = randomFrame(n, 22);
    engine.time().set(h);
    engine.forward();
    const held = engine.hold();
    engine.time().set(x);
    engine.forward();
    engine.multiply(held, 1 / n);
    engine.inverse();
    const direct = new Float64Array(2 * n);
    for (let m = 0; m < n; m++) {
      for (let k = 0; k < n; k++) {
        const j = (m - k + n) % n;
        const hr = h[2 * k] as number;
        const hi = h[2 * k + 1] as number;
        const xr = x[2 * j] as number;
        const xi = x[2 * j + 1] as number;
        direct[2 * m] = (direct[2 * m] as number) + hr * xr - hi * xi;
        direct[2 * m + 1] = (direct[2 * m + 1] as number) + hr * xi + hi * xr;
      }
    }
    expect(relativeError(engine.output(), direct)).toBeLessThan(1e-5);
  });

  it("views taken again after the engine's memory grows still hold the buffers", () => {
    const engine = fastFft(4096, implementation);
    const x = randomFrame(4096, 31);
    engine.time().set(x);
    const big = [fastFft(1 << 20, implementation), fastFft(1 << 20, implementation)];
    expect(big.length).toBe(2);
    expect(engine.time()).toEqual(x);
    engine.forward();
    const got = naturalSpectrum(engine.spectrum(), engine.layout.realIndex, engine.layout.imagOffset);
    expect(relativeError(got, referenceDft(x, "forward"))).toBeLessThan(1e-5);
  });
});

describe("fftImplementation()", () => {
  it("names the chosen implementation and a reason; PFFFT where it loads (Node 20 has WebAssembly SIMD)", () => {
    const c = fftImplementation();
    expect(c.reason.length).toBeGreaterThan(0);
    if (process.env.IQAUDIT_FFT === "fftjs") expect(c.implementation).toBe("fftjs");
    else expect(c.implementation).toBe(pffftAvailable() ? "pffft-simd" : "fftjs");
  });

  it("fftPlan (the double-precision reference) and the fast engine agree on one frame", () => {
    const n = 4096;
    const plan = fftPlan(n);
    const x = randomFrame(n, 41);
    const input = plan.createBuffer();
    for (let i = 0; i < x.length; i++) input[i] = x[i] as number;
    const out = plan.createBuffer();
    plan.forward(out, input);
    const engine = fastFft(n);
    engine.time().set(x);
    engine.forward();
    expect(relativeError(naturalSpectrum(engine.spectrum(), engine.layout.realIndex, engine.layout.imagOffset), out)).toBeLessThan(1e-5);
  });
});

describe("the moments kernel (health figures from samples in the engine's memory)", () => {
  it.skipIf(!pffftAvailable())("gives the same mean, variances and covariance as the two-pass sums in double precision", () => {
    const previous = fftImplementation().implementation;
    setFftImplementation("pffft-simd");
    const store = sampleStore(2 * 5000);
    setFftImplementation(previous);
    const x = randomFrame(5000, 61);
    for (let i = 0; i < x.length; i += 2) {
      x[i] = 0.3 + 0.5 * (x[i] as number);
      x[i + 1] = -0.1 + 0.2 * (x[i + 1] as number) + 0.1 * (x[i] as number);
    }
    store.view().set(x);
    const inHeap = new HealthAccumulator();
    inHeap.push(store.view(), 0, 10);
    const plain = new HealthAccumulator();
    plain.push(x, 0, 10);
    // One pass on data shifted by the first sample (Chan, Golub & LeVeque 1983) against two
    // passes: both in double from the same float32 samples, equal to rounding (1e-9 absolute).
    const a = inHeap.snapshot();
    const b = plain.snapshot();
    expect(a.samples).toBe(4990);
    for (const k of ["meanI", "meanQ", "sumSqI", "sumSqQ", "sumIQ"] as const) expect(a[k]).toBeCloseTo(b[k], 9);
    // And against the definition: cov(I, Q) = Σ(I − μI)(Q − μQ), computed here.
    let mi = 0;
    let mq = 0;
    for (let i = 20; i < x.length; i += 2) { mi += x[i] as number; mq += x[i + 1] as number; }
    mi /= 4990;
    mq /= 4990;
    let c = 0;
    for (let i = 20; i < x.length; i += 2) c += ((x[i] as number) - mi) * ((x[i + 1] as number) - mq);
    expect(a.sumIQ).toBeCloseTo(c, 9);
    // An odd count takes the kernel's last single-sample step.
    const odd = new HealthAccumulator();
    odd.push(store.view(), 0, 11);
    const oddPlain = new HealthAccumulator();
    oddPlain.push(x, 0, 11);
    for (const k of ["meanI", "meanQ", "sumSqI", "sumSqQ", "sumIQ"] as const) expect(odd.snapshot()[k]).toBeCloseTo(oddPlain.snapshot()[k], 9);
  });
});

describe("the scrub kernel (float samples decoded into the engine's memory)", () => {
  it.skipIf(!pffftAvailable())("zeroes and counts the same non-finite samples and clipped components as the plain decoder", () => {
    // cf32 bytes with NaN, ±∞, components at ±1 and beyond, in an odd number of samples.
    const n = 1001;
    const values = randomFrame(n, 71).map((v) => 0.15 * v); // |x| < 1 unless set below (6.7σ)
    const special: Array<[number, number]> = [[3, NaN], [10, Infinity], [11, -Infinity], [40, 1], [41, -1.5], [500, 2], [2001, NaN], [2000, 1]];
    for (const [i, v] of special) values[i] = v;
    const bytes = new Uint8Array(values.buffer.slice(0));
    const plain = new Float32Array(2 * n);
    const a = decodeSamples("cf32_le", bytes, plain, false);
    const previous = fftImplementation().implementation;
    setFftImplementation("pffft-simd");
    const store = sampleStore(2 * n);
    setFftImplementation(previous);
    const b = decodeSamples("cf32_le", bytes, store.view(), false);
    // Counted by hand from the list above: samples 1 (component 3), 5 (components 10 and 11)
    // and 1000 (2001) are non-finite; components 40, 41 and 500 are clipped, 2000 is not counted
    // (it belongs to sample 1000, zeroed).
    expect(a.nonFiniteSamples).toBe(3);
    expect(a.clippedComponents).toBe(3);
    expect(b).toEqual(a);
    expect(Array.from(store.view())).toEqual(Array.from(plain));
  });
});
