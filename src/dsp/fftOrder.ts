/** Sizes and bin order of the transforms (conventions of fft.ts): plain helpers, no engine. */

/** True when `n` is a size `fftPlan` accepts (a power of two, at least 2). */
export function isFftSize(n: number): boolean {
  return Number.isInteger(n) && n >= 2 && (n & (n - 1)) === 0;
}

/**
 * The natural-order bin that sits at centred index `centredIndex` of an N-point spectrum:
 * (centredIndex + N/2) mod N. Centred index i is the frequency (i − N/2)·fs/N.
 */
export function naturalBinIndex(centredIndex: number, size: number): number {
  const half = size >>> 1;
  return centredIndex < half ? centredIndex + half : centredIndex - half;
}

/**
 * A copy of a natural-order spectrum of N values in centred order, each multiplied by `scale`:
 * out[i] = scale · natural[(i + N/2) mod N]. N must be even.
 */
export function toCentredOrder(natural: Float64Array, scale = 1): Float64Array {
  const n = natural.length;
  const half = n >>> 1;
  const out = new Float64Array(n);
  for (let i = 0; i < half; i++) {
    out[i] = scale * (natural[i + half] as number);
    out[i + half] = scale * (natural[i] as number);
  }
  return out;
}
