/**
 * What `check` prints for a person (without --json): the verdict, one line a check, what could
 * not be checked, where the files went, and the one-line caution.
 */
import type { CheckEntry } from "../licence/index.js";
import type { CheckReport } from "./checkReport.js";
import { formatUncertainty } from "./format.js";
import { displayClass } from "./className.js";

export function checkText(r: CheckReport, files: readonly string[]): string {
  const lines = [
    `${r.report.capture.path}: ${r.verdict === "pass" ? "PASS" : "FAIL"} (decision with U: ${r.decision})`,
    `  emission measured: ${displayClass(r.report.modulation.class, r.report.modulation.order)}${r.report.emission.designator === null ? "" : `, ${r.report.emission.designator}`}`,
    "",
    ...r.checks.map(checkLine),
    ...(r.skipped.length === 0 ? [] : ["", "not checked:", ...r.skipped.map((s) => `  ${s}`)]),
    ...(files.length === 0 ? [] : ["", `written: ${files.length} files, ${files[files.length - 1] ?? ""} last`]),
    "",
    "Indicative only, not an accredited test; the licence and local regulation prevail (iqaudit check --help).",
    "",
  ];
  return lines.join("\n");
}

function checkLine(e: CheckEntry): string {
  const name = e.name.padEnd(15);
  if (e.kind === "information") return `  ${name} ${formatValue(e.measured, e)} (information; no limit in the licence)`;
  if (e.kind === "match") return `  ${name} ${e.pass ? "pass" : "FAIL"}  licence ${String(e.limit)}, measured ${String(e.measured ?? "none")}  [${e.decision ?? ""}]`;
  const u = e.uncertainty === null ? "U not stated" : formatUncertainty(e.uncertainty, digitsOf(e), "");
  const pct = e.marginPercent === null ? "" : ` (${e.marginPercent >= 0 ? "+" : ""}${e.marginPercent.toFixed(1)} %)`;
  return `  ${name} ${e.pass ? "pass" : "FAIL"}  limit ${formatValue(e.limit, e)}, measured ${formatValue(e.measured, e)} ${u}, margin ${formatNumber(e.margin ?? 0, e, true)}${pct}  [${e.decision ?? ""}]`;
}

function formatValue(x: number | string | null, e: CheckEntry): string {
  if (x === null) return "none";
  if (typeof x === "string") return x;
  return `${formatNumber(x, e)} ${e.unit ?? ""}`.trim();
}

function formatNumber(x: number, e: CheckEntry, signed = false): string {
  return `${signed && x >= 0 ? "+" : ""}${x.toFixed(digitsOf(e))}`;
}

/** Decimals of a check's figures: ppm to 0.001, dB to 0.1, Hz to 1. */
export function digitsOf(e: CheckEntry): number {
  return e.unit === "ppm" ? 3 : e.unit === "dB" ? 1 : 0;
}
