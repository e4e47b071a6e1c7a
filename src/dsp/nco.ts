/**
 * A numerically controlled oscillator that mixes complex samples down by `frequencyHz`:
 * y[n] = x[n]·e^(−j2π·f·n/fs), n the absolute sample index (startSample for the first sample of
 * the first call), so a tone at +f moves to 0 Hz.
 *
 * The phasor at n is computed, not accumulated: n = n0 + k with n0 a multiple of 1024, and
 * e^(−j2πrn) = e^(−j2πr·n0) · e^(−j2πr·k), r = f/fs. The first factor is evaluated once per 1024
 * samples from the exact fractional part of r·n0 (r split into a double and its rounding
 * residual, r·n0 formed as an exact two-term product by Dekker's algorithm, T. J. Dekker 1971,
 * "A floating-point technique for extending the available precision", Numer. Math. 18); the
 * second comes from a table of 1024 phasors computed with cos/sin. The phase error is then at the
 * level of double rounding (~1e-15 rad) at any index below 2^53, there is no drift, and the
 * output at each index does not depend on how the samples were split into calls.
 */

import type { KernelArena } from "./chainKernels.js";

const TABLE_LENGTH = 1024;
const SPLIT = 134217729; // 2^27 + 1, Veltkamp's splitting constant for doubles

/** Mixes interleaved I,Q blocks down by a fixed frequency, phase continuous across calls. */
export class Nco {
  /** The frequency shifted to 0 Hz, Hz (negative below the capture centre). */
  readonly frequencyHz: number;
  /** Sample rate, Hz. */
  readonly sampleRateHz: number;
  private readonly ratio: number;
  private readonly ratioResidual: number;
  private readonly tableRe = new Float64Array(TABLE_LENGTH);
  private readonly tableIm = new Float64Array(TABLE_LENGTH);
  private nextSample: number;
  private readonly arena: KernelArena | null;
  // With an arena: the table there, 32 bytes an index: (cos, sin, −sin, cos) as float64.
  private readonly tablePtr: number;

  /**
   * `frequencyHz` any finite value (Hz), `sampleRateHz` > 0, `startSample` the index of the first
   * sample the first `mix` call gets (a non-negative safe integer). Throws RangeError otherwise.
   * With `arena`, a `mix` whose output lies in the arena runs the SIMD kernel (chainKernels.ts),
   * to the same values.
   */
  constructor(frequencyHz: number, sampleRateHz: number, startSample = 0, arena: KernelArena | null = null) {
    if (!Number.isFinite(frequencyHz)) throw new RangeError(`frequencyHz ${frequencyHz} is not finite`);
    if (!(Number.isFinite(sampleRateHz) && sampleRateHz > 0)) {
      throw new RangeError(`sampleRateHz ${sampleRateHz} is not a positive finite number`);
    }
    if (!(Number.isSafeInteger(startSample) && startSample >= 0)) {
      throw new RangeError(`startSample ${startSample} is not a non-negative safe integer`);
    }
    this.frequencyHz = frequencyHz;
    this.sampleRateHz = sampleRateHz;
    this.nextSample = startSample;
    const r = frequencyHz / sampleRateHz;
    // f − r·fs exactly (two-product), divided by fs: the part of f/fs the double r lost.
    const [p, e] = twoProduct(r, sampleRateHz);
    this.ratio = r;
    this.ratioResidual = (frequencyHz - p - e) / sampleRateHz;
    for (let k = 0; k < TABLE_LENGTH; k++) {
      const a = -2 * Math.PI * fractionalCycles(r, this.ratioResidual, k);
      this.tableRe[k] = Math.cos(a);
      this.tableIm[k] = Math.sin(a);
    }
    this.arena = arena;
    this.tablePtr = arena === null ? 0 : arena.alloc(32 * TABLE_LENGTH);
    if (arena !== null) {
      const t = arena.f64(this.tablePtr, 4 * TABLE_LENGTH);
      for (let k = 0; k < TABLE_LENGTH; k++) {
        const c = this.tableRe[k] as number;
        const sn = this.tableIm[k] as number;
        t.set([c, sn, -sn, c], 4 * k);
      }
    }
  }

