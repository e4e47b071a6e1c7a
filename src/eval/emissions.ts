/**
 * Baseband emissions of the evaluation set (carrier at 0 Hz), one builder per variant, made from
 * the scenario's building blocks with parameters drawn from a seeded generator. Each returns the
 * samples, the power and bandwidth its SNR is stated in, the half-width it needs in the capture,
 * and the parameters and true figures that follow from how it was made.
 */
import {
  SeededRandom, amFromAudio, burstGate, constellation, fmFromAudio, nrzLevels, ookFromBits, randomSymbols, rrcPsk,
  speechLikeAudio, toneAudio, type ConstellationKind, type GlidingTone,
} from "../scenario/index.js";
import { rrcObw99PerBaud, toneAmObw99Hz, toneFmObw99Hz } from "./theory.js";
import type { Quantity, Variant } from "./truth.js";

export interface BuiltEmission {
  /** Interleaved I,Q at complex baseband, carrier (or centre of the tones) at 0 Hz. */
  readonly iq: Float64Array;
  /** Mean power the SNR refers to (full scale 1 = 0 dBFS), over the whole record or while keyed on. */
  readonly powerFs: number;
  /** Bandwidth the in-band SNR is stated in, Hz. */
  readonly snrReferenceHz: number;
  /** Half the band the emission needs in the capture (for placing it), Hz. */
  readonly halfWidthHz: number;
  readonly params: Record<string, number>;
  /** True figures known before the SNR (EVM is added by the generator, from the SNR). */
  readonly figures: Partial<Record<Quantity, number | null>>;
}

export interface BuildContext {
  readonly rng: SeededRandom;
  readonly sampleRateHz: number;
  readonly samples: number;
}

const between = (rng: SeededRandom, lo: number, hi: number): number => lo + (hi - lo) * rng.uniform();

/** Multiplies the I and Q of `iq` by a real gate, in place. */
function applyGate(iq: Float64Array, gate: ArrayLike<number>): Float64Array {
  for (let k = 0; k < gate.length; k++) {
    const g = gate[k] as number;
    iq[2 * k] = (iq[2 * k] as number) * g;
    iq[2 * k + 1] = (iq[2 * k + 1] as number) * g;
  }
  return iq;
}

function meanPower(iq: Float64Array, gate?: ArrayLike<number>): number {
  let s = 0;
  let w = 0;
  for (let k = 0; k < iq.length / 2; k++) {
    const g = gate === undefined ? 1 : (gate[k] as number) >= 0.5 ? 1 : 0;
    s += g * ((iq[2 * k] as number) ** 2 + (iq[2 * k + 1] as number) ** 2);
    w += g;
  }
  return s / Math.max(w, 1);
}

/** Convolves `x` with a kernel normalised to unit sum, centred (same length out). */
function smooth(x: Float64Array, kernel: Float64Array): Float64Array {
  let sum = 0;
  for (const v of kernel) sum += v;
  const half = Math.floor(kernel.length / 2);
  const out = new Float64Array(x.length);
  for (let n = 0; n < x.length; n++) {
    let acc = 0;
    for (let j = 0; j < kernel.length; j++) {
      const i = n + j - half;
      if (i >= 0 && i < x.length) acc += (kernel[j] as number) * (x[i] as number);
    }
    out[n] = acc / sum;
  }
  return out;
}

/** A Hann kernel of `length` samples (raised-cosine edges when convolved with a step). */
function hannKernel(length: number): Float64Array {
  const k = new Float64Array(Math.max(1, length));
  for (let i = 0; i < k.length; i++) k[i] = 0.5 - 0.5 * Math.cos((2 * Math.PI * (i + 1)) / (k.length + 1));
  return k;
}

/**
 * Gaussian frequency pulse of a GFSK modulator: h(t) ∝ exp(−t²/2σ²), σ = sqrt(ln 2)/(2π·BT)·T
 * (the Gaussian filter of 3 dB bandwidth B = BT/T; Murota & Hirade 1981, from memory), ±4σ.
 */
