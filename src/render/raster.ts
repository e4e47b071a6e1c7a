import { forEachInkPixel, textHeightPx, textWidthPx } from "./font.js";

/** An opaque colour as 8-bit sRGB components [red, green, blue], each 0–255. */
export type Rgb = readonly [number, number, number];

/** An axis-aligned rectangle in pixels: top-left corner (x, y), x to the right, y down. */
export interface Rect {
  readonly x: number;
  readonly y: number;
  readonly width: number;
  readonly height: number;
}

/** Options of {@link RgbaCanvas.line}. */
export interface LineStyle {
  /** Side of the square pen, in pixels (default 1). */
  readonly widthPx?: number;
  /** Dash pattern [on, off] in pixels along the major axis; solid when absent. */
  readonly dashPx?: readonly [number, number];
}

/** Options of {@link RgbaCanvas.text}. */
export interface TextStyle {
  /** Text scale step (default 1): capitals 8, 10, 13 px tall at 1, 2, 3 (see font.ts). */
  readonly scale?: number;
  /** 0 = left to right; 90 = rotated a quarter turn anticlockwise, reading bottom to top. */
  readonly rotationDeg?: 0 | 90;
}

/**
 * An opaque RGBA raster (8 bits per channel, alpha always 255), row-major from the top-left,
 * with a clipping rectangle that every drawing call respects. Coordinates are integer pixels;
 * drawing outside the canvas or the clip does nothing.
 */
export class RgbaCanvas {
  /** Width in pixels. */
  readonly width: number;
  /** Height in pixels. */
  readonly height: number;
  /** width × height × 4 bytes, R G B A per pixel, the layout pngjs expects. */
  readonly data: Uint8Array;
  private clipX0 = 0;
  private clipY0 = 0;
  private clipX1: number;
  private clipY1: number;

  /** A canvas of `widthPx` × `heightPx` filled with `background`. */
  constructor(widthPx: number, heightPx: number, background: Rgb) {
    if (!Number.isInteger(widthPx) || widthPx < 1) throw new RangeError(`canvas widthPx ${widthPx} must be a positive integer`);
    if (!Number.isInteger(heightPx) || heightPx < 1) throw new RangeError(`canvas heightPx ${heightPx} must be a positive integer`);
    this.width = widthPx;
    this.height = heightPx;
    this.data = new Uint8Array(widthPx * heightPx * 4);
    this.clipX1 = widthPx;
    this.clipY1 = heightPx;
    this.fillRect({ x: 0, y: 0, width: widthPx, height: heightPx }, background);
  }

  /** Restricts drawing to `rect` (intersected with the canvas); `null` lifts the restriction. */
  setClip(rect: Rect | null): void {
    if (rect === null) {
      this.clipX0 = 0;
      this.clipY0 = 0;
      this.clipX1 = this.width;
      this.clipY1 = this.height;
      return;
    }
    this.clipX0 = Math.max(0, Math.floor(rect.x));
    this.clipY0 = Math.max(0, Math.floor(rect.y));
    this.clipX1 = Math.min(this.width, Math.floor(rect.x + rect.width));
    this.clipY1 = Math.min(this.height, Math.floor(rect.y + rect.height));
  }

  /** Sets one pixel, if it lies inside the clip. */
  setPixel(x: number, y: number, colour: Rgb): void {
    if (x < this.clipX0 || x >= this.clipX1 || y < this.clipY0 || y >= this.clipY1) return;
    const i = (y * this.width + x) * 4;
    this.data[i] = colour[0];
    this.data[i + 1] = colour[1];
    this.data[i + 2] = colour[2];
    this.data[i + 3] = 255;
  }

  /**
   * Mixes `colour` into one pixel with weight `alpha` (0–1), inside the clip: each 8-bit sRGB
   * component becomes old + alpha·(new − old), rounded. Blending the encoded values rather than
   * linear light keeps small dark text on a light page from looking thin, as unhinted text
   * blended in linear light does.
   */
  blendPixel(x: number, y: number, colour: Rgb, alpha: number): void {
    if (x < this.clipX0 || x >= this.clipX1 || y < this.clipY0 || y >= this.clipY1 || !(alpha > 0)) return;
    const a = Math.min(1, alpha);
    const i = (y * this.width + x) * 4;
    for (let c = 0; c < 3; c++) {
      const old = this.data[i + c] ?? 0;
      this.data[i + c] = Math.round(old + a * (colour[c]! - old));
    }
    this.data[i + 3] = 255;
  }

