import type { Rgb } from "./raster.js";

/** A colour in OKLab: [L, a, b], L = 0 black to 1 white; a green–red, b blue–yellow. */
export type Oklab = readonly [number, number, number];

/** A colour in linear-light sRGB, each component 0–1 inside the gamut. */
export type LinearRgb = readonly [number, number, number];

/**
 * The sRGB transfer function (IEC 61966-2-1:1999): encoded value 0–1 from linear light 0–1,
 * 12.92·c below 0.0031308, else 1.055·c^(1/2.4) − 0.055.
 */
export function srgbEncode(linear: number): number {
  return linear <= 0.0031308 ? 12.92 * linear : 1.055 * Math.pow(linear, 1 / 2.4) - 0.055;
}

/** Inverse of {@link srgbEncode}: linear light 0–1 from an encoded sRGB value 0–1 (IEC 61966-2-1). */
export function srgbDecode(encoded: number): number {
  return encoded <= 0.04045 ? encoded / 12.92 : Math.pow((encoded + 0.055) / 1.055, 2.4);
}

// Ottosson's M2: non-linear cone response (after the cube root) to Lab.
function lmsCubeRootToOklab(l: number, m: number, s: number): Oklab {
  const lc = Math.cbrt(l);
  const mc = Math.cbrt(m);
  const sc = Math.cbrt(s);
  return [
    0.2104542553 * lc + 0.793617785 * mc - 0.0040720468 * sc,
    1.9779984951 * lc - 2.428592205 * mc + 0.4505937099 * sc,
    0.0259040371 * lc + 0.7827717662 * mc - 0.808675766 * sc,
  ];
}

/**
 * Linear sRGB to OKLab with the matrices published in B. Ottosson, "A perceptual color space
 * for image processing" (2020, bottosson.github.io/posts/oklab): linear RGB → LMS, cube root,
 * then M2. White (1, 1, 1) gives L = 1, a = b = 0.
 */
export function linearSrgbToOklab(rgb: LinearRgb): Oklab {
  const [r, g, b] = rgb;
  return lmsCubeRootToOklab(
    0.4122214708 * r + 0.5363325363 * g + 0.0514459929 * b,
    0.2119034982 * r + 0.6806995451 * g + 0.1073969566 * b,
    0.0883024619 * r + 0.2817188376 * g + 0.6299787005 * b,
  );
}

/** CIE XYZ (D65, Y = 1 for white) to OKLab with Ottosson's M1 and M2 (same reference as above). */
export function xyzD65ToOklab(xyz: readonly [number, number, number]): Oklab {
  const [x, y, z] = xyz;
  return lmsCubeRootToOklab(
    0.8189330101 * x + 0.3618667424 * y - 0.1288597137 * z,
    0.0329845436 * x + 0.9293118715 * y + 0.0361456387 * z,
    0.0482003018 * x + 0.2643662691 * y + 0.633851707 * z,
  );
}

/** OKLab to linear sRGB, the inverse of {@link linearSrgbToOklab} (Ottosson 2020). May leave 0–1 when out of gamut. */
export function oklabToLinearSrgb(lab: Oklab): LinearRgb {
  const [L, a, b] = lab;
  const l = (L + 0.3963377774 * a + 0.2158037573 * b) ** 3;
  const m = (L - 0.1055613458 * a - 0.0638541728 * b) ** 3;
  const s = (L - 0.0894841775 * a - 1.291485548 * b) ** 3;
  return [
    4.0767416621 * l - 3.3077115913 * m + 0.2309699292 * s,
    -1.2684380046 * l + 2.6097574011 * m - 0.3413193965 * s,
    -0.0041960863 * l - 0.7034186147 * m + 1.707614701 * s,
  ];
}

/** OKLab of an 8-bit sRGB colour (decode each component /255 with {@link srgbDecode}, then Ottosson). */
export function srgb8ToOklab(colour: Rgb): Oklab {
  return linearSrgbToOklab([srgbDecode(colour[0] / 255), srgbDecode(colour[1] / 255), srgbDecode(colour[2] / 255)]);
}

/** Number of entries in the colour ramp lookup table. */
export const COLOUR_RAMP_SIZE = 256;

// Our ramp, in OKLCh: lightness rises linearly from RAMP_L0 to RAMP_L1; the hue turns from a
// dark blue-green (165°) through blue, violet and rose to a pale apricot (40°, i.e. 400°);
// chroma swells in the middle and is cut back to stay inside the sRGB gamut.
const RAMP_L0 = 0.2;
const RAMP_L1 = 0.95;
const RAMP_HUE0_DEG = 165;
const RAMP_HUE_TURN_DEG = 235;
const GAMUT_MARGIN = 0.97;

