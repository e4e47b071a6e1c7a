import { describe, expect, it } from "vitest";
import { buildAxis, positionPx, textWidthPx } from "../../src/render/index.js";

describe("buildAxis", () => {
  it("buildAxis(absolute RF, 156.775–156.825 MHz) titles the unit and gives distinct labels spaced wider than themselves", () => {
    const axis = buildAxis({ min: 156.775e6, max: 156.825e6, quantity: { kind: "hertz" }, name: "Frequency", lengthPx: 900, orientation: "horizontal", textScale: 2 });
    expect(axis.title).toBe("Frequency (MHz)");
    expect(axis.ticks.length).toBeGreaterThanOrEqual(3);
    const labels = axis.ticks.map((t) => t.label);
    expect(new Set(labels).size).toBe(labels.length);
    for (const l of labels) expect(l).toMatch(/^156\.\d{2,3}$/);
    // Neighbouring labels, centred on their ticks, must not touch (linear map: px = 900 · (v − min) / span).
    for (let i = 1; i < axis.ticks.length; i++) {
      const a = axis.ticks[i - 1]!;
      const b = axis.ticks[i]!;
      const gapPx = ((b.value - a.value) / 50e3) * 900 - (textWidthPx(a.label, 2) + textWidthPx(b.label, 2)) / 2;
      // buildAxis keeps two figure widths between labels.
      expect(gapPx).toBeGreaterThanOrEqual(textWidthPx("00", 2));
    }
  });

  it("buildAxis(time 0–0.04 s) is in ms; a linear axis keeps the unit it is given", () => {
    const t = buildAxis({ min: 0, max: 0.04, quantity: { kind: "seconds" }, name: "Time", lengthPx: 400, orientation: "vertical", textScale: 1 });
    expect(t.title).toBe("Time (ms)");
    expect(t.ticks[0]).toEqual({ value: 0, label: "0" });
    const level = buildAxis({ min: -120, max: -40, quantity: { kind: "linear", unit: "dBFS/Hz" }, name: "Level", lengthPx: 400, orientation: "vertical", textScale: 1 });
    expect(level.title).toBe("Level (dBFS/Hz)");
    expect(level.ticks.map((x) => x.value)).toContain(-100);
  });

  it("positionPx is the linear map start + (v − min)/(max − min)·length, reversed from the far end", () => {
    const axis = { min: -10, max: 30 };
    expect(positionPx(-10, axis, 100, 400, false)).toBe(100);
    expect(positionPx(30, axis, 100, 400, false)).toBe(500);
    expect(positionPx(0, axis, 100, 400, false)).toBe(200);
    expect(positionPx(0, axis, 100, 400, true)).toBe(400);
  });
});
