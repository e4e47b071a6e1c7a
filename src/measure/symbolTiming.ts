/**
 * Feed-forward symbol timing (M. Oerder & H. Meyr, "Digital filter and square timing recovery",
 * IEEE Trans. Commun. 36(5), 1988).
 *
 * The matched-filter output y has a squared magnitude whose mean is periodic in T and largest at
 * the symbol instants; over a block of B symbols the Fourier coefficient at the symbol rate,
 *   c = Σ_n |y[n]|²·e^(−j2πn/sps),
 * has the argument −2π·τ/sps, τ the instant of the symbol centres modulo sps (samples). Oerder &
 * Meyr use an integer 4 samples per symbol; evaluating the coefficient at the real ratio sps
 * makes the estimator work for any sps above about 2 + α (|y|² occupies |f| ≤ (1+α)Rs and must
 * not alias onto Rs). Per block the estimates are unwrapped into a continuous τ(k), and a
 * least-squares straight line through them gives the instants: a small symbol-rate error (a
 * linear drift of τ) is followed without symbol slips, and the self-noise of each block's
 * estimate is averaged over the whole record.
 */

/**
 * The instants (in samples of y) of the symbol centres k = 0, 1, …: t_k = k·sps + τ(k), keeping
 * those with margin ≤ t_k ≤ N − 1 − margin. `power` is |y[n]|² of the matched-filter output
 * (matchedFilterPower); blockSymbols B ≥ 16.
 */
export function symbolInstants(power: Float64Array, samplesPerSymbol: number, blockSymbols: number, margin: number): Float64Array {
  const n = power.length;
  const sps = samplesPerSymbol;
  const blockSamples = blockSymbols * sps;
  const blocks = Math.max(1, Math.floor(n / blockSamples));
  const tau = new Float64Array(blocks);
  const w = (-2 * Math.PI) / sps;
  for (let b = 0; b < blocks; b++) {
    const lo = Math.round(b * blockSamples);
    const hi = b === blocks - 1 ? n : Math.round((b + 1) * blockSamples);
    let re = 0;
    let im = 0;
    for (let k = lo; k < hi; k++) {
      const p = power[k] as number;
      // Phase from k mod sps keeps the argument small and exact.
      const ph = w * (k - sps * Math.floor(k / sps));
      re += p * Math.cos(ph);
      im += p * Math.sin(ph);
    }
    let t = (-Math.atan2(im, re) * sps) / (2 * Math.PI);
    if (b > 0) {
      const prev = tau[b - 1] as number;
      t += sps * Math.round((prev - t) / sps);
    }
    tau[b] = t;
  }
  const line = timingLine(tau, blockSymbols);
  const times: number[] = [];
  const first = Math.ceil((margin - line.at(0)) / sps) - 1;
  for (let k = Math.max(first, -1); ; k++) {
    const t = k * sps + line.at(k);
    if (t > n - 1 - margin) break;
    if (t >= margin) times.push(t);
  }
  return Float64Array.from(times);
}

/**
 * The least-squares straight line τ(k) = a + b·k through the unwrapped block estimates, at the
 * block centres k = (i + ½)·B: a symbol clock offset from the nominal rate drifts linearly, and
 * the fit averages each block's self-noise (the pattern noise of |y|², large at small roll-off)
 * over the whole record instead of following it from block to block.
 */
function timingLine(tau: Float64Array, blockSymbols: number): { at(k: number): number } {
  const m = tau.length;
  if (m < 3) {
    const mean = tau.reduce((x, y) => x + y, 0) / m;
    return { at: () => mean };
  }
  let sk = 0;
  let st = 0;
  for (let i = 0; i < m; i++) { sk += (i + 0.5) * blockSymbols; st += tau[i] as number; }
  const kBar = sk / m;
  const tBar = st / m;
  let num = 0;
  let den = 0;
  for (let i = 0; i < m; i++) {
    const dk = (i + 0.5) * blockSymbols - kBar;
    num += dk * ((tau[i] as number) - tBar);
    den += dk * dk;
  }
  const slope = num / den;
  return { at: (k) => tBar + slope * (k - kBar) };
}
