import { readdirSync, readFileSync } from "node:fs";
import { join } from "node:path";
import { describe, expect, it } from "vitest";

// STYLE.md §2 and §9: dsp/ imports nothing from the rest of the project and does no I/O; only
// dsp/fft.ts imports an FFT library (fft.js, @echogarden/pffft-wasm), reads that library's
// .wasm (node:fs, to know its memory) and one setting of the process, IQAUDIT_FFT (the choice of
// engine). Read the import lines of every source file.
describe("src/dsp imports", () => {
  it("are relative to the folder, or the FFT libraries from fft.ts only; no node: modules, console or process (but IQAUDIT_FFT)", () => {
    const dir = join(import.meta.dirname, "../../src/dsp");
    const files = readdirSync(dir, { recursive: true }).map(String).filter((f) => f.endsWith(".ts"));
    expect(files.length).toBeGreaterThan(5);
    for (const file of files) {
      const text = readFileSync(join(dir, file), "utf8");
      for (const m of text.matchAll(/^\s*(?:import|export)[^"']*from\s+["']([^"']+)["']/gm)) {
        const spec = m[1] as string;
        if (spec === "fft.js") expect(file).toBe("fft.ts");
        else if (spec.startsWith("@echogarden/pffft-wasm") || spec === "node:fs") expect(file).toBe("fft.ts");
        else expect(spec.startsWith("./"), `${file} imports ${spec}`).toBe(true);
      }
      expect(/import\(["']@echogarden/.test(text) && file !== "fft.ts", `${file} loads PFFFT`).toBe(false);
      const checked = file === "fft.ts" ? text.replaceAll("process.env.IQAUDIT_FFT", "") : text;
      expect(/\bconsole\.\w|\bprocess\.\w/.test(checked), `${file} uses console or process`).toBe(false);
    }
  });
});
