/**
 * The DFT of a whole record in place, in double precision, for long one-off transforms (memory:
 * the record and a quarter-wave table). Conventions of fft.ts.
 */
import { isFftSize } from "./fftOrder.js";

/**
 * The DFT of `x` in place: `x` holds N complex values interleaved (re, im; length 2N, N a power
 * of two ≥ 2) and is overwritten by X, in the conventions above (forward unscaled, inverse
 * scaled by 1/N, natural bin order). For long one-off transforms of a whole record: iterative
 * radix-2 decimation in time after a bit-reversal permutation (Cooley & Tukey 1965; e.g.
 * Oppenheim & Schafer, Discrete-Time Signal Processing, §9.3), with the twiddles read from a
 * quarter-wave table of N/4 + 1 cosines (sines by symmetry), so that the memory is `x` (16 bytes
 * a point) and 2 bytes a point of table, where a plan holds a full table and needs a second
 * buffer (48 bytes a point, all in the JS heap). Throws RangeError unless N is a power of two ≥ 2.
 */
export function transformInPlace(x: Float64Array, direction: "forward" | "inverse" = "forward"): void {
  const n = x.length >> 1;
  if (x.length !== 2 * n || !isFftSize(n)) throw new RangeError(`transform of ${x.length / 2} points: not a power of two of at least 2`);
  bitReverse(x, n);
  const m = Math.max(n, 4);
  const cosines = quarterCosines(m);
  const sign = direction === "forward" ? -1 : 1;
  for (let half = 1; half < n; half *= 2) butterflies(x, n, half, cosines, m / (2 * half), sign);
  if (direction === "inverse") for (let i = 0; i < 2 * n; i++) x[i] = (x[i] as number) / n;
}

/** cos(2πj/m) for j = 0 … m/4 (the last exactly 0): with sin(2πj/m) = cos(2π(m/4 − j)/m), every twiddle. */
function quarterCosines(m: number): Float64Array {
  const q = m >> 2;
  const c = new Float64Array(q + 1);
  for (let j = 0; j < q; j++) c[j] = Math.cos((2 * Math.PI * j) / m);
  c[q] = 0;
  return c;
}

/** Reorders the N complex values of `x` to bit-reversed index order (in place, by swaps). */
function bitReverse(x: Float64Array, n: number): void {
  for (let i = 1, j = 0; i < n; i++) {
    let bit = n >> 1;
    for (; j & bit; bit >>= 1) j ^= bit;
    j ^= bit;
    if (i < j) {
      const r = x[2 * i] as number;
      const m = x[2 * i + 1] as number;
      x[2 * i] = x[2 * j] as number;
      x[2 * i + 1] = x[2 * j + 1] as number;
      x[2 * j] = r;
      x[2 * j + 1] = m;
    }
  }
}

/**
 * One radix-2 stage, block by block in memory order: butterflies of span `half`, twiddle
 * e^(sign·j·2π·k·stride/m) for k = 0 … half − 1 (k·stride < m/2), from the quarter-wave table:
 * for k·stride ≤ m/4, cos = c[j] and sin = c[m/4 − j]; beyond, cos = −c[m/2 − j], sin = c[j − m/4].
 */
function butterflies(x: Float64Array, n: number, half: number, c: Float64Array, stride: number, sign: number): void {
  const q = c.length - 1;
  const split = Math.min(half, Math.floor(q / stride) + 1);
  for (let start = 0; start < 2 * n; start += 4 * half) {
    for (let k = 0; k < split; k++) {
      const j = k * stride;
      butterfly(x, start + 2 * k, start + 2 * k + 2 * half, c[j] as number, sign * (c[q - j] as number));
    }
    for (let k = split; k < half; k++) {
      const j = k * stride;
      butterfly(x, start + 2 * k, start + 2 * k + 2 * half, -(c[2 * q - j] as number), sign * (c[j - q] as number));
    }
  }
}

/** x[a] ← x[a] + w·x[b], x[b] ← x[a] − w·x[b] (complex values at interleaved offsets a and b). */
function butterfly(x: Float64Array, a: number, b: number, wr: number, wi: number): void {
  const br = x[b] as number;
  const bi = x[b + 1] as number;
  const tr = wr * br - wi * bi;
  const ti = wr * bi + wi * br;
  const ar = x[a] as number;
  const ai = x[a + 1] as number;
  x[b] = ar - tr;
  x[b + 1] = ai - ti;
  x[a] = ar + tr;
  x[a + 1] = ai + ti;
}

