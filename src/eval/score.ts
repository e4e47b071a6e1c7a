/**
 * Scores of an evaluation run: confusion of true and measured class per SNR band, reliability of
 * the stated confidence, coverage of the stated k = 2 uncertainties, and the targets.
 */
import { SNR_BANDS } from "./generator.js";
import type { CaseResult } from "./measureCase.js";
import { QUANTITIES, TRUE_LABELS, type Quantity } from "./truth.js";

/** Answers that name no class. */
const NO_CLASS = new Set(["unknown", "noise", "error"]);

export function isCorrect(r: CaseResult): boolean {
  return r.measuredLabel === r.truth.label;
}

/** Index of the SNR band of an SNR, dB (below 5 dB into the first band, above 40 into the last). */
export function bandOf(snrDb: number): number {
  for (let b = SNR_BANDS.length - 1; b >= 0; b--) if (snrDb >= (SNR_BANDS[b] as readonly [number, number])[0]) return b;
  return 0;
}

export function bandName(b: number): string {
  const [lo, hi] = SNR_BANDS[b] as readonly [number, number];
  return `${lo}–${hi} dB`;
}

export interface Confusion {
  readonly rows: readonly string[];
  readonly columns: readonly string[];
  /** counts[row][column] */
  readonly counts: ReadonlyMap<string, ReadonlyMap<string, number>>;
  readonly total: number;
  readonly correct: number;
}

/** Confusion of the cases in `results` (rows: true labels; columns: the labels measured). */
export function confusion(results: readonly CaseResult[]): Confusion {
  const seen = new Set(results.map((r) => r.measuredLabel));
  const extras = [...seen].filter((l) => !(TRUE_LABELS as readonly string[]).includes(l) && !NO_CLASS.has(l)).sort();
  const columns = [...TRUE_LABELS.filter((l) => seen.has(l) || results.some((r) => r.truth.label === l)), ...extras, ...["unknown", "noise", "error"].filter((l) => seen.has(l))];
  const rows = TRUE_LABELS.filter((l) => results.some((r) => r.truth.label === l));
  const counts = new Map<string, Map<string, number>>();
  for (const row of rows) counts.set(row, new Map(columns.map((c) => [c, 0])));
  for (const r of results) {
    const m = counts.get(r.truth.label) as Map<string, number>;
    m.set(r.measuredLabel, (m.get(r.measuredLabel) ?? 0) + 1);
  }
  return { rows, columns, counts, total: results.length, correct: results.filter(isCorrect).length };
}

export interface ReliabilityBin {
  readonly lo: number;
  readonly hi: number;
  readonly count: number;
  readonly meanConfidence: number | null;
  readonly accuracy: number | null;
}

/** Stated-confidence bins of the answers that name a class; "unknown", "noise" and errors apart. */
export const CONFIDENCE_EDGES = [0, 0.5, 0.7, 0.8, 0.9, 0.95, 1.000001] as const;

export function reliability(results: readonly CaseResult[]): { bins: ReliabilityBin[]; noClass: number } {
  const named = results.filter((r) => !NO_CLASS.has(r.measuredLabel));
  const bins: ReliabilityBin[] = [];
  for (let i = 0; i + 1 < CONFIDENCE_EDGES.length; i++) {
    const lo = CONFIDENCE_EDGES[i] as number;
    const hi = CONFIDENCE_EDGES[i + 1] as number;
    const inBin = named.filter((r) => r.confidence >= lo && r.confidence < hi);
    const n = inBin.length;
    bins.push({
      lo, hi: Math.min(hi, 1), count: n,
      meanConfidence: n === 0 ? null : inBin.reduce((s, r) => s + r.confidence, 0) / n,
      accuracy: n === 0 ? null : inBin.filter(isCorrect).length / n,
    });
  }
  return { bins, noClass: results.length - named.length };
}

export interface CoverageMiss {
  readonly id: string;
  readonly snrDb: number;
  readonly measuredLabel: string;
  readonly truth: number;
  readonly value: number | null;
  readonly uncertainty: number | null;
}

