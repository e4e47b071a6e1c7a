/**
 * The one bitmap font of iqaudit: a monospaced 5×9 pixel design of our own (7 rows above the
 * baseline, 2 below for descenders) covering printable ASCII (0x20–0x7E) plus ° µ ± ² · ×.
 * A character without a glyph is drawn as a hollow box. The cell is 6×9 px at scale 1 (one
 * blank column between characters); text is drawn at integer scale 1, 2 or 3.
 */

/** Font metrics at scale 1, in pixels: advance per character, ink rows, rows above the baseline. */
export const FONT_METRICS = {
  /** Horizontal distance from one character's left edge to the next. */
  advancePx: 6,
  /** Columns of ink a glyph may use, starting at its left edge. */
  glyphWidthPx: 5,
  /** Rows of a cell: 7 above the baseline and 2 of descender. */
  cellHeightPx: 9,
  /** Rows above the baseline (cap height). */
  ascentPx: 7,
} as const;

// Each glyph: rows top to bottom separated by "|", "#" = ink. Seven rows sit above the
// baseline; rows 8 and 9, when given, are the descender.
const GLYPH_ROWS: Readonly<Record<string, string>> = {
  " ": ".....|.....|.....|.....|.....|.....|.....",
  "!": "..#..|..#..|..#..|..#..|..#..|.....|..#..",
  '"': ".#.#.|.#.#.|.....|.....|.....|.....|.....",
  "#": ".#.#.|.#.#.|#####|.#.#.|#####|.#.#.|.#.#.",
  $: "..#..|.####|#.#..|.###.|..#.#|####.|..#..",
  "%": "##...|##..#|...#.|..#..|.#...|#..##|...##",
  "&": ".##..|#..#.|#.#..|.#...|#.#.#|#..#.|.##.#",
  "'": "..#..|..#..|.....|.....|.....|.....|.....",
  "(": "...#.|..#..|.#...|.#...|.#...|..#..|...#.",
  ")": ".#...|..#..|...#.|...#.|...#.|..#..|.#...",
  "*": ".....|..#..|#.#.#|.###.|#.#.#|..#..|.....",
  "+": ".....|..#..|..#..|#####|..#..|..#..|.....",
  ",": ".....|.....|.....|.....|.....|..#..|..#..|.#...",
  "-": ".....|.....|.....|.###.|.....|.....|.....",
  ".": ".....|.....|.....|.....|.....|.##..|.##..",
  "/": "....#|....#|...#.|..#..|.#...|#....|#....",
  "0": ".###.|#...#|#..##|#.#.#|##..#|#...#|.###.",
  "1": "..#..|.##..|..#..|..#..|..#..|..#..|.###.",
  "2": ".###.|#...#|....#|...#.|..#..|.#...|#####",
  "3": "#####|...#.|..#..|...#.|....#|#...#|.###.",
  "4": "...#.|..##.|.#.#.|#..#.|#####|...#.|...#.",
  "5": "#####|#....|####.|....#|....#|#...#|.###.",
  "6": "..##.|.#...|#....|####.|#...#|#...#|.###.",
  "7": "#####|....#|...#.|..#..|.#...|.#...|.#...",
  "8": ".###.|#...#|#...#|.###.|#...#|#...#|.###.",
  "9": ".###.|#...#|#...#|.####|....#|...#.|.##..",
  ":": ".....|.##..|.##..|.....|.##..|.##..|.....",
  ";": ".....|.##..|.##..|.....|.##..|.##..|..#..|.#...",
  "<": "...#.|..#..|.#...|#....|.#...|..#..|...#.",
  "=": ".....|.....|#####|.....|#####|.....|.....",
  ">": ".#...|..#..|...#.|....#|...#.|..#..|.#...",
  "?": ".###.|#...#|....#|...#.|..#..|.....|..#..",
  "@": ".###.|#...#|#.###|#.#.#|#.###|#....|.####",
  A: ".###.|#...#|#...#|#####|#...#|#...#|#...#",
  B: "####.|#...#|#...#|####.|#...#|#...#|####.",
  C: ".###.|#...#|#....|#....|#....|#...#|.###.",
  D: "###..|#..#.|#...#|#...#|#...#|#..#.|###..",
  E: "#####|#....|#....|####.|#....|#....|#####",
  F: "#####|#....|#....|####.|#....|#....|#....",
  G: ".###.|#...#|#....|#.###|#...#|#...#|.####",
  H: "#...#|#...#|#...#|#####|#...#|#...#|#...#",
  I: ".###.|..#..|..#..|..#..|..#..|..#..|.###.",
  J: "..###|...#.|...#.|...#.|...#.|#..#.|.##..",
  K: "#...#|#..#.|#.#..|##...|#.#..|#..#.|#...#",
  L: "#....|#....|#....|#....|#....|#....|#####",
  M: "#...#|##.##|#.#.#|#.#.#|#...#|#...#|#...#",
  N: "#...#|#...#|##..#|#.#.#|#..##|#...#|#...#",
  O: ".###.|#...#|#...#|#...#|#...#|#...#|.###.",
  P: "####.|#...#|#...#|####.|#....|#....|#....",
  Q: ".###.|#...#|#...#|#...#|#.#.#|#..#.|.##.#",
  R: "####.|#...#|#...#|####.|#.#..|#..#.|#...#",
  S: ".####|#....|#....|.###.|....#|....#|####.",
  T: "#####|..#..|..#..|..#..|..#..|..#..|..#..",
  U: "#...#|#...#|#...#|#...#|#...#|#...#|.###.",
  V: "#...#|#...#|#...#|#...#|#...#|.#.#.|..#..",
  W: "#...#|#...#|#...#|#.#.#|#.#.#|#.#.#|.#.#.",
  X: "#...#|#...#|.#.#.|..#..|.#.#.|#...#|#...#",
  Y: "#...#|#...#|.#.#.|..#..|..#..|..#..|..#..",
  Z: "#####|....#|...#.|..#..|.#...|#....|#####",
  "[": ".###.|.#...|.#...|.#...|.#...|.#...|.###.",
  "\\": "#....|#....|.#...|..#..|...#.|....#|....#",
  "]": ".###.|...#.|...#.|...#.|...#.|...#.|.###.",
  "^": "..#..|.#.#.|#...#|.....|.....|.....|.....",
  _: ".....|.....|.....|.....|.....|.....|.....|#####",
  "`": ".#...|..#..|.....|.....|.....|.....|.....",
  a: ".....|.....|.###.|....#|.####|#...#|.####",
  b: "#....|#....|####.|#...#|#...#|#...#|####.",
  c: ".....|.....|.###.|#....|#....|#...#|.###.",
  d: "....#|....#|.####|#...#|#...#|#...#|.####",
  e: ".....|.....|.###.|#...#|#####|#....|.###.",
  f: "..##.|.#..#|.#...|###..|.#...|.#...|.#...",
  g: ".....|.....|.####|#...#|#...#|#...#|.####|....#|.###.",
  h: "#....|#....|#.##.|##..#|#...#|#...#|#...#",
  i: "..#..|.....|.##..|..#..|..#..|..#..|.###.",
  j: "...#.|.....|..##.|...#.|...#.|...#.|...#.|#..#.|.##..",
  k: "#....|#....|#..#.|#.#..|##...|#.#..|#..#.",
  l: ".##..|..#..|..#..|..#..|..#..|..#..|.###.",
  m: ".....|.....|##.#.|#.#.#|#.#.#|#.#.#|#.#.#",
  n: ".....|.....|#.##.|##..#|#...#|#...#|#...#",
  o: ".....|.....|.###.|#...#|#...#|#...#|.###.",
  p: ".....|.....|####.|#...#|#...#|#...#|####.|#....|#....",
  q: ".....|.....|.####|#...#|#...#|#...#|.####|....#|....#",
  r: ".....|.....|#.##.|##..#|#....|#....|#....",
  s: ".....|.....|.####|#....|.###.|....#|####.",
  t: ".#...|.#...|###..|.#...|.#...|.#..#|..##.",
  u: ".....|.....|#...#|#...#|#...#|#..##|.##.#",
  v: ".....|.....|#...#|#...#|#...#|.#.#.|..#..",
  w: ".....|.....|#...#|#...#|#.#.#|#.#.#|.#.#.",
  x: ".....|.....|#...#|.#.#.|..#..|.#.#.|#...#",
  y: ".....|.....|#...#|#...#|#...#|#...#|.####|....#|.###.",
  z: ".....|.....|#####|...#.|..#..|.#...|#####",
  "{": "...##|..#..|..#..|.#...|..#..|..#..|...##",
  "|": "..#..|..#..|..#..|..#..|..#..|..#..|..#..",
  "}": "##...|..#..|..#..|...#.|..#..|..#..|##...",
  "~": ".....|.....|.#...|#.#.#|...#.|.....|.....",
  "°": ".##..|#..#.|#..#.|.##..|.....|.....|.....",
  "µ": ".....|.....|#...#|#...#|#...#|#..##|###.#|#....|#....",
  "±": "..#..|..#..|#####|..#..|..#..|.....|#####",
  "²": ".##..|...#.|..#..|.#...|.###.|.....|.....",
  "·": ".....|.....|.....|..#..|.....|.....|.....",
  "×": ".....|#...#|.#.#.|..#..|.#.#.|#...#|.....",
};

