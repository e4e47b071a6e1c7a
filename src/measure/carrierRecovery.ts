/**
 * Carrier recovery on symbol-spaced samples: frequency and phase from the M-th power line
 * (feed-forward), then decision-directed phase tracking.
 *
 * Raising r_k = s_k·e^(j(2πνk + θ)) + n_k to the M-th power strips M-fold symmetric modulation:
 * E[s^M] ≠ 0 for BPSK (M = 2), QPSK and square/cross QAM (M = 4) and 8PSK (M = 8), so r^M holds
 * a line at M·ν (cycles per symbol) of phase M·θ + arg E[s^M] (A. J. Viterbi & A. M. Viterbi,
 * "Nonlinear estimation of PSK-modulated carrier phase…", IEEE Trans. Inf. Theory IT-29(4),
 * 1983, for the phase; the frequency as the ML line of r^M, Rife & Boorstyn 1974). The range is
 * |ν| < 1/(2M) cycles per symbol and θ is known modulo 2π/M (the constellation's symmetry).
 */
import { constellation, transformInPlace, type ConstellationKind } from "../dsp/index.js";
import { dtftAt, lineFrequencyCrbVariance, refinePeak } from "./periodogramPeak.js";

/** The power M whose line each kind carries. */
export const CARRIER_POWER: Readonly<Record<ConstellationKind, number>> = {
  bpsk: 2, qpsk: 4, "8psk": 8, "16qam": 4, "32qam": 4, "64qam": 4,
};

/** A feed-forward carrier estimate. */
export interface PowerLineCarrier {
  /** Frequency offset, cycles per symbol. */
  readonly frequencyCyclesPerSymbol: number;
  /** Variance of it from the Cramér–Rao bound of the M-th power line, (cycles/symbol)². */
  readonly frequencyVariance: number;
  /** Phase at the centre symbol (index (K − 1)/2), rad, modulo 2π/M. */
  readonly phaseRad: number;
  /** Line-to-rest power ratio of r^M per symbol (linear). */
  readonly lineSnr: number;
}

/** The padded transform powerLineCarrier uses for `count` symbols: its size and one buffer,
 * transformed in place (16 bytes a point). A caller estimating several times on records of one
 * length passes one, so that the buffer is made once, not per estimate. */
export interface LineTransform {
  readonly size: number;
  readonly buffer: Float64Array;
}

/** The LineTransform for records of `count` symbols: at least 4·count points (a power of two). */
export function lineTransform(count: number): LineTransform {
  let size = 2;
  while (size < 4 * count) size *= 2;
  return { size, buffer: new Float64Array(2 * size) };
}

/** Frequency and phase of `symbols` (interleaved I,Q) from the M-th power line of `kind`;
 * `transform` (lineTransform of the symbol count) may be given to reuse it. */
export function powerLineCarrier(symbols: Float64Array, kind: ConstellationKind, transform?: LineTransform): PowerLineCarrier {
  const mPow = CARRIER_POWER[kind];
  const count = symbols.length >> 1;
  const z = new Float64Array(2 * count);
  let total = 0;
  for (let k = 0; k < count; k++) {
    let re = 1;
    let im = 0;
    const a = symbols[2 * k] as number;
    const b = symbols[2 * k + 1] as number;
    for (let p = 0; p < mPow; p++) {
      const t = re * a - im * b;
      im = re * b + im * a;
      re = t;
    }
    z[2 * k] = re;
    z[2 * k + 1] = im;
    total += re * re + im * im;
  }
  const { size, buffer: out } = transform !== undefined && transform.size >= 4 * count && transform.size < 8 * count
    ? transform : lineTransform(count);
  out.set(z);
  out.fill(0, 2 * count);
  transformInPlace(out);
  let kPeak = 0;
  let pPeak = -1;
  for (let k = 0; k < size; k++) {
    const p = (out[2 * k] as number) ** 2 + (out[2 * k + 1] as number) ** 2;
    if (p > pPeak) { pPeak = p; kPeak = k; }
  }
  const nu0 = (kPeak < size / 2 ? kPeak : kPeak - size) / size;
  const nuM = refinePeak(z, nu0);
  const [xr, xi] = dtftAt(z, nuM);
  const a2 = (xr * xr + xi * xi) / (count * count);
  const rest = Math.max(total / count - a2, 1e-300);
  const snr = a2 / rest;
  // The reference moment E[s^M] of the ideal constellation fixes the phase origin.
  const pts = constellation(kind);
  let mr = 0;
  let mi = 0;
  for (let j = 0; j < pts.length; j += 2) {
    let re = 1;
    let im = 0;
    for (let p = 0; p < mPow; p++) {
      const t = re * (pts[j] as number) - im * (pts[j + 1] as number);
      im = re * (pts[j + 1] as number) + im * (pts[j] as number);
      re = t;
    }
    mr += re;
    mi += im;
  }
  const phase = (Math.atan2(xi, xr) - Math.atan2(mi, mr)) / mPow;
  return {
    frequencyCyclesPerSymbol: nuM / mPow,
    frequencyVariance: lineFrequencyCrbVariance(snr, count) / (mPow * mPow),
    phaseRad: phase,
    lineSnr: snr,
  };
}

