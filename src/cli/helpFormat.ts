/**
 * How `--help` shows an option's default and choices: as a person types them (`(default: 3k)`,
 * `(choices: mean, max)`), not as JSON strings (`(default: "3k")`, commander's own form). An
 * empty list (the repeatable `--tag`) shows no default.
 */
import type { Option } from "commander";

export function optionDescription(option: Option): string {
  const extra: string[] = [];
  if (option.argChoices !== undefined) extra.push(`choices: ${option.argChoices.join(", ")}`);
  const value: unknown = option.defaultValue;
  const shown = option.defaultValueDescription ?? (Array.isArray(value) && value.length === 0 ? undefined : plain(value));
  if (value !== undefined && shown !== undefined && (option.required || option.optional)) extra.push(`default: ${shown}`);
  if (extra.length === 0) return option.description;
  return `${option.description} (${extra.join(", ")})`.trim();
}

function plain(value: unknown): string {
  if (Array.isArray(value)) return value.map(plain).join(", ");
  return typeof value === "string" ? value : JSON.stringify(value);
}

/**
 * The subject of a commander error line: the long name of an option it quotes
 * (`'-o, --out <file.png>'` gives `--out`), else the first quoted word, else "usage".
 */
export function usageSubject(message: string): string {
  const quoted = /'([^']+)'/.exec(message);
  if (quoted === null) return "usage";
  const words = (quoted[1] as string).split(/[\s,|]+/).filter((w) => w.length > 0);
  return words.find((w) => w.startsWith("--")) ?? words[0] ?? "usage";
}
