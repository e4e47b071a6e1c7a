/**
 * The survey for a person (survey.md): what file, then one table row per emission, numbered as
 * on survey.png (frequency, bandwidth, power, SNR, time span, duty cycle, class, designator,
 * notes), then the receiver artefacts that were set aside. Built from the JSON report alone.
 */
import { basename } from "node:path";
import type { SurveyEmission, SurveyReport } from "./surveyReport.js";
import { formatHz, formatRate, formatSeconds } from "./format.js";
import { displayClass } from "./className.js";

const HEADER = ["No.", "Frequency", "Bandwidth (99 %)", "Power", "SNR", "On from – to", "Duty", "Class", "Designator", "Notes"];

export function surveyMarkdown(r: SurveyReport): string {
  const c = r.capture;
  const emissions = r.emissions.filter((e) => e.artefact === null);
  const artefacts = r.emissions.filter((e) => e.artefact !== null);
  const lines = [
    `# Survey of ${basename(c.path)}`,
    "",
    `${formatRate(c.sampleRateHz)}, ${c.centerHz === null ? "centre unknown (frequencies are offsets)" : `centre ${formatHz(c.centerHz)}`}, ` +
      `${formatSeconds(c.durationS)} analysed; SHA-256 \`${c.sha256}\`; surveyed ${r.measuredAt} by ${r.tool.name} ${r.tool.version}.`,
    "",
    `## Emissions (${emissions.length})`,
    "",
    ...table(emissions.map(row)),
    "",
    `## Receiver artefacts set aside (${artefacts.length})`,
    "",
    ...(artefacts.length === 0 ? ["None."] : artefacts.map(artefactLine)),
    ...(r.warnings.length === 0 ? [] : ["", "## Warnings", "", ...r.warnings.map((w) => `- ${w}`)]),
    "",
    "Results are indicative. Each emission's own report (its sub-folder) gives every figure with its uncertainty and method.",
    "",
  ];
  return lines.join("\n");
}

function row(e: SurveyEmission): string[] {
  const notes: string[] = [];
  if (e.burstCount !== undefined && e.burstCount !== null && e.burstCount > 1) notes.push(`${e.burstCount} bursts`);
  if (e.report !== null && e.report.modulation.confidence < 0.9 && e.class !== null) notes.push(`class confidence ${(100 * e.report.modulation.confidence).toFixed(0)} %`);
  return [
    String(e.id),
    e.frequencyHz === null ? `${formatHz(e.offsetHz)} offset` : formatHz(e.frequencyHz),
    e.bandwidthHz === null ? "n/a" : formatHz(e.bandwidthHz),
    e.powerDbfs === null ? "n/a" : `${e.powerDbfs.toFixed(1)} dBFS`,
    e.snrDb === null ? "n/a" : `${e.snrDb.toFixed(1)} dB`,
    `${formatSeconds(e.startS)} – ${formatSeconds(e.endS)}`,
    e.dutyCyclePercent === null ? "n/a" : `${e.dutyCyclePercent.toFixed(0)} %`,
    e.class === null ? "n/a" : displayClass(e.class, e.order),
    e.designator ?? "n/a",
    notes.join("; "),
  ];
}

function artefactLine(e: SurveyEmission): string {
  const where = e.frequencyHz === null ? `${formatHz(e.offsetHz)} offset` : formatHz(e.frequencyHz);
  const what = e.artefact === "dc" ? "the receiver's DC spike" : `an IQ-imbalance image${e.imageOf === undefined || e.imageOf === null ? "" : ` of emission ${e.imageOf}`}`;
  return `- ${e.id}: ${what} at ${where}${e.powerDbfs === null ? "" : `, ${e.powerDbfs.toFixed(1)} dBFS`}`;
}

function table(rows: readonly string[][]): string[] {
  const escape = (s: string): string => s.replace(/\|/g, "\\|");
  return [
    `| ${HEADER.join(" | ")} |`,
    `| ${HEADER.map(() => "---").join(" | ")} |`,
    ...rows.map((r) => `| ${r.map(escape).join(" | ")} |`),
  ];
}
