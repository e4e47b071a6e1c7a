// The one line of an error on stderr.

/**
 * An error line as one line: control characters (a newline or escape in a file name) written as
 * \n, \t or \xHH, and an empty subject named ("iqaudit: : ..." from an empty path).
 */
export function oneLine(text: string): string {
  const escaped = text.replace(/[\x00-\x1f\x7f]/g, (c) =>
    c === "\n" ? "\\n" : c === "\t" ? "\\t" : c === "\r" ? "\\r" : `\\x${c.charCodeAt(0).toString(16).padStart(2, "0")}`);
  return escaped.replace(/^iqaudit: : /, "iqaudit: (empty path): ");
}
