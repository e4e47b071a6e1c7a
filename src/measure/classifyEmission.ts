/**
 * The modulation class of one emission, analogue and digital (interface.md `modulation.class`,
 * `.order`, `.confidence`). It extends the analogue decision (classifyAnalog.ts) with the
 * digital features of digitalFeatures.ts. Rules, in order:
 *
 * 1. noise and cw from the analogue decision stand (no SNR, or one line with a flat envelope).
 * 2. ook (order 2): the smoothed envelope dwells at two levels (middle-half share ≤ 0.2:
 *    keying with raised-cosine edges up to half a symbol gives ≤ 0.15 at high SNR, a sinusoidal
 *    envelope 1/3 by the arcsine law; digitalFeatures.ts), the off level lies within 6 dB of the
 *    noise in the band and at least 10 dB below the on level. It comes before the analogue am:
 *    a depth read over 100 % with an envelope at the noise level for the off share is keying.
 * 3. fsk: near-constant envelope (κ < 0.25), per-symbol frequencies in 4 clusters of separation
 *    ≥ 6 (gap over pooled σ; midpoint-threshold error Q(3) ≈ 1e-3) with gaps within a factor 2
 *    of each other → order 4; else 2 clusters of separation ≥ 6 → order 2. A strict alternation
 *    (repeat share < 0.1: tone FM read at twice its tone) is not FSK.
 * 4. psk/qam: a power-law line (p = 2, 4 or 8) at the symbol instants, then the nearest ideal
 *    point of (|C20|, |C40|, C42) normalised (Swami & Sadler 2000, Table I; p = 2 → BPSK,
 *    p = 8 → 8PSK, p = 4 → QPSK, 16QAM, 32QAM or 64QAM), accepted when within 0.3 of it.
 * 5. the analogue class when it was am or fm; else unknown.
 *
 * confidence: the smallest ramped margin of the deciding features, 0.5 + 0.5·margin (as in
 * classifyAnalog); for psk/qam the margin is 1 − d₁/d₂ of the two nearest ideal points. A
 * decision whose margin is below 0.1 is given as unknown. Thresholds tuned here on synthetic
 * emissions, not from a standard.
 */
import type { WelchPsd } from "../dsp/index.js";
import type { AnalogClassification } from "./classifyAnalog.js";
import { digitalFeatures, type DigitalFeatures } from "./digitalFeatures.js";

/** Every class of interface.md `modulation.class`. */
export type EmissionClass = "cw" | "am" | "fm" | "fsk" | "ook" | "psk" | "qam" | "noise" | "unknown";

/** A class decision with its order (null for analogue classes), confidence and reason. */
export interface EmissionClassification {
  readonly class: EmissionClass;
  readonly order: number | null;
  readonly confidence: number;
  readonly method: string;
  readonly features: DigitalFeatures | null;
}

/** Options of classifyEmission. */
export interface ClassifyEmissionOptions {
  readonly snrDb: number | null;
  /** The analogue decision (classifyAnalog) of the same emission. */
  readonly analog: AnalogClassification;
  /** Noise density, FS²/Hz; default noiseFloor(psd). */
  readonly noiseFloorPerHz?: number;
}

/** Thresholds of classifyEmission (module comment). */
export const CLASSIFY_EMISSION_THRESHOLDS = {
  ookMidFraction: 0.2, ookOffOverNoiseDb: 6, ookOnOffDb: 10,
  fskKappa: 0.25, fskSeparation: 6, fskGapRatio: 2, fskRepeatFraction: 0.1,
  linearDistance: 0.3, minMargin: 0.1,
} as const;

/** Ideal (|C20|, |C40|, C42) of each linear constellation (Swami & Sadler 2000, Table I; 32QAM computed from the cross grid). */
export const IDEAL_CUMULANTS = [
  { class: "psk", order: 2, law: 2, c20: 1, c40: 2, c42: -2 },
  { class: "psk", order: 4, law: 4, c20: 0, c40: 1, c42: -1 },
  { class: "psk", order: 8, law: 8, c20: 0, c40: 0, c42: -1 },
  { class: "qam", order: 16, law: 4, c20: 0, c40: 0.68, c42: -0.68 },
  { class: "qam", order: 32, law: 4, c20: 0, c40: 0.19, c42: -0.69 },
  { class: "qam", order: 64, law: 4, c20: 0, c40: 0.619, c42: -0.619 },
] as const;

const ramp = (x: number, a: number, b: number): number => Math.min(1, Math.max(0, (x - a) / (b - a)));

/**
 * The class of the emission in `iq` (interleaved I,Q at `sampleRateHz`, Welch PSD `psd` at the
 * same rate), by the rules of the module comment.
 */
