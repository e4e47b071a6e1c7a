/**
 * `npm run bench:figure`: time to render one 1200 × 700 px line figure (two 4096-point series,
 * three marker lines, a note; title, subtitle, legend, axes) to PNG, the first time in the
 * process (font loaded, glyphs rasterised) and then the median of 30 more. Not a test: numbers
 * for a person to read. Measured on this 2-core machine, alternating with a build of the former
 * bitmap font: 220–430 ms first and a median of 96 ms after, against 130–175 ms and 87 ms (PNG
 * encoding is most of either).
 */
import { renderLineFigure, type LineFigureInput } from "../render/index.js";

function benchFigure(): LineFigureInput {
  const n = 4096;
  const x = Float64Array.from({ length: n }, (_, i) => -12.5e3 + (25e3 * i) / (n - 1));
  const mean = Float64Array.from(x, (f) => -110 + 60 * Math.exp(-((f / 3e3) ** 2)) + 3 * Math.sin(f / 97));
  const max = Float64Array.from(mean, (v) => v + 6);
  return {
    title: "PSD of the channel: bench figure, 164.975 MHz",
    subtitle: "Welch 4096-point Hann, 240 segments, RBW 7.3 Hz · ±0.5 dB",
    x: { name: "Frequency offset", quantity: { kind: "hertz" } },
    y: { name: "PSD", quantity: { kind: "linear", unit: "dBFS/Hz" } },
    series: [
      { label: "PSD (Welch mean)", xValues: x, yValues: mean },
      { label: "max hold", xValues: x, yValues: max },
    ],
    markers: [
      { orientation: "vertical", value: -4e3, label: "99 % OBW lower" },
      { orientation: "vertical", value: 4e3, label: "99 % OBW upper" },
      { orientation: "horizontal", value: -100, label: "noise floor" },
    ],
    notes: [{ x: 1e3, y: -60, text: "worst 1.00 kHz: margin +3.2 dB" }],
    widthPx: 1200,
    heightPx: 700,
  };
}

function timeMs(run: () => void): number {
  const start = performance.now();
  run();
  return performance.now() - start;
}

const input = benchFigure();
const firstMs = timeMs(() => renderLineFigure(input));
const laterMs = Array.from({ length: 30 }, () => timeMs(() => renderLineFigure(input))).sort((a, b) => a - b);
process.stdout.write(
  `1200 × 700 line figure to PNG: first ${firstMs.toFixed(0)} ms (font load and glyph rasterising included), ` +
    `then median ${(laterMs[15] ?? NaN).toFixed(0)} ms, fastest ${(laterMs[0] ?? NaN).toFixed(0)} ms of 30\n`,
);
