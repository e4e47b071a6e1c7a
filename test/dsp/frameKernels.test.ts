import { describe, expect, it } from "vitest";
// @ts-expect-error: a plain JavaScript build script, without type declarations
import { assembleKernels } from "../../scripts/assemble-kernels.mjs";
import { FRAME_KERNELS_WASM_BASE64 } from "../../src/dsp/frameKernelsWasm.js";

describe("frameKernelsWasm.ts", () => {
  it("holds exactly the bytes that frameKernels.wat assembles to (wabt), so the binary is its source", async () => {
    const assembled = (await assembleKernels()) as string;
    expect(assembled).toBe(FRAME_KERNELS_WASM_BASE64);
  });
});