export function classifyEmission(
  iq: Float32Array | Float64Array, sampleRateHz: number, psd: WelchPsd, options: ClassifyEmissionOptions,
): EmissionClassification {
  const a = options.analog;
  if (a.class === "noise" || a.class === "cw" || options.snrDb === null) {
    return { class: a.class === "cw" ? "cw" : a.class === "noise" ? "noise" : "unknown", order: null, confidence: a.confidence, method: a.method, features: null };
  }
  const t = CLASSIFY_EMISSION_THRESHOLDS;
  const f = digitalFeatures(iq, sampleRateHz, psd, options.noiseFloorPerHz === undefined ? {} : { noiseFloorPerHz: options.noiseFloorPerHz });
  const decided = (cls: EmissionClass, order: number | null, margin: number, why: string): EmissionClassification =>
    margin < t.minMargin
      ? { class: "unknown", order: null, confidence: 0.5, method: `${why} (margin ${margin.toFixed(2)} too small)`, features: f }
      : { class: cls, order, confidence: 0.5 + 0.5 * margin, method: why, features: f };

  const e = f.envelope;
  if (e !== null) {
    const onOffDb = 10 * Math.log10(e.onPower / Math.max(e.offPower, 1e-30));
    if (e.midFraction <= t.ookMidFraction && e.offOverNoiseDb <= t.ookOffOverNoiseDb && onOffDb >= t.ookOnOffDb) {
      const m = Math.min(ramp(t.ookMidFraction - e.midFraction, 0, 0.1), ramp(onOffDb, t.ookOnOffDb, t.ookOnOffDb + 6));
      return decided("ook", 2, m, `envelope at two levels (middle share ${e.midFraction.toFixed(3)}, on/off ${onOffDb.toFixed(1)} dB, off ${e.offOverNoiseDb.toFixed(1)} dB over noise), ${e.symbolRateBd.toFixed(1)} Bd`);
    }
  }
  const fr = f.frequency;
  if (fr !== null && f.envelopeKappa !== null && f.envelopeKappa < t.fskKappa && fr.repeatFraction >= t.fskRepeatFraction) {
    const c4 = fr.four.centres;
    const gaps = c4.slice(1).map((c, i) => c - (c4[i] as number));
    const even = gaps.length === 3 && Math.max(...gaps) <= t.fskGapRatio * Math.min(...gaps);
    const kappaMargin = ramp(t.fskKappa - f.envelopeKappa, 0, 0.1);
    if (even && fr.four.separation >= t.fskSeparation) {
      const m = Math.min(kappaMargin, ramp(fr.four.separation, t.fskSeparation, t.fskSeparation + 4));
      return decided("fsk", 4, m, `4 frequency levels, separation ${fr.four.separation.toFixed(1)}, ${fr.symbolRateBd.toFixed(1)} Bd`);
    }
    if (fr.two.separation >= t.fskSeparation) {
      const m = Math.min(kappaMargin, ramp(fr.two.separation, t.fskSeparation, t.fskSeparation + 4));
      return decided("fsk", 2, m, `2 frequency levels, separation ${fr.two.separation.toFixed(1)}, ${fr.symbolRateBd.toFixed(1)} Bd`);
    }
  }
  const l = f.linear;
  if (l !== null && l.powerLaw !== null && a.class !== "fm" && a.class !== "am") {
    const ranked = IDEAL_CUMULANTS
      .map((c) => ({ c, d: Math.hypot(l.c20Abs - c.c20, l.c40Abs - c.c40, l.c42 - c.c42) }))
      .sort((x, y) => x.d - y.d);
    const allowed = ranked.filter((r) => r.c.law === l.powerLaw);
    const best = allowed[0];
    const second = ranked.find((r) => r !== best);
    if (best !== undefined && second !== undefined && best.d <= t.linearDistance) {
      const m = Math.min(1 - best.d / Math.max(second.d, 1e-9), ramp(t.linearDistance - best.d, 0, 0.1));
      const why = `power-law line p = ${l.powerLaw}, |C20| ${l.c20Abs.toFixed(2)}, |C40| ${l.c40Abs.toFixed(2)}, C42 ${l.c42.toFixed(2)} (${l.symbolCount} symbols, ${l.symbolRateBd.toFixed(1)} Bd)`;
      return decided(best.c.class, best.c.order, m, why);
    }
  }
  if (a.class === "fm") {
    // FM that nearly passed as FSK: symbol frequencies that repeat (not the strict alternation of
    // tone FM) in clusters more distinct than a uniform spread gives (separation 2√3 ≈ 3.5) but
    // short of the FSK rule's 6. The closer to 6, the less the FM decision is worth.
    const sep = fr === null || fr.repeatFraction < t.fskRepeatFraction ? 0 : Math.max(fr.two.separation, fr.four.separation);
    const doubt = 0.5 * ramp(sep, 2 * Math.sqrt(3), t.fskSeparation);
    const confidence = Math.min(a.confidence, 1 - doubt);
    const method = doubt > 0 ? `${a.method}; the symbol frequencies cluster (separation ${sep.toFixed(1)}, FSK needs ${t.fskSeparation}): confidence lowered` : a.method;
    return { class: "fm", order: null, confidence, method, features: f };
  }
  if (a.class === "am") return { class: a.class, order: null, confidence: a.confidence, method: a.method, features: f };
  return { class: "unknown", order: null, confidence: 0.5, method: `${a.method}; no digital class fits`, features: f };
}