const MISSING_GLYPH = "#####|#...#|#...#|#...#|#...#|#...#|#####";

// Characters that look the same as one we have: the minus sign and the micro sign.
const ALIASES: Readonly<Record<string, string>> = { "\u2212": "-", "\u03bc": "µ" };

/** One glyph as ink rows: `rows[r]` is a bitmask, bit (4 − c) set when column c (0 = left) has ink. */
export interface Glyph {
  readonly rows: readonly number[];
  /** False for the hollow box that stands in for a character the font lacks. */
  readonly defined: boolean;
}

function parseGlyph(spec: string, defined: boolean): Glyph {
  const rows = new Array<number>(FONT_METRICS.cellHeightPx).fill(0);
  spec.split("|").forEach((row, r) => {
    let bits = 0;
    for (let c = 0; c < row.length; c++) if (row[c] === "#") bits |= 1 << (FONT_METRICS.glyphWidthPx - 1 - c);
    rows[r] = bits;
  });
  return { rows, defined };
}

const GLYPHS = new Map<string, Glyph>(Object.entries(GLYPH_ROWS).map(([ch, spec]) => [ch, parseGlyph(spec, true)]));
const MISSING = parseGlyph(MISSING_GLYPH, false);

/** The glyph for one character (one UTF-16 code unit or code point); the hollow box if the font lacks it. */
export function glyphFor(character: string): Glyph {
  return GLYPHS.get(ALIASES[character] ?? character) ?? MISSING;
}

