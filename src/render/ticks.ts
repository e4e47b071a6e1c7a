/**
 * A "nice" number near `x` > 0: 1, 2, 5 or 10 times a power of ten (P. S. Heckbert, "Nice
 * numbers for graph labels", Graphics Gems, 1990). With `round`, the nearest (thresholds 1.5,
 * 3, 7 on the mantissa); without, the smallest nice number ≥ x.
 */
export function niceNumber(x: number, round: boolean): number {
  if (!(x > 0) || !Number.isFinite(x)) throw new RangeError(`niceNumber: x ${x} must be a positive finite number`);
  const exponent = Math.floor(Math.log10(x));
  const power = Math.pow(10, exponent);
  const f = x / power;
  let nice: number;
  if (round) nice = f < 1.5 ? 1 : f < 3 ? 2 : f < 7 ? 5 : 10;
  else nice = f <= 1 ? 1 : f <= 2 ? 2 : f <= 5 ? 5 : 10;
  return nice * power;
}

/** Tick values inside an axis range, with the step they share. */
export interface Ticks {
  /** Distance between neighbouring ticks, a nice number (1, 2 or 5 × 10^k), in the axis unit. */
  readonly step: number;
  /** Multiples of `step` inside [min, max], ascending. */
  readonly values: readonly number[];
}

/**
 * Ticks for the fixed range [min, max] aiming at about `targetCount` of them. The step is
 * Heckbert's: niceNumber(niceNumber(max − min, false) / (targetCount − 1), true); the values
 * are the multiples of it inside the range (the axis is not widened to the ticks), and the step
 * is made finer when that leaves fewer than two.
 */
export function niceTicks(min: number, max: number, targetCount: number): Ticks {
  if (!Number.isFinite(min) || !Number.isFinite(max) || !(max > min)) throw new RangeError(`niceTicks: range [${min}, ${max}] must be finite with max > min`);
  if (!(targetCount >= 2)) throw new RangeError(`niceTicks: targetCount ${targetCount} must be at least 2`);
  let step = niceNumber(niceNumber(max - min, false) / (Math.floor(targetCount) - 1), true);
  let ticks = ticksWithStep(min, max, step);
  // Heckbert widens the axis to its ticks; ours is fixed, so a step up to 5× the range can leave
  // fewer than two ticks inside it. Step down the 1-2-5 sequence until there are two.
  while (ticks.values.length < 2) {
    step = previousNiceStep(step);
    ticks = ticksWithStep(min, max, step);
  }
  return ticks;
}

/** The multiples of `step` (> 0) inside [min, max], ascending, rounded to the step's precision. */
export function ticksWithStep(min: number, max: number, step: number): Ticks {
  if (!(step > 0) || !Number.isFinite(step)) throw new RangeError(`ticksWithStep: step ${step} must be a positive finite number`);
  const values: number[] = [];
  // A relative tolerance keeps a tick that lands on an end despite rounding.
  const eps = step * 1e-9;
  for (let k = Math.ceil((min - eps) / step); k * step <= max + eps; k++) values.push(roundToStep(k * step, step));
  return { step, values };
}

/** The next nice number above `step` in the 1-2-5 sequence: 1 → 2 → 5 → 10 (× 10^k). */
export function nextNiceStep(step: number): number {
  const power = Math.pow(10, Math.floor(Math.log10(step) + 1e-9));
  const f = Math.round(step / power);
  return (f < 2 ? 2 : f < 5 ? 5 : 10) * power;
}

function previousNiceStep(step: number): number {
  const power = Math.pow(10, Math.floor(Math.log10(step) + 1e-9));
  const f = Math.round(step / power);
  return f >= 5 ? 2 * power : f >= 2 ? power : 0.5 * power;
}

// k·step in floating point gives 0.30000000000000004; round it to the step's precision.
function roundToStep(value: number, step: number): number {
  const digits = Math.max(0, -Math.floor(Math.log10(step)) + 1);
  const rounded = Number(value.toFixed(Math.min(20, digits)));
  return rounded === 0 ? 0 : rounded;
}

/** A unit prefix chosen for an axis: labels are value / factor, followed by `symbol`. */
export interface SiScale {
  /** e.g. "kHz", "ms". */
  readonly symbol: string;
  /** Size of one `symbol` in the base unit, e.g. 1000 for kHz. */
  readonly factor: number;
}

/** Hz, kHz, MHz or GHz: the largest whose factor is ≤ `largestMagnitudeHz` (Hz below 1 kHz). */
export function siScaleForHz(largestMagnitudeHz: number): SiScale {
  const m = Math.abs(largestMagnitudeHz);
  if (m >= 1e9) return { symbol: "GHz", factor: 1e9 };
  if (m >= 1e6) return { symbol: "MHz", factor: 1e6 };
  if (m >= 1e3) return { symbol: "kHz", factor: 1e3 };
  return { symbol: "Hz", factor: 1 };
}

/** s, ms or µs for a time axis: s from 1 s up, ms from 1 ms, µs below. */
export function siScaleForSeconds(largestMagnitudeS: number): SiScale {
  const m = Math.abs(largestMagnitudeS);
  if (m >= 1) return { symbol: "s", factor: 1 };
  if (m >= 1e-3) return { symbol: "ms", factor: 1e-3 };
  return { symbol: "µs", factor: 1e-6 };
}

/**
 * Digits after the decimal point needed to tell ticks `step` apart once divided by `factor`:
 * max(0, ⌈−log10(step / factor)⌉). A step of 10 kHz on a MHz axis needs 2 (156.79, 156.80).
 */
export function fractionDigitsForStep(step: number, factor: number): number {
  const scaled = step / factor;
  return Math.max(0, Math.ceil(-Math.log10(scaled) - 1e-9));
}

/**
 * A tick label: value / scale.factor with the digits {@link fractionDigitsForStep} asks for,
 * ASCII hyphen for minus, and never "-0". The unit itself goes in the axis title.
 */
export function formatTickLabel(value: number, step: number, scale: SiScale): string {
  const digits = fractionDigitsForStep(step, scale.factor);
  const text = (value / scale.factor).toFixed(Math.min(20, digits));
  return /^-0(\.0*)?$/.test(text) ? text.slice(1) : text;
}

/** A number for a caption with `significant` significant digits and its SI-prefixed unit, e.g. "3.52 kHz". */
export function formatHz(valueHz: number, significant = 3): string {
  const scale = siScaleForHz(valueHz);
  return `${trimNumber(valueHz / scale.factor, significant)} ${scale.symbol}`;
}

/** As {@link formatHz}, for seconds: "25.0 ms", "1.50 s". */
export function formatSeconds(valueS: number, significant = 3): string {
  const scale = siScaleForSeconds(valueS);
  return `${trimNumber(valueS / scale.factor, significant)} ${scale.symbol}`;
}

function trimNumber(x: number, significant: number): string {
  if (x === 0) return "0";
  const magnitude = Math.floor(Math.log10(Math.abs(x)));
  const digits = Math.max(0, significant - 1 - magnitude);
  return x.toFixed(Math.min(20, digits));
}
