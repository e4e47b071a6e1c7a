/**
 * Samples of a linearly modulated signal at its symbol instants, for feature-based decisions
 * (cumulants) without full carrier and timing recovery. Module-internal to src/measure.
 *
 * 1. Matched filter: a root-raised-cosine of the measured symbol rate, roll-off estimated from
 *    the occupied bandwidth by inverting the 99 % OBW of RRC signalling (REFERENCES.md §3:
 *    α = 0.20 → 1.0731·Rs … 1.0 → 1.6330·Rs), clamped to [0.2, 1].
 * 2. Timing: the square-law line. |y|² has a line at Rs whose phase gives the timing offset,
 *    τ = −arg(Σ|y[n]|²·e^(−j2πnRs/fs))/(2π)·fs/Rs samples (M. Oerder & H. Meyr, "Digital filter
 *    and square timing recovery", IEEE Trans. Commun. 36(5), 1988).
 * 3. Interpolation: cubic Lagrange through the four nearest samples (common practice; Farrow).
 * 4. Residual carrier: the power-law line. For M-fold symmetric constellations s^p (p = 2 for
 *    BPSK, 4 for QPSK/QAM, 8 for 8PSK) has a line at p·Δf; the smallest p whose periodogram line
 *    stands clearly above the rest is used, and the symbols are de-rotated by Δf (common
 *    practice of non-data-aided carrier estimation, e.g. Viterbi & Viterbi 1983 for the power
 *    law). Offsets up to ±Rs/(2p) are unambiguous.
 */
import { transformInPlace } from "../dsp/index.js";
import { filterLinearPhase } from "./firFilter.js";

/** RRC roll-off from OBW / Rs (REFERENCES.md §3 table, linear between its rows). */
const RRC_OBW_TABLE: readonly (readonly [number, number])[] = [
  [0.2, 1.0731], [0.22, 1.0849], [0.25, 1.1031], [0.35, 1.1667], [0.5, 1.268], [1, 1.633],
];

/** Roll-off α whose 99 % OBW is `obwOverRs`·Rs (REFERENCES.md §3), clamped to [0.2, 1]. */
export function rollOffFromObw(obwOverRs: number): number {
  const t = RRC_OBW_TABLE;
  if (!(obwOverRs > (t[0] as readonly [number, number])[1])) return 0.2;
  for (let i = 1; i < t.length; i++) {
    const [a1, b1] = t[i] as readonly [number, number];
    const [a0, b0] = t[i - 1] as readonly [number, number];
    if (obwOverRs <= b1) return a0 + ((a1 - a0) * (obwOverRs - b0)) / (b1 - b0);
  }
  return 1;
}

/** Unit-energy-per-period RRC pulse at x = t/T (Proakis & Salehi form; see scenario rrcPulse). */
function rrc(x: number, a: number): number {
  if (Math.abs(x) < 1e-9) return 1 - a + (4 * a) / Math.PI;
  if (Math.abs(Math.abs(x) - 1 / (4 * a)) < 1e-9) {
    const g = Math.PI / (4 * a);
    return (a / Math.SQRT2) * ((1 + 2 / Math.PI) * Math.sin(g) + (1 - 2 / Math.PI) * Math.cos(g));
  }
  return (Math.sin(Math.PI * x * (1 - a)) + 4 * a * x * Math.cos(Math.PI * x * (1 + a))) / (Math.PI * x * (1 - (4 * a * x) ** 2));
}

/** Symbol-instant samples and what was found on the way. */
export interface SymbolSamples {
  /** De-rotated symbol samples, interleaved I,Q (matched-filter scale). */
  readonly symbols: Float64Array;
  /** Noise power at the symbol samples, FS² (white noise of the given density through the filter). */
  readonly noisePower: number;
  readonly rollOff: number;
  /** Power of the power law used (2, 4, 8), or null when no line stood out. */
  readonly powerLaw: 2 | 4 | 8 | null;
  /** Line-to-mean ratio of the chosen power-law periodogram (linear). */
  readonly lineRatio: number;
  /** Residual carrier offset removed, Hz. */
  readonly offsetHz: number;
}

/** Line-to-mean ratio a power-law line must reach (≈ 3× the largest of 2^15 noise bins, ln 2^15 ≈ 10.4). */
export const POWER_LAW_LINE_RATIO = 30;
const MAX_SYMBOLS = 1 << 15;

/**
 * Matched-filters `iq` (rate fs) for symbol rate `symbolRateBd`, samples it at the square-law
 * timing, removes the power-law carrier offset. `noiseDensityPerHz` is the white-noise density
 * (FS²/Hz) for `noisePower`. At most 2^15 symbols are used.
 */
