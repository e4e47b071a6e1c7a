/**
 * The licence a check uses: a template's limits overridden field by field by a licence file
 * (docs/interface.md "Licence file"), with the origin of every field for the report.
 *
 * A file field replaces the template's field of the same name, and also the template fields that
 * only make sense beside the one replaced: a tolerance in the other unit (a licence states one),
 * and, when the file gives a different mask, the template's maskReference, maskDetector and
 * maskResolutionHz (they belong to the template's mask). Those are listed in `dropped` with the
 * reason. The merged terms are checked for contradictions as a licence file is.
 */
import { checkCombination, LICENCE_FIELDS, type Licence } from "./licence.js";
import { templateLimits, type Template } from "./templates.js";

/** Where a value came from: a template, the licence file, or a command-line option (`--assigned`). */
export type Origin = "template" | "file" | "option";

export interface FieldOrigin {
  field: keyof Licence;
  origin: Origin;
  /** The template value's source, or the licence file's path. */
  source: string;
  /** The template value's REFERENCES status; null for a file value. */
  status: string | null;
  note: string | null;
}

export interface MergedLicence {
  licence: Licence;
  origins: readonly FieldOrigin[];
  /** The template's name, or null. */
  template: string | null;
  /** The licence file's path, or null. */
  file: string | null;
  /** Template values not used, each with the reason. */
  dropped: readonly { field: string; reason: string }[];
}

/** `template`'s limits with `file`'s fields over them (module comment). Throws LicenceFileError (naming the file) for merged terms that contradict each other. */
export function mergeLicences(template: Template | null, file: { path: string; licence: Licence } | null): MergedLicence {
  const limits = template === null ? { licence: {} as Licence, dropped: [] } : templateLimits(template);
  const fileLicence: Licence = file?.licence ?? {};
  const replaced = replacedByFile(limits.licence, fileLicence);
  const licence: Record<string, unknown> = {};
  const origins: FieldOrigin[] = [];
  for (const field of LICENCE_FIELDS) {
    if (file !== null && fileLicence[field] !== undefined) {
      licence[field] = fileLicence[field];
      origins.push({ field, origin: "file", source: file.path, status: null, note: null });
    } else if (template !== null && limits.licence[field] !== undefined && !replaced.has(field)) {
      const v = template.values[field];
      licence[field] = limits.licence[field];
      origins.push({ field, origin: "template", source: v?.source ?? template.name, status: v?.status ?? null, note: v?.note ?? null });
    }
  }
  if (file !== null) checkCombination(licence as Licence, file.path);
  const dropped = [
    ...limits.dropped.filter((d) => fileLicence[d.field as keyof Licence] === undefined),
    ...[...replaced].map(([field, reason]) => ({ field, reason })),
  ];
  return { licence: licence as Licence, origins, template: template?.name ?? null, file: file?.path ?? null, dropped };
}

/** Template fields the file replaces without naming them, with the reason (module comment). */
function replacedByFile(fromTemplate: Licence, fromFile: Licence): Map<keyof Licence, string> {
  const replaced = new Map<keyof Licence, string>();
  const drop = (field: keyof Licence, reason: string): void => {
    if (fromTemplate[field] !== undefined && fromFile[field] === undefined) replaced.set(field, reason);
  };
  if (fromFile.frequencyTolerancePpm !== undefined) drop("frequencyToleranceHz", "the licence file gives frequencyTolerancePpm instead");
  if (fromFile.frequencyToleranceHz !== undefined) drop("frequencyTolerancePpm", "the licence file gives frequencyToleranceHz instead");
  if (fromFile.mask !== undefined && JSON.stringify(fromFile.mask) !== JSON.stringify(fromTemplate.mask)) {
    for (const field of ["maskReference", "maskDetector", "maskResolutionHz"] as const) {
      drop(field, "it belongs to the template's mask, which the licence file replaces");
    }
  }
  return replaced;
}
