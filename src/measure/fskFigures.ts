/**
 * FSK figures: tone frequencies, shift, symbol rate, modulation index, and the histogram of the
 * instantaneous frequency for a figure (interface.md `fsk.shiftHz`, `fsk.modulationIndex`,
 * `digital.symbolRateBd`).
 *
 * Method: the record is band-limited to 1.2 × the span between the 2 % and 98 % quantiles of its
 * raw instantaneous frequency (at least fs/50 wide) for the rate, widened by 1.5·Rs each side
 * for the tones; the discriminator (fmDiscriminator.ts) gives f[n]; the symbol rate is the line of the frequency-
 * transition feature (symbolRate.ts, feature "frequency"); f is averaged over each symbol at the
 * timing phase (of 8) that maximises the variance of the averages (integrate-and-dump, the
 * matched filter of rectangular FSK); the averages are clustered into `order` levels (Lloyd
 * 1982); each tone is the mean of the symbols whose neighbours share its cluster (runs of three,
 * free of the transition smear of band-limiting). Shift = f1 − f0 for 2-FSK, the mean spacing
 * (f_{M−1} − f0)/(M − 1) for M-FSK; h = shift / Rs (e.g. REFERENCES.md §4: 800 Hz shift at
 * 1200 Bd gives h = 2/3). Uncertainty of a tone (k = 2): 2σ/√count of its cluster, σ the pooled
 * spread; of the shift, the two tones' combined in quadrature; of h, propagated from shift and
 * rate.
 */
import { powerToDb } from "../dsp/index.js";
import { bandLimit } from "./bandLimit.js";
import { fundamentalRate, symbolFrequencies } from "./digitalFeatures.js";
import { instantaneousFrequencyHz } from "./fmDiscriminator.js";
import { levelClusters, type LevelClusters } from "./levelClusters.js";
import { measurement, notAvailable, type Measurement } from "./measurement.js";

/** Options of fskFigures. */
export interface FskFiguresOptions {
  /** Number of tones M (2 or 4). Default 2. */
  readonly order?: 2 | 4;
  /** Known symbol rate, Bd; measured when absent. */
  readonly symbolRateBd?: number;
}

/** Histogram of the instantaneous frequency: bin centres (Hz) and counts. */
export interface FrequencyHistogram {
  readonly binsHz: Float64Array;
  readonly counts: Float64Array;
}

/** The figures of fskFigures. */
export interface FskFigures {
  /** One Measurement per tone, ascending. */
  readonly toneFrequenciesHz: readonly Measurement<"Hz">[];
  readonly shiftHz: Measurement<"Hz">;
  readonly symbolRateBd: Measurement<"Bd">;
  readonly modulationIndex: Measurement<"">;
  readonly histogram: FrequencyHistogram;
}

/** Defaults of fskFigures. */
export const FSK_FIGURES_DEFAULTS = { order: 2, histogramBins: 200 } as const;

/** FSK figures of `iq` (interleaved I,Q at `sampleRateHz`); see the module comment. */
export function fskFigures(iq: Float32Array | Float64Array, sampleRateHz: number, options: FskFiguresOptions = {}): FskFigures {
  if (!(sampleRateHz > 0 && Number.isFinite(sampleRateHz))) throw new RangeError(`sampleRateHz ${sampleRateHz} is not a positive finite rate`);
  if (iq.length % 2 !== 0) throw new RangeError(`iq has odd length ${iq.length}; it must be interleaved I,Q pairs`);
  const order = options.order ?? FSK_FIGURES_DEFAULTS.order;
  if (order !== 2 && order !== 4) throw new RangeError(`order ${String(order)} must be 2 or 4`);
  if (options.symbolRateBd !== undefined && !(options.symbolRateBd > 0)) throw new RangeError(`symbolRateBd ${options.symbolRateBd} is not a positive rate`);
  const fs = sampleRateHz;
  const [lo, hi] = bandOf(iq, fs);
  const band = bandLimit(iq, fs, lo, hi);
  const histogram = histogramOf(instantaneousFrequencyHz(band, fs), FSK_FIGURES_DEFAULTS.histogramBins);
  const rateMethod = "symbol rate: line of the frequency-transition feature (symbolRateBlind)";
  const rate = options.symbolRateBd !== undefined
    ? measurement(options.symbolRateBd, "Bd", null, "symbol rate given by the caller")
    : fundamentalRate(band, fs, "frequency", fs / 1000, fs / 2);
  const method = `${order}-level clustering of per-symbol mean instantaneous frequency (integrate-and-dump, Lloyd 1982)`;
  const missing = (why: string): FskFigures => ({
    toneFrequenciesHz: [], shiftHz: notAvailable("Hz", method, why), symbolRateBd: rate.value === null ? rate : measurement(rate.value, "Bd", rate.uncertainty, rate.method || rateMethod),
    modulationIndex: notAvailable("", method, why), histogram,
  });
  if (rate.value === null) return missing(rate.warnings[0] ?? "no symbol rate");
  // For the tones, widen the band by 1.5·Rs each side so the keying's sidebands pass.
  const centre = (lo + hi) / 2;
  const half = (hi - lo) / 2 + 1.5 * rate.value;
  const freq = instantaneousFrequencyHz(bandLimit(iq, fs, centre - half, centre + half), fs);
  const v = symbolFrequencies(freq, fs, rate.value);
  if (v.length < 8 * order) return missing(`${v.length} symbols are too few for ${order} tones`);
  const c = runCentres(v, levelClusters(v, order));
  const tones = c.centres.map((f, i) => measurement(f, "Hz", (2 * c.spread) / Math.sqrt(Math.max(1, c.counts[i] as number)), method));
  const first = c.centres[0] as number;
  const last = c.centres[order - 1] as number;
  const shift = (last - first) / (order - 1);
  const u0 = tones[0]?.uncertainty ?? 0;
  const u1 = tones[order - 1]?.uncertainty ?? 0;
  const shiftU = Math.hypot(u0, u1) / (order - 1);
  const warnings = c.separation < 6 ? [`tone clusters overlap (separation ${c.separation.toFixed(1)} σ); shift and index are doubtful`] : [];
  const shiftM = measurement(shift, "Hz", shiftU, `${method}; ${order === 2 ? "f1 − f0" : "mean tone spacing"}, ${v.length} symbols, cluster separation ${powerToDb(c.separation ** 2).toFixed(1)} dB`, warnings);
  const ru = rate.uncertainty ?? 0;
  const h = shift / rate.value;
  const hU = Math.abs(h) * Math.hypot(shiftU / shift, ru / rate.value);
  return {
    toneFrequenciesHz: tones, shiftHz: shiftM, symbolRateBd: rate,
    modulationIndex: measurement(h, "", hU, "h = shift / symbol rate", warnings), histogram,
  };
}

