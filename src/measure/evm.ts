/**
 * Symbol decisions, error-vector magnitude and modulation error ratio against an ideal
 * PSK/QAM constellation, and the choice of constellation that best explains a set of symbols.
 */
import { constellation, type ConstellationKind } from "../dsp/index.js";
import { measurement, notAvailable, type Measurement } from "./measurement.js";

/** The figures of one set of symbols against its reference points. */
export interface EvmFigures {
  /** sqrt(Σ|e|²/Σ|s_ref|²)·100 (3GPP TS 36.141 / 38.101-2 style, average-normalised). */
  readonly evmRmsPercent: Measurement<"Percent">;
  /** max|e| / RMS(s_ref)·100, the same normalisation. */
  readonly evmPeakPercent: Measurement<"Percent">;
  /** 10·log10(Σ|s_ref|²/Σ|e|²) (ETSI TR 101 290); equals −20·log10(EVM_rms). */
  readonly merDb: Measurement<"Db">;
  /** 10·log10(|mean e|²/mean|s_ref|²): the constant (origin) offset left in the error (common practice). */
  readonly iqOriginOffsetDb: Measurement<"Db">;
  /** Symbols used. */
  readonly symbols: number;
}

/** The nearest ideal point of `kind` to each symbol (Euclidean), interleaved I,Q. */
export function decideSymbols(symbols: Float64Array, kind: ConstellationKind): Float64Array {
  const pts = constellation(kind);
  const m = pts.length >> 1;
  const out = new Float64Array(symbols.length);
  for (let k = 0; k < symbols.length; k += 2) {
    const i = symbols[k] as number;
    const q = symbols[k + 1] as number;
    let best = 0;
    let bestD = Infinity;
    for (let j = 0; j < m; j++) {
      const d = (i - (pts[2 * j] as number)) ** 2 + (q - (pts[2 * j + 1] as number)) ** 2;
      if (d < bestD) { bestD = d; best = j; }
    }
    out[k] = pts[2 * best] as number;
    out[k + 1] = pts[2 * best + 1] as number;
  }
  return out;
}

/**
 * EVM, MER and origin offset of `symbols` against the reference points `ideal` (both
 * interleaved I,Q, same length), e_k = symbols_k − ideal_k. `kind` names the reference
 * constellation (in the method text). Uncertainty (k = 2), statistical for Gaussian errors:
 * |e|² is exponential, so Σ|e|² has relative σ 1/√K and EVM ½ of it: ±EVM/√K, MER ±8.69/√K dB.
 * Decision-directed references (ideal = decideSymbols) under-read EVM at low SNR and high order
 * (Mahmoud & Arslan, IEEE Trans. Wireless Commun. 8(5), 2009; REFERENCES.md §6 caution).
 * Null values for no symbols; RangeError for mismatched lengths.
 */
export function evmFigures(symbols: Float64Array, ideal: Float64Array, kind: ConstellationKind): EvmFigures {
  if (symbols.length !== ideal.length || symbols.length % 2 !== 0) {
    throw new RangeError(`symbols (${symbols.length}) and ideal (${ideal.length}) must be interleaved I,Q of one length`);
  }
  const count = symbols.length >> 1;
  const method = `error vectors against the ${kind} reference points`;
  if (count === 0) {
    const reason = "no symbols to measure";
    return {
      evmRmsPercent: notAvailable("Percent", method, reason), evmPeakPercent: notAvailable("Percent", method, reason),
      merDb: notAvailable("Db", method, reason), iqOriginOffsetDb: notAvailable("Db", method, reason), symbols: 0,
    };
  }
  let eSum = 0;
  let rSum = 0;
  let eMax = 0;
  let mi = 0;
  let mq = 0;
  for (let k = 0; k < symbols.length; k += 2) {
    const ei = (symbols[k] as number) - (ideal[k] as number);
    const eq = (symbols[k + 1] as number) - (ideal[k + 1] as number);
    const e2 = ei * ei + eq * eq;
    eSum += e2;
    eMax = Math.max(eMax, e2);
    rSum += (ideal[k] as number) ** 2 + (ideal[k + 1] as number) ** 2;
    mi += ei;
    mq += eq;
  }
  mi /= count;
  mq /= count;
  const evm = Math.sqrt(eSum / rSum);
  const refRms = Math.sqrt(rSum / count);
  const sq = Math.sqrt(count);
  return {
    evmRmsPercent: measurement(100 * evm, "Percent", (100 * evm) / sq, `RMS ${method} over RMS reference (3GPP TS 36.141 style), ${count} symbols`),
    evmPeakPercent: measurement((100 * Math.sqrt(eMax)) / refRms, "Percent", null, `largest ${method} over RMS reference, ${count} symbols`),
    merDb: measurement(10 * Math.log10(rSum / eSum), "Db", 8.69 / sq, `MER (ETSI TR 101 290), ${count} symbols`),
    iqOriginOffsetDb: measurement(10 * Math.log10(Math.max((mi * mi + mq * mq) / (rSum / count), 1e-30)), "Db", null, `mean error vector over mean reference power, ${count} symbols`),
    symbols: count,
  };
}