  /** Index of the next sample `mix` expects. */
  get sampleIndex(): number {
    return this.nextSample;
  }

  /**
   * The next `mix` call gets the sample of index `sampleIndex` (a non-negative safe integer):
   * its output is what a continuous stream gives at that index (the phasor is a function of the
   * index alone). Throws RangeError otherwise.
   */
  seek(sampleIndex: number): void {
    if (!(Number.isSafeInteger(sampleIndex) && sampleIndex >= 0)) {
      throw new RangeError(`sampleIndex ${sampleIndex} is not a non-negative safe integer`);
    }
    this.nextSample = sampleIndex;
  }

  /**
   * y = x·e^(−j2π·f·n/fs) for the block `iq` (interleaved I,Q, any even length), written to `out`
   * (same length; may be `iq` itself) or to a new array, which is returned.
   */
  mix(iq: Float32Array, out?: Float32Array): Float32Array {
    if (iq.length % 2 !== 0) throw new RangeError(`iq length ${iq.length} is not even (interleaved I,Q)`);
    const y = out ?? new Float32Array(iq.length);
    if (y.length !== iq.length) throw new RangeError(`out length ${y.length} differs from iq length ${iq.length}`);
    const count = iq.length / 2;
    const arena = this.arena !== null && this.arena.holds(y) ? this.arena : null;
    // The kernel mixes in place: the input goes to the output first.
    if (arena !== null && iq !== y) y.set(iq);
    let done = 0;
    while (done < count) {
      const n = this.nextSample + done;
      const k0 = n % TABLE_LENGTH;
      const base = n - k0;
      const run = Math.min(TABLE_LENGTH - k0, count - done);
      const a = -2 * Math.PI * fractionalCycles(this.ratio, this.ratioResidual, base);
      if (arena === null) mixRun(iq, y, done, run, k0, Math.cos(a), Math.sin(a), this.tableRe, this.tableIm);
      else arena.mix(y.byteOffset + 8 * done, run, this.tablePtr + 32 * k0, Math.cos(a), Math.sin(a));
      done += run;
    }
    this.nextSample += count;
    return y;
  }
}

/** y[i] = x[i]·(c + js)·table[k0 + i − start] for `run` samples from sample `start`. */
function mixRun(
  x: Float32Array, y: Float32Array, start: number, run: number, k0: number,
  c: number, s: number, tableRe: Float64Array, tableIm: Float64Array,
): void {
  for (let i = 0; i < run; i++) {
    const tr = tableRe[k0 + i] as number;
    const ti = tableIm[k0 + i] as number;
    const pr = c * tr - s * ti;
    const pi = c * ti + s * tr;
    const j = 2 * (start + i);
    const xr = x[j] as number;
    const xi = x[j + 1] as number;
    y[j] = xr * pr - xi * pi;
    y[j + 1] = xr * pi + xi * pr;
  }
}

/** frac((r + residual)·n) in [−1, 1), with r·n formed exactly. */
function fractionalCycles(r: number, residual: number, n: number): number {
  const [p, e] = twoProduct(r, n);
  const whole = Math.round(p);
  return p - whole + e + residual * n;
}

/** [p, e] with p = fl(a·b) and p + e = a·b exactly (Dekker 1971, Veltkamp split). */
function twoProduct(a: number, b: number): [number, number] {
  const p = a * b;
  const ta = SPLIT * a;
  const ah = ta - (ta - a);
  const al = a - ah;
  const tb = SPLIT * b;
  const bh = tb - (tb - b);
  const bl = b - bh;
  const e = ah * bh - p + ah * bl + al * bh + al * bl;
  return [p, e];
}
