/**
 * The SigMF datatype grammar (SigMF specification v1.2.x, "Dataset Format", ABNF):
 *   dataset-format = (real / complex) ((type endianness) / byte)
 *   real = "r"   complex = "c"
 *   type = "f32" / "f64" / "i32" / "i16" / "u32" / "u16"      endianness = "_le" / "_be"
 *   byte = "i8" / "u8"
 * Bit widths are per component; a complex sample is I then Q. The v1.2.x JSON schema pattern is
 * looser (it makes the endianness optional on every type); we follow the ABNF, but accept an
 * endianness suffix on the 8-bit types, where it is meaningless, with a warning.
 */
import type { SampleFormat } from "./source.js";

/** A parsed SigMF datatype. */
export interface SigmfDatatype {
  /** The datatype as written. */
  readonly text: string;
  readonly complex: boolean;
  readonly kind: "f" | "i" | "u";
  readonly bits: 8 | 16 | 32 | 64;
  /** null for the 8-bit types. */
  readonly endian: "le" | "be" | null;
  /** The SampleFormat iqaudit decodes it as, or null when it cannot decode it (cu16_le, cf32_be, …). */
  readonly format: SampleFormat | null;
  /** Set for an 8-bit type written with an endianness suffix. */
  readonly warning: string | null;
}

const GRAMMAR = /^([rc])(?:(f32|f64|i32|i16|u32|u16)_(le|be)|(i8|u8)(?:_(le|be))?)$/;

const DECODABLE: ReadonlySet<string> = new Set<SampleFormat>([
  "cu8", "ci8", "ci16_le", "ci16_be", "ci32_le", "cf32_le", "cf64_le",
  "ru8", "ri8", "ri16_le", "ri16_be", "ri32_le", "rf32_le", "rf64_le",
]);

/** Parses a SigMF datatype string; null when it does not follow the grammar. */
export function parseSigmfDatatype(text: string): SigmfDatatype | null {
  const m = GRAMMAR.exec(text);
  if (m === null) return null;
  const complex = m[1] === "c";
  const type = (m[2] ?? m[4]) as string;
  const kind = type[0] as "f" | "i" | "u";
  const bits = Number(type.slice(1)) as 8 | 16 | 32 | 64;
  const endian = bits === 8 ? null : (m[3] as "le" | "be");
  const canonical = `${m[1] as string}${type}${endian === null ? "" : `_${endian}`}`;
  const warning =
    m[5] === undefined
      ? null
      : `The SigMF datatype ${text} carries an endianness suffix that 8-bit samples do not have; it is read as ${canonical}.`;
  return {
    text,
    complex,
    kind,
    bits,
    endian,
    format: DECODABLE.has(canonical) ? (canonical as SampleFormat) : null,
    warning,
  };
}
