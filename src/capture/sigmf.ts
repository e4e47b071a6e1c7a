/**
 * SigMF metadata (`NAME.sigmf-meta`, UTF-8 JSON) checked against the SigMF specification and
 * its JSON schema, v1.2.x (REFERENCES.md §9): the fields iqaudit reads, with their types.
 *
 * Rule: a field with the wrong JSON type, a missing `global` or `core:datatype`, or a value that
 * changes how samples are read (datatype, sample rate, channels, header and trailing bytes) is
 * a CaptureFormatError. A required field that reading does not need (`core:version`,
 * `captures`, `annotations`) or a value that is only descriptive (a `core:datetime` that is not
 * RFC 3339 with `Z`) gives a warning instead.
 */
import { CaptureFormatError } from "../errors.js";
import { centerProblem, sampleRateProblem } from "./acceptedRanges.js";
import { parseSigmfDatatype, type SigmfDatatype } from "./sigmfDatatype.js";
import type { SigmfAnnotation } from "./source.js";

/** What iqaudit takes from a .sigmf-meta file. */
export interface SigmfRecording {
  /** global core:datatype. */
  readonly datatype: SigmfDatatype;
  /** global core:sample_rate, samples/s, or null when absent. */
  readonly sampleRateHz: number | null;
  /** global core:version, or null when absent. */
  readonly version: string | null;
  /** global core:dataset: the data file name of a non-conforming dataset, else null. */
  readonly dataset: string | null;
  /** global core:trailing_bytes (0 when absent): bytes after the samples to ignore. */
  readonly trailingBytes: number;
  /** captures[0] core:frequency, Hz, or null. */
  readonly frequencyHz: number | null;
  /** captures[0] core:header_bytes (0 when absent): bytes before the first sample. */
  readonly headerBytes: number;
  /** captures[0] core:datetime when it is RFC 3339 with the Z offset, else null. */
  readonly datetime: string | null;
  readonly captureCount: number;
  /** global core:description, or null. */
  readonly description: string | null;
  /** The annotations, in file order (their sample_start less core:offset). */
  readonly annotations: readonly SigmfAnnotation[];
  readonly warnings: readonly string[];
}

type Json = null | boolean | number | string | Json[] | { [key: string]: Json };
type JsonObject = { [key: string]: Json };