export function symbolSamples(
  iq: Float32Array | Float64Array, fs: number, symbolRateBd: number, occupiedHz: number | null, noiseDensityPerHz: number,
): SymbolSamples {
  const n = iq.length >> 1;
  const sps = fs / symbolRateBd;
  const alpha = rollOffFromObw(occupiedHz === null ? 1.1667 : occupiedHz / symbolRateBd);
  const half = Math.ceil(6 * sps);
  const taps = new Float64Array(2 * half + 1);
  let e = 0;
  for (let k = -half; k <= half; k++) {
    const v = rrc(k / sps, alpha);
    taps[k + half] = v;
    e += v * v;
  }
  const used = Math.min(n, Math.ceil((MAX_SYMBOLS + 4) * sps) + 2 * half + 8);
  const re = new Float64Array(used);
  const im = new Float64Array(used);
  for (let m = 0; m < used; m++) {
    re[m] = iq[2 * m] as number;
    im[m] = iq[2 * m + 1] as number;
  }
  const fr = filterLinearPhase(re, taps);
  const fi = filterLinearPhase(im, taps);
  const y = new Float64Array(2 * used);
  for (let m = 0; m < used; m++) {
    y[2 * m] = fr[m] as number;
    y[2 * m + 1] = fi[m] as number;
  }
  // Square-law timing over the part where the filter is fully inside the record.
  let cr = 0;
  let ci = 0;
  const w = (2 * Math.PI) / sps;
  for (let m = half; m < used - half; m++) {
    const p = (y[2 * m] as number) ** 2 + (y[2 * m + 1] as number) ** 2;
    cr += p * Math.cos(w * m);
    ci -= p * Math.sin(w * m);
  }
  let tau = (-Math.atan2(ci, cr) / (2 * Math.PI)) * sps;
  while (tau < half + 1) tau += sps;
  const count = Math.min(MAX_SYMBOLS, Math.max(0, Math.floor((used - half - 3 - tau) / sps)));
  const s = new Float64Array(2 * count);
  for (let k = 0; k < count; k++) {
    const t = tau + k * sps;
    const i0 = Math.floor(t);
    const u = t - i0;
    // Cubic Lagrange weights for samples i0−1 … i0+2.
    const c0 = (-u * (u - 1) * (u - 2)) / 6;
    const c1 = ((u + 1) * (u - 1) * (u - 2)) / 2;
    const c2 = (-(u + 1) * u * (u - 2)) / 2;
    const c3 = ((u + 1) * u * (u - 1)) / 6;
    for (let c = 0; c < 2; c++) {
      s[2 * k + c] = c0 * (y[2 * (i0 - 1) + c] as number) + c1 * (y[2 * i0 + c] as number)
        + c2 * (y[2 * (i0 + 1) + c] as number) + c3 * (y[2 * (i0 + 2) + c] as number);
    }
  }
  const law = powerLawOffset(s);
  if (law.p !== null) {
    for (let k = 0; k < count; k++) {
      const ph = -2 * Math.PI * law.cyclesPerSymbol * k;
      const a = s[2 * k] as number;
      const b = s[2 * k + 1] as number;
      s[2 * k] = a * Math.cos(ph) - b * Math.sin(ph);
      s[2 * k + 1] = a * Math.sin(ph) + b * Math.cos(ph);
    }
  }
  return {
    symbols: s, noisePower: noiseDensityPerHz * fs * e, rollOff: alpha,
    powerLaw: law.p, lineRatio: law.ratio, offsetHz: law.cyclesPerSymbol * symbolRateBd,
  };
}

function powerLawOffset(s: Float64Array): { p: 2 | 4 | 8 | null; ratio: number; cyclesPerSymbol: number } {
  const k = s.length >> 1;
  if (k < 16) return { p: null, ratio: 0, cyclesPerSymbol: 0 };
  let size = 2;
  while (size < 4 * k) size *= 2;
  const b = new Float64Array(2 * size);
  let best = { p: null as 2 | 4 | 8 | null, ratio: 0, cyclesPerSymbol: 0 };
  for (const p of [2, 4, 8] as const) {
    b.fill(0);
    for (let j = 0; j < k; j++) {
      // s^p by repeated squaring (p = 2, 4, 8).
      let re = s[2 * j] as number;
      let im = s[2 * j + 1] as number;
      for (let q = 1; q < p; q *= 2) {
        const r2 = re * re - im * im;
        im = 2 * re * im;
        re = r2;
      }
      b[2 * j] = re;
      b[2 * j + 1] = im;
    }
    transformInPlace(b);
    let peak = 0;
    let at = 0;
    let sum = 0;
    for (let i = 0; i < size; i++) {
      const m = (b[2 * i] as number) ** 2 + (b[2 * i + 1] as number) ** 2;
      sum += m;
      if (m > peak) { peak = m; at = i; }
    }
    const ratio = peak / (sum / size);
    if (ratio >= POWER_LAW_LINE_RATIO) {
      const mag = (i: number): number => Math.hypot(b[2 * ((i + size) % size)] as number, b[2 * ((i + size) % size) + 1] as number);
      const l = mag(at - 1);
      const c = mag(at);
      const r = mag(at + 1);
      const d = l - 2 * c + r;
      const delta = d < 0 ? (0.5 * (l - r)) / d : 0;
      const bin = (at < size / 2 ? at : at - size) + delta;
      return { p, ratio, cyclesPerSymbol: bin / size / p };
    }
    if (ratio > best.ratio) best = { p: null, ratio, cyclesPerSymbol: 0 };
  }
  return best;
}
