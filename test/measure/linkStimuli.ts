// RRC-shaped PSK/QAM test links with noise at a known Es/N0 (shared by the digital tests).
import { complexNoise, frequencyShift, randomSymbols, rrcPsk, SeededRandom, type ConstellationKind } from "../../src/scenario/index.js";

/** Parameters of a synthetic link. */
export interface Link {
  readonly kind: ConstellationKind;
  readonly samplesPerSymbol: number;
  /** Es/N0, dB (Infinity for none). */
  readonly esN0Db: number;
  readonly symbolCount: number;
  readonly symbolRateBd?: number;
  readonly rollOff?: number;
  /** Transmit pulse span, symbols (default 12). */
  readonly spanSymbols?: number;
  readonly offsetHz?: number;
  readonly phaseRad?: number;
  readonly seed?: number;
}

/**
 * x = e^(jθ)·Σ s_k p(t − kT) shifted by offsetHz, plus complex white noise. rrcPsk has mean
 * power E|s|² = 1 per sample, so Es = 1·T and N0 = σ²/fs: Es/N0 = sps/σ² (Proakis, SNR per
 * symbol), hence σ² = sps·10^(−Es/N0/10).
 */
export function link(l: Link): { iq: Float64Array; sampleRateHz: number; symbolRateBd: number } {
  const rs = l.symbolRateBd ?? 1000;
  const fs = rs * l.samplesPerSymbol;
  const seed = l.seed ?? 1;
  const syms = randomSymbols(new SeededRandom(seed), l.kind, l.symbolCount);
  const th = l.phaseRad ?? 0;
  const c = Math.cos(th);
  const s = Math.sin(th);
  for (let k = 0; k < syms.length; k += 2) {
    const i = syms[k] as number;
    const q = syms[k + 1] as number;
    syms[k] = i * c - q * s;
    syms[k + 1] = i * s + q * c;
  }
  // Symbol 0 at 0.3 T: the timing recovery must find a fractional phase.
  const iq = rrcPsk(syms, 0, Math.floor(l.symbolCount * l.samplesPerSymbol), {
    symbolRateBd: rs, sampleRateHz: fs, rollOff: l.rollOff ?? 0.35, spanSymbols: l.spanSymbols ?? 12, firstSymbolS: 0.3 / rs,
  });
  const shifted = l.offsetHz ? frequencyShift(iq, fs, l.offsetHz) : iq;
  if (Number.isFinite(l.esN0Db)) {
    const noise = new Float64Array(shifted.length);
    complexNoise(new SeededRandom(seed + 1000), noise, l.samplesPerSymbol * 10 ** (-l.esN0Db / 10));
    for (let k = 0; k < shifted.length; k++) shifted[k] = (shifted[k] as number) + (noise[k] as number);
  }
  return { iq: shifted, sampleRateHz: fs, symbolRateBd: rs };
}