function gaussianKernel(bt: number, samplesPerSymbol: number): Float64Array {
  const sigma = (Math.sqrt(Math.LN2) / (2 * Math.PI * bt)) * samplesPerSymbol;
  const half = Math.ceil(4 * sigma);
  const k = new Float64Array(2 * half + 1);
  for (let i = -half; i <= half; i++) k[i + half] = Math.exp(-(i * i) / (2 * sigma * sigma));
  return k;
}

/** Random speech-like partials inside the 300–3000 Hz telephony band (odd Hz, even glide rates). */
function speechPartials(rng: SeededRandom): GlidingTone[] {
  const count = 3 + rng.integer(2);
  const tones: GlidingTone[] = [];
  for (let i = 0; i < count; i++) {
    const f = 2 * Math.floor(between(rng, 180, 1250)) + 1;
    tones.push({ frequencyHz: f, glideHz: Math.min(between(rng, 40, 220), 2900 - f, f - 320), glideRateHz: 2 * (1 + rng.integer(3)) });
  }
  return tones;
}

function speech(ctx: BuildContext): { audio: Float64Array; syllablePeriodS: number } {
  const period = ctx.rng.uniform() < 0.5 ? 0.25 : 0.125;
  const audio = speechLikeAudio(0, ctx.samples, ctx.sampleRateHz, {
    peakTimeS: 0.5, syllablePeriodS: period, syllableLengthS: period * between(ctx.rng, 0.6, 0.9), tones: speechPartials(ctx.rng),
  });
  return { audio, syllablePeriodS: period };
}

function cw(ctx: BuildContext): BuiltEmission {
  const iq = new Float64Array(2 * ctx.samples);
  const phase = 2 * Math.PI * ctx.rng.uniform();
  for (let k = 0; k < ctx.samples; k++) { iq[2 * k] = Math.cos(phase); iq[2 * k + 1] = Math.sin(phase); }
  // A carrier has no bandwidth; its SNR is stated in 1 kHz (a stated convention of this set).
  return { iq, powerFs: 1, snrReferenceHz: 1000, halfWidthHz: 500, params: {}, figures: { occupiedHz: null } };
}

function amTone(ctx: BuildContext): BuiltEmission {
  const toneHz = between(ctx.rng, 300, 2500);
  const depth = between(ctx.rng, 30, 95);
  const iq = amFromAudio(toneAudio(0, ctx.samples, ctx.sampleRateHz, toneHz, ctx.rng.uniform()), depth);
  // A3E: necessary bandwidth 2M (47 CFR 2.202(g)); the SNR is stated in it.
  return {
    iq, powerFs: meanPower(iq), snrReferenceHz: 2 * toneHz, halfWidthHz: toneHz + 500,
    params: { toneHz, depthPercent: depth },
    figures: { amDepthPercent: depth, occupiedHz: toneAmObw99Hz(depth, toneHz) },
  };
}

function amSpeech(ctx: BuildContext): BuiltEmission {
  const depth = between(ctx.rng, 30, 95);
  const { audio, syllablePeriodS } = speech(ctx);
  const iq = amFromAudio(audio, depth);
  return {
    iq, powerFs: meanPower(iq), snrReferenceHz: 6000, halfWidthHz: 3500,
    params: { depthPercent: depth, syllablePeriodS }, figures: { amDepthPercent: depth, occupiedHz: null },
  };
}

function fmTone(ctx: BuildContext): BuiltEmission {
  const toneHz = between(ctx.rng, 300, 3000);
  const dev = between(ctx.rng, 1000, 5000);
  const { iq } = fmFromAudio(toneAudio(0, ctx.samples, ctx.sampleRateHz, toneHz, ctx.rng.uniform()), ctx.sampleRateHz, dev, 2 * Math.PI * ctx.rng.uniform());
  const obw = toneFmObw99Hz(dev, toneHz);
  return {
    iq, powerFs: 1, snrReferenceHz: obw, halfWidthHz: Math.max(obw, 2 * (dev + toneHz)) / 2 + 500,
    params: { toneHz, peakDeviationHz: dev, modulationIndex: dev / toneHz },
    figures: { fmPeakDeviationHz: dev, occupiedHz: obw },
  };
}

