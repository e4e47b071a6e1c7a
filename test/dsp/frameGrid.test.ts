import { describe, expect, it } from "vitest";
import { checkBlock, frameGrid, framesInBlock, wholeFrameCount } from "../../src/dsp/index.js";
import { randomPartition } from "./blocks.js";

describe("framesInBlock(grid, dataStart, n, ownedStart)", () => {
  it("whole frames of a span: floor((n − L)/H) + 1 (Welch 1967: a trailing partial segment is dropped)", () => {
    // Hand count: L = 4, H = 2, n = 11 → frames at 0, 2, 4, 6 (8 + 4 > 11).
    expect(wholeFrameCount(frameGrid(4, 2), 11)).toBe(4);
    expect(wholeFrameCount(frameGrid(4, 2), 3)).toBe(0);
    expect(framesInBlock(frameGrid(4, 2), 0, 11, 0)).toEqual({ firstFrame: 0, frameCount: 4 });
  });

  for (const [l, h] of [[16, 8], [16, 16], [16, 5], [7, 3]] as const) {
    it(`with prefixes of L samples, random blocks process every frame exactly once (L ${l}, H ${h})`, () => {
      // Property of the block contract (frameGrid.ts): the union of the blocks' frames is
      // 0..F−1 with no repeats, F from the closed form above.
      const grid = frameGrid(l, h);
      const total = 1000;
      for (const seed of [1, 2, 3]) {
        const seen = new Uint8Array(wholeFrameCount(grid, total) + 10);
        for (const [owned, stop] of randomPartition(total, 40, seed)) {
          const dataStart = Math.max(0, owned - l);
          const r = framesInBlock(grid, dataStart, stop - dataStart, owned);
          for (let k = r.firstFrame; k < r.firstFrame + r.frameCount; k++) {
            const s = k * h;
            expect(s).toBeGreaterThanOrEqual(dataStart);
            expect(s + l).toBeLessThanOrEqual(stop);
            seen[k] = (seen[k] as number) + 1;
          }
        }
        const frames = wholeFrameCount(grid, total);
        for (let k = 0; k < seen.length; k++) expect(seen[k]).toBe(k < frames ? 1 : 0);
      }
    });
  }
});

describe("checkBlock(iq, dataStart, ownedStart)", () => {
  it("refuses odd-length data and an owned start outside the block", () => {
    expect(() => checkBlock(new Float32Array(3), 0, 0)).toThrow(/3 values/);
    expect(() => checkBlock(new Float32Array(4), 10, 9)).toThrow(/ownedStart 9/);
    expect(() => checkBlock(new Float32Array(4), 10, 13)).toThrow(RangeError);
    expect(checkBlock(new Float32Array(4), 10, 12)).toBe(2);
  });
});
