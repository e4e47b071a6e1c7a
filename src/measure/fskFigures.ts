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
import { transitionTiming, type Segments } from "./transitionTiming.js";

/** Options of fskFigures. */
export interface FskFiguresOptions {
  /** Number of tones M (2 or 4). Default 2. */
  readonly order?: 2 | 4;
  /** Known symbol rate, Bd; measured when absent. */
  readonly symbolRateBd?: number;
  /**
   * The bursts of a bursty link joined end to end in `iq`: sample ranges, each with its own
   * symbol clock. When given, the rate and timing come from the level transitions of each burst
   * (transitionTiming.ts) and only samples inside the bursts count.
   */
  readonly segments?: Segments;
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
  /** Smallest gap between adjacent tone clusters over their pooled σ, or null without tones. */
  readonly clusterSeparation: number | null;
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
  if (options.segments !== undefined) return segmentedFsk(iq, sampleRateHz, order, options.segments, options.symbolRateBd);
  const fs = sampleRateHz;
  const [lo, hi] = bandOf(iq, fs);
  const band = bandLimit(iq, fs, lo, hi);
  const histogram = histogramOf(instantaneousFrequencyHz(band, fs), FSK_FIGURES_DEFAULTS.histogramBins);
  const rate = options.symbolRateBd !== undefined
    ? measurement(options.symbolRateBd, "Bd", null, "symbol rate given by the caller")
    : fundamentalRate(band, fs, "frequency", fs / 1000, fs / 2);
  if (rate.value === null) return missingFigures(order, rate, histogram, rate.warnings[0] ?? "no symbol rate");
  // For the tones, widen the band by 1.5·Rs each side so the keying's sidebands pass.
  const centre = (lo + hi) / 2;
  const half = (hi - lo) / 2 + 1.5 * rate.value;
  const freq = instantaneousFrequencyHz(bandLimit(iq, fs, centre - half, centre + half), fs);
  return figuresFromSymbols(symbolFrequencies(freq, fs, rate.value), order, rate, histogram, "");
}

const clusterMethod = (order: number): string =>
  `${order}-level clustering of per-symbol mean instantaneous frequency (integrate-and-dump, Lloyd 1982)`;

function missingFigures(order: number, rate: Measurement<"Bd">, histogram: FrequencyHistogram, why: string): FskFigures {
  const method = clusterMethod(order);
  return { toneFrequenciesHz: [], shiftHz: notAvailable("Hz", method, why), symbolRateBd: rate, modulationIndex: notAvailable("", method, why), histogram, clusterSeparation: null };
}

/** Tones, shift and index from the per-symbol mean frequencies `v` (module comment). */
function figuresFromSymbols(v: Float64Array, order: 2 | 4, rate: Measurement<"Bd">, histogram: FrequencyHistogram, where: string): FskFigures {
  const method = clusterMethod(order);
  const rs = rate.value as number;
  if (v.length < 8 * order) return missingFigures(order, rate, histogram, `${v.length} symbols${where} are too few for ${order} tones`);
  const c = runCentres(v, levelClusters(v, order));
  const tones = c.centres.map((f, i) => measurement(f, "Hz", (2 * c.spread) / Math.sqrt(Math.max(1, c.counts[i] as number)), method));
  const first = c.centres[0] as number;
  const last = c.centres[order - 1] as number;
  const shift = (last - first) / (order - 1);
  const u0 = tones[0]?.uncertainty ?? 0;
  const u1 = tones[order - 1]?.uncertainty ?? 0;
  const shiftU = Math.hypot(u0, u1) / (order - 1);
  const warnings = c.separation < 6 ? [`tone clusters overlap (separation ${c.separation.toFixed(1)} σ); shift and index are doubtful`] : [];
  const shiftM = measurement(shift, "Hz", shiftU, `${method}; ${order === 2 ? "f1 − f0" : "mean tone spacing"}, ${v.length} symbols${where}, cluster separation ${powerToDb(c.separation ** 2).toFixed(1)} dB`, warnings);
  const ru = rate.uncertainty ?? 0;
  const h = shift / rs;
  const hU = Math.abs(h) * Math.hypot(shiftU / shift, ru / rs);
  return {
    toneFrequenciesHz: tones, shiftHz: shiftM, symbolRateBd: rate,
    modulationIndex: measurement(h, "", hU, "h = shift / symbol rate", warnings), histogram, clusterSeparation: c.separation,
  };
}

/**
 * FSK figures of bursts joined end to end (options.segments): the samples inside the bursts
 * only, the symbol clock of each burst from its own level transitions.
 */
function segmentedFsk(iq: Float32Array | Float64Array, fs: number, order: 2 | 4, segments: Segments, givenBd: number | undefined): FskFigures {
  const [lo, hi] = bandOf(iq, fs);
  const narrow = instantaneousFrequencyHz(bandLimit(iq, fs, lo, hi), fs);
  // Trim the smear of the band-limiting filter at the joins: a few periods of the band edge.
  const guard = Math.ceil((4 * fs) / (hi - lo));
  const inner = segments.map(([a, b]) => [a + guard, b - guard] as const).filter(([a, b]) => b - a > 2 * guard);
  const inside = samplesIn(narrow, inner);
  const histogram = histogramOf(inside, FSK_FIGURES_DEFAULTS.histogramBins);
  const levels = levelClusters(inside, order).centres;
  const where = ` in ${inner.length} bursts`;
  if (levels.length < order) return missingFigures(order, notAvailable("Bd", "symbol rate", "too few samples in the bursts"), histogram, `too few samples${where}`);
  const timing = givenBd === undefined
    ? transitionTiming(narrow, fs, levels, inner, fs / 1000, fs / 2)
    : transitionTiming(narrow, fs, levels, inner, 0.97 * givenBd, 1.03 * givenBd);
  const rate = givenBd === undefined ? timing.rateBd : measurement(givenBd, "Bd", null, "symbol rate given by the caller");
  if (rate.value === null) return missingFigures(order, rate, histogram, rate.warnings[0] ?? "no symbol rate");
  const centre = (lo + hi) / 2;
  const half = (hi - lo) / 2 + 1.5 * rate.value;
  const wide = instantaneousFrequencyHz(bandLimit(iq, fs, centre - half, centre + half), fs);
  return figuresFromSymbols(symbolMeans(wide, fs / rate.value, inner, timing.boundaries), order, rate, histogram, where);
}

/** The values of x inside the ranges, joined. */
function samplesIn(x: Float32Array, ranges: Segments): Float32Array {
  const total = ranges.reduce((s, [a, b]) => s + (b - a), 0);
  const out = new Float32Array(total);
  let o = 0;
  for (const [a, b] of ranges) { out.set(x.subarray(a, b), o); o += b - a; }
  return out;
}

/**
 * Mean of x over the central 60 % of every whole symbol of each range, on that range's grid
 * (boundary instant + k·period); ranges without a boundary are skipped.
 */
function symbolMeans(x: Float32Array, period: number, ranges: Segments, boundaries: readonly (number | null)[]): Float64Array {
  const out: number[] = [];
  ranges.forEach(([a, b], r) => {
    const t0 = boundaries[r];
    if (t0 === null || t0 === undefined) return;
    for (let k = Math.ceil((a - t0) / period); t0 + (k + 1) * period <= b; k++) {
      const s = Math.round(t0 + (k + 0.2) * period);
      const e = Math.round(t0 + (k + 0.8) * period);
      let sum = 0;
      for (let i = s; i < e; i++) sum += x[i] as number;
      if (e > s) out.push(sum / (e - s));
    }
  });
  return Float64Array.from(out);
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
