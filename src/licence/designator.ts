/**
 * Reading an emission designator as a licence states it (ITU Radio Regulations, Appendix 1;
 * 47 CFR 2.201–2.202), the inverse of `emissionDesignator` in src/measure/designator.ts.
 *
 * Bandwidth code (RR Appendix 1 §2; 47 CFR 2.202(b)(1)–(2)): exactly four characters, three
 * numerals and one letter standing where the decimal point would be: H (hertz), K (kilohertz),
 * M (megahertz), G (gigahertz). The first character is never 0, K, M or G; H may come first for
 * bandwidths below 1 Hz (H002 = 0.002 Hz). So 16K0 = 16.0 kHz, 11K2 = 11.2 kHz, 6K00 = 6 kHz,
 * 180K = 180 kHz, 400H = 400 Hz, 2M50 = 2.5 MHz.
 *
 * Classification (RR Appendix 1 §4; 47 CFR 2.201): three symbols, each from its own set
 * (REFERENCES.md §2). A fourth and a fifth symbol (details of the signal, nature of
 * multiplexing) are optional in the Regulations; they are accepted as capital letters and kept,
 * but not checked against their sets, which our reference table does not list.
 */

export interface ParsedDesignator {
  /** The designator as given, e.g. "16K0F3E". */
  text: string;
  /** The bandwidth the code states, Hz (16K0 → 16000). */
  bandwidthHz: number;
  /** The three classification symbols, e.g. "F3E". */
  classSymbols: string;
  /** Modulation of the main carrier (first symbol), e.g. "F". */
  first: string;
  /** Nature of the signal modulating the main carrier (second symbol), e.g. "3". */
  second: string;
  /** Type of information transmitted (third symbol), e.g. "E". */
  third: string;
  /** The optional fourth and fifth symbols as given ("" when absent). */
  extraSymbols: string;
}

/** RR Appendix 1 §4 (REFERENCES.md §2, status V). */
const FIRST_SYMBOLS = "NAHRJBCFGDPKLMQVWX";
const SECOND_SYMBOLS = "0123789X";
const THIRD_SYMBOLS = "NABCDEFWX";

const UNIT_SCALE: Readonly<Record<string, number>> = { H: 1, K: 1e3, M: 1e6, G: 1e9 };

/**
 * The parts of designator `s`, e.g. "16K0F3E" → 16000 Hz, "F3E". Throws RangeError whose message
 * says what is wrong ("the bandwidth code "16K" has 3 characters; it needs 4 ...").
 */
export function parseDesignator(s: string): ParsedDesignator {
  if (s !== s.trim() || s === "") throw new RangeError(`"${s}" is empty or has spaces around it`);
  if (s !== s.toUpperCase()) throw new RangeError(`"${s}" has lower-case letters; designators are written in capitals (${s.toUpperCase()})`);
  const code = s.slice(0, 4);
  const problem = bandwidthCodeProblem(s, code);
  if (problem !== null) throw new RangeError(`"${s}": ${problem}`);
  const symbols = s.slice(4);
  if (/^[0-9]/.test(symbols)) throw new RangeError(`"${s}": a digit follows the bandwidth code "${code}"; ${CODE_RULE}`);
  const symbolProblem = classSymbolsProblem(symbols);
  if (symbolProblem !== null) throw new RangeError(`"${s}": ${symbolProblem}`);
  return {
    text: s,
    bandwidthHz: bandwidthOfCode(code),
    classSymbols: symbols.slice(0, 3),
    first: symbols.charAt(0),
    second: symbols.charAt(1),
    third: symbols.charAt(2),
    extraSymbols: symbols.slice(3),
  };
}

const CODE_RULE = "a bandwidth code is 4 characters, three digits and one letter H, K, M or G in the place of the decimal point (16K0, 180K, 2M50)";

/** Why the first four characters of `s` are not a bandwidth code, or null when they are. */
function bandwidthCodeProblem(s: string, code: string): string | null {
  const letters = [...code].filter((c) => !/[0-9]/.test(c));
  if (code.length < 4 || letters.length !== 1) {
    // A code written with too few digits ("16KF3E"): name the short code the user meant.
    const short = /^[0-9]{0,3}[HKMG][0-9]{0,3}/.exec(s)?.[0];
    if (short !== undefined && short.length !== 4) return `the bandwidth code "${short}" has ${short.length} characters; ${CODE_RULE}`;
    return `"${code}" is not a bandwidth code; ${CODE_RULE}`;
  }
  const letter = letters[0] as string;
  if (!(letter in UNIT_SCALE)) return `"${letter}" in "${code}" is not a unit letter; ${CODE_RULE}`;
  if (code.startsWith("0")) return `the bandwidth code "${code}" begins with 0, which RR Appendix 1 does not allow (write 500H, not 0K50)`;
  if (letter !== "H" && code.startsWith(letter)) return `the bandwidth code "${code}" begins with ${letter}, which RR Appendix 1 does not allow (only H may come first, below 1 Hz)`;
  if (bandwidthOfCode(code) === 0) return `the bandwidth code "${code}" states 0 Hz`;
  return null;
}

/** The bandwidth of a well-formed code, Hz: the digits with the letter read as a decimal point. */
function bandwidthOfCode(code: string): number {
  const at = code.search(/[HKMG]/);
  const digits = Number(code.slice(0, at) + code.slice(at + 1));
  const decimals = 3 - at;
  // Integer digits times the scale, divided once: 11K2 → 112 · 1000 / 10 = 11200 exactly.
  return (digits * (UNIT_SCALE[code.charAt(at)] as number)) / 10 ** decimals;
}

/** Why `symbols` (what follows the bandwidth code) are not classification symbols, or null. */
function classSymbolsProblem(symbols: string): string | null {
  if (symbols.length < 3) return `after the bandwidth code come three classification symbols (e.g. F3E), found "${symbols}"`;
  if (symbols.length > 5) return `at most five symbols follow the bandwidth code (three plus two optional), found ${symbols.length} ("${symbols}")`;
  const sets: ReadonlyArray<readonly [string, string]> = [
    [FIRST_SYMBOLS, "first symbol (modulation of the main carrier)"],
    [SECOND_SYMBOLS, "second symbol (nature of the modulating signal)"],
    [THIRD_SYMBOLS, "third symbol (type of information)"],
  ];
  for (const [i, [set, what]] of sets.entries()) {
    const c = symbols.charAt(i);
    if (!set.includes(c)) return `"${c}" is not a ${what}; RR Appendix 1 allows ${[...set].join(" ")}`;
  }
  if (!/^[A-Z]*$/.test(symbols.slice(3))) return `the optional fourth and fifth symbols are capital letters, found "${symbols.slice(3)}"`;
  return null;
}