/** 1.2 × the 2 %…98 % quantile span of the raw instantaneous frequency (first 2^16 samples). */
function bandOf(iq: Float32Array | Float64Array, fs: number): [number, number] {
  const freqs = instantaneousFrequencyHz(Float32Array.from(iq.subarray(0, Math.min(iq.length, 1 << 17))), fs);
  const s = Float64Array.from(freqs).sort();
  const lo = s[Math.floor(0.02 * s.length)] ?? -fs / 2;
  const hi = s[Math.floor(0.98 * s.length)] ?? fs / 2;
  const centre = (lo + hi) / 2;
  const half = 0.6 * Math.max(hi - lo, fs / 50);
  return [centre - half, centre + half];
}

function histogramOf(freq: Float32Array, bins: number): FrequencyHistogram {
  const s = Float64Array.from(freq).sort();
  const lo = s[Math.floor(0.001 * s.length)] ?? 0;
  const hi = s[Math.floor(0.999 * s.length)] ?? 0;
  const w = (hi - lo) / bins || 1;
  const binsHz = new Float64Array(bins);
  const counts = new Float64Array(bins);
  for (let i = 0; i < bins; i++) binsHz[i] = lo + (i + 0.5) * w;
  for (const f of s) {
    const i = Math.floor((f - lo) / w);
    if (i >= 0 && i < bins) counts[i] = (counts[i] as number) + 1;
  }
  return { binsHz, counts };
}

/**
 * Tone centres from the symbols whose two neighbours fall in the same cluster: band-limiting
 * smears each transition into the adjacent symbols and pulls their means towards the
 * neighbouring tone, which runs of three avoid. Clusters with fewer than 3 such symbols keep
 * their k-means centre. The spread is recomputed about the new centres over the same symbols.
 */
function runCentres(v: Float64Array, c: LevelClusters): LevelClusters {
  const k = c.centres.length;
  if (k === 0) return c;
  const label = (x: number): number => {
    let j = 0;
    while (j < k - 1 && x > ((c.centres[j] as number) + (c.centres[j + 1] as number)) / 2) j++;
    return j;
  };
  const labels = Array.from(v, label);
  const sum = new Array<number>(k).fill(0);
  const cnt = new Array<number>(k).fill(0);
  for (let i = 1; i + 1 < v.length; i++) {
    const l = labels[i] as number;
    if (labels[i - 1] === l && labels[i + 1] === l) { sum[l] = (sum[l] as number) + (v[i] as number); cnt[l] = (cnt[l] as number) + 1; }
  }
  const centres = c.centres.map((m, j) => ((cnt[j] as number) >= 3 ? (sum[j] as number) / (cnt[j] as number) : m));
  let ss = 0;
  let used = 0;
  for (let i = 1; i + 1 < v.length; i++) {
    const l = labels[i] as number;
    if (labels[i - 1] === l && labels[i + 1] === l) { ss += ((v[i] as number) - (centres[l] as number)) ** 2; used++; }
  }
  const spread = used > k ? Math.sqrt(ss / (used - k)) : c.spread;
  let gap = Infinity;
  for (let j = 1; j < k; j++) gap = Math.min(gap, (centres[j] as number) - (centres[j - 1] as number));
  return { centres, counts: cnt.map((x, j) => (x >= 3 ? x : (c.counts[j] as number))), spread, separation: spread > 0 ? gap / spread : Infinity };
}