function fmSpeech(ctx: BuildContext): BuiltEmission {
  const dev = between(ctx.rng, 1500, 5000);
  const { audio, syllablePeriodS } = speech(ctx);
  const { iq } = fmFromAudio(audio, ctx.sampleRateHz, dev, 2 * Math.PI * ctx.rng.uniform());
  // F3E: Carson's rule 2(D + M), M = 3 kHz (REFERENCES.md §2); the SNR is stated in it.
  const carson = 2 * (dev + 3000);
  return {
    iq, powerFs: 1, snrReferenceHz: carson, halfWidthHz: carson / 2 + 500,
    params: { peakDeviationHz: dev, syllablePeriodS }, figures: { fmPeakDeviationHz: dev, occupiedHz: null },
  };
}

/** Symbol levels of M-FSK: ±1 (2-FSK) or ±1, ±3 (4-FSK). */
function fskLevel(rng: SeededRandom, order: 2 | 4): number {
  return order === 2 ? 2 * rng.integer(2) - 1 : 2 * rng.integer(4) - 3;
}

/** NRZ frequency levels of random M-FSK symbols from t0 on, for `count` samples from `start`. */
function fskLevels(rng: SeededRandom, order: 2 | 4, rateBd: number, fs: number, start: number, count: number, t0S: number): Float64Array {
  const symbols = Math.ceil((count / fs) * rateBd) + 2;
  const ones = nrzLevels(new Uint8Array(symbols).fill(1), rateBd, fs, start, count, t0S);
  const values = Array.from({ length: symbols }, () => fskLevel(rng, order));
  for (let n = 0; n < count; n++) {
    const j = Math.floor(((start + n) / fs - t0S) * rateBd);
    ones[n] = (ones[n] as number) * (values[j] ?? 0);
  }
  return ones;
}

interface FskDraw { readonly order: 2 | 4; readonly rateBd: number; readonly spacingHz: number }

function drawFsk(ctx: BuildContext, order: 2 | 4, hLo: number, hHi: number): FskDraw {
  const rateBd = order === 2 ? between(ctx.rng, 1200, 9600) : between(ctx.rng, 1200, 4800);
  return { order, rateBd, spacingHz: rateBd * between(ctx.rng, hLo, hHi) };
}

/**
 * Continuous-phase M-FSK from NRZ frequency levels: tones at (2i − M + 1)·spacing/2; peak
 * deviation (M − 1)·spacing/2. SNR reference: Carson's rule 2·D + Rs (REFERENCES.md §2).
 */
function fskFromLevels(ctx: BuildContext, d: FskDraw, levels: Float64Array, extra: Record<string, number>): BuiltEmission {
  const { iq } = fmFromAudio(levels, ctx.sampleRateHz, d.spacingHz / 2, 2 * Math.PI * ctx.rng.uniform());
  const peakDev = ((d.order - 1) * d.spacingHz) / 2;
  return {
    iq, powerFs: 1, snrReferenceHz: 2 * peakDev + d.rateBd, halfWidthHz: peakDev + 1.5 * d.rateBd,
    params: { order: d.order, symbolRateBd: d.rateBd, toneSpacingHz: d.spacingHz, peakDeviationHz: peakDev, ...extra },
    figures: { symbolRateBd: d.rateBd, occupiedHz: null },
  };
}

function fsk(order: 2 | 4) {
  return (ctx: BuildContext): BuiltEmission => {
    const d = drawFsk(ctx, order, order === 2 ? 0.5 : 0.5, order === 2 ? 2 : 1.2);
    const levels = fskLevels(ctx.rng, order, d.rateBd, ctx.sampleRateHz, 0, ctx.samples, -ctx.rng.uniform() / d.rateBd);
    return fskFromLevels(ctx, d, levels, { modulationIndex: d.spacingHz / d.rateBd });
  };
}