/** Width in pixels of `text` drawn at `scale`: characters × 6 × scale, less the trailing blank column. */
export function textWidthPx(text: string, scale: number): number {
  const count = [...text].length;
  return count === 0 ? 0 : (count * FONT_METRICS.advancePx - 1) * scale;
}

/** Height in pixels of one line of text at `scale`, descenders included (9 × scale). */
export function textHeightPx(scale: number): number {
  return FONT_METRICS.cellHeightPx * scale;
}

/**
 * Calls `plot(dx, dy)` for every ink pixel of `text` at `scale`, with (dx, dy) relative to the
 * top-left corner of the text's box, x to the right and y down. Drawing order is left to right.
 */
export function forEachInkPixel(text: string, scale: number, plot: (dx: number, dy: number) => void): void {
  let originX = 0;
  for (const ch of text) {
    const { rows } = glyphFor(ch);
    for (let r = 0; r < rows.length; r++) {
      const bits = rows[r] ?? 0;
      if (bits === 0) continue;
      for (let c = 0; c < FONT_METRICS.glyphWidthPx; c++) {
        if ((bits & (1 << (FONT_METRICS.glyphWidthPx - 1 - c))) === 0) continue;
        for (let sy = 0; sy < scale; sy++)
          for (let sx = 0; sx < scale; sx++) plot(originX + c * scale + sx, r * scale + sy);
      }
    }
    originX += FONT_METRICS.advancePx * scale;
  }
}
