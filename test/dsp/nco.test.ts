import { describe, expect, it } from "vitest";
import { Nco } from "../../src/dsp/index.js";
import { KernelArena } from "../../src/dsp/chainKernels.js";
import { randomPartition } from "./blocks.js";

/**
 * A complex tone e^(j·2π·(p/q)·n/fs) at integer sample indices, with the phase reduced exactly in
 * BigInt: (p·n mod q·fs)/(q·fs) cycles. An independent, exact reference at any index.
 */
function exactTone(p: bigint, q: bigint, fsHz: bigint, start: bigint, count: number): Float32Array {
  const out = new Float32Array(2 * count);
  const period = q * fsHz;
  for (let k = 0; k < count; k++) {
    const residue = (p * (start + BigInt(k))) % period;
    const a = (2 * Math.PI * Number(residue)) / Number(period);
    out[2 * k] = Math.cos(a);
    out[2 * k + 1] = Math.sin(a);
  }
  return out;
}

function mixInBlocks(nco: Nco, iq: Float32Array, seed: number): Float32Array {
  const out = new Float32Array(iq.length);
  for (const [a, b] of randomPartition(iq.length / 2, 700, seed)) out.set(nco.mix(iq.subarray(2 * a, 2 * b)), 2 * a);
  return out;
}

describe("Nco(f, fs, startSample).mix(iq)", () => {
  // f = 123456.7890625 Hz = 15802469/128, exactly a double (so the NCO gets the very frequency the
  // reference uses); fs = 2.4 MHz, so f/fs = 15802469/307200000 is not a binary fraction.
  const p = 15_802_469n;
  const q = 128n;
  const fsHz = 2_400_000n;
  const fHz = Number(p) / Number(q);

  for (const start of [0, 1_000_000_000 - 500, 2 ** 40]) {
    it(`moves a tone at f to 0 Hz with phase error < 1e-6 rad from sample ${start}`, () => {
      const count = 5000;
      const x = exactTone(p, q, fsHz, BigInt(start), count);
      const y = mixInBlocks(new Nco(fHz, Number(fsHz), start), x, 7);
      let worst = 0;
      for (let k = 0; k < count; k++) worst = Math.max(worst, Math.abs(Math.atan2(y[2 * k + 1] as number, y[2 * k] as number)));
      // Bound from the brief; the float32 samples alone carry ~2^-24 ≈ 6e-8 rad of rounding.
      expect(worst).toBeLessThan(1e-6);
    });
  }

  it("gives the same samples for any block partition (phase from the absolute index)", () => {
    const x = exactTone(p, q, fsHz, 0n, 6000);
    const one = new Nco(fHz, Number(fsHz), 12345).mix(x);
    expect(mixInBlocks(new Nco(fHz, Number(fsHz), 12345), x, 3)).toEqual(one);
    expect(mixInBlocks(new Nco(fHz, Number(fsHz), 12345), x, 99)).toEqual(one);
  });

  it("in the SIMD kernel (output in its arena) moves the exact tone to 0 Hz as well, with the JavaScript loop's samples to the bit", () => {
    const count = 5000;
    const start = 2 ** 40;
    const x = exactTone(p, q, fsHz, BigInt(start), count);
    const arena = new KernelArena();
    const simd = new Nco(fHz, Number(fsHz), start, arena);
    const out = arena.f32(arena.alloc(8 * count), 2 * count);
    simd.mix(x.subarray(0, 2 * 1234), out.subarray(0, 2 * 1234));
    simd.mix(x.subarray(2 * 1234), out.subarray(2 * 1234));
    let worst = 0;
    for (let k = 0; k < count; k++) worst = Math.max(worst, Math.abs(Math.atan2(out[2 * k + 1] as number, out[2 * k] as number)));
    expect(worst).toBeLessThan(1e-6);
    expect(out).toEqual(new Nco(fHz, Number(fsHz), start).mix(x));
  });

  it("preserves magnitude: |y| = |x| to float32 rounding (a unit-modulus phasor)", () => {
    const x = new Float32Array([0.5, -0.25, 1, 0, 0, -1, 0.3, 0.4]);
    const y = new Nco(-317_000, 2_400_000).mix(x);
    for (let k = 0; k < 4; k++) {
      expect(Math.hypot(y[2 * k] as number, y[2 * k + 1] as number)).toBeCloseTo(Math.hypot(x[2 * k] as number, x[2 * k + 1] as number), 6);
    }
  });

  it("rejects bad parameters", () => {
    expect(() => new Nco(Number.NaN, 1)).toThrow(/frequencyHz NaN/);
    expect(() => new Nco(1, 0)).toThrow(/sampleRateHz 0/);
    expect(() => new Nco(1, 1, -1)).toThrow(/startSample -1/);
    expect(() => new Nco(1, 1).mix(new Float32Array(3))).toThrow(/not even/);
  });
});