  /** The colour at (x, y); throws RangeError outside the canvas. */
  getPixel(x: number, y: number): Rgb {
    if (x < 0 || x >= this.width || y < 0 || y >= this.height) throw new RangeError(`pixel (${x}, ${y}) is outside the canvas`);
    const i = (y * this.width + x) * 4;
    return [this.data[i] ?? 0, this.data[i + 1] ?? 0, this.data[i + 2] ?? 0];
  }

  /** Fills `rect` (rounded to whole pixels) with `colour`. */
  fillRect(rect: Rect, colour: Rgb): void {
    const x0 = Math.max(this.clipX0, Math.round(rect.x));
    const y0 = Math.max(this.clipY0, Math.round(rect.y));
    const x1 = Math.min(this.clipX1, Math.round(rect.x + rect.width));
    const y1 = Math.min(this.clipY1, Math.round(rect.y + rect.height));
    for (let y = y0; y < y1; y++) {
      for (let x = x0; x < x1; x++) {
        const i = (y * this.width + x) * 4;
        this.data[i] = colour[0];
        this.data[i + 1] = colour[1];
        this.data[i + 2] = colour[2];
        this.data[i + 3] = 255;
      }
    }
  }

  /** Draws the one-pixel outline just inside `rect`. */
  strokeRect(rect: Rect, colour: Rgb): void {
    const x1 = rect.x + rect.width - 1;
    const y1 = rect.y + rect.height - 1;
    this.line(rect.x, rect.y, x1, rect.y, colour);
    this.line(rect.x, y1, x1, y1, colour);
    this.line(rect.x, rect.y, rect.x, y1, colour);
    this.line(x1, rect.y, x1, y1, colour);
  }

  /**
   * A straight line from (x0, y0) to (x1, y1), both ends included, by Bresenham's integer
   * algorithm (J. E. Bresenham, "Algorithm for computer control of a digital plotter", IBM
   * Systems Journal 4(1), 1965): one pixel per step along the major axis. Ends are rounded.
   */
  line(x0: number, y0: number, x1: number, y1: number, colour: Rgb, style: LineStyle = {}): void {
    let x = Math.round(x0);
    let y = Math.round(y0);
    const xEnd = Math.round(x1);
    const yEnd = Math.round(y1);
    const dx = Math.abs(xEnd - x);
    const dy = -Math.abs(yEnd - y);
    const sx = x < xEnd ? 1 : -1;
    const sy = y < yEnd ? 1 : -1;
    const pen = Math.max(1, Math.round(style.widthPx ?? 1));
    const penOffset = Math.floor((pen - 1) / 2);
    const dash = style.dashPx;
    let err = dx + dy;
    for (let step = 0; ; step++) {
      const on = dash === undefined || step % (dash[0] + dash[1]) < dash[0];
      if (on) {
        if (pen === 1) this.setPixel(x, y, colour);
        else this.fillRect({ x: x - penOffset, y: y - penOffset, width: pen, height: pen }, colour);
      }
      if (x === xEnd && y === yEnd) break;
      const e2 = 2 * err;
      if (e2 >= dy) {
        err += dy;
        x += sx;
      }
      if (e2 <= dx) {
        err += dx;
        y += sy;
      }
    }
  }

  /**
   * Draws `text` anti-aliased (font.ts) with the top-left corner of its box at (x, y), the
   * baseline ascentPx below it. Unrotated, the box is textWidthPx × textHeightPx; rotated 90° it
   * is textHeightPx wide and textWidthPx tall, and the first character sits at the bottom.
   */
  text(text: string, x: number, y: number, colour: Rgb, style: TextStyle = {}): void {
    const scale = style.scale ?? 1;
    const left = Math.round(x);
    const top = Math.round(y);
    if (style.rotationDeg === 90) {
      const lengthPx = textWidthPx(text, scale);
      forEachInkPixel(text, scale, (dx, dy, a) => this.blendPixel(left + dy, top + lengthPx - 1 - dx, colour, a));
    } else {
      forEachInkPixel(text, scale, (dx, dy, a) => this.blendPixel(left + dx, top + dy, colour, a));
    }
  }
}

/** Size in pixels of the box `text` occupies at `scale`, unrotated: { widthPx, heightPx }. */
export function measureText(text: string, scale: number): { widthPx: number; heightPx: number } {
  return { widthPx: textWidthPx(text, scale), heightPx: textHeightPx(scale) };
}
