import { readdirSync, readFileSync } from "node:fs";
import { join } from "node:path";
import { describe, expect, it } from "vitest";

// STYLE.md §2 and §9: dsp/ imports nothing from the rest of the project and does no I/O; only
// dsp/fft.ts imports fft.js. Read the import lines of every source file of the folder.
describe("src/dsp imports", () => {
  it("are relative to the folder, or fft.js from fft.ts only; no node: modules, console or process", () => {
    const dir = join(import.meta.dirname, "../../src/dsp");
    const files = readdirSync(dir, { recursive: true }).map(String).filter((f) => f.endsWith(".ts"));
    expect(files.length).toBeGreaterThan(5);
    for (const file of files) {
      const text = readFileSync(join(dir, file), "utf8");
      for (const m of text.matchAll(/^\s*(?:import|export)[^"']*from\s+["']([^"']+)["']/gm)) {
        const spec = m[1] as string;
        if (spec === "fft.js") expect(file).toBe("fft.ts");
        else expect(spec.startsWith("./"), `${file} imports ${spec}`).toBe(true);
      }
      expect(/\bconsole\.\w|\bprocess\.\w/.test(text), `${file} uses console or process`).toBe(false);
    }
  });
});
