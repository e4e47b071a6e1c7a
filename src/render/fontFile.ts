/**
 * The typeface of every figure: IBM Plex Sans Regular (version 3.201, © 2017 IBM Corp.,
 * SIL Open Font License 1.1, Reserved Font Name "Plex"), shipped unmodified in
 * assets/fonts/ with its licence (see assets/fonts/README.md). opentype.js 2.x parses it (cmap,
 * hmtx, glyf, OS/2); this module is the only one that loads opentype.js. Library and file are
 * loaded once, on first use, so that commands drawing no figure never pay for them: about 35 ms
 * to require the library (an ESM import of its CommonJS build takes some 150 ms more, spent
 * analysing its exports) and some 25 ms to parse the file.
 */
import { readFileSync } from "node:fs";
import { createRequire } from "node:module";
import type { Font } from "opentype.js";

/** The font file, relative to this module (src/render/ and dist/render/ are both two levels down). */
export const FONT_FILE_URL = new URL("../../assets/fonts/IBMPlexSans_400Regular.ttf", import.meta.url);

let font: Font | null = null;

/** The parsed font, read from {@link FONT_FILE_URL} on the first call. */
export function figureFont(): Font {
  if (font === null) {
    const opentype = createRequire(import.meta.url)("opentype.js") as { parse(buffer: ArrayBuffer): Font };
    const bytes = readFileSync(FONT_FILE_URL);
    font = opentype.parse(bytes.buffer.slice(bytes.byteOffset, bytes.byteOffset + bytes.byteLength));
  }
  return font;
}
