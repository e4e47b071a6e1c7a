import { describe, expect, it } from "vitest";
import { linearSrgbToOklab, MARKER_COLOUR, SERIES_COLOURS, SERIES_PALETTE_OKLAB, srgb8ToOklab, type Oklab, type Rgb } from "../../src/render/index.js";

type Matrix = readonly [readonly [number, number, number], readonly [number, number, number], readonly [number, number, number]];

// Machado, Oliveira & Fernandes, "A physiologically-based model for simulation of color vision
// deficiency", IEEE TVCG 15(6), 2009: the severity-1.0 matrices of its supplementary table, on
// linear sRGB. Values from memory, confirmed against several published reproductions (V2).
const MACHADO_2009: Readonly<Record<"protanopia" | "deuteranopia" | "tritanopia", Matrix>> = {
  protanopia: [
    [0.152286, 1.052583, -0.204868],
    [0.114503, 0.786281, 0.099216],
    [-0.003882, -0.048116, 1.051998],
  ],
  deuteranopia: [
    [0.367322, 0.860646, -0.227968],
    [0.280085, 0.672501, 0.047413],
    [-0.01182, 0.04294, 0.968881],
  ],
  tritanopia: [
    [1.255528, -0.076749, -0.178779],
    [-0.078411, 0.930809, 0.147602],
    [0.004733, 0.691367, 0.3039],
  ],
};

// sRGB decoding, IEC 61966-2-1:1999.
const decode = (c8: number): number => {
  const c = c8 / 255;
  return c <= 0.04045 ? c / 12.92 : ((c + 0.055) / 1.055) ** 2.4;
};

/** OKLab of `rgb` as a reader with `vision` sees it (Machado 2009 on linear light, clamped to the gamut). */
function seen(rgb: Rgb, vision: "normal" | keyof typeof MACHADO_2009): Oklab {
  const lin = [decode(rgb[0]), decode(rgb[1]), decode(rgb[2])] as const;
  if (vision === "normal") return linearSrgbToOklab(lin);
  const m = MACHADO_2009[vision];
  const row = (r: readonly [number, number, number]): number => Math.min(1, Math.max(0, r[0] * lin[0] + r[1] * lin[1] + r[2] * lin[2]));
  return linearSrgbToOklab([row(m[0]), row(m[1]), row(m[2])]);
}

const deltaEOk = (p: Oklab, q: Oklab): number => Math.hypot(p[0] - q[0], p[1] - q[1], p[2] - q[2]);

// WCAG 2.1, definitions of relative luminance and contrast ratio.
const relativeLuminance = (rgb: Rgb): number => 0.2126 * decode(rgb[0]) + 0.7152 * decode(rgb[1]) + 0.0722 * decode(rgb[2]);
const contrastOnWhite = (rgb: Rgb): number => 1.05 / (relativeLuminance(rgb) + 0.05);

const hueDeg = (lab: Oklab): number => ((Math.atan2(lab[2], lab[1]) * 180) / Math.PI + 360) % 360;

describe("series palette", () => {
  it("the Machado 2009 matrices keep white white: every row sums to 1 (the model preserves achromatic colours)", () => {
    for (const m of Object.values(MACHADO_2009)) for (const r of m) expect(r[0] + r[1] + r[2]).toBeCloseTo(1, 5);
  });

  it("SERIES_COLOURS are pairwise ≥ 0.10 apart in OKLab, and from the marker red, for normal vision and the three dichromacies (Machado 2009)", () => {
    // 0.10 = five times the just noticeable difference of 0.02 in OKLab that CSS Color 4 uses in
    // its gamut mapping; the margin is ours, for lines one or two pixels wide, whose colours are
    // harder to tell apart than large patches (Stone, Szafir & Setlur, Color Imaging Conf. 2014).
    const colours = [...SERIES_COLOURS, MARKER_COLOUR];
    expect(SERIES_COLOURS.length).toBeGreaterThanOrEqual(5);
    for (const vision of ["normal", "protanopia", "deuteranopia", "tritanopia"] as const) {
      for (let i = 0; i < colours.length; i++)
        for (let j = i + 1; j < colours.length; j++) {
          const d = deltaEOk(seen(colours[i]!, vision), seen(colours[j]!, vision));
          expect(d, `${vision}: colours ${i} and ${j}`).toBeGreaterThanOrEqual(0.1);
        }
    }
  });

  it("SERIES_COLOURS each reach 3:1 contrast on the white page (WCAG 2.1, 1.4.11 non-text contrast)", () => {
    for (const c of SERIES_COLOURS) expect(contrastOnWhite(c), c.join(",")).toBeGreaterThanOrEqual(3);
  });

  it("SERIES_COLOURS lie on the colour ramp's hue path (165° turning to 400°, i.e. not between 40° and 165°) and are the OKLab design rounded", () => {
    SERIES_COLOURS.forEach((c, i) => {
      const lab = srgb8ToOklab(c);
      const h = hueDeg(lab);
      // ±1° for the 8-bit rounding.
      expect(h <= 41 || h >= 164, `colour ${i} hue ${h.toFixed(1)}°`).toBe(true);
      // Rounding each sRGB component to 8 bits moves OKLab by well under 0.01.
      expect(deltaEOk(lab, SERIES_PALETTE_OKLAB[i]!)).toBeLessThan(0.01);
    });
  });

  it("SERIES_COLOURS does not open with blue then orange, the cycle figures commonly default to (OKLCh hue bands, common practice)", () => {
    const [first, second] = SERIES_COLOURS.map((c) => hueDeg(srgb8ToOklab(c)));
    const blue = first! >= 220 && first! <= 275;
    const orange = second! >= 40 && second! <= 75;
    expect(blue && orange).toBe(false);
    // And the first colour alone is not a blue.
    expect(blue).toBe(false);
  });
});
