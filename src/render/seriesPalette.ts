/**
 * The series palette of the line figures: six colours of our own, each taken from the colour
 * ramp's hue path (colourRamp.ts: hue from 165° turning to 400°, position t = 0 … 1) at a
 * lightness set for a thin line on the white page, with chroma at 92 % of the most the sRGB
 * gamut holds there (at most 0.20).
 *
 * Chosen so that, for normal vision and for protanopia, deuteranopia and tritanopia as
 * simulated by Machado, Oliveira & Fernandes (2009, severity 1), every two colours, and every
 * colour and the marker red, are at least 0.10 apart in OKLab (five times the 0.02 just
 * noticeable difference CSS Color 4 uses): 0.13 at the closest (test/render/seriesPalette.test.ts
 * computes it). Each has a contrast of at least 3:1 on the white page (WCAG 2.1, 1.4.11). Dark
 * and light alternate, so that the first two differ in lightness by 0.27 whatever the reader's
 * colour vision. In order: plum, teal, vermilion, indigo, cerulean, lilac.
 */
import { labFromLch, maxChromaInGamut, oklabToSrgb8, rampHueRad, type Oklab } from "./colourRamp.js";
import type { Rgb } from "./raster.js";

// [position along the ramp's hue path, OKLab lightness].
const SERIES_DESIGN: readonly (readonly [number, number])[] = [
  [0.75, 0.38], // plum, 341°
  [0.13, 0.65], // teal, 196°
  [1.0, 0.66], // vermilion, 40°
  [0.49, 0.4], // indigo, 280°
  [0.3, 0.52], // cerulean, 236°
  [0.58, 0.65], // lilac, 301°
];
const CHROMA_OF_GAMUT = 0.92;
const CHROMA_MAX = 0.2;

function seriesOklab([t, L]: readonly [number, number]): Oklab {
  const hueRad = rampHueRad(t);
  return labFromLch(L, Math.min(CHROMA_MAX, CHROMA_OF_GAMUT * maxChromaInGamut(L, hueRad)), hueRad);
}

/** The series colours in OKLab, in the order series take them. */
export const SERIES_PALETTE_OKLAB: readonly Oklab[] = SERIES_DESIGN.map(seriesOklab);

/** The series colours as 8-bit sRGB, in the order series take them. */
export const SERIES_PALETTE_RGB: readonly Rgb[] = SERIES_PALETTE_OKLAB.map(oklabToSrgb8);