/** r_k·e^(−j(2πν(k − c) + θ)), c = (K − 1)/2: removes a feed-forward estimate. */
export function derotate(symbols: Float64Array, cyclesPerSymbol: number, phaseRad: number): Float64Array {
  const count = symbols.length >> 1;
  const c = (count - 1) / 2;
  const out = new Float64Array(symbols.length);
  for (let k = 0; k < count; k++) {
    const ph = -(2 * Math.PI * cyclesPerSymbol * (k - c) + phaseRad);
    const cs = Math.cos(ph);
    const sn = Math.sin(ph);
    const i = symbols[2 * k] as number;
    const q = symbols[2 * k + 1] as number;
    out[2 * k] = i * cs - q * sn;
    out[2 * k + 1] = i * sn + q * cs;
  }
  return out;
}

/**
 * Decision-directed second-order phase-locked loop over unit-power symbols: phase error
 * e_k = arg(r_k·e^(−jφ_k)·d_k*), d_k the nearest ideal point; φ_{k+1} = φ_k + K1·e_k + Σ K2·e.
 * Gains from the loop noise bandwidth B_L·T and damping ζ = 1/√2:
 * θn = B_L·T/(ζ + 1/(4ζ)), K1 = 4ζθn/(1 + 2ζθn + θn²), K2 = 4θn²/(1 + 2ζθn + θn²)
 * (M. Rice, Digital Communications: A Discrete-Time Approach, 2009, Appendix C; from memory,
 * with unit detector and oscillator gains). Run backward over the record first, then forward
 * from the state the backward pass ends in. Returns the tracked symbols and the residual
 * frequency, cycles per symbol: the least-squares slope of the forward pass's phase.
 */
export function trackPhase(symbols: Float64Array, kind: ConstellationKind, loopBandwidth: number): { symbols: Float64Array; residualCyclesPerSymbol: number } {
  const zeta = Math.SQRT1_2;
  const thn = loopBandwidth / (zeta + 1 / (4 * zeta));
  const den = 1 + 2 * zeta * thn + thn * thn;
  const gains = { k1: (4 * zeta * thn) / den, k2: (4 * thn * thn) / den };
  const count = symbols.length >> 1;
  // A first pass from the last symbol back to the first leaves the loop converged at the start
  // (its phase there, and the opposite of the frequency): the forward pass then starts locked,
  // instead of spending its first ~1/B_L symbols pulling in from the block estimate's residue.
  const back = runLoop(symbols, kind, gains, count - 1, -1, 0, 0, null);
  const out = new Float64Array(symbols.length);
  const forward = runLoop(symbols, kind, gains, 0, 1, back.phi, -back.integ, out);
  return { symbols: out, residualCyclesPerSymbol: forward.slope / (2 * Math.PI) };
}

/** The loop of trackPhase from symbol `start` in steps of `step` (±1), writing the corrected symbols into `out` if given. */
function runLoop(
  symbols: Float64Array, kind: ConstellationKind, gains: { k1: number; k2: number }, start: number, step: 1 | -1,
  phi0: number, integ0: number, out: Float64Array | null,
): { phi: number; integ: number; slope: number } {
  const count = symbols.length >> 1;
  const pts = constellation(kind);
  const m = pts.length >> 1;
  let phi = phi0;
  let integ = integ0;
  // Least-squares slope of the loop's phase over the symbols: the residual frequency.
  let sn1 = 0;
  let sp = 0;
  let snp = 0;
  let snn = 0;
  for (let n = 0, k = start; n < count; n++, k += step) {
    sn1 += n;
    sp += phi;
    snp += n * phi;
    snn += n * n;
    const cs = Math.cos(-phi);
    const sn = Math.sin(-phi);
    const i = symbols[2 * k] as number;
    const q = symbols[2 * k + 1] as number;
    const ri = i * cs - q * sn;
    const rq = i * sn + q * cs;
    if (out !== null) {
      out[2 * k] = ri;
      out[2 * k + 1] = rq;
    }
    let best = 0;
    let bestD = Infinity;
    for (let j = 0; j < m; j++) {
      const dd = (ri - (pts[2 * j] as number)) ** 2 + (rq - (pts[2 * j + 1] as number)) ** 2;
      if (dd < bestD) { bestD = dd; best = j; }
    }
    const di = pts[2 * best] as number;
    const dq = pts[2 * best + 1] as number;
    const e = Math.atan2(rq * di - ri * dq, ri * di + rq * dq);
    integ += gains.k2 * e;
    phi += gains.k1 * e + integ;
  }
  const den = count * snn - sn1 * sn1;
  return { phi, integ, slope: den > 0 ? (step * (count * snp - sn1 * sp)) / den : 0 };
}
