/**
 * A small seeded pseudo-random generator, so that the sample scenario and the tests' synthetic
 * signals are the same bytes on every machine.
 *
 * Uniform: mulberry32 (a 32-bit multiply–xorshift generator, public domain, T. Ettinger 2017);
 * fine for test signals, not for cryptography. Gaussian: Box–Muller (Box & Muller 1958), both
 * outputs used.
 */
export class SeededRandom {
  private state: number;
  private spare: number | null = null;

  constructor(seed: number) {
    this.state = seed >>> 0;
  }

  /** Uniform on [0, 1). */
  uniform(): number {
    let t = (this.state = (this.state + 0x6d2b79f5) >>> 0);
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  }

  /** Standard normal (mean 0, variance 1). */
  gaussian(): number {
    if (this.spare !== null) {
      const s = this.spare;
      this.spare = null;
      return s;
    }
    let u = 0;
    while (u === 0) u = this.uniform();
    const v = this.uniform();
    const r = Math.sqrt(-2 * Math.log(u));
    this.spare = r * Math.sin(2 * Math.PI * v);
    return r * Math.cos(2 * Math.PI * v);
  }

  /** Integer uniform on [0, n). */
  integer(n: number): number {
    return Math.floor(this.uniform() * n);
  }
}

/**
 * Fills `out` (interleaved I,Q) with circular complex white Gaussian noise of total variance
 * `variance` = E|z|² (each component variance/2).
 */
export function complexNoise(rng: SeededRandom, out: Float64Array | Float32Array, variance: number): void {
  const s = Math.sqrt(variance / 2);
  for (let k = 0; k < out.length; k++) out[k] = s * rng.gaussian();
}
