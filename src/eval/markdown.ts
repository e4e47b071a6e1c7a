/**
 * The evaluation's tables as Markdown (printed by `npm run eval`, and written into
 * docs/classification.md between its markers with --write-doc).
 */
import { SNR_BANDS } from "./generator.js";
import type { CaseResult } from "./measureCase.js";
import {
  bandName, bandOf, confusion, coverages, isCorrect, reliability, targetCheck, CONFIDENT_HIGH_SNR, CONFIDENT_LOW_SNR,
  type Confusion, type Coverage,
} from "./score.js";
import { VARIANTS } from "./truth.js";

export interface RunInfo {
  readonly seed: number;
  readonly quick: boolean;
  readonly elapsedS: number;
  readonly workers: number;
  readonly date: string;
}

export const DOC_BEGIN = "<!-- eval:begin (written by npm run eval -- --write-doc) -->";
export const DOC_END = "<!-- eval:end -->";

function fmt(x: number | null, digits = 3): string {
  if (x === null || !Number.isFinite(x)) return "—";
  const a = Math.abs(x);
  if (a !== 0 && (a >= 1e6 || a < 1e-3)) return x.toExponential(2);
  return Number(x.toPrecision(digits)).toString();
}

const pct = (num: number, den: number): string => (den === 0 ? "—" : `${((100 * num) / den).toFixed(1)} %`);

function table(header: readonly string[], rows: readonly (readonly string[])[]): string {
  const line = (cells: readonly string[]): string => `| ${cells.join(" | ")} |`;
  return [line(header), line(header.map(() => "---")), ...rows.map(line)].join("\n");
}

function confusionTable(c: Confusion): string {
  const rows = c.rows.map((row) => {
    const m = c.counts.get(row) as ReadonlyMap<string, number>;
    let n = 0;
    for (const v of m.values()) n += v;
    return [`**${row}**`, ...c.columns.map((col) => {
      const v = m.get(col) ?? 0;
      return v === 0 ? "·" : col === row ? `**${v}**` : String(v);
    }), String(n)];
  });
  return table(["true \\ measured", ...c.columns, "cases"], rows);
}

function confusionSection(results: readonly CaseResult[]): string {
  const parts: string[] = ["### Confusion per in-band SNR band", ""];
  parts.push("Rows: the true class (with order); columns: what `measure` answered; `·` = 0; the diagonal in bold.", "");
  for (let b = 0; b < SNR_BANDS.length; b++) {
    const inBand = results.filter((r) => bandOf(r.truth.snrDb) === b);
    if (inBand.length === 0) continue;
    const c = confusion(inBand);
    parts.push(`#### ${bandName(b)}: ${c.correct} of ${c.total} correct (${pct(c.correct, c.total)})`, "", confusionTable(c), "");
  }
  return parts.join("\n");
}

function variantSection(results: readonly CaseResult[]): string {
  const header = ["variant", ...SNR_BANDS.map((_, b) => bandName(b)), "all"];
  const rows = VARIANTS.filter((v) => results.some((r) => r.truth.variant === v)).map((v) => {
    const mine = results.filter((r) => r.truth.variant === v);
    const cell = (rs: readonly CaseResult[]): string => (rs.length === 0 ? "—" : `${rs.filter(isCorrect).length}/${rs.length}`);
    return [v, ...SNR_BANDS.map((_, b) => cell(mine.filter((r) => bandOf(r.truth.snrDb) === b))), cell(mine)];
  });
  return ["### Correct class per variant and SNR band (correct/cases)", "", table(header, rows), ""].join("\n");
}

function reliabilitySection(results: readonly CaseResult[]): string {
  const { bins, noClass } = reliability(results);
  const rows = bins.map((b) => [
    `${b.lo.toFixed(2)}–${b.hi.toFixed(2)}${b.hi >= 1 ? " (incl.)" : ""}`, String(b.count), fmt(b.meanConfidence), b.accuracy === null ? "—" : `${(100 * b.accuracy).toFixed(1)} %`,
  ]);
  return [
    "### Reliability of the stated confidence",
    "",
    "Answers that name a class, binned by the confidence `measure` stated; a reliable confidence has the observed accuracy near the mean stated confidence.",
    `${noClass} answers named no class ("unknown", "noise" or an error) and are not in the bins.`,
    "",
    table(["stated confidence", "answers", "mean stated", "observed accuracy"], rows),
    "",
  ].join("\n");
}

const UNITS: Readonly<Record<string, string>> = {
  carrierOffsetHz: "Hz", fmPeakDeviationHz: "Hz", amDepthPercent: "%", occupiedHz: "Hz", symbolRateBd: "Bd", evmRmsPercent: "%",
};

