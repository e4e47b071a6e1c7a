import { describe, expect, it } from "vitest";
import {
  COLOUR_RAMP_OKLAB,
  COLOUR_RAMP_SIZE,
  linearSrgbToOklab,
  oklabToLinearSrgb,
  rampColour,
  rampIndex,
  srgb8ToOklab,
  srgbDecode,
  srgbEncode,
  xyzD65ToOklab,
  type Oklab,
} from "../../src/render/index.js";

function expectLab(actual: Oklab, expected: Oklab, tolerance: number): void {
  for (let i = 0; i < 3; i++) expect(Math.abs((actual[i] ?? NaN) - (expected[i] ?? NaN))).toBeLessThanOrEqual(tolerance);
}

describe("OKLab conversion", () => {
  it("xyzD65ToOklab matches the test table of Ottosson 2020 (bottosson.github.io/posts/oklab), 3 decimals", () => {
    // Table of XYZ → OKLab pairs in "A perceptual color space for image processing"; values from memory.
    expectLab(xyzD65ToOklab([0.95, 1.0, 1.089]), [1.0, 0.0, 0.0], 1e-3);
    expectLab(xyzD65ToOklab([1, 0, 0]), [0.45, 1.236, -0.019], 1e-3);
    expectLab(xyzD65ToOklab([0, 1, 0]), [0.922, -0.671, 0.263], 1e-3);
    expectLab(xyzD65ToOklab([0, 0, 1]), [0.153, -1.415, -0.449], 1e-3);
  });

  it("linearSrgbToOklab(white) is L = 1, a = b = 0 (Ottosson 2020: the sRGB matrices are normalised to D65 white)", () => {
    expectLab(linearSrgbToOklab([1, 1, 1]), [1, 0, 0], 1e-6);
    expectLab(linearSrgbToOklab([0, 0, 0]), [0, 0, 0], 1e-12);
  });

  it("linearSrgbToOklab of the sRGB primaries gives the commonly quoted OKLab values (from memory)", () => {
    expectLab(linearSrgbToOklab([1, 0, 0]), [0.62796, 0.22486, 0.12585], 1e-3);
    expectLab(linearSrgbToOklab([0, 1, 0]), [0.86644, -0.23389, 0.1795], 1e-3);
    expectLab(linearSrgbToOklab([0, 0, 1]), [0.45201, -0.03246, -0.31153], 1e-3);
  });

  it("oklabToLinearSrgb inverts linearSrgbToOklab (Ottosson's published inverse matrices)", () => {
    for (const rgb of [[0.2, 0.5, 0.9], [1, 0.1, 0], [0.02, 0.02, 0.3]] as const) {
      const back = oklabToLinearSrgb(linearSrgbToOklab(rgb));
      for (let i = 0; i < 3; i++) expect(back[i]).toBeCloseTo(rgb[i], 6);
    }
  });

  it("srgbDecode / srgbEncode follow IEC 61966-2-1: 0.5 encoded is 0.21404 linear (from memory), and they invert", () => {
    expect(srgbDecode(0.5)).toBeCloseTo(0.21404, 5);
    expect(srgbDecode(0.04)).toBeCloseTo(0.04 / 12.92, 12);
    for (const v of [0, 0.001, 0.3, 0.75, 1]) expect(srgbEncode(srgbDecode(v))).toBeCloseTo(v, 10);
  });
});

describe("colour ramp", () => {
  const designL = (i: number): number => COLOUR_RAMP_OKLAB[i * 3] ?? NaN;

  it("COLOUR_RAMP_OKLAB lightness rises monotonically in equal steps (perceptually uniform ramp, Ottosson 2020)", () => {
    expect(COLOUR_RAMP_OKLAB.length).toBe(COLOUR_RAMP_SIZE * 3);
    const steps = Array.from({ length: COLOUR_RAMP_SIZE - 1 }, (_, i) => designL(i + 1) - designL(i));
    const mean = steps.reduce((a, b) => a + b, 0) / steps.length;
    expect(mean).toBeGreaterThan(0);
    for (const d of steps) expect(Math.abs(d - mean)).toBeLessThanOrEqual(0.01 * mean);
    expect(designL(0)).toBeLessThan(0.3);
    expect(designL(COLOUR_RAMP_SIZE - 1)).toBeGreaterThan(0.9);
  });

  it("every ramp entry lies inside the sRGB gamut (linear components in [0, 1])", () => {
    for (let i = 0; i < COLOUR_RAMP_SIZE; i++) {
      const lab: Oklab = [designL(i), COLOUR_RAMP_OKLAB[i * 3 + 1] ?? NaN, COLOUR_RAMP_OKLAB[i * 3 + 2] ?? NaN];
      for (const c of oklabToLinearSrgb(lab)) {
        expect(c).toBeGreaterThanOrEqual(-1e-6);
        expect(c).toBeLessThanOrEqual(1 + 1e-6);
      }
    }
  });

  it("the 8-bit ramp, measured back in OKLab, keeps rising lightness with near-equal steps over 16 entries", () => {
    const L = Array.from({ length: COLOUR_RAMP_SIZE }, (_, i) => srgb8ToOklab(rampColour(i))[0]);
    // Rounding each channel to the nearest code moves it by at most half a step; in L that is about
    // dlin / (3 L²), near 0.003 at L = 0.2 and less above (closed-form estimate), so 0.005 bounds it.
    for (let i = 0; i < COLOUR_RAMP_SIZE; i++) expect(Math.abs((L[i] ?? NaN) - designL(i))).toBeLessThan(0.005);
    const coarse = Array.from({ length: 15 }, (_, k) => (L[(k + 1) * 17] ?? NaN) - (L[k * 17] ?? NaN));
    const mean = coarse.reduce((a, b) => a + b, 0) / coarse.length;
    for (const d of coarse) expect(Math.abs(d - mean)).toBeLessThan(0.15 * mean);
  });

  it("the ramp is coloured, not grey: mid-ramp chroma √(a² + b²) above 0.05", () => {
    const i = 128;
    expect(Math.hypot(COLOUR_RAMP_OKLAB[i * 3 + 1] ?? 0, COLOUR_RAMP_OKLAB[i * 3 + 2] ?? 0)).toBeGreaterThan(0.05);
  });

  it("rampIndex(v, min, max) maps min → 0, max → 255, the midpoint to 128 (127.5 rounded), NaN → 0, and clamps", () => {
    expect(rampIndex(-100, -100, 0)).toBe(0);
    expect(rampIndex(0, -100, 0)).toBe(255);
    expect(rampIndex(-50, -100, 0)).toBe(128);
    expect(rampIndex(NaN, -100, 0)).toBe(0);
    expect(rampIndex(20, -100, 0)).toBe(255);
    expect(rampIndex(-200, -100, 0)).toBe(0);
  });
});
