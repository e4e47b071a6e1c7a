/**
 * Licence templates: the terms of a common channel class (`check --template NAME`), each value
 * with its source and its status in REFERENCES.md (V verified, V2 verified through a secondary
 * copy, C computed, CP common practice, M from memory). They are JSON files in
 * templates/licence/ at the package root, read at run time; docs/licence.md tables them.
 *
 * Only V and V2 values, and CP values marked tradePractice, become limits (templateLimits); the
 * others stay in the template so a user can see them, and are listed as dropped with the reason.
 */
import { readdirSync, readFileSync } from "node:fs";
import { fileURLToPath } from "node:url";
import { LicenceFileError, UsageError } from "../errors.js";
import { describeJson } from "./fieldRules.js";
import { checkCombination, checkField, LICENCE_FIELDS, parseJsonObject, type Licence, type MaskPoints } from "./licence.js";

export type TemplateStatus = "V" | "V2" | "C" | "CP" | "M";

export interface TemplateValue {
  value: number | string | MaskPoints;
  /** Where the value comes from, e.g. "47 CFR 90.213 Table 1 (150–174 MHz, fixed and base stations)". */
  source: string;
  status: TemplateStatus;
  /** For status CP: the trade treats this value as a limit, so it is used as one. */
  tradePractice?: boolean;
  note?: string;
}

export interface Template {
  /** The file name without ".json", e.g. "vhf-land-mobile-25k". */
  name: string;
  description: string;
  values: Partial<Record<keyof Licence, TemplateValue>>;
}

/** src/licence/ under vitest and dist/licence/ once built both sit two levels below the package root. */
const TEMPLATE_FOLDER = new URL("../../templates/licence/", import.meta.url);
const STATUSES: readonly string[] = ["V", "V2", "C", "CP", "M"];

let cache: readonly Template[] | null = null;

/** Every bundled template, sorted by name. Throws LicenceFileError naming a template file that breaks the rules. */
export function listTemplates(): readonly Template[] {
  if (cache === null) {
    const names = readdirSync(TEMPLATE_FOLDER).filter((f) => f.endsWith(".json")).sort();
    cache = names.map((f) => {
      const url = new URL(f, TEMPLATE_FOLDER);
      return parseTemplate(readFileSync(url, "utf8"), fileURLToPath(url), f.slice(0, -".json".length));
    });
  }
  return cache;
}

/** The template called `name`; UsageError on --template naming the known ones otherwise. */
export function findTemplate(name: string): Template {
  const all = listTemplates();
  const t = all.find((x) => x.name === name);
  if (t === undefined) {
    throw new UsageError("--template", `unknown template ${name}; known: ${all.map((x) => x.name).join(", ")} (iqaudit check --list-templates)`);
  }
  return t;
}

/**
 * The values of `t` that may be limits: status V or V2, or CP with tradePractice true. The others
 * are left out of `licence` and listed in `dropped` with the reason.
 */
export function templateLimits(t: Template): { licence: Licence; dropped: readonly { field: string; reason: string }[] } {
  const licence: Record<string, unknown> = {};
  const dropped: { field: string; reason: string }[] = [];
  for (const field of LICENCE_FIELDS) {
    const v = t.values[field];
    if (v === undefined) continue;
    const reason = notALimit(v);
    if (reason === null) licence[field] = v.value;
    else dropped.push({ field, reason: `${reason}; give it in the licence file if the licence states it` });
  }
  return { licence: licence as Licence, dropped };
}

/** Why a template value is not used as a limit, or null when it is. */
function notALimit(v: TemplateValue): string | null {
  if (v.status === "V" || v.status === "V2") return null;
  if (v.status === "CP") return v.tradePractice === true ? null : `common practice with no single authority (CP, ${v.source}), not a limit`;
  if (v.status === "C") return `computed (C, ${v.source}), not a stated limit`;
  return `from memory and unverified (M, ${v.source}), not a limit`;
}

/**
 * The template in `text`, read from `filePath` and expected to be called `name`. Checks every
 * key, every value against its licence field's rule, and the statuses; LicenceFileError otherwise.
 */
export function parseTemplate(text: string, filePath: string, name: string): Template {
  const root = parseJsonObject(text, filePath, "template keys (name, description, values)");
  for (const key of Object.keys(root)) {
    if (!["name", "description", "values"].includes(key)) throw new LicenceFileError(filePath, key, "is not a template key; known: name, description, values");
  }
  if (root["name"] !== name) throw new LicenceFileError(filePath, "name", `must be ${JSON.stringify(name)}, the file's name, not ${describeJson(root["name"])}`);
  const description = root["description"];
  if (typeof description !== "string" || description === "") throw new LicenceFileError(filePath, "description", `must be a non-empty string, not ${describeJson(description)}`);
  const values = root["values"];
  if (typeof values !== "object" || values === null || Array.isArray(values)) throw new LicenceFileError(filePath, "values", `must be an object of licence fields, not ${describeJson(values)}`);
  const checked: Record<string, TemplateValue> = {};
  for (const [field, entry] of Object.entries(values)) checked[field] = templateValue(field, entry, filePath);
  const licence = Object.fromEntries(Object.entries(checked).map(([f, v]) => [f, v.value])) as Licence;
  checkCombination(licence, filePath);
  return { name, description, values: checked as Template["values"] };
}

const VALUE_KEYS: readonly string[] = ["value", "source", "status", "tradePractice", "note"];

function templateValue(field: string, entry: unknown, filePath: string): TemplateValue {
  const label = `values.${field}`;
  if (typeof entry !== "object" || entry === null || Array.isArray(entry)) {
    throw new LicenceFileError(filePath, label, `must be an object { value, source, status }, not ${describeJson(entry)}`);
  }
  const e = entry as Record<string, unknown>;
  for (const key of Object.keys(e)) {
    if (!VALUE_KEYS.includes(key)) throw new LicenceFileError(filePath, `${label}.${key}`, `is not a template value key; known: ${VALUE_KEYS.join(", ")}`);
  }
  checkField(field, e["value"], filePath, `${label}.value`);
  const { source, status, tradePractice, note } = e;
  if (typeof source !== "string" || source === "") throw new LicenceFileError(filePath, `${label}.source`, `must name where the value comes from, not ${describeJson(source)}`);
  if (typeof status !== "string" || !STATUSES.includes(status)) throw new LicenceFileError(filePath, `${label}.status`, `must be one of ${STATUSES.join(", ")} (REFERENCES.md), not ${describeJson(status)}`);
  if (tradePractice !== undefined && (tradePractice !== true || status !== "CP")) {
    throw new LicenceFileError(filePath, `${label}.tradePractice`, "may only be true, and only on a value of status CP");
  }
  if (note !== undefined && (typeof note !== "string" || note === "")) throw new LicenceFileError(filePath, `${label}.note`, `must be a non-empty string, not ${describeJson(note)}`);
  const v: TemplateValue = { value: e["value"] as TemplateValue["value"], source, status: status as TemplateStatus };
  if (tradePractice === true) v.tradePractice = true;
  if (typeof note === "string") v.note = note;
  return v;
}
