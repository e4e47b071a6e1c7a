// wrapText(text, maxWidthPx, scale): greedy first-fit line breaking (the usual rule of text
// layout, common practice), measured with the font's textWidthPx; and drawTitleBlock, which
// wraps a title instead of cutting it with "...".
import { describe, expect, it, vi } from "vitest";
import { drawTitleBlock, RgbaCanvas, wrapText } from "../../src/render/index.js";
import { textWidthPx } from "../../src/render/font.js";

const TITLE = "Spectrogram of the measured channel: ostrel-bay-survey_165.2MHz_1Msps.cu8, harbour launch channel, with its 99 % occupied bandwidth and channel edges marked";

describe("wrapText(text, maxWidthPx, scale)", () => {
  it("keeps every line within the width, loses no word, and leaves no room for the next word on a line", () => {
    for (const [width, scale] of [[300, 1], [480, 2], [1184, 3]] as const) {
      const lines = wrapText(TITLE, width, scale);
      for (const l of lines) expect(textWidthPx(l, scale)).toBeLessThanOrEqual(width);
      expect(lines.join(" ")).toBe(TITLE);
      // First fit: the first word of each following line would not have fitted on the line before.
      for (let i = 1; i < lines.length; i++) {
        const next = (lines[i] as string).split(" ")[0] as string;
        expect(textWidthPx(`${lines[i - 1]} ${next}`, scale)).toBeGreaterThan(width);
      }
    }
  });
  it("gives a text that fits as one line, and an empty text as one empty line", () => {
    expect(wrapText("PSD of the channel", 1000, 2)).toEqual(["PSD of the channel"]);
    expect(wrapText("", 100, 1)).toEqual([""]);
  });
  it("breaks a word wider than the line between characters, with nothing lost", () => {
    const word = "x".repeat(40);
    const lines = wrapText(word, textWidthPx("x".repeat(15), 1), 1);
    expect(lines).toEqual(["x".repeat(15), "x".repeat(15), "x".repeat(10)]);
  });
  it("refuses a width that holds no character", () => {
    expect(() => wrapText("a", 2, 1)).toThrow(RangeError);
  });
});

describe("drawTitleBlock(canvas, title, subtitle, scale)", () => {
  it("draws a long title on two lines, none ending in '...' or '…', and returns a lower y than for one line", () => {
    const drawn: string[] = [];
    const spy = vi.spyOn(RgbaCanvas.prototype, "text").mockImplementation((t: string) => { drawn.push(t); });
    const long = drawTitleBlock(new RgbaCanvas(800, 600, [255, 255, 255]), TITLE, "", 1);
    const titleLines = drawn.length;
    drawn.length = 0;
    const short = drawTitleBlock(new RgbaCanvas(800, 600, [255, 255, 255]), "PSD", "", 1);
    spy.mockRestore();
    expect(titleLines).toBe(2);
    expect(long).toBeGreaterThan(short);
    for (const t of drawn) expect(t).not.toMatch(/(\.\.\.|…)$/);
  });
});
