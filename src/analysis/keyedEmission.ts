/**
 * Emissions keyed on and off: a bursty data link (FSK, PSK, QAM inside its bursts) or an
 * on-off keyed carrier (a steady carrier inside its "bursts", which are its marks). Both have an
 * envelope that sits at the noise between bursts; what is inside the bursts tells them apart.
 * See docs/methods.md ("Keyed emissions and bursts").
 */
import { burstSpans, gatherBursts, classifyAnalog, analogFeatures, classifyEmission, fskFigures, type Bursts, type EmissionClass, type FskFigures } from "../measure/index.js";
import type { WelchPsd } from "../dsp/index.js";

/** An envelope is keyed when its on level stands this far above its off level, dB (as the OOK rule: 10 dB). */
export const KEYED_ON_OFF_DB = 10;
/** ... and it is off for at least this share of the time, % (a carrier on 90 % of the time or more is not keyed). */
export const KEYED_MAX_DUTY_PERCENT = 90;
/** FSK tone clusters must stand this many pooled σ apart (midpoint decision error Q(3) ≈ 1e-3), as classifyEmission. */
const FSK_SEPARATION = 6;

export interface KeyedDecision {
  readonly class: EmissionClass;
  readonly order: number | null;
  readonly confidence: number;
  readonly method: string;
  /** The bursts the figures of the class are measured in, or null for the whole record (ook). */
  readonly bursts: Bursts | null;
}

const ramp = (x: number, a: number, b: number): number => Math.min(1, Math.max(0, (x - a) / (b - a)));

/** The bursts of `iq` when its envelope is keyed (module constants), else null; the samples of the bursts are gathered only then. */
export function keyedBursts(iq: Float32Array, fs: number): Bursts | null {
  const b = burstSpans(iq, fs);
  const enough = b.keptSamples >= 1024 && b.spans.length >= 1;
  return enough && b.onOffDb >= KEYED_ON_OFF_DB && b.dutyCyclePercent <= KEYED_MAX_DUTY_PERCENT ? gatherBursts(iq, b) : null;
}

/**
 * What is keyed: FSK when the frequency inside the bursts dwells at 2 (or 4 evenly spaced)
 * levels at least FSK_SEPARATION σ apart; PSK/QAM when classifyEmission finds it inside the
 * bursts; on-off keying when the bursts hold a steady carrier; null when none of these holds.
 */
export function keyedDecision(
  bursts: Bursts, fs: number, psdOf: (iq: Float32Array) => WelchPsd | null, floorPerHz: number, snrDb: number | null, halfHz: number,
): KeyedDecision | null {
  const where = `inside ${bursts.burstCount} bursts (on ${bursts.dutyCyclePercent.toFixed(1)} % of the time, on/off ${bursts.onOffDb.toFixed(1)} dB)`;
  const fsk = fskInBursts(bursts, fs);
  if (fsk !== null) {
    const c = 0.5 + 0.5 * Math.min(ramp(fsk.separation, FSK_SEPARATION, FSK_SEPARATION + 4), ramp(bursts.onOffDb, KEYED_ON_OFF_DB, KEYED_ON_OFF_DB + 6));
    return { class: "fsk", order: fsk.order, confidence: c, method: `${fsk.order} frequency levels, separation ${fsk.separation.toFixed(1)} σ, ${where}`, bursts };
  }
  const psd = psdOf(bursts.iq);
  if (psd === null) return null;
  const features = analogFeatures(bursts.iq, fs, psd, { noiseFloorPerHz: floorPerHz, lowerHz: -halfHz, upperHz: halfHz });
  const analog = classifyAnalog(features);
  if (analog.class === "cw") {
    return { class: "ook", order: 2, confidence: Math.min(analog.confidence, 0.5 + 0.5 * ramp(bursts.onOffDb, KEYED_ON_OFF_DB, KEYED_ON_OFF_DB + 6)), method: `a steady carrier keyed on and off: ${where}`, bursts: null };
  }
  const inner = classifyEmission(bursts.iq, fs, psd, { snrDb, analog, noiseFloorPerHz: floorPerHz });
  if ((inner.class === "psk" || inner.class === "qam") && inner.confidence >= 0.6) {
    return { class: inner.class, order: inner.order, confidence: inner.confidence, method: `${inner.method}; ${where}`, bursts };
  }
  return null;
}

/**
 * 2- or 4-FSK inside the bursts, or null. Two levels are tried first: 4-FSK read as 2 levels
 * pairs its tones, and each pair's spread (half a tone gap) holds the separation near 4 σ,
 * below FSK_SEPARATION; 2-FSK smeared by a narrow channel, read as 4 levels, can look like
 * evenly spaced tones, so 4 levels are tried only when 2 do not fit.
 */
export function fskInBursts(bursts: Bursts, fs: number, order?: 2 | 4): { order: 2 | 4; separation: number; figures: FskFigures } | null {
  const tried = (order === undefined ? [2, 4] : [order]) as (2 | 4)[];
  for (const m of tried) {
    const figures = fskFigures(bursts.iq, fs, { order: m, segments: bursts.segments });
    const tones = figures.toneFrequenciesHz.map((t) => t.value as number);
    const separation = figures.clusterSeparation ?? 0;
    if (tones.length !== m || (order === undefined && separation < FSK_SEPARATION)) continue;
    const gaps = tones.slice(1).map((t, i) => t - (tones[i] as number));
    if (m === 4 && order === undefined && Math.max(...gaps) > 2 * Math.min(...gaps)) continue;
    return { order: m, separation, figures };
  }
  return null;
}
