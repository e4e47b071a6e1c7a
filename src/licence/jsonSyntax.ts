/**
 * Where a JSON text first breaks the grammar of RFC 8259, and what was expected there. JSON.parse
 * in Node 20 names a position for some errors and for others only quotes the whole text, so a
 * licence file's error line would be neither short nor precise; this scanner, run only after
 * JSON.parse has refused the text, gives line, column and the expectation in one phrase.
 */

export interface JsonSyntaxProblem {
  /** 1-based line and column (in UTF-16 code units) of the first character that breaks the grammar. */
  readonly line: number;
  readonly column: number;
  /** What the grammar expected there, e.g. "a property name in double quotes". */
  readonly expected: string;
}

class Stop {
  constructor(readonly offset: number, readonly expected: string) {}
}

/** The first syntax error in `text`, or null when the text is one valid JSON value. */
export function jsonSyntaxProblem(text: string): JsonSyntaxProblem | null {
  const scanner = new Scanner(text);
  try {
    scanner.document();
    return null;
  } catch (e) {
    if (!(e instanceof Stop)) throw e;
    const before = text.slice(0, e.offset).split("\n");
    return { line: before.length, column: (before.at(-1) as string).length + 1, expected: e.expected };
  }
}

class Scanner {
  private at = 0;
  constructor(private readonly text: string) {}

  document(): void {
    this.value();
    this.space();
    if (this.at < this.text.length) this.stop("the end of the file after the JSON value");
  }

  private stop(expected: string): never {
    const found = this.at >= this.text.length ? " (the file ends here)" : "";
    throw new Stop(this.at, expected + found);
  }

  private space(): void {
    while (/^[ \t\n\r]$/.test(this.text.charAt(this.at))) this.at++;
  }

  private value(): void {
    this.space();
    const c = this.text.charAt(this.at);
    if (c === "{") this.object();
    else if (c === "[") this.array();
    else if (c === '"') this.string();
    else if (c === "-" || /[0-9]/.test(c)) this.number();
    else this.word();
  }

  private word(): void {
    for (const w of ["true", "false", "null"]) {
      if (this.text.startsWith(w, this.at)) { this.at += w.length; return; }
    }
    this.stop("a value (object, array, string, number, true, false or null)");
  }

  private object(): void {
    this.at++;
    this.space();
    if (this.text.charAt(this.at) === "}") { this.at++; return; }
    for (;;) {
      this.space();
      if (this.text.charAt(this.at) !== '"') this.stop("a property name in double quotes");
      this.string();
      this.space();
      this.expect(":", "':' after the property name");
      this.value();
      this.space();
      if (this.text.charAt(this.at) === "}") { this.at++; return; }
      this.expect(",", "',' or '}' after the property value");
    }
  }

  private array(): void {
    this.at++;
    this.space();
    if (this.text.charAt(this.at) === "]") { this.at++; return; }
    for (;;) {
      this.value();
      this.space();
      if (this.text.charAt(this.at) === "]") { this.at++; return; }
      this.expect(",", "',' or ']' after the array element");
    }
  }

  private expect(c: string, expected: string): void {
    if (this.text.charAt(this.at) !== c) this.stop(expected);
    this.at++;
  }

  private string(): void {
    this.at++;
    for (;;) {
      if (this.at >= this.text.length) this.stop("the closing '\"' of the string");
      const c = this.text.charCodeAt(this.at);
      if (c === 0x22) { this.at++; return; }
      if (c < 0x20) this.stop("no control character inside a string (write \\n, \\t)");
      if (c === 0x5c) this.escape();
      else this.at++;
    }
  }

  private escape(): void {
    const next = this.text.charAt(this.at + 1);
    if (next === "u" && /^[0-9a-fA-F]{4}$/.test(this.text.slice(this.at + 2, this.at + 6))) { this.at += 6; return; }
    if (next !== "" && '"\\/bfnrt'.includes(next)) { this.at += 2; return; }
    this.stop("an escape \\\" \\\\ \\/ \\b \\f \\n \\r \\t or \\uXXXX");
  }

  private number(): void {
    const m = /^-?(0|[1-9][0-9]*)(\.[0-9]+)?([eE][+-]?[0-9]+)?/.exec(this.text.slice(this.at));
    if (m === null) { this.at++; this.stop("a digit"); }
    this.at += m[0].length;
    // A malformed fraction or exponent ("1.", "1e") stops right after the part that matched.
    if (/^[.eE]/.test(this.text.charAt(this.at))) { this.at++; this.stop("a digit"); }
  }
}
