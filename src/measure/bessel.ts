/**
 * Bessel functions of the first kind of integer order, J_n(x), and the zeros of J_n: the
 * amplitudes of the lines of tone FM (J_n(β) at the carrier ± n·fm, Abramowitz & Stegun 9.1.41–
 * 9.1.43, the Jacobi–Anger expansion) and the carrier nulls of the Bessel-null method.
 */

/**
 * J_n(x) for integer n ≥ 0 and real x (dimensionless).
 *
 * - |x| ≤ 1: the power series J_n(x) = Σ_k (−1)^k (x/2)^(2k+n) / (k!·(k+n)!) (A&S 9.1.10), whose
 *   terms fall by (x/2)²/(k(k+n)) ≤ ¼ per step, so there is no cancellation to speak of.
 * - otherwise: Miller's backward recurrence J_{k−1} = (2k/x)·J_k − J_{k+1} (A&S 9.1.27), started
 *   at an even order M = n + ⌈|x|⌉ + 20 + 6·⌈√(n + |x|)⌉ with J_{M+1} = 0, J_M = 1, and normalised by
 *   J_0 + 2·Σ_k J_{2k} = 1 (A&S 9.1.46; the method of A&S 9.12, Example 1). Backward recurrence is
 *   stable for every order; the start order makes the neglected terms ~(e|x|/2M)^M, below 1e-20
 *   for |x| ≤ 100. Tested to 1e-9 against A&S Table 9.1; expected ~1e-14 for |x| ≤ 20.
 *
 * J_n(−x) = (−1)^n·J_n(x). Throws RangeError for n not a non-negative integer or x not finite.
 */
export function besselJ(n: number, x: number): number {
  if (!Number.isInteger(n) || n < 0) throw new RangeError(`order ${n} is not a non-negative integer`);
  if (!Number.isFinite(x)) throw new RangeError(`x ${x} is not finite`);
  const sign = x < 0 && n % 2 === 1 ? -1 : 1;
  const ax = Math.abs(x);
  if (ax === 0) return n === 0 ? 1 : 0;
  return sign * (ax <= 1 ? series(n, ax) : miller(n, ax));
}

function series(n: number, x: number): number {
  const h = x / 2;
  let term = 1;
  for (let k = 1; k <= n; k++) term *= h / k; // (x/2)^n / n!
  let sum = term;
  const h2 = h * h;
  for (let k = 1; k < 100; k++) {
    term *= -h2 / (k * (k + n));
    sum += term;
    if (Math.abs(term) < 1e-17 * Math.abs(sum)) break;
  }
  return sum;
}

function miller(n: number, x: number): number {
  let m = n + Math.ceil(x) + 20 + 6 * Math.ceil(Math.sqrt(n + x));
  if (m % 2 === 1) m += 1;
  let next = 0; // J_{k+1}
  let cur = 1; // J_k, k = m
  let norm = 0; // J_0 + 2 Σ J_2k, accumulated as k descends
  let wanted = 0;
  for (let k = m; k >= 1; k--) {
    if (k % 2 === 0) norm += 2 * cur;
    if (k === n) wanted = cur;
    const prev = ((2 * k) / x) * cur - next;
    next = cur;
    cur = prev;
    if (Math.abs(cur) > 1e250) {
      // Rescale everything held so far to stay within double range.
      cur *= 1e-250;
      next *= 1e-250;
      norm *= 1e-250;
      wanted *= 1e-250;
    }
  }
  norm += cur; // J_0
  if (n === 0) wanted = cur;
  return wanted / norm;
}

/**
 * The first `count` positive zeros j_{n,1} < j_{n,2} < … of J_n, for integer n ≥ 0: McMahon's
 * asymptotic start β − (μ − 1)/(8β), β = (k + n/2 − ¼)π, μ = 4n² (A&S 9.5.12), refined by Newton
 * steps with J_n'(x) = J_{n−1}(x) − (n/x)·J_n(x) (A&S 9.1.27; J_0' = −J_1) until the step is
 * below 1e-13. Checked against A&S Table 9.5 (j_{0,k} = 2.404825558, 5.520078110, … ).
 * Throws RangeError for a bad order or count.
 */
export function besselJZeros(order: number, count: number): Float64Array {
  if (!Number.isInteger(order) || order < 0) throw new RangeError(`order ${order} is not a non-negative integer`);
  if (!Number.isInteger(count) || count < 1 || count > 1000) throw new RangeError(`count ${count} is not an integer in 1-1000`);
  const out = new Float64Array(count);
  const mu = 4 * order * order;
  for (let k = 1; k <= count; k++) {
    const b = (k + order / 2 - 0.25) * Math.PI;
    let z = b - (mu - 1) / (8 * b);
    for (let it = 0; it < 50; it++) {
      const j = besselJ(order, z);
      const dj = order === 0 ? -besselJ(1, z) : besselJ(order - 1, z) - (order / z) * j;
      const step = j / dj;
      z -= step;
      if (Math.abs(step) < 1e-13) break;
    }
    out[k - 1] = z;
  }
  return out;
}
