/**
 * check.md: the verdict table first (one row a check: limit, measured, U, margin, simple
 * acceptance, decision), then the method and notes of each check, the licence values with their
 * origin, what could not be checked, the measurement's warnings and the cautions.
 */
import type { CheckEntry } from "../licence/index.js";
import type { CheckReport } from "./checkReport.js";
import { digitsOf } from "./checkText.js";
import { formatHz, formatUncertainty } from "./format.js";

const DECISION_WORDS: Record<string, string> = {
  pass: "pass",
  "conditional-pass": "conditional pass",
  "conditional-fail": "conditional fail",
  fail: "fail",
};

export function checkMarkdown(r: CheckReport, files: readonly string[]): string {
  const c = r.report.capture;
  const lines = [
    `# Licence check: ${c.path}`,
    "",
    `**Verdict: ${r.verdict.toUpperCase()}** (simple acceptance) · decision with the guard band U: **${DECISION_WORDS[r.decision] ?? r.decision}** (ILAC-G8:09/2019 §4.2.3)`,
    "",
    `Capture: ${c.format} at ${c.sampleRateHz} S/s, ${c.durationS.toFixed(2)} s analysed, SHA-256 \`${c.sha256}\`.`,
    `Channels, centred on the ${r.channel.centredOn} (${hz(r.channel.offsetHz)} from the capture centre): the emission measured in ${hz(r.channel.measureWidthHz)}, the mask and the adjacent channels read in ${hz(r.channel.widthHz)}.`,
    "",
    "| check | limit | measured | U (k = 2) | margin | margin % | simple acceptance | decision |",
    "| --- | --- | --- | --- | --- | --- | --- | --- |",
    ...r.checks.map(verdictRow),
    "",
    "Margins are positive inside the limit. The decision treats a value within U of the limit as conditional:",
    "pass below limit − U, conditional pass up to the limit, conditional fail up to limit + U, fail beyond.",
    "Rows marked information are not part of the verdict.",
    "",
    "## Methods",
    "",
    ...r.checks.flatMap(methodLines),
    ...licenceLines(r),
    ...(r.skipped.length === 0 ? [] : ["## Not checked", "", ...r.skipped.map((s) => `- ${s}`), ""]),
    ...(r.warnings.length === 0 ? [] : ["## Warnings of the measurement", "", ...r.warnings.map((w) => `- ${w}`), ""]),
    "## Files",
    "",
    ...files.map((f) => `- ${f}`),
    "- check.json (this check as data; lists every file above with its SHA-256)",
    "",
    "## Cautions",
    "",
    ...r.cautions.map((s) => `- ${s}`),
    "",
  ];
  return `${lines.join("\n")}\n`;
}

function verdictRow(e: CheckEntry): string {
  const u = e.unit ?? "";
  const num = (x: number | string | null, digits: number): string => (x === null ? "—" : typeof x === "string" ? x : `${x.toFixed(digits)} ${u}`.trim());
  const digits = digitsOf(e);
  const unc = e.uncertainty === null ? "not stated" : formatUncertainty(e.uncertainty, digits, u);
  const margin = e.margin === null ? "—" : `${e.margin >= 0 ? "+" : ""}${e.margin.toFixed(digits)} ${u}`.trim();
  const pct = e.marginPercent === null ? "—" : `${e.marginPercent >= 0 ? "+" : ""}${e.marginPercent.toFixed(1)} %`;
  const pass = e.pass === null ? "information" : e.pass ? "pass" : "**fail**";
  const decision = e.decision === null ? "—" : DECISION_WORDS[e.decision] ?? e.decision;
  return `| ${e.name} | ${num(e.limit, digits)} | ${num(e.measured, digits)} | ${e.kind === "upper" ? unc : "—"} | ${margin} | ${pct} | ${pass} | ${decision} |`;
}

function methodLines(e: CheckEntry): string[] {
  return [`### ${e.name}`, "", `- Method: ${e.method}`, `- Licence fields: ${e.fields.join(", ")}`, ...e.notes.map((n) => `- ${n}`), ""];
}

function licenceLines(r: CheckReport): string[] {
  const l = r.licence;
  const rows = l.origins.map((o) => {
    const v = (l.values as Record<string, unknown>)[o.field];
    const shown = Array.isArray(v) ? `${v.length} points` : String(v);
    return `| ${o.field} | ${shown} | ${o.origin} | ${o.source}${o.status === null ? "" : ` (status ${o.status})`}${o.note === null ? "" : `; ${o.note}`} |`;
  });
  const head = [
    "## Licence values",
    "",
    `Template: ${l.template ?? "none"} · licence file: ${l.file ?? "none"}. A file's value wins over the template's.`,
    "",
    "| field | value | from | source |",
    "| --- | --- | --- | --- |",
    ...rows,
    "",
  ];
  if (l.dropped.length === 0) return head;
  return [...head, "Template values not used as limits:", "", ...l.dropped.map((d) => `- ${d.field}: ${d.reason}`), ""];
}

function hz(x: number): string {
  return formatHz(x);
}