/**
 * `symbols` scaled by the least-squares gain against their own decisions, g = Σ Re(r·d*)/Σ|d|²,
 * starting from RMS normalisation and repeated with fresh decisions (3 passes). Returns the
 * scaled symbols and their decisions.
 */
export function normaliseGain(symbols: Float64Array, kind: ConstellationKind): { symbols: Float64Array; ideal: Float64Array; gain: number } {
  let p = 0;
  for (let k = 0; k < symbols.length; k++) p += (symbols[k] as number) ** 2;
  let gain = Math.sqrt(p / Math.max(1, symbols.length >> 1));
  let scaled = symbols.map((v) => v / gain);
  let ideal = decideSymbols(scaled, kind);
  for (let pass = 0; pass < 3; pass++) {
    let num = 0;
    let den = 0;
    for (let k = 0; k < symbols.length; k += 2) {
      num += (symbols[k] as number) * (ideal[k] as number) + (symbols[k + 1] as number) * (ideal[k + 1] as number);
      den += (ideal[k] as number) ** 2 + (ideal[k + 1] as number) ** 2;
    }
    if (!(num > 0)) break;
    gain = num / den;
    scaled = symbols.map((v) => v / gain);
    ideal = decideSymbols(scaled, kind);
  }
  return { symbols: scaled, ideal, gain };
}

/** The result of bestConstellation. */
export interface ConstellationChoice {
  readonly kind: ConstellationKind;
  readonly evm: EvmFigures;
  /** Per candidate: mean log-likelihood per symbol and the EVM RMS %, in the order given. */
  readonly scores: readonly { readonly kind: ConstellationKind; readonly logLikelihood: number; readonly evmRmsPercent: number | null }[];
}

/**
 * Which of `kinds` best explains `symbols` (carrier-corrected, interleaved I,Q). Each candidate
 * is gain-normalised (normaliseGain) and its EVM computed. The choice is the candidate whose
 * Gaussian mixture (equal weights on the ideal points, circular variance σ² fitted by EM) has the
 * largest mean log-likelihood, the maximum-likelihood classifier of W. Wei & J. M. Mendel,
 * "Maximum-likelihood classification for digital amplitude-phase modulations", IEEE Trans.
 * Commun. 48(2), 2000. The lowest decision-directed EVM alone would prefer dense constellations
 * on noisy symbols (a 64QAM grid sits closer to noisy QPSK clusters than QPSK noise does); among
 * candidates of equal likelihood (within 1e-3 nats) the lowest EVM wins.
 */
export function bestConstellation(symbols: Float64Array, kinds: readonly ConstellationKind[]): ConstellationChoice {
  if (kinds.length === 0) throw new RangeError("kinds is empty");
  const scores: { kind: ConstellationKind; logLikelihood: number; evmRmsPercent: number | null }[] = [];
  let best: { kind: ConstellationKind; evm: EvmFigures; ll: number } | null = null;
  for (const kind of kinds) {
    const norm = normaliseGain(symbols, kind);
    const evm = evmFigures(norm.symbols, norm.ideal, kind);
    const ll = mixtureLogLikelihood(norm.symbols, kind, evm.evmRmsPercent.value ?? 100);
    scores.push({ kind, logLikelihood: ll, evmRmsPercent: evm.evmRmsPercent.value });
    const better = best === null || ll > best.ll + 1e-3 ||
      (Math.abs(ll - best.ll) <= 1e-3 && (evm.evmRmsPercent.value ?? Infinity) < (best.evm.evmRmsPercent.value ?? Infinity));
    if (better) best = { kind, evm, ll };
  }
  const b = best as { kind: ConstellationKind; evm: EvmFigures };
  return { kind: b.kind, evm: b.evm, scores };
}

/** Mean log-likelihood per symbol of an equal-weight circular Gaussian mixture on `kind`'s
 * points, σ² from EM starting at (evm/100)² (at most 10 updates, floored at 1e-8). */
function mixtureLogLikelihood(symbols: Float64Array, kind: ConstellationKind, evmPercent: number): number {
  const pts = constellation(kind);
  const m = pts.length >> 1;
  const count = symbols.length >> 1;
  let s2 = Math.max((evmPercent / 100) ** 2, 1e-8);
  const d2 = new Float64Array(m);
  let ll = 0;
  for (let iter = 0; iter < 10; iter++) {
    let acc = 0;
    ll = 0;
    for (let k = 0; k < symbols.length; k += 2) {
      let dMin = Infinity;
      for (let j = 0; j < m; j++) {
        const d = ((symbols[k] as number) - (pts[2 * j] as number)) ** 2 + ((symbols[k + 1] as number) - (pts[2 * j + 1] as number)) ** 2;
        d2[j] = d;
        if (d < dMin) dMin = d;
      }
      let w = 0;
      let wd = 0;
      for (let j = 0; j < m; j++) {
        const e = Math.exp(-((d2[j] as number) - dMin) / s2);
        w += e;
        wd += e * (d2[j] as number);
      }
      acc += wd / w;
      ll += -dMin / s2 + Math.log(w / m) - Math.log(Math.PI * s2);
    }
    const next = Math.max(acc / count, 1e-8);
    if (Math.abs(next - s2) < 1e-6 * s2) { s2 = next; break; }
    s2 = next;
  }
  return ll / Math.max(1, count);
}
