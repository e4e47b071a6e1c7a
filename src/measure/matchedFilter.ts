/**
 * The receive side of an RRC link: the matched filter at the sample rate and the symbol-spaced
 * samples taken from its output at fractional instants.
 *
 * Conventions: y = h ∗ x for complex `iq` (interleaved I,Q) and real symmetric `taps` of odd
 * length 2L + 1, aligned so that y[n] = Σ_m h[m]·x[n + L − m] (the filter's delay of L samples
 * removed; zeros are assumed outside the record), direct form. Symbols are taken from y at real
 * instants t by cubic Lagrange interpolation on y[i − 1 … i + 2], i = ⌊t⌋, μ = t − i, in Farrow
 * form ((c3·μ + c2)·μ + c1)·μ + c0 (C. W. Farrow, ISCAS 1988; coefficients as in L. Erup,
 * F. M. Gardner & R. A. Harris, "Interpolation in digital modems—Part II: implementation and
 * performance", IEEE Trans. Commun. 41(6), 1993). y itself is never kept for the whole record.
 */

/**
 * |y[n]|² of the matched-filter output y (conventions above), without keeping y: the timing estimator
 * needs only the power, so the record's complex double-precision output is never held.
 */
export function matchedFilterPower(iq: Float32Array | Float64Array, taps: Float64Array): Float64Array {
  const n = iq.length >> 1;
  const p = new Float64Array(n);
  const y = new Float64Array(2);
  for (let k = 0; k < n; k++) {
    realTapsAt(iq, taps, k, n, y, 0);
    p[k] = (y[0] as number) * (y[0] as number) + (y[1] as number) * (y[1] as number);
  }
  return p;
}

/**
 * The symbols at `times` of the matched filter of x·e^(j2π·ν·k), without record-length copies: the
 * shifted record's filter output is formed only at the four samples around each instant that the
 * cubic interpolation reads. Filtering a shifted record equals shifting the output of the
 * shifted taps, (x·e^(jωk)) ∗ h = e^(jωn)·(x ∗ (h·e^(jωm))) (the modulation property of the
 * DFT), so each output is e^(jωj)·Σ_m g[m]·x[j + L − m] with complex taps g[m] = h[m]·e^(jω(L − m)),
 * ω = 2π·`cyclesPerSample`; with ν = 0 the real taps h themselves.
 * Memory: the symbols only. Instants must satisfy 1 ≤ t < N − 2.
 */
export function filteredAt(iq: Float32Array | Float64Array, taps: Float64Array, times: Float64Array, cyclesPerSample = 0): Float64Array {
  const n = iq.length >> 1;
  const len = taps.length;
  const half = (len - 1) >> 1;
  const w = 2 * Math.PI * cyclesPerSample;
  const gr = new Float64Array(len);
  const gi = new Float64Array(len);
  for (let m = 0; m < len; m++) {
    gr[m] = w === 0 ? (taps[m] as number) : (taps[m] as number) * Math.cos(w * (half - m));
    gi[m] = w === 0 ? 0 : (taps[m] as number) * Math.sin(w * (half - m));
  }
  const y = new Float64Array(8);
  const out = new Float64Array(2 * times.length);
  for (let k = 0; k < times.length; k++) {
    const t = times[k] as number;
    const i = Math.floor(t);
    if (!(i >= 1 && i + 2 < n)) throw new RangeError(`instant ${t} lies outside 1..${n - 3} samples`);
    for (let d = 0; d < 4; d++) {
      const j = i - 1 + d;
      if (w === 0) realTapsAt(iq, taps, j, n, y, 2 * d);
      else complexTapsAt(iq, gr, gi, j, n, w, y, 2 * d);
    }
    farrow(y, t - i, out, 2 * k);
  }
  return out;
}

/** y[at], y[at + 1] ← output j of the matched filter with real taps (zeros outside the record). */
function realTapsAt(iq: Float32Array | Float64Array, taps: Float64Array, j: number, n: number, y: Float64Array, at: number): void {
  const len = taps.length;
  const half = (len - 1) >> 1;
  let re = 0;
  let im = 0;
  const lo = Math.max(0, j + half - (n - 1));
  const hi = Math.min(len - 1, j + half);
  for (let m = lo; m <= hi; m++) {
    const h = taps[m] as number;
    const p = 2 * (j + half - m);
    re += h * (iq[p] as number);
    im += h * (iq[p + 1] as number);
  }
  y[at] = re;
  y[at + 1] = im;
}

/** y[at], y[at + 1] ← e^(jωj)·Σ_m g[m]·x[j + L − m], g = gr + j·gi (zeros outside the record). */
function complexTapsAt(
  iq: Float32Array | Float64Array, gr: Float64Array, gi: Float64Array, j: number, n: number, w: number, y: Float64Array, at: number,
): void {
  const len = gr.length;
  const half = (len - 1) >> 1;
  let re = 0;
  let im = 0;
  const lo = Math.max(0, j + half - (n - 1));
  const hi = Math.min(len - 1, j + half);
  for (let m = lo; m <= hi; m++) {
    const a = gr[m] as number;
    const b = gi[m] as number;
    const p = 2 * (j + half - m);
    const xr = iq[p] as number;
    const xi = iq[p + 1] as number;
    re += a * xr - b * xi;
    im += a * xi + b * xr;
  }
  const cs = Math.cos(w * j);
  const sn = Math.sin(w * j);
  y[at] = re * cs - im * sn;
  y[at + 1] = re * sn + im * cs;
}

/** out[at], out[at + 1] ← the cubic Farrow interpolation of the four complex values
 * y[0..7] (samples i − 1 … i + 2) at μ. */
function farrow(y: Float64Array, mu: number, out: Float64Array, at: number): void {
  for (let part = 0; part < 2; part++) {
    const ym = y[part] as number;
    const y0 = y[2 + part] as number;
    const y1 = y[4 + part] as number;
    const y2 = y[6 + part] as number;
    const c1 = -ym / 3 - y0 / 2 + y1 - y2 / 6;
    const c2 = ym / 2 - y0 + y1 / 2;
    const c3 = -ym / 6 + y0 / 2 - y1 / 2 + y2 / 6;
    out[at + part] = ((c3 * mu + c2) * mu + c1) * mu + y0;
  }
}