/** SigMF core:datetime: full-date "T" partial-time ["." 1*DIGIT] "Z" (spec ABNF; only Z allowed). */
const DATETIME = /^(\d{4})-(\d{2})-(\d{2})T(\d{2}):(\d{2}):(\d{2})(\.\d+)?Z$/;
/** Characters the schema forbids in core:dataset (it must be a bare file name). */
const BAD_FILE_NAME = /[/\\:*?"<>|]/;

/**
 * Parses and checks the text of the .sigmf-meta file `metaPath` (a leading byte-order mark is
 * skipped). Errors: CaptureFormatError naming `metaPath` (see the rule above).
 */
export function parseSigmfMeta(text: string, metaPath: string): SigmfRecording {
  const fail = (problem: string): never => {
    throw new CaptureFormatError(metaPath, problem);
  };
  let root: Json;
  try {
    // A UTF-8 byte-order mark (U+FEFF, as some editors write it) is not JSON, but a parser
    // may ignore it (RFC 8259 §8.1, from memory): it is skipped.
    root = JSON.parse(text.startsWith("\uFEFF") ? text.slice(1) : text) as Json;
  } catch (e) {
    return fail(`is not valid JSON (${oneLine((e as Error).message)})`);
  }
  if (!isObject(root)) return fail(`is not SigMF metadata: the top level is ${describe(root)}, not an object`);
  const warnings: string[] = [];
  const global = root["global"];
  if (global === undefined) return fail('has no "global" object (SigMF requires one)');
  if (!isObject(global)) return fail(`has a "global" that is ${describe(global)}, not an object`);
  const g = new Fields(global, "global", fail);

  const datatypeText = g.string("core:datatype");
  if (datatypeText === undefined) return fail("has no global core:datatype (SigMF requires it)");
  const datatype = parseSigmfDatatype(datatypeText);
  if (datatype === null) {
    return fail(`has global core:datatype "${datatypeText}", which is not a SigMF datatype (e.g. cf32_le, ci16_be, cu8)`);
  }
  if (datatype.warning !== null) warnings.push(datatype.warning);

  const version = g.string("core:version") ?? null;
  if (version === null) warnings.push(`${metaPath} has no global core:version, which SigMF requires.`);
  else if (!/^1\.\d+\.\d+/.test(version)) {
    warnings.push(`${metaPath} declares SigMF core:version ${version}; it is read as SigMF 1.x.`);
  }
  const sampleRateHz = g.number("core:sample_rate") ?? null;
  const rateProblem = sampleRateHz === null ? null : sampleRateProblem(sampleRateHz);
  if (rateProblem !== null) fail(`has global core:sample_rate ${numberText(sampleRateHz as number)}, which ${rateProblem}`);
  const channels = g.integer("core:num_channels") ?? 1;
  if (channels !== 1) fail(`has core:num_channels ${channels}; iqaudit reads a dataset of 1 channel`);
  const offset = g.integer("core:offset") ?? 0;
  const dataset = g.string("core:dataset") ?? null;
  if (dataset !== null && BAD_FILE_NAME.test(dataset)) {
    fail(`has global core:dataset "${dataset}", which must be a bare file name in the same folder`);
  }
  const trailingBytes = g.integer("core:trailing_bytes") ?? 0;
  const description = g.string("core:description") ?? null;
  if (g.boolean("core:metadata_only") === true && dataset === null) {
    fail("is metadata only (core:metadata_only is true): there is no dataset to read");
  }
  checkExtensions(global["core:extensions"], fail, warnings, metaPath);

  const captures = root["captures"];
  let frequencyHz: number | null = null;
  let headerBytes = 0;
  let datetime: string | null = null;
  let captureCount = 0;
  if (captures === undefined) warnings.push(`${metaPath} has no captures array, which SigMF requires; the centre frequency is unknown.`);
  else if (!Array.isArray(captures)) fail(`has "captures" that is ${describe(captures)}, not an array`);
  else {
    captureCount = captures.length;
    const segments = captures.map((c, k) => {
      if (!isObject(c)) return fail(`has captures[${k}] that is ${describe(c)}, not an object`);
      const f = new Fields(c, `captures[${k}]`, fail);
      const sampleStart = f.integer("core:sample_start");
      if (sampleStart === undefined) return fail(`has no core:sample_start in captures[${k}] (SigMF requires it)`);
      return {
        sampleStart,
        frequencyHz: f.number("core:frequency") ?? null,
        headerBytes: f.integer("core:header_bytes") ?? 0,
        datetime: f.string("core:datetime") ?? null,
      };
    });
    segments.forEach((s, k) => {
      if (k > 0 && s.headerBytes > 0) {
        fail(`has core:header_bytes ${s.headerBytes} in captures[${k}]; only header bytes before the first segment are supported`);
      }
      if (k > 0 && s.sampleStart < (segments[k - 1] as typeof s).sampleStart) {
        warnings.push(`The captures of ${metaPath} are not sorted by core:sample_start, as SigMF requires.`);
      }
    });
    const first = segments[0];
    if (first !== undefined) {
      frequencyHz = first.frequencyHz;
      const frequencyProblem = frequencyHz === null ? null : centerProblem(frequencyHz);
      if (frequencyProblem !== null) fail(`has captures[0] core:frequency ${numberText(frequencyHz as number)}, which ${frequencyProblem}`);
      headerBytes = first.headerBytes;
      datetime = checkDatetime(first.datetime, metaPath, warnings);
      const firstIndex = first.sampleStart >= offset ? first.sampleStart - offset : first.sampleStart;
      if (firstIndex > 0 && datetime !== null) {
        warnings.push(`captures[0] of ${metaPath} starts at sample ${firstIndex}, not 0; its core:datetime is not used as the time of sample 0.`);
        datetime = null;
      }
      const other = segments.find((s) => s.frequencyHz !== first.frequencyHz);
      if (other !== undefined) {
        warnings.push(
          `${metaPath} has ${segments.length} capture segments with different core:frequency values; the first ` +
            `(${first.frequencyHz === null ? "none" : `${first.frequencyHz} Hz`}) is used for the whole recording.`,
        );
      }
    }
  }
  const annotations = readAnnotations(root["annotations"], offset, fail, warnings, metaPath);
  return { datatype, sampleRateHz, version, dataset, trailingBytes, frequencyHz, headerBytes, datetime, captureCount, description, annotations, warnings };
}

/** The annotations array: each an object with core:sample_start; the descriptive fields typed. */
function readAnnotations(annotations: Json | undefined, offset: number, fail: (p: string) => never, warnings: string[], metaPath: string): SigmfAnnotation[] {
  if (annotations === undefined) {
    warnings.push(`${metaPath} has no annotations array, which SigMF requires.`);
    return [];
  }
  if (!Array.isArray(annotations)) return fail(`has "annotations" that is ${describe(annotations)}, not an array`);
  return annotations.flatMap((a, k) => {
    if (!isObject(a)) return fail(`has annotations[${k}] that is ${describe(a)}, not an object`);
    const f = new Fields(a, `annotations[${k}]`, fail);
    const start = f.integer("core:sample_start");
    if (start === undefined) {
      // Required by SigMF but not needed to read the samples: a warning, and the annotation is not listed.
      warnings.push(`annotations[${k}] of ${metaPath} has no core:sample_start, which SigMF requires; it is not listed.`);
      return [];
    }
    return [{
      sampleStart: start >= offset ? start - offset : start,
      sampleCount: f.integer("core:sample_count") ?? null,
      lowerFrequencyHz: f.number("core:freq_lower_edge") ?? null,
      upperFrequencyHz: f.number("core:freq_upper_edge") ?? null,
      label: f.string("core:label") ?? null,
      comment: f.string("core:comment") ?? null,
    }];
  });
}

/** Typed access to the keys of one JSON object; a key of the wrong type fails with its path. */
class Fields {
  constructor(
    private readonly obj: JsonObject,
    private readonly where: string,
    private readonly fail: (problem: string) => never,
  ) {}
  private bad(key: string, wanted: string): never {
    return this.fail(`has ${this.where} ${key} = ${describe(this.obj[key] as Json)}; SigMF requires ${wanted}`);
  }
  string(key: string): string | undefined {
    const v = this.obj[key];
    if (v === undefined || typeof v === "string") return v;
    return this.bad(key, "a string");
  }
  number(key: string): number | undefined {
    const v = this.obj[key];
    if (v === undefined || typeof v === "number") return v;
    return this.bad(key, "a number");
  }
  integer(key: string): number | undefined {
    const v = this.obj[key];
    if (v === undefined) return undefined;
    if (typeof v === "number" && Number.isSafeInteger(v) && v >= 0) return v;
    return this.bad(key, "a non-negative integer");
  }
  boolean(key: string): boolean | undefined {
    const v = this.obj[key];
    if (v === undefined || typeof v === "boolean") return v;
    return this.bad(key, "true or false");
  }
}

function checkExtensions(ext: Json | undefined, fail: (p: string) => never, warnings: string[], metaPath: string): void {
  if (ext === undefined) return;
  if (!Array.isArray(ext)) fail(`has global core:extensions = ${describe(ext)}; SigMF requires an array`);
  else {
    ext.forEach((e, k) => {
      if (!isObject(e)) return fail(`has global core:extensions[${k}] = ${describe(e)}; SigMF requires an object`);
      const f = new Fields(e, `global core:extensions[${k}]`, fail);
      const name = f.string("name");
      if (f.boolean("optional") === false) {
        warnings.push(`${metaPath} says the SigMF extension ${name ?? "(unnamed)"} is required to read it; iqaudit reads only the core namespace.`);
      }
    });
  }
}

function checkDatetime(value: string | null, metaPath: string, warnings: string[]): string | null {
  if (value === null) return null;
  const m = DATETIME.exec(value);
  const [, , month, day, hour, minute, second] = (m ?? []).map(Number);
  const inRange =
    m !== null &&
    (month as number) >= 1 && (month as number) <= 12 &&
    (day as number) >= 1 && (day as number) <= 31 &&
    (hour as number) <= 23 && (minute as number) <= 59 && (second as number) <= 60;
  if (!inRange) {
    warnings.push(`captures[0] core:datetime "${value}" of ${metaPath} is not an RFC 3339 time with the Z offset, as SigMF requires; it is not used.`);
    return null;
  }
  return value;
}

function isObject(v: Json | undefined): v is JsonObject {
  return typeof v === "object" && v !== null && !Array.isArray(v);
}

function describe(v: Json): string {
  if (v === null) return "null";
  if (Array.isArray(v)) return "an array";
  if (typeof v === "object") return "an object";
  if (typeof v === "string") return `the string ${JSON.stringify(v.length > 40 ? `${v.slice(0, 40)}…` : v)}`;
  return `the ${typeof v} ${String(v)}`;
}

/** A JSON number as written, or what became of it: JSON.parse reads 1e400 as Infinity. */
function numberText(x: number): string {
  return Number.isFinite(x) ? String(x) : `${x} (a number beyond the range of a double, such as 1e400)`;
}

function oneLine(s: string): string {
  return s.replace(/\s+/g, " ").trim();
}