function coverageSection(results: readonly CaseResult[]): string {
  const cs = coverages(results);
  const rows = cs.map((c) => {
    const ratio = c.medianWidth !== null && c.medianError !== null && c.medianError > 0 ? c.medianWidth / c.medianError : null;
    return [
      `${c.quantity} (${UNITS[c.quantity]})`, String(c.cases), String(c.stated), `${c.covered} (${pct(c.covered, c.stated)})`,
      c.stated === 0 ? "—" : c.covered / c.stated >= 0.9 ? "met" : "**not met**",
      fmt(c.medianWidth), fmt(c.medianError), fmt(ratio, 2), ratio === null ? "—" : ratio < 5 ? "met" : "**not met**",
    ];
  });
  return [
    "### Coverage of the stated uncertainties",
    "",
    "Over every case with a true value: *stated* = a value with a k = 2 uncertainty U; *covered* = |measured − true| ≤ U (target ≥ 90 % of the stated);",
    "*width* = the median full interval 2U; *error* = the median |measured − true|; their ratio should stay below 5 (the interval not uselessly wide).",
    "",
    table(["quantity", "cases", "stated", "covered", "≥ 90 %", "median width", "median error", "width/error", "< 5"], rows),
    "",
    missesOfCoverage(cs),
  ].join("\n");
}

function missesOfCoverage(cs: readonly Coverage[]): string {
  const parts: string[] = ["#### Coverage misses", ""];
  const cap = 30;
  for (const c of cs) {
    if (c.misses.length === 0 && c.notStated.length === 0) continue;
    parts.push(`**${c.quantity}**: ${c.misses.length} outside the interval, ${c.notStated.length} with no value or no uncertainty.`, "");
    if (c.misses.length > 0) {
      const sorted = [...c.misses].sort((a, b) => Math.abs(b.value! - b.truth) / b.uncertainty! - Math.abs(a.value! - a.truth) / a.uncertainty!);
      parts.push(table(["case", "SNR dB", "measured class", "true", "measured", "U (k=2)", "|error|/U"], sorted.slice(0, cap).map((m) => [
        m.id, m.snrDb.toFixed(1), m.measuredLabel, fmt(m.truth, 6), fmt(m.value, 6), fmt(m.uncertainty), fmt(Math.abs((m.value as number) - m.truth) / (m.uncertainty as number), 3),
      ])));
      if (sorted.length > cap) parts.push("", `… and ${sorted.length - cap} more.`);
      parts.push("");
    }
    if (c.notStated.length > 0) {
      parts.push(`Not stated: ${c.notStated.map((m) => `${m.id} (${m.measuredLabel}${m.value === null ? "" : ", no U"})`).join(", ")}.`, "");
    }
  }
  return parts.join("\n");
}

function missesOfClass(results: readonly CaseResult[]): string {
  const wrong = results.filter((r) => !isCorrect(r)).sort((a, b) => b.truth.snrDb - a.truth.snrDb);
  if (wrong.length === 0) return "### Classification misses\n\nNone.\n";
  const rows = wrong.map((r) => [
    r.id, r.truth.snrDb.toFixed(1), r.truth.format, r.truth.dcSpikeDbc === null ? "—" : `+${r.truth.dcSpikeDbc.toFixed(1)} dB`,
    r.truth.label, r.measuredLabel, r.confidence.toFixed(2), r.error ?? "",
  ]);
  return [`### Classification misses (${wrong.length})`, "", table(["case", "SNR dB", "file", "DC spike", "true", "measured", "confidence", "error"], rows), ""].join("\n");
}

function targetsSection(results: readonly CaseResult[]): string {
  const t = targetCheck(results);
  const rows = [...t.accuracyAt15.entries()].map(([label, a]) => [label, `${a.correct}/${a.cases}`, pct(a.correct, a.cases), a.cases > 0 && a.correct / a.cases >= 0.95 ? "met" : "**not met**"]);
  const list = (rs: readonly CaseResult[]): string => (rs.length === 0 ? "none" : rs.map((r) => `${r.id} (${r.truth.snrDb.toFixed(1)} dB: ${r.measuredLabel} at ${r.confidence.toFixed(2)})`).join(", "));
  return [
    "### The issue's targets",
    "",
    table(["true class", "correct at SNR ≥ 15 dB", "share", "≥ 95 %"], rows),
    "",
    `- Wrong class with confidence ≥ ${CONFIDENT_HIGH_SNR} at SNR ≥ 20 dB (target: none): ${list(t.confidentWrongAt20)}.`,
    `- Below 20 dB, a wrong class with confidence ≥ ${CONFIDENT_LOW_SNR} instead of "unknown" (target: none): ${list(t.confidentWrongBelow20)}.`,
    "",
  ].join("\n");
}

/** All tables of a run, in Markdown. */
export function evalMarkdown(results: readonly CaseResult[], info: RunInfo): string {
  const correct = results.filter(isCorrect).length;
  return [
    `Run of ${info.date}: ${info.quick ? "quick subset" : "full set"}, seed ${info.seed}, ${results.length} captures, ` +
      `${correct} classified correctly (${pct(correct, results.length)}), ${info.elapsedS.toFixed(0)} s with ${info.workers} worker(s).`,
    "",
    targetsSection(results),
    confusionSection(results),
    variantSection(results),
    reliabilitySection(results),
    coverageSection(results),
    missesOfClass(results),
  ].join("\n");
}

/** `doc` with the text between its markers replaced by `tables` (markers appended when missing). */
export function replaceDocTables(doc: string, tables: string): string {
  const block = `${DOC_BEGIN}\n\n${tables.trimEnd()}\n\n${DOC_END}`;
  const i = doc.indexOf(DOC_BEGIN);
  const j = doc.indexOf(DOC_END);
  if (i < 0 || j < i) return `${doc.trimEnd()}\n\n${block}\n`;
  return doc.slice(0, i) + block + doc.slice(j + DOC_END.length);
}
