/**
 * Root-raised-cosine pulse shaping and QPSK symbols for synthetic digital links.
 */
import { ParameterError } from "../errors.js";
import { requireCount, requirePositive, requireRange } from "./checks.js";
import type { SeededRandom } from "./random.js";

/**
 * The root-raised-cosine pulse p(t) at time x = t/T (T the symbol period), roll-off α ∈ (0, 1],
 * normalised to unit energy per symbol period: ∫ p(t)² dt = T (p = √T·g for the unit-energy g).
 *
 *   p(x) = [sin(πx(1−α)) + 4αx·cos(πx(1+α))] / [πx(1 − (4αx)²)]
 *   p(0) = 1 − α + 4α/π
 *   p(±1/(4α)) = (α/√2)[(1 + 2/π) sin(π/(4α)) + (1 − 2/π) cos(π/(4α))]
 *
 * Its autocorrelation (p ⋆ p)(t)/T is the raised-cosine pulse, zero at every t = kT, k ≠ 0
 * (Nyquist); |P(f)|² is the raised-cosine spectrum of REFERENCES.md §7 and the absolute
 * bandwidth is (1 + α)/T. Formula from memory, in the form given by Proakis & Salehi,
 * "Communication Systems Engineering" (square-root raised cosine), and by many DSP texts.
 */
export function rrcPulse(x: number, rollOff: number): number {
  const a = rollOff;
  if (!(a > 0 && a <= 1)) throw new ParameterError("rollOff", `${a} must lie in (0, 1]`);
  if (Math.abs(x) < 1e-9) return 1 - a + (4 * a) / Math.PI;
  const edge = 1 / (4 * a);
  if (Math.abs(Math.abs(x) - edge) < 1e-9) {
    const arg = Math.PI / (4 * a);
    return (a / Math.SQRT2) * ((1 + 2 / Math.PI) * Math.sin(arg) + (1 - 2 / Math.PI) * Math.cos(arg));
  }
  const num = Math.sin(Math.PI * x * (1 - a)) + 4 * a * x * Math.cos(Math.PI * x * (1 + a));
  const den = Math.PI * x * (1 - (4 * a * x) ** 2);
  return num / den;
}

/**
 * `count` Gray-coded QPSK symbols (±1 ± j)/√2, interleaved I,Q, from `rng`: each has energy
 * |s|² = 1 exactly, and the four points are equally likely. Two bits per symbol: bit 1 → I sign,
 * bit 0 → Q sign (0 → +, 1 → −), so neighbours differ in one bit (Gray mapping, Proakis).
 */
export function qpskSymbols(rng: SeededRandom, count: number): Float64Array {
  requireCount("count", count);
  const out = new Float64Array(2 * count);
  for (let k = 0; k < count; k++) {
    const v = rng.integer(4);
    out[2 * k] = (v & 2 ? -1 : 1) * Math.SQRT1_2;
    out[2 * k + 1] = (v & 1 ? -1 : 1) * Math.SQRT1_2;
  }
  return out;
}

/** Options of `rrcPsk`. */
export interface RrcPskOptions {
  readonly symbolRateBd: number;
  readonly sampleRateHz: number;
  /** Roll-off α, (0, 1]. */
  readonly rollOff: number;
  /** Pulse truncated to ±spanSymbols symbol periods. Default 8. */
  readonly spanSymbols?: number;
  /** Time of the centre of symbol 0, s from sample 0. Default 0. */
  readonly firstSymbolS?: number;
  /** Peak amplitude scale A (mean power A²·E|s|²). Default 1. */
  readonly amplitude?: number;
}

/**
 * A linearly modulated baseband signal: x(t) = A·Σ_k s_k·p((t − t_k)/T), t_k = firstSymbolS + k·T,
 * p the unit-energy root-raised-cosine pulse of `rrcPulse`, evaluated at t = n/fs for
 * n = startSample … startSample+count−1 (a pure function of n, so blocks join seamlessly; any
 * fs/Rs ratio). With independent zero-mean symbols the mean power is A²·E|s|²·(∫p²dt)/T = A²·E|s|²
 * (Proakis, power spectrum of linearly modulated signals). `symbols` is interleaved I,Q; outside
 * the symbol sequence the signal is zero (with the pulse tails ramping in and out).
 */
export function rrcPsk(symbols: Float64Array, startSample: number, count: number, options: RrcPskOptions): Float64Array {
  requirePositive("symbolRateBd", options.symbolRateBd);
  requirePositive("sampleRateHz", options.sampleRateHz);
  requireRange("rollOff", options.rollOff, Number.MIN_VALUE, 1);
  const span = options.spanSymbols ?? 8;
  requirePositive("spanSymbols", span);
  const t0 = options.firstSymbolS ?? 0;
  const a = options.amplitude ?? 1;
  const nSymbols = symbols.length >> 1;
  const out = new Float64Array(2 * count);
  for (let n = 0; n < count; n++) {
    // Position in symbol periods relative to symbol 0.
    const u = ((startSample + n) / options.sampleRateHz - t0) * options.symbolRateBd;
    const kLo = Math.max(0, Math.ceil(u - span));
    const kHi = Math.min(nSymbols - 1, Math.floor(u + span));
    let i = 0;
    let q = 0;
    for (let k = kLo; k <= kHi; k++) {
      const p = rrcPulse(u - k, options.rollOff);
      i += (symbols[2 * k] as number) * p;
      q += (symbols[2 * k + 1] as number) * p;
    }
    out[2 * n] = a * i;
    out[2 * n + 1] = a * q;
  }
  return out;
}
