/**
 * On-off keying figures (interface.md `ook.onOffRatioDb`, `ook.dutyCyclePercent`,
 * `digital.symbolRateBd`), from the envelope of the channel baseband.
 *
 * - Symbol (chip) rate: the line of the envelope-transition feature (|x[n+1]| − |x[n]|)²
 *   (symbolRate.ts, feature "envelope"), or the caller's.
 * - On/off decision: |x| smoothed over a quarter symbol, threshold at the valley of its
 *   256-bin histogram between the two Otsu class means (Otsu 1979; digitalFeatures.ts).
 * - onOffRatioDb = 10·log10(mean |x|² while on / mean |x|² while off); the off mean holds the
 *   noise, so the ratio is the keyed carrier's only when the leakage is above the noise.
 * - dutyCyclePercent = 100 × samples on / samples (time on over total time).
 * - onLevelDbfs = 10·log10(mean |x|² while on) (0 dBFS = full-scale complex tone).
 * Uncertainty of the duty cycle (k = 2): one smoothing length per transition counted, i.e.
 * 100·(transitions × L/2)/n, plus 2√(p(1−p)/n_sym) for the finite record; of the levels: the
 * standard error of the class mean, in dB.
 */
import { powerToDb } from "../dsp/index.js";
import { envelopeSplit, fundamentalRate, movingAverage } from "./digitalFeatures.js";
import { measurement, notAvailable, type Measurement } from "./measurement.js";

/** Options of ookFigures. */
export interface OokFiguresOptions {
  /** Known symbol rate, Bd; measured when absent. */
  readonly symbolRateBd?: number;
}

/** The figures of ookFigures. */
export interface OokFigures {
  readonly symbolRateBd: Measurement<"Bd">;
  readonly onOffRatioDb: Measurement<"Db">;
  readonly dutyCyclePercent: Measurement<"Percent">;
  readonly onLevelDbfs: Measurement<"Dbfs">;
}

/** OOK figures of `iq` (interleaved I,Q at `sampleRateHz`); see the module comment. */
export function ookFigures(iq: Float32Array | Float64Array, sampleRateHz: number, options: OokFiguresOptions = {}): OokFigures {
  if (!(sampleRateHz > 0 && Number.isFinite(sampleRateHz))) throw new RangeError(`sampleRateHz ${sampleRateHz} is not a positive finite rate`);
  if (iq.length % 2 !== 0) throw new RangeError(`iq has odd length ${iq.length}; it must be interleaved I,Q pairs`);
  if (options.symbolRateBd !== undefined && !(options.symbolRateBd > 0)) throw new RangeError(`symbolRateBd ${options.symbolRateBd} is not a positive rate`);
  const fs = sampleRateHz;
  const rate = options.symbolRateBd !== undefined
    ? measurement(options.symbolRateBd, "Bd", null, "symbol rate given by the caller")
    : fundamentalRate(iq, fs, "envelope", fs / 1000, fs / 2);
  const method = "envelope smoothed over 1/4 symbol, threshold at the histogram valley (Otsu 1979)";
  if (rate.value === null) {
    const why = rate.warnings[0] ?? "no symbol rate";
    return {
      symbolRateBd: rate, onOffRatioDb: notAvailable("Db", method, why),
      dutyCyclePercent: notAvailable("Percent", method, why), onLevelDbfs: notAvailable("Dbfs", method, why),
    };
  }
  const n = iq.length >> 1;
  const pow = new Float64Array(n);
  const mag = new Float64Array(n);
  for (let k = 0; k < n; k++) {
    pow[k] = (iq[2 * k] as number) ** 2 + (iq[2 * k + 1] as number) ** 2;
    mag[k] = Math.sqrt(pow[k] as number);
  }
  const length = Math.max(1, Math.round(fs / rate.value / 4));
  const smooth = movingAverage(mag, length);
  const { threshold } = envelopeSplit(smooth);
  let on = 0, on2 = 0, onCount = 0, off = 0, off2 = 0, transitions = 0;
  let was = (smooth[0] as number) > threshold;
  for (let k = 0; k < n; k++) {
    const p = pow[k] as number;
    const isOn = (smooth[k] as number) > threshold;
    if (isOn) { on += p; on2 += p * p; onCount++; } else { off += p; off2 += p * p; }
    if (isOn !== was) transitions++;
    was = isOn;
  }
  const offCount = n - onCount;
  const stats = (s: number, s2: number, c: number): { mean: number; seDb: number } => {
    const mean = c > 0 ? s / c : 0;
    const sd = c > 1 ? Math.sqrt(Math.max(0, s2 / c - mean * mean) / c) : Infinity;
    return { mean, seDb: mean > 0 ? 10 * Math.log10(1 + (2 * sd) / mean) : Infinity };
  };
  const onS = stats(on, on2, onCount);
  const offS = stats(off, off2, offCount);
  const duty = onCount / n;
  const symbols = (n / fs) * rate.value;
  const dutyU = 100 * ((transitions * length) / 2 / n + 2 * Math.sqrt((duty * (1 - duty)) / Math.max(1, symbols)));
  const warnings = onCount === 0 || offCount === 0 ? ["the envelope never crosses the threshold: no keying seen"] : [];
  return {
    symbolRateBd: rate,
    onOffRatioDb: offS.mean > 0 && onCount > 0
      ? measurement(powerToDb(onS.mean / offS.mean), "Db", Math.hypot(onS.seDb, offS.seDb), `${method}; mean on power over mean off power (noise included)`, warnings)
      : notAvailable("Db", method, "no off (or no on) samples"),
    dutyCyclePercent: measurement(100 * duty, "Percent", dutyU, `${method}; time on over total time, ${transitions} transitions`, warnings),
    onLevelDbfs: onCount > 0 ? measurement(powerToDb(onS.mean), "Dbfs", onS.seDb, `${method}; mean power while on`, warnings) : notAvailable("Dbfs", method, "no on samples"),
  };
}
