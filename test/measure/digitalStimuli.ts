// Synthetic digital emissions for the classification, FSK and OOK tests, with their closed-form
// parameters. Noise is added over a stated reference bandwidth (see each builder).
import {
  fmFromAudio, frequencyShift, nrzLevels, ookFromBits, randomSymbols, rrcPsk, SeededRandom, type ConstellationKind,
} from "../../src/scenario/index.js";
import { addNoise, meanPower } from "./emissionStimuli.js";

/** Random bits 0/1. */
export function randomBits(rng: SeededRandom, count: number): Uint8Array {
  const b = new Uint8Array(count);
  for (let k = 0; k < count; k++) b[k] = rng.integer(2);
  return b;
}

/** Adds white noise so that signal power over the noise in `referenceHz` is `snrDb`. */
export function withSnr(signal: Float64Array, fs: number, snrDb: number, referenceHz: number, seed: number): Float64Array {
  const n0 = meanPower(signal) / (10 ** (snrDb / 10) * referenceHz);
  return addNoise(signal.slice(), n0 * fs, seed);
}

/** Rotates a record by a constant phase. */
export function rotate(iq: Float64Array, phaseRad: number): Float64Array {
  const c = Math.cos(phaseRad);
  const s = Math.sin(phaseRad);
  const out = new Float64Array(iq.length);
  for (let k = 0; k < iq.length; k += 2) {
    const a = iq[k] as number;
    const b = iq[k + 1] as number;
    out[k] = a * c - b * s;
    out[k + 1] = a * s + b * c;
  }
  return out;
}

/**
 * RRC-shaped linear modulation of `kind` at `rs` Bd, amplitude 0.5, random phase, carrier offset
 * `offsetHz`; reference bandwidth for the SNR: the absolute RRC bandwidth (1 + α)·Rs (REFERENCES.md §7).
 */
export function linearEmission(kind: ConstellationKind, n: number, fs: number, rs: number, rollOff: number, offsetHz: number, snrDb: number, seed: number): Float64Array {
  const rng = new SeededRandom(seed);
  const symbols = randomSymbols(rng, kind, Math.ceil((n / fs) * rs) + 16);
  const base = rrcPsk(symbols, 0, n, { symbolRateBd: rs, sampleRateHz: fs, rollOff, amplitude: 0.5, firstSymbolS: -8 / rs });
  const sig = frequencyShift(rotate(base, rng.uniform() * 2 * Math.PI), fs, offsetHz);
  return withSnr(sig, fs, snrDb, (1 + rollOff) * rs, seed + 1000);
}

/**
 * Continuous-phase M-FSK (M = 2 or 4), rectangular frequency pulses: tones at
 * centre + (2i − M + 1)·spacing/2, i = 0 … M − 1, amplitude 0.5. Built as fmFromAudio of NRZ
 * levels (2-FSK: deviation = shift/2) or of the 4-level sequence ±1, ±3 (deviation spacing/2).
 * Reference bandwidth: 47 CFR 2.202(g) F1B, Bn = B + 2·D·K, K = 1.2, D = peak deviation.
 */
export function fskEmission(order: 2 | 4, n: number, fs: number, rb: number, spacingHz: number, centreHz: number, snrDb: number | null, seed: number): { iq: Float64Array; symbols: Int8Array } {
  const rng = new SeededRandom(seed);
  const count = Math.ceil((n / fs) * rb) + 1;
  const symbols = new Int8Array(count);
  for (let k = 0; k < count; k++) symbols[k] = order === 2 ? 2 * rng.integer(2) - 1 : 2 * rng.integer(4) - 3;
  const ones = nrzLevels(new Uint8Array(count).fill(1), rb, fs, 0, n);
  const audio = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    const j = Math.floor((i / fs) * rb);
    audio[i] = (ones[i] as number) * (symbols[j] as number);
  }
  const sig = fmFromAudio(audio, fs, spacingHz / 2, rng.uniform() * 2 * Math.PI, 0.5).iq;
  const shifted = frequencyShift(sig, fs, centreHz);
  const peakDev = ((order - 1) * spacingHz) / 2;
  return { iq: snrDb === null ? shifted : withSnr(shifted, fs, snrDb, rb + 2 * peakDev * 1.2, seed + 2000), symbols };
}

/**
 * On-off keying of random bits at `rb` Bd: on amplitude 1, off amplitude `offAmplitude` (carrier
 * leakage), random phase and offset. Noise of total power `noisePower` over ±fs/2 (white).
 */
export function ookEmission(n: number, fs: number, rb: number, offAmplitude: number, offsetHz: number, noisePower: number, seed: number): { iq: Float64Array; bits: Uint8Array } {
  const rng = new SeededRandom(seed);
  const bits = randomBits(rng, Math.ceil((n / fs) * rb) + 1);
  const keyed = ookFromBits(bits, rb, fs, 0, n);
  for (let k = 0; k < keyed.length; k += 2) keyed[k] = offAmplitude + (1 - offAmplitude) * (keyed[k] as number);
  const sig = frequencyShift(rotate(keyed, rng.uniform() * 2 * Math.PI), fs, offsetHz);
  return { iq: noisePower > 0 ? addNoise(sig, noisePower, seed + 3000) : sig, bits };
}

/**
 * Envelope (0 … 1) of on-off keying of `bits` at `rb` Bd over `n` samples at `fs`, with
 * raised-cosine edges over a share `edge` of a symbol, centred on each symbol boundary.
 */
export function softKeyingEnvelope(bits: ArrayLike<number>, rb: number, fs: number, n: number, edge: number): Float64Array {
  const rc = (from: number, to: number, u: number): number => from + ((to - from) * (1 - Math.cos(Math.PI * u))) / 2;
  const out = new Float64Array(n);
  for (let k = 0; k < n; k++) {
    const t = (k / fs) * rb;
    const j = Math.floor(t);
    const frac = t - j;
    let e = bits[j] as number;
    if (frac < edge / 2 && j > 0) e = rc(bits[j - 1] as number, e, (frac + edge / 2) / edge);
    else if (frac > 1 - edge / 2) e = rc(e, bits[j + 1] as number, (frac - 1 + edge / 2) / edge);
    out[k] = e;
  }
  return out;
}