function inGamut(lab: Oklab): boolean {
  const eps = 1e-9;
  return oklabToLinearSrgb(lab).every((c) => c >= -eps && c <= 1 + eps);
}

/** OKLab from OKLCh: lightness L, chroma, hue in radians (a = C·cos h, b = C·sin h; Ottosson 2020). */
export function labFromLch(L: number, chroma: number, hueRad: number): Oklab {
  return [L, chroma * Math.cos(hueRad), chroma * Math.sin(hueRad)];
}

/** Hue of the colour ramp at position t (0 … 1) along it, in radians: from 165° turning 235° to 400° (40°). */
export function rampHueRad(t: number): number {
  return ((RAMP_HUE0_DEG + RAMP_HUE_TURN_DEG * t) * Math.PI) / 180;
}

/** Largest OKLab chroma inside the sRGB gamut at lightness L and hue `hueRad`, by bisection (to 0.4 / 2^40). */
export function maxChromaInGamut(L: number, hueRad: number): number {
  let lo = 0;
  let hi = 0.4;
  for (let i = 0; i < 40; i++) {
    const mid = (lo + hi) / 2;
    if (inGamut(labFromLch(L, mid, hueRad))) lo = mid;
    else hi = mid;
  }
  return lo;
}

function buildRampOklab(): Float64Array {
  const lab = new Float64Array(COLOUR_RAMP_SIZE * 3);
  for (let i = 0; i < COLOUR_RAMP_SIZE; i++) {
    const t = i / (COLOUR_RAMP_SIZE - 1);
    const L = RAMP_L0 + (RAMP_L1 - RAMP_L0) * t;
    const hueRad = rampHueRad(t);
    const wanted = 0.05 + 0.09 * Math.sin(Math.PI * t);
    const chroma = Math.min(wanted, GAMUT_MARGIN * maxChromaInGamut(L, hueRad));
    const [, a, b] = labFromLch(L, chroma, hueRad);
    lab[i * 3] = L;
    lab[i * 3 + 1] = a;
    lab[i * 3 + 2] = b;
  }
  return lab;
}

/**
 * The colour ramp's design points in OKLab, COLOUR_RAMP_SIZE × [L, a, b]: L rises evenly from
 * 0.20 to 0.95 (ΔL = 0.75/255 per entry), every entry inside the sRGB gamut.
 */
export const COLOUR_RAMP_OKLAB: Readonly<Float64Array> = buildRampOklab();

/** An OKLab colour as 8-bit sRGB: linear components clamped to 0–1, encoded (IEC 61966-2-1), rounded. */
export function oklabToSrgb8(lab: Oklab): Rgb {
  const [r, g, b] = oklabToLinearSrgb(lab);
  const encode = (c: number): number => Math.round(255 * srgbEncode(Math.min(1, Math.max(0, c))));
  return [encode(r), encode(g), encode(b)];
}

function buildRampRgb(): Uint8Array {
  const rgb = new Uint8Array(COLOUR_RAMP_SIZE * 3);
  for (let i = 0; i < COLOUR_RAMP_SIZE; i++) {
    const lab: Oklab = [COLOUR_RAMP_OKLAB[i * 3] ?? 0, COLOUR_RAMP_OKLAB[i * 3 + 1] ?? 0, COLOUR_RAMP_OKLAB[i * 3 + 2] ?? 0];
    rgb.set(oklabToSrgb8(lab), i * 3);
  }
  return rgb;
}

/** The colour ramp as 8-bit sRGB, COLOUR_RAMP_SIZE × [R, G, B], entry 0 darkest. */
export const COLOUR_RAMP_RGB: Readonly<Uint8Array> = buildRampRgb();

/** The ramp entry `index` (0 … 255, clamped) as an 8-bit sRGB colour. */
export function rampColour(index: number): Rgb {
  const i = Math.min(COLOUR_RAMP_SIZE - 1, Math.max(0, Math.round(index)));
  return [COLOUR_RAMP_RGB[i * 3] ?? 0, COLOUR_RAMP_RGB[i * 3 + 1] ?? 0, COLOUR_RAMP_RGB[i * 3 + 2] ?? 0];
}

/** Ramp index 0 … 255 for `value` between `min` (→ 0) and `max` (→ 255), clamped; NaN → 0. */
export function rampIndex(value: number, min: number, max: number): number {
  if (!(value > min)) return 0;
  if (value >= max) return COLOUR_RAMP_SIZE - 1;
  return Math.round(((value - min) / (max - min)) * (COLOUR_RAMP_SIZE - 1));
}
