/**
 * What a capture's file name says: the container or sample format from the extension, and our
 * own convention for a sample rate and a centre frequency written into the name.
 *
 * Convention (docs/formats.md): the base name without its extension is split into tokens at
 * `_`, `-`, spaces and `, ; = @ + ( ) [ ]`, but not at the sign of an exponent (`1e-3`). A token that is wholly a number, an optional SI
 * prefix and a unit is read:
 *   rate   `<number>[k|M|G]sps`  e.g. `2.4Msps`, `250ksps`, `48000sps`      → samples/s
 *   centre `<number>[k|M|G]Hz`   e.g. `156.8MHz`, `433.92MHz`, `1.2GHz`     → Hz
 * Prefix and unit are case-insensitive (`mhz` is MHz: millihertz has no use in a capture name).
 * The number may carry an exponent (`2.4e6sps`). Dots are decimal points, never separators.
 * When two tokens of one kind disagree, the first is used and a warning says so.
 */
import { CaptureFormatError } from "../errors.js";
import { centerProblem, sampleRateProblem } from "./acceptedRanges.js";
import type { SampleFormat } from "./source.js";

/** What an extension names: a raw sample format, a WAV file, or a SigMF file (meta, data or archive). */
export type ExtensionKind = SampleFormat | "wav" | "sigmf-meta" | "sigmf-data" | "sigmf-archive";

const EXTENSIONS: ReadonlyMap<string, ExtensionKind> = new Map<string, ExtensionKind>([
  ["cu8", "cu8"], ["u8", "cu8"],
  ["cs8", "ci8"], ["ci8", "ci8"], ["s8", "ci8"],
  ["cs16", "ci16_le"], ["ci16", "ci16_le"], ["s16", "ci16_le"],
  ["cf32", "cf32_le"], ["fc32", "cf32_le"], ["cfile", "cf32_le"],
  ["cf64", "cf64_le"], ["fc64", "cf64_le"],
  ["wav", "wav"],
  ["sigmf-meta", "sigmf-meta"], ["sigmf-data", "sigmf-data"], ["sigmf", "sigmf-archive"],
]);

/** The extension of the file name in `path` (after the last dot), lower case, or "" when there is none. */
export function fileExtension(path: string): string {
  const name = baseName(path);
  const dot = name.lastIndexOf(".");
  return dot <= 0 ? "" : name.slice(dot + 1).toLowerCase();
}

/** What the extension of `path` names (case-insensitive), or null for an extension we do not know. */
export function extensionKind(path: string): ExtensionKind | null {
  return EXTENSIONS.get(fileExtension(path)) ?? null;
}

/** Rate and centre read from a file name by the convention above. */
export interface FileNameTokens {
  /** From a `…sps` token, samples per second, or null. */
  readonly sampleRateHz: number | null;
  /** From a `…Hz` token, Hz, or null. */
  readonly centerHz: number | null;
  readonly warnings: readonly string[];
}

/**
 * Token separators: `_`, spaces, `, ; = @ ( ) [ ]`, and `-` or `+` except as the sign of an
 * exponent (after a digit or point and an `e`), so that `1e-300sps` is one token, read whole,
 * and never `300sps`.
 */
const SEPARATORS = /[_\s,;=@()[\]]+|(?<![\d.][eE])[-+]+/;
const TOKEN = /^(\d+(?:\.\d*)?|\.\d+)(?:e([+-]?\d+))?([kmg]?)(sps|hz)$/i;
const PREFIX_EXPONENT: Readonly<Record<string, number>> = { "": 0, k: 3, m: 6, g: 9 };

/**
 * Reads the rate and centre tokens from the file name of `path`. A token outside the accepted
 * ranges (acceptedRanges.ts), e.g. `0sps` or `1e400Hz`, is a CaptureFormatError; the values are
 * parsed from their decimal text, so `156.8MHz` is exactly 156800000.
 */
export function fileNameTokens(path: string): FileNameTokens {
  const name = baseName(path);
  const dot = name.lastIndexOf(".");
  const stem = dot > 0 ? name.slice(0, dot) : name;
  const rates: { text: string; value: number }[] = [];
  const centres: { text: string; value: number }[] = [];
  for (const token of stem.split(SEPARATORS)) {
    const m = TOKEN.exec(token);
    if (m === null) continue;
    const exponent = Number(m[2] ?? "0") + (PREFIX_EXPONENT[(m[3] as string).toLowerCase()] as number);
    const value = Number(`${m[1] as string}e${exponent}`);
    if ((m[4] as string).toLowerCase() === "sps") rates.push({ text: token, value });
    else centres.push({ text: token, value });
  }
  const warnings: string[] = [];
  const rate = pickFirst(rates, "rate", warnings);
  const centre = pickFirst(centres, "centre frequency", warnings);
  checkToken(path, rate, "rate", "S/s", sampleRateProblem);
  checkToken(path, centre, "centre", "Hz", centerProblem);
  return { sampleRateHz: rate?.value ?? null, centerHz: centre?.value ?? null, warnings };
}

function checkToken(
  path: string,
  token: { text: string; value: number } | null,
  what: string,
  unit: string,
  problemOf: (value: number) => string | null,
): void {
  const problem = token === null ? null : problemOf(token.value);
  if (token !== null && problem !== null) {
    throw new CaptureFormatError(path, `the file-name ${what} token ${token.text} (${token.value} ${unit}) ${problem}`);
  }
}

function pickFirst(
  found: readonly { text: string; value: number }[],
  what: string,
  warnings: string[],
): { text: string; value: number } | null {
  const first = found[0];
  if (first === undefined) return null;
  const other = found.find((t) => t.value !== first.value);
  if (other !== undefined) {
    warnings.push(`The file name gives two ${what} tokens (${first.text}, ${other.text}); ${first.text} is used.`);
  }
  return first;
}

function baseName(path: string): string {
  const slash = Math.max(path.lastIndexOf("/"), path.lastIndexOf("\\"));
  return path.slice(slash + 1);
}