export interface Coverage {
  readonly quantity: Quantity;
  /** Cases with a true value. */
  readonly cases: number;
  /** Cases with a measured value and a stated uncertainty. */
  readonly stated: number;
  /** Stated cases with |measured − true| ≤ U (k = 2). */
  readonly covered: number;
  readonly medianWidth: number | null;
  readonly medianError: number | null;
  readonly misses: readonly CoverageMiss[];
  readonly notStated: readonly CoverageMiss[];
}

function median(xs: readonly number[]): number | null {
  if (xs.length === 0) return null;
  const s = [...xs].sort((a, b) => a - b);
  const m = s.length >> 1;
  return s.length % 2 === 1 ? (s[m] as number) : ((s[m - 1] as number) + (s[m] as number)) / 2;
}

/**
 * Coverage of one quantity over every case that has its truth: the share of stated intervals
 * that hold the true value, and the median interval width (2U, the full k = 2 interval) over the
 * median error.
 */
export function coverage(results: readonly CaseResult[], quantity: Quantity): Coverage {
  const misses: CoverageMiss[] = [];
  const notStated: CoverageMiss[] = [];
  const widths: number[] = [];
  const errors: number[] = [];
  let cases = 0;
  let covered = 0;
  for (const r of results) {
    const c = r.compared[quantity];
    if (c === undefined) {
      if (r.truth.figures[quantity] === null) continue;
      cases += 1;
      notStated.push({ id: r.id, snrDb: r.truth.snrDb, measuredLabel: r.measuredLabel, truth: r.truth.figures[quantity] as number, value: null, uncertainty: null });
      continue;
    }
    cases += 1;
    const row = { id: r.id, snrDb: r.truth.snrDb, measuredLabel: r.measuredLabel, truth: c.truth, value: c.value, uncertainty: c.uncertainty };
    if (c.value === null || c.uncertainty === null) { notStated.push(row); continue; }
    const err = Math.abs(c.value - c.truth);
    widths.push(2 * c.uncertainty);
    errors.push(err);
    if (err <= c.uncertainty) covered += 1;
    else misses.push(row);
  }
  return { quantity, cases, stated: widths.length, covered, medianWidth: median(widths), medianError: median(errors), misses, notStated };
}

export function coverages(results: readonly CaseResult[]): Coverage[] {
  return QUANTITIES.map((q) => coverage(results, q));
}

/** The classification targets, checked on a set of results. */
export interface TargetCheck {
  /** Per true label: correct / cases at in-band SNR ≥ 15 dB (target ≥ 95 %). */
  readonly accuracyAt15: ReadonlyMap<string, { readonly correct: number; readonly cases: number }>;
  /** Wrong named class with confidence ≥ 0.9 at SNR ≥ 20 dB (target: none). */
  readonly confidentWrongAt20: readonly CaseResult[];
  /** Below 20 dB: a wrong named class with confidence ≥ CONFIDENT_LOW_SNR, not "unknown" (target: none). */
  readonly confidentWrongBelow20: readonly CaseResult[];
}

/** Confidence at which a wrong class is confident enough to be a fault at SNR ≥ 20 dB (issue target). */
export const CONFIDENT_HIGH_SNR = 0.9;
/**
 * "Confident" below 20 dB: the same 0.9 the issue sets at 20 dB and above (below 20 dB the tool
 * caps its confidence under 0.9 and gives "unknown" below 10 dB).
 */
export const CONFIDENT_LOW_SNR = 0.9;

export function targetCheck(results: readonly CaseResult[]): TargetCheck {
  const accuracyAt15 = new Map<string, { correct: number; cases: number }>();
  for (const r of results) {
    if (r.truth.snrDb < 15) continue;
    const a = accuracyAt15.get(r.truth.label) ?? { correct: 0, cases: 0 };
    accuracyAt15.set(r.truth.label, { correct: a.correct + (isCorrect(r) ? 1 : 0), cases: a.cases + 1 });
  }
  const wrongNamed = results.filter((r) => !isCorrect(r) && !NO_CLASS.has(r.measuredLabel));
  return {
    accuracyAt15,
    confidentWrongAt20: wrongNamed.filter((r) => r.truth.snrDb >= 20 && r.confidence >= CONFIDENT_HIGH_SNR),
    confidentWrongBelow20: wrongNamed.filter((r) => r.truth.snrDb < 20 && r.confidence >= CONFIDENT_LOW_SNR),
  };
}
