// The report's figures: titles are never cut with "..." (they wrap), and a PSD trace never breaks
// at the noise floor (a bin of zero power is drawn below the axis, not left as a gap).
import { describe, expect, it, vi } from "vitest";
import { WelchAccumulator } from "../../src/dsp/index.js";
import { RgbaCanvas } from "../../src/render/index.js";
import { constellationFigure, spectrumFigure, traceDb, traceFigure } from "../../src/report/measureFigures.js";

const LONG_NAME = "ostrel-bay-survey_165.2MHz_1Msps_second-visit_after-the-repair_of-the-quay-crane-link.cu8";

function tonePsd() {
  const fs = 48_000;
  const n = 1 << 15;
  const x = new Float32Array(2 * n);
  for (let k = 0; k < n; k++) { x[2 * k] = 0.5 * Math.cos(2 * Math.PI * 1000 * k / fs); x[2 * k + 1] = 0.5 * Math.sin(2 * Math.PI * 1000 * k / fs); }
  const w = new WelchAccumulator({ fftLength: 1024, sampleRateHz: fs });
  w.push(x, 0);
  return w.finish();
}

/** Every string the figure draws. */
function drawnTexts(draw: () => void): string[] {
  const drawn: string[] = [];
  const original = RgbaCanvas.prototype.text;
  const spy = vi.spyOn(RgbaCanvas.prototype, "text").mockImplementation(function (this: RgbaCanvas, ...args: Parameters<RgbaCanvas["text"]>) {
    drawn.push(args[0]);
    original.apply(this, args);
  });
  try { draw(); } finally { spy.mockRestore(); }
  return drawn;
}

describe("report figure titles", () => {
  it("never end in '...' or '…': a long title wraps and keeps every word", () => {
    const psd = tonePsd();
    const figures: Record<string, () => void> = {
      spectrum: () => spectrumFigure({
        title: LONG_NAME, psd, channelOffsetHz: 0, channelWidthHz: 20_000, centerHz: 165.2e6, lowerEdgeHz: 900, upperEdgeHz: 1100,
        carrierOffsetHz: 1000, xDb: 26, xDbReference: "peak-hold", xDbLevelDbfsPerHz: -60, noiseFloorDbfsPerHz: -140, widthPx: 640, heightPx: 480,
      }),
      trace: () => traceFigure({
        title: `Deviation from the carrier: ${LONG_NAME}`, subtitle: "FM discriminator after a 3.000 kHz audio low-pass; lines at the peak deviations",
        timeS: [0, 1, 2], min: [-1, -2, -1], max: [1, 2, 1], yName: "Deviation", yUnit: "hertz", markers: [], widthPx: 640, heightPx: 480,
      }),
      constellation: () => constellationFigure({
        name: LONG_NAME, symbols: Float64Array.from([1, 0, 0, 1, -1, 0, 0, -1]), ideal: Float64Array.from([1, 0, 0, 1, -1, 0, 0, -1]),
        constellation: "qpsk", evmRmsPercent: 2.81, merDb: 31.0, symbolRateBd: 19_200,
      }),
    };
    for (const [name, draw] of Object.entries(figures)) {
      const texts = drawnTexts(draw);
      for (const t of texts) expect(t, name).not.toMatch(/(\.\.\.|…)$/);
      // The file name is drawn whole, on one line or split between lines.
      expect(texts.join(" ").replace(/\s+/g, ""), name).toContain(LONG_NAME);
    }
  });
});

describe("traceDb(densityPerHz, clampDb)", () => {
  it("is 10·log10(p) above the clamp and the clamp for zero, NaN or a power under it", () => {
    // 10·log10(1e-10) = −100 dB exactly (definition of the decibel).
    expect(Array.from(traceDb([1e-10, 0, Number.NaN, 1e-30, 1], -150))).toEqual([-100, -150, -150, -150, 0]);
    // Nothing a polyline would break on: every value finite.
    for (const v of traceDb([0, Number.NaN, -1, Number.POSITIVE_INFINITY], -150)) expect(v).toBe(-150);
  });
});
