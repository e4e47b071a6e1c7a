/**
 * What the `archive` commands print for a person: tables with units in their headings, times in
 * UTC, uncertainties (k = 2) beside the values they belong to.
 */
import type { ComparedFigure, EntryDetail, EntryRow, HistoryPoint, VerifyResult } from "../archive/index.js";
import { formatHz, formatUncertainty, uncertaintyDecimals } from "./format.js";

type Listed = EntryRow & { readonly tags: readonly string[] };

export function archiveListText(entries: readonly Listed[]): string {
  if (entries.length === 0) return "no entries match\n";
  const head = ["id", "time (UTC)", "kind", "frequency", "class", "designator", "OBW", "error ppm", "peak dev.", "decision", "tags"];
  const rows = entries.map((e) => [
    String(e.id), shortTime(e.capturedAt ?? e.measuredAt), e.kind, e.frequencyHz === null ? "—" : formatHz(e.frequencyHz),
    e.modulationClass ?? "—", e.designator ?? "—", e.occupiedBandwidthHz === null ? "—" : formatHz(e.occupiedBandwidthHz),
    e.carrierErrorPpm === null ? "—" : e.carrierErrorPpm.toFixed(3), e.peakDeviationHz === null ? "—" : formatHz(e.peakDeviationHz),
    e.checkDecision ?? "—", e.tags.join(", "),
  ]);
  return `${table(head, rows)}${entries.length} entries\n`;
}

export function archiveShowText(d: EntryDetail): string {
  const e = d.entry;
  const lines = [
    `entry ${e.id}: ${e.kind} report, added ${e.addedAt}`,
    `  capture      ${e.capturePath ?? "?"} (${e.captureFormat ?? "?"}, ${e.sampleRateHz ?? "?"} S/s), SHA-256 ${e.captureSha256 ?? "?"}`,
    `  recorded     ${e.capturedAt ?? "not stated"}; measured ${e.measuredAt ?? "?"} by iqaudit ${e.toolVersion ?? "?"}`,
    `  tags         ${d.tags.length === 0 ? "none" : d.tags.join(", ")}${e.note === null ? "" : `; note: ${e.note}`}`,
    ...(e.kind === "check" ? [`  check        ${e.checkVerdict ?? "?"} (decision ${e.checkDecision ?? "?"})`] : []),
    `  manifest     ${e.manifest}, SHA-256 ${e.contentSha256}`,
    "",
    "files",
    ...d.files.map((f) => `  ${f.path.padEnd(28)} ${String(f.bytes).padStart(9)} B  ${f.sha256}`),
    "",
    "figures (value ± U, k = 2)",
    ...d.figures.map((f) => `  ${f.field.padEnd(36)} ${valueWithU(f.value, f.uncertainty)}`),
    "",
  ];
  return lines.join("\n");
}

export function archiveCompareText(c: { first: EntryRow; second: EntryRow; figures: readonly ComparedFigure[] }): string {
  const head = ["figure", `entry ${c.first.id}`, `entry ${c.second.id}`, "change", "√(U1²+U2²)", "beyond U?"];
  const rows = c.figures.map((f) => [
    f.field, valueWithU(f.first, f.firstUncertainty), valueWithU(f.second, f.secondUncertainty), signed(f.change),
    f.combinedUncertainty === null ? "not known" : f.combinedUncertainty.toPrecision(3), f.significant === null ? "—" : f.significant ? "yes" : "no",
  ]);
  return `entry ${c.first.id} (${shortTime(c.first.capturedAt ?? c.first.measuredAt)}) against entry ${c.second.id} (${shortTime(c.second.capturedAt ?? c.second.measuredAt)})\n` +
    `${table(head, rows)}A change beyond √(U1² + U2²) (both expanded, k = 2) is more than the two measurements' uncertainties explain.\n`;
}

export function archiveHistoryText(h: { tag: string; field: string; points: readonly HistoryPoint[]; limit: { value: number; source: string; symmetric: boolean } | null; files: readonly string[] }): string {
  const rows = h.points.map((p) => [shortTime(p.time), String(p.id), p.kind, valueWithU(p.value, p.uncertainty)]);
  const limit = h.limit === null ? "no limit line (give --limit, or archive a check of this field)" : `limit ${h.limit.symmetric ? "±" : ""}${h.limit.value} (${h.limit.source})`;
  return `${h.field} of tag ${h.tag}\n${table(["time (UTC)", "entry", "kind", "value ± U (k = 2)"], rows)}${limit}\n${h.files.map((f) => `-> ${f}\n`).join("")}`;
}

export function archiveVerifyText(v: VerifyResult & { archive: string }): string {
  const head = `${v.archive}: ${v.entries} entries, ${v.files} stored files`;
  if (v.problems.length === 0) return `${head}: every file re-hashed and the database checked, nothing missing or altered\n`;
  return `${head}: ${v.problems.length} problems\n${v.problems.map((p) => `  ${p}\n`).join("")}`;
}

function valueWithU(v: number, u: number | null): string {
  if (u === null || !(u > 0)) return formatNumber(v);
  const d = uncertaintyDecimals(u, 0);
  return `${v.toFixed(d)} ${formatUncertainty(u, d, "")}`;
}

function formatNumber(v: number): string {
  return Math.abs(v) >= 1e6 || (Math.abs(v) < 1e-3 && v !== 0) ? v.toExponential(6) : String(Number(v.toPrecision(9)));
}

function signed(v: number): string {
  return `${v >= 0 ? "+" : ""}${formatNumber(v)}`;
}

function shortTime(iso: string | null): string {
  return iso === null ? "?" : iso.replace("T", " ").replace(/:\d\d(\.\d+)?Z$/, "");
}

function table(head: readonly string[], rows: readonly (readonly string[])[]): string {
  const widths = head.map((h, i) => Math.max(h.length, ...rows.map((r) => (r[i] ?? "").length)));
  const line = (cells: readonly string[]): string => cells.map((c, i) => c.padEnd(widths[i] ?? 0)).join("  ").trimEnd();
  return `${[line(head), line(widths.map((w) => "-".repeat(w))), ...rows.map(line)].join("\n")}\n`;
}