/** 2-FSK through a Gaussian filter of BT = 0.5, index h in 0.5–1. */
function gfsk(ctx: BuildContext): BuiltEmission {
  const d = drawFsk(ctx, 2, 0.5, 1);
  const nrz = fskLevels(ctx.rng, 2, d.rateBd, ctx.sampleRateHz, 0, ctx.samples, -ctx.rng.uniform() / d.rateBd);
  const levels = smooth(nrz, gaussianKernel(0.5, ctx.sampleRateHz / d.rateBd));
  return fskFromLevels(ctx, d, levels, { bt: 0.5, modulationIndex: d.spacingHz / d.rateBd });
}

/**
 * M-FSK in bursts: a duty cycle of 5–50 %, each burst a fresh symbol clock starting at a
 * fractional sample, raised-cosine edges of 0.1–0.5 ms, a period of 50–200 ms (longer where
 * a burst would be under 8 ms), at least 40 symbols a burst (the rate is raised to that where needed). The SNR is
 * stated for the power while keyed on.
 */
function fskBurst(order: 2 | 4) {
  return (ctx: BuildContext): BuiltEmission => {
    const fs = ctx.sampleRateHz;
    const duty = between(ctx.rng, 0.05, 0.5);
    const periodS = Math.max(between(ctx.rng, 0.05, 0.2), 0.008 / duty);
    const onS = duty * periodS;
    const drawn = drawFsk(ctx, order, 0.6, order === 2 ? 2 : 1.2);
    const rateBd = Math.max(drawn.rateBd, 40 / onS);
    const d: FskDraw = { order, rateBd, spacingHz: (drawn.spacingHz / drawn.rateBd) * rateBd };
    const schedule = { periodS, onS, firstStartS: between(ctx.rng, 0.002, 0.02), rampS: between(ctx.rng, 1e-4, 5e-4) };
    const levels = new Float64Array(ctx.samples);
    for (let k = 0; ; k++) {
      const t0 = schedule.firstStartS + k * periodS - schedule.rampS;
      const start = Math.max(0, Math.floor(t0 * fs));
      if (start >= ctx.samples) break;
      const count = Math.min(ctx.samples - start, Math.ceil((onS + 2 * schedule.rampS) * fs) + 1);
      levels.set(fskLevels(ctx.rng, order, rateBd, fs, start, count, t0), start);
    }
    const gate = burstGate(0, ctx.samples, fs, schedule);
    const built = fskFromLevels(ctx, d, levels, {
      modulationIndex: d.spacingHz / rateBd, dutyCyclePercent: 100 * duty, burstPeriodS: periodS, burstOnS: onS,
    });
    applyGate(built.iq, gate);
    return { ...built, powerFs: meanPower(built.iq, gate) };
  };
}

/**
 * On-off keying of random bits at 500–5000 Bd (amplitude 1 on, 0 off); the soft variant has
 * raised-cosine edges 15–40 % of a bit long. SNR: mean power over the record, in 2·Rb (the main
 * lobe of the keying spectrum).
 */
function ook(soft: boolean) {
  return (ctx: BuildContext): BuiltEmission => {
    const rateBd = between(ctx.rng, 500, 5000);
    const fs = ctx.sampleRateHz;
    const bits = Array.from({ length: Math.ceil((ctx.samples / fs) * rateBd) + 2 }, () => ctx.rng.integer(2));
    const keyed = ookFromBits(bits, rateBd, fs, 0, ctx.samples, -ctx.rng.uniform() / rateBd);
    const env = new Float64Array(ctx.samples);
    for (let k = 0; k < ctx.samples; k++) env[k] = keyed[2 * k] as number;
    const edge = soft ? between(ctx.rng, 0.15, 0.4) : 0;
    const shaped = soft ? smooth(env, hannKernel(Math.round((edge * fs) / rateBd))) : env;
    const phase = 2 * Math.PI * ctx.rng.uniform();
    const iq = new Float64Array(2 * ctx.samples);
    for (let k = 0; k < ctx.samples; k++) { iq[2 * k] = (shaped[k] as number) * Math.cos(phase); iq[2 * k + 1] = (shaped[k] as number) * Math.sin(phase); }
    return {
      iq, powerFs: meanPower(iq), snrReferenceHz: 2 * rateBd, halfWidthHz: 3 * rateBd,
      params: { symbolRateBd: rateBd, edgeFractionOfBit: edge }, figures: { symbolRateBd: rateBd, occupiedHz: null },
    };
  };
}

