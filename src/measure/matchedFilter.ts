/**
 * The receive side of an RRC link: the matched filter at the sample rate and the symbol-spaced
 * samples taken from its output at fractional instants.
 */

/**
 * y = h ∗ x for complex `iq` (interleaved I,Q) and real symmetric `taps` of odd length 2L + 1,
 * aligned so that y[n] = Σ_m h[m]·x[n + L − m] (the filter's delay of L samples removed; zeros
 * are assumed outside the record). Direct form, (2L + 1) multiply–adds per output component.
 */
export function matchedFilter(iq: Float32Array | Float64Array, taps: Float64Array): Float64Array {
  const n = iq.length >> 1;
  const len = taps.length;
  const half = (len - 1) >> 1;
  const y = new Float64Array(2 * n);
  for (let k = 0; k < n; k++) {
    let re = 0;
    let im = 0;
    const lo = Math.max(0, k + half - (n - 1));
    const hi = Math.min(len - 1, k + half);
    for (let m = lo; m <= hi; m++) {
      const h = taps[m] as number;
      const j = 2 * (k + half - m);
      re += h * (iq[j] as number);
      im += h * (iq[j + 1] as number);
    }
    y[2 * k] = re;
    y[2 * k + 1] = im;
  }
  return y;
}

/**
 * Samples of complex `y` at the real instants `times` (in samples), by cubic Lagrange
 * interpolation on y[i − 1 … i + 2], i = ⌊t⌋, μ = t − i, in Farrow form
 * ((c3·μ + c2)·μ + c1)·μ + c0 (C. W. Farrow, ISCAS 1988; coefficients as in L. Erup,
 * F. M. Gardner & R. A. Harris, "Interpolation in digital modems—Part II: implementation and
 * performance", IEEE Trans. Commun. 41(6), 1993). Instants must satisfy 1 ≤ t < N − 2.
 */
export function sampleAt(y: Float64Array, times: Float64Array): Float64Array {
  const n = y.length >> 1;
  const out = new Float64Array(2 * times.length);
  for (let k = 0; k < times.length; k++) {
    const t = times[k] as number;
    const i = Math.floor(t);
    if (!(i >= 1 && i + 2 < n)) throw new RangeError(`instant ${t} lies outside 1..${n - 3} samples`);
    const mu = t - i;
    for (let part = 0; part < 2; part++) {
      const ym = y[2 * (i - 1) + part] as number;
      const y0 = y[2 * i + part] as number;
      const y1 = y[2 * (i + 1) + part] as number;
      const y2 = y[2 * (i + 2) + part] as number;
      const c1 = -ym / 3 - y0 / 2 + y1 - y2 / 6;
      const c2 = ym / 2 - y0 + y1 / 2;
      const c3 = -ym / 6 + y0 / 2 - y1 / 2 + y2 / 6;
      out[2 * k + part] = ((c3 * mu + c2) * mu + c1) * mu + y0;
    }
  }
  return out;
}
