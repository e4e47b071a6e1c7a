/**
 * SigMF metadata carrying a survey's emissions as annotations (`survey --sigmf-annotations`):
 * a copy of the capture's own metadata (or new metadata for a raw or WAV file) with one
 * annotation per emission, written beside the capture as `<name>.survey.sigmf-meta`, never over
 * the user's own `.sigmf-meta`. Field rules: SigMF v1.2.2 (`sigmf-schema.json`):
 *
 * - global `core:datatype` and `core:version` are required; `core:dataset` names the data file,
 *   so the copy stays a valid description although its base name differs from the data's;
 * - captures and annotations are sorted by `core:sample_start`, ascending;
 * - each annotation has `core:sample_start` and `core:sample_count` (unsigned integers),
 *   `core:freq_lower_edge` and `core:freq_upper_edge` together (at RF when the capture's centre
 *   is known, else relative to baseband), `core:label` (at most 20 characters, as the
 *   specification recommends; the whole text goes to `core:comment`) and `core:generator`.
 *
 * Pure: builds the object; the command writes it (atomically, like every output).
 */
import { basename, dirname, extname, join } from "node:path";

/** One emission as an annotation: samples from the data file's first, offsets from the capture centre. */
export interface SurveyAnnotation {
  readonly startSample: number;
  readonly sampleCount: number;
  readonly lowerOffsetHz: number;
  readonly upperOffsetHz: number;
  /** e.g. "3 fsk 2"; cut to 20 characters in `core:label`. */
  readonly label: string;
  readonly comment?: string | undefined;
}

/** What the metadata describes. */
export interface AnnotatedSigmfInput {
  /** The capture's own parsed `.sigmf-meta`, or null for a raw or WAV file. */
  readonly base: Readonly<Record<string, unknown>> | null;
  /** SigMF datatype of the samples, e.g. "ci16_le" (used when there is no base). */
  readonly datatype: string;
  readonly sampleRateHz: number;
  /** RF centre, Hz, or null when unknown (the edges are then relative to baseband). */
  readonly centerHz: number | null;
  /** File name of the data file (no directory), for `core:dataset`. */
  readonly dataFileName: string;
  /** Bytes before the first sample in the data file (a WAV header), 0 for raw or SigMF data. */
  readonly headerBytes: number;
  /** e.g. "iqaudit 0.1.0". */
  readonly generator: string;
  readonly annotations: readonly SurveyAnnotation[];
}

/** The SigMF specification version written. */
export const SIGMF_VERSION = "1.2.2";
/** Longest `core:label` the specification recommends. */
export const SIGMF_LABEL_MAX = 20;

/** `<capture without .sigmf-meta/.sigmf-data>.survey.sigmf-meta`, beside the capture. */
export function surveySigmfMetaPath(capturePath: string): string {
  const ext = extname(capturePath);
  const base = ext === ".sigmf-meta" || ext === ".sigmf-data" ? basename(capturePath, ext) : basename(capturePath);
  return join(dirname(capturePath), `${base}.survey.sigmf-meta`);
}

/** The metadata object (module comment). */
export function annotatedSigmfMeta(input: AnnotatedSigmfInput): Record<string, unknown> {
  const base = input.base;
  const global = { ...(isObject(base?.["global"]) ? base["global"] : newGlobal(input)), "core:dataset": input.dataFileName };
  const captures = Array.isArray(base?.["captures"]) && base["captures"].length > 0 ? base["captures"] : [newCapture(input)];
  const previous = Array.isArray(base?.["annotations"]) ? base["annotations"].filter(isObject) : [];
  const ours = input.annotations.map((a) => annotation(a, input));
  return { ...(base ?? {}), global, captures: sortedByStart(captures), annotations: sortedByStart([...previous, ...ours]) };
}

function newGlobal(input: AnnotatedSigmfInput): Record<string, unknown> {
  return { "core:datatype": input.datatype, "core:sample_rate": input.sampleRateHz, "core:version": SIGMF_VERSION };
}

function newCapture(input: AnnotatedSigmfInput): Record<string, unknown> {
  return {
    "core:sample_start": 0,
    ...(input.centerHz === null ? {} : { "core:frequency": input.centerHz }),
    ...(input.headerBytes > 0 ? { "core:header_bytes": input.headerBytes } : {}),
  };
}

function annotation(a: SurveyAnnotation, input: AnnotatedSigmfInput): Record<string, unknown> {
  const rf = input.centerHz ?? 0;
  const label = a.label.length > SIGMF_LABEL_MAX ? a.label.slice(0, SIGMF_LABEL_MAX) : a.label;
  const comment = a.comment ?? (label === a.label ? undefined : a.label);
  return {
    "core:sample_start": Math.max(0, Math.round(a.startSample)),
    "core:sample_count": Math.max(0, Math.round(a.sampleCount)),
    "core:freq_lower_edge": rf + Math.min(a.lowerOffsetHz, a.upperOffsetHz),
    "core:freq_upper_edge": rf + Math.max(a.lowerOffsetHz, a.upperOffsetHz),
    "core:label": label,
    ...(comment === undefined ? {} : { "core:comment": comment }),
    "core:generator": input.generator,
  };
}

/** Sorted by `core:sample_start`, ascending; equal starts keep their order. */
function sortedByStart(items: readonly unknown[]): unknown[] {
  return items.map((a, i) => ({ a, i })).sort((x, y) => startOf(x.a) - startOf(y.a) || x.i - y.i).map((x) => x.a);
}

function startOf(x: unknown): number {
  const v = isObject(x) ? x["core:sample_start"] : undefined;
  return typeof v === "number" ? v : 0;
}

function isObject(x: unknown): x is Record<string, unknown> {
  return typeof x === "object" && x !== null && !Array.isArray(x);
}