/**
 * Span of the transmitted RRC pulse, symbols each side: truncation at ±24 leaves inter-symbol
 * interference near −62 dB after an ideal matched filter (α = 0.2, computed by numerical
 * convolution of the truncated pulses), far below the 1 % EVM of a 40 dB SNR.
 */
const RRC_SPAN_SYMBOLS = 24;

/**
 * RRC-shaped linear modulation, roll-off 0.2–0.5, 4–30 kBd (at most 0.3·fs wide), random phase.
 * SNR in the 99 % OBW of the RRC spectrum (REFERENCES.md §3), which is also the true OBW.
 */
function linear(kind: ConstellationKind) {
  return (ctx: BuildContext): BuiltEmission => {
    const fs = ctx.sampleRateHz;
    const rollOff = between(ctx.rng, 0.2, 0.5);
    const rateBd = Math.min(between(ctx.rng, 4000, 30000), (0.3 * fs) / (1 + rollOff));
    const symbols = randomSymbols(ctx.rng, kind, Math.ceil((ctx.samples / fs) * rateBd) + 20);
    const base = rrcPsk(symbols, 0, ctx.samples, { symbolRateBd: rateBd, sampleRateHz: fs, rollOff, spanSymbols: RRC_SPAN_SYMBOLS, firstSymbolS: -(RRC_SPAN_SYMBOLS + ctx.rng.uniform()) / rateBd });
    const phase = 2 * Math.PI * ctx.rng.uniform();
    const c = Math.cos(phase);
    const s = Math.sin(phase);
    for (let k = 0; k < base.length; k += 2) {
      const i = base[k] as number;
      const q = base[k + 1] as number;
      base[k] = i * c - q * s;
      base[k + 1] = i * s + q * c;
    }
    const obw = rrcObw99PerBaud(rollOff) * rateBd;
    return {
      iq: base, powerFs: meanEnergy(kind), snrReferenceHz: obw, halfWidthHz: ((1 + rollOff) * rateBd) / 2 + 500,
      params: { order: constellation(kind).length / 2, symbolRateBd: rateBd, rollOff },
      figures: { symbolRateBd: rateBd, occupiedHz: obw },
    };
  };
}

/** Mean energy of the unit-energy constellations: 1 by construction (src/dsp/constellations.ts). */
function meanEnergy(kind: ConstellationKind): number {
  const p = constellation(kind);
  let s = 0;
  for (let k = 0; k < p.length; k += 2) s += (p[k] as number) ** 2 + (p[k + 1] as number) ** 2;
  return s / (p.length / 2);
}

export const BUILDERS: Readonly<Record<Variant, (ctx: BuildContext) => BuiltEmission>> = {
  cw,
  "am-tone": amTone,
  "am-speech": amSpeech,
  "fm-tone": fmTone,
  "fm-speech": fmSpeech,
  fsk2: fsk(2),
  fsk4: fsk(4),
  "fsk2-burst": fskBurst(2),
  "fsk4-burst": fskBurst(4),
  gfsk2: gfsk,
  ook: ook(false),
  "ook-soft": ook(true),
  bpsk: linear("bpsk"),
  qpsk: linear("qpsk"),
  "8psk": linear("8psk"),
  "16qam": linear("16qam"),
  "32qam": linear("32qam"),
  "64qam": linear("64qam"),
};

/** Capture length each variant needs, s: speech peaks at 0.5 s and 1.0 s; bursts need several periods. */
export function durationSOf(variant: Variant): number {
  if (variant === "am-speech" || variant === "fm-speech") return 1.2;
  if (variant === "fsk2-burst" || variant === "fsk4-burst") return 1.0;
  return 0.5;
}
