/**
 * `iqaudit check --list-templates`: each template with its values, their sources and REFERENCES
 * status, and whether each becomes a limit (V, V2, or CP marked trade practice) or not.
 */
import { listTemplates, templateLimits, type Template } from "./templates.js";

export function templateListText(): string {
  const blocks = listTemplates().map(templateBlock);
  return [
    "Licence templates (iqaudit check --template NAME --assigned HZ; a --licence file's fields win over them)",
    "",
    ...blocks,
    "Status: V read in the regulation's text; V2 from a reproduction of it; CP common (trade) practice; M from memory.",
    "Only V and V2 values, and CP values a template marks as trade practice, are used as limits.",
    "Indicative only: the licence and local regulation prevail.",
    "",
  ].join("\n");
}

function templateBlock(t: Template): string {
  const { dropped } = templateLimits(t);
  const rows = Object.entries(t.values).map(([field, v]) => {
    if (v === undefined) return "";
    const shown = Array.isArray(v.value) ? `${v.value.length} points` : String(v.value);
    const out = dropped.find((d) => d.field === field);
    const use = out === undefined ? (v.tradePractice === true ? "limit (trade practice)" : "limit") : `not a limit: ${out.reason}`;
    return `  ${field.padEnd(24)} ${shown.padEnd(14)} ${v.source} [${v.status}] ${use}`;
  });
  return [`${t.name}: ${t.description}`, ...rows.filter((r) => r !== ""), ""].join("\n");
}
