// Type declarations for the part of opentype.js 2.x that src/render/fontFile.ts uses (the
// package ships none, and @types/opentype.js describes 1.3). Only fontFile.ts imports it.
declare module "opentype.js" {
  /** One drawing command of a glyph outline, in the units given to getPath (y down). */
  export type PathCommand =
    | { readonly type: "M" | "L"; readonly x: number; readonly y: number }
    | { readonly type: "Q"; readonly x1: number; readonly y1: number; readonly x: number; readonly y: number }
    | { readonly type: "C"; readonly x1: number; readonly y1: number; readonly x2: number; readonly y2: number; readonly x: number; readonly y: number }
    | { readonly type: "Z" };

  export interface Path {
    readonly commands: readonly PathCommand[];
  }

  export interface BoundingBox {
    readonly x1: number;
    readonly y1: number;
    readonly x2: number;
    readonly y2: number;
  }

  export interface Glyph {
    readonly index: number;
    readonly name: string | null;
    /** In font units. */
    readonly advanceWidth: number;
    /** The outline at (x, y) (baseline origin) for an em of fontSize units, y growing downwards. */
    getPath(x: number, y: number, fontSize: number): Path;
    /** Ink bounds in font units, y up (from the glyf table's xMin, yMin, xMax, yMax). */
    getBoundingBox(): BoundingBox;
  }

  export interface Font {
    readonly unitsPerEm: number;
    readonly ascender: number;
    readonly descender: number;
    readonly numGlyphs: number;
    readonly tables: {
      readonly os2: { readonly sCapHeight: number; readonly sxHeight: number };
      readonly [name: string]: unknown;
    };
    /** The cmap lookup: 0 (.notdef) when the font has no glyph for the character. */
    charToGlyphIndex(character: string): number;
    charToGlyph(character: string): Glyph;
    readonly glyphs: { get(index: number): Glyph };
  }

  export function parse(buffer: ArrayBuffer): Font;

  const opentype: { parse: typeof parse };
  export default opentype;
}
