/**
 * Line breaking for figure titles and subtitles: the words of `text` in lines at most
 * `maxWidthPx` wide at font scale `scale`, measured with the font's own textWidthPx, so that a
 * long title goes on to a second line instead of being cut. Greedy first fit (each line takes
 * as many words as fit; the usual rule of text layout, common practice); a word wider than the
 * line on its own is broken between characters. Joining the lines with single spaces gives the
 * text back with its runs of spaces made single. Pure: no drawing.
 */
import { textWidthPx } from "./font.js";

/** The lines of `text`, each at most maxWidthPx wide (module comment). Throws RangeError for a width below one character. */
export function wrapText(text: string, maxWidthPx: number, scale: number): string[] {
  if (!(textWidthPx("M", scale) <= maxWidthPx)) throw new RangeError(`wrapText: maxWidthPx ${maxWidthPx} holds no character at scale ${scale}`);
  const fits = (line: string): boolean => textWidthPx(line, scale) <= maxWidthPx;
  const lines: string[] = [];
  let line = "";
  for (const word of text.split(/\s+/).filter((w) => w !== "")) {
    const joined = line === "" ? word : `${line} ${word}`;
    if (fits(joined)) { line = joined; continue; }
    if (line !== "") lines.push(line);
    line = "";
    for (const piece of breakWord(word, fits)) {
      if (line !== "") lines.push(line);
      line = piece;
    }
  }
  if (line !== "" || lines.length === 0) lines.push(line);
  return lines;
}

/** `word` in pieces that each fit (the last may be followed by more words on its line). */
function breakWord(word: string, fits: (s: string) => boolean): string[] {
  const pieces: string[] = [];
  let piece = "";
  for (const ch of word) {
    if (piece !== "" && !fits(piece + ch)) { pieces.push(piece); piece = ""; }
    piece += ch;
  }
  pieces.push(piece);
  return pieces;
}
