// The spectrogram command end to end: a PNG of the stated size in which a tone of the capture is
// the brightest column, at the pixel its frequency maps to.
import { mkdtempSync, readFileSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { PNG } from "pngjs";
import { describe, expect, it } from "vitest";
import { encodeSamples } from "../../src/capture/index.js";
import { spectrogramCommand } from "../../src/commands/spectrogram.js";
import { SeededRandom, complexNoise } from "../../src/scenario/index.js";

const dir = mkdtempSync(join(tmpdir(), "iqaudit-sg-"));

describe("spectrogramCommand(path, options)", () => {
  it("draws a tone as the brightest column, at its frequency's pixel (pngjs as the reference decoder)", async () => {
    const fs = 250_000;
    const toneHz = 61_000;
    const n = 400_000;
    const iq = new Float64Array(2 * n);
    complexNoise(new SeededRandom(3), iq, 1e-4);
    for (let k = 0; k < n; k++) {
      iq[2 * k] = (iq[2 * k] as number) + 0.3 * Math.cos((2 * Math.PI * toneHz * k) / fs);
      iq[2 * k + 1] = (iq[2 * k + 1] as number) + 0.3 * Math.sin((2 * Math.PI * toneHz * k) / fs);
    }
    const path = join(dir, "tone_250ksps.cf32");
    writeFileSync(path, encodeSamples("cf32_le", iq));
    const out = join(dir, "tone.png");
    const s = await spectrogramCommand(path, { capture: {}, outputPath: out, widthPx: 900, heightPx: 600 });
    const png = PNG.sync.read(readFileSync(out));
    expect([png.width, png.height]).toEqual([900, 600]);

    // Brightness (sum of RGB) of each plot column, summed over the plot's rows. The colour ramp's
    // lightness rises with level, so the tone's column is the brightest.
    const { x, y, width, height } = s.plot;
    let bestColumn = -1;
    let bestSum = -1;
    for (let c = Math.ceil(x); c < Math.floor(x + width); c++) {
      let sum = 0;
      for (let r = Math.ceil(y); r < Math.floor(y + height); r++) {
        const o = 4 * (r * png.width + c);
        sum += (png.data[o] as number) + (png.data[o + 1] as number) + (png.data[o + 2] as number);
      }
      if (sum > bestSum) {
        bestSum = sum;
        bestColumn = c;
      }
    }
    // Independent mapping: linear from the plot's left edge (frequency of its left edge) to its right edge.
    const [f0, f1] = s.frequencySpanHz;
    const expectedX = x + ((toneHz - f0) / (f1 - f0)) * width;
    expect(Math.abs(bestColumn + 0.5 - expectedX)).toBeLessThanOrEqual(1.5);
  });
});
