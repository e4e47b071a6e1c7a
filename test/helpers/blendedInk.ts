// Finds anti-aliased ink of one colour in a PNG decoded by pngjs (the reference decoder).
import { PNG } from "pngjs";
import type { Rgb } from "../../src/render/index.js";

const WHITE: Rgb = [255, 255, 255];

/**
 * Pixels that are `ink` laid over `page` with weight at least `minAlpha`: every component equals
 * page + α·(ink − page) for one α ≥ minAlpha, within 1.5 levels (one rounding step of 8-bit
 * blending, plus half a level of slack). Text drawn anti-aliased is found here where an
 * exact-colour match would find only its fully covered pixels.
 */
export function blendedInkOf(png: Buffer, ink: Rgb, minAlpha: number, page: Rgb = WHITE): [number, number][] {
  const image = PNG.sync.read(png);
  const out: [number, number][] = [];
  // α from the component where ink and page differ most, then all three checked against it.
  const c = [0, 1, 2].reduce((best, k) => (Math.abs(ink[k]! - page[k]!) > Math.abs(ink[best]! - page[best]!) ? k : best), 0);
  for (let y = 0; y < image.height; y++)
    for (let x = 0; x < image.width; x++) {
      const i = (y * image.width + x) * 4;
      const alpha = (image.data[i + c]! - page[c]!) / (ink[c]! - page[c]!);
      if (!(alpha >= minAlpha && alpha <= 1 + 1e-9)) continue;
      if ([0, 1, 2].every((k) => Math.abs(image.data[i + k]! - (page[k]! + alpha * (ink[k]! - page[k]!))) <= 1.5)) out.push([x, y]);
    }
  return out;
}
