/**
 * The true figures of the evaluation emissions, from theory alone (no code of the tool under
 * test): 99 % occupied bandwidths from the power spectra, Bessel lines by numerical quadrature,
 * and the expected EVM of a linear modulation at a given SNR.
 */

/**
 * Jn(x) = (1/π) ∫₀^π cos(nτ − x sin τ) dτ (Bessel's integral, A&S 9.1.21), by the composite
 * trapezoid rule over 2048 panels: the integrand is smooth and periodic, so the rule converges
 * geometrically (error far below 1e-12 for x ≤ 30, n ≤ 60).
 */
export function besselJIntegral(n: number, x: number): number {
  const panels = 2048;
  let sum = 0;
  for (let k = 0; k <= panels; k++) {
    const tau = (Math.PI * k) / panels;
    const w = k === 0 || k === panels ? 0.5 : 1;
    sum += w * Math.cos(n * tau - x * Math.sin(tau));
  }
  return sum / panels;
}

/**
 * The 99 % occupied bandwidth of tone FM of index β = D/fm: the lines at fc + n·fm carry Jn(β)²
 * of the power (Σ Jn² = 1, A&S 9.1.76); with N the smallest count such that lines |n| ≤ N hold
 * at least 99 %, both 0.5 % points fall inside the lines ±N, so OBW = 2·N·fm (REFERENCES.md §1,
 * "lines holding ≥ 99 % of power"; ITU-R SM.328 β % method).
 */
export function toneFmObw99Hz(peakDeviationHz: number, toneHz: number): number {
  const beta = peakDeviationHz / toneHz;
  let inside = besselJIntegral(0, beta) ** 2;
  let n = 0;
  while (inside < 0.99 && n < 200) {
    n += 1;
    inside += 2 * besselJIntegral(n, beta) ** 2;
  }
  return 2 * n * toneHz;
}

/**
 * Tone AM with depth m: carrier A², sidebands A²m²/4 each at ±fm (REFERENCES.md §5). When each
 * sideband holds more than 0.5 % of the power (m²/(4 + 2m²) > 0.005, m > 0.1421) the 0.5 % points
 * fall inside the sideband lines and OBW = 2·fm; else the carrier alone holds 99 % (OBW → 0, not
 * a figure to compare) and this returns null.
 */
export function toneAmObw99Hz(depthPercent: number, toneHz: number): number | null {
  const m = depthPercent / 100;
  return (m * m) / (4 + 2 * m * m) > 0.005 ? 2 * toneHz : null;
}

/**
 * The raised-cosine power spectrum (Proakis, Nyquist pulse shaping; REFERENCES.md §7) at
 * x = f·T, normalised to H(0) = 1.
 */
export function raisedCosineShape(x: number, rollOff: number): number {
  const a = Math.abs(x);
  if (a <= (1 - rollOff) / 2) return 1;
  if (a > (1 + rollOff) / 2) return 0;
  return 0.5 * (1 + Math.cos((Math.PI / rollOff) * (a - (1 - rollOff) / 2)));
}

/**
 * 99 % occupied bandwidth of an RRC-shaped linear modulation, in units of the symbol rate: the
 * width 2x inside which the raised-cosine spectrum holds 99 % of its area, found by integrating
 * it in closed form. REFERENCES.md §3 tabulates α = 0.20 → 1.0731, 0.25 → 1.1031, 0.35 → 1.1667,
 * 0.50 → 1.2680.
 */
export function rrcObw99PerBaud(rollOff: number): number {
  // Area of one side beyond x (the whole spectrum has area 1 in units of Rs).
  const tail = (x: number): number => {
    const x1 = (1 - rollOff) / 2;
    const x2 = (1 + rollOff) / 2;
    if (x >= x2) return 0;
    // ∫_x^x2 ½(1 + cos(π/α (u − x1))) du = ½(x2 − x) − (α/2π) sin(π/α (x − x1)).
    const lo = Math.max(x, x1);
    const roll = 0.5 * (x2 - lo) - (rollOff / (2 * Math.PI)) * Math.sin((Math.PI / rollOff) * (lo - x1));
    return roll + Math.max(0, x1 - x);
  };
  let lo = 0;
  let hi = (1 + rollOff) / 2;
  for (let i = 0; i < 80; i++) {
    const mid = (lo + hi) / 2;
    if (tail(mid) > 0.005) lo = mid;
    else hi = mid;
  }
  return lo + hi;
}

/**
 * Expected RMS EVM of a linear modulation in white noise, percent: 1/sqrt(Es/N0) (Shafik,
 * Rahman & Islam 2006; REFERENCES.md §6), data-aided. Decision-directed EVM reads low once
 * symbol decisions go wrong (Mahmoud & Arslan 2009), so see `evmComparable`.
 */
export function expectedEvmPercent(esN0Db: number): number {
  return 100 / Math.sqrt(10 ** (esN0Db / 10));
}

/**
 * Minimum distance between points of the unit-mean-energy constellations (closed forms):
 * M-PSK 2 sin(π/M); square 16/64-QAM 2/sqrt(2(M−1)/3); 32-QAM cross on the odd-integer grid
 * (mean energy 20) 2/sqrt(20).
 */
export const MIN_DISTANCE: Readonly<Record<string, number>> = {
  bpsk: 2, qpsk: 2 * Math.sin(Math.PI / 4), "8psk": 2 * Math.sin(Math.PI / 8),
  "16qam": 2 / Math.sqrt(10), "32qam": 2 / Math.sqrt(20), "64qam": 2 / Math.sqrt(42),
};

/**
 * Whether the decision-directed EVM can be compared with 1/sqrt(Es/N0): half the minimum distance
 * at least 3.5 noise standard deviations per dimension, so fewer than about 2.3e-4 of the
 * symbols are decided wrong (Q(3.5), per neighbour) and the bias is negligible (common practice).
 */
export function evmComparable(kind: string, esN0Db: number): boolean {
  const d = MIN_DISTANCE[kind];
  if (d === undefined) return false;
  const sigma = Math.sqrt(1 / (2 * 10 ** (esN0Db / 10)));
  return d / 2 >= 3.5 * sigma;
}
