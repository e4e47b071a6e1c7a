// The survey's analyses in worker threads (issue 9, "both cores"): the threads change where the
// work runs, nothing else. The reference is the same analysis run in this thread, an independent
// run of the same published methods: every figure of every emission agrees to within float
// rounding (relative 1e-12; the last digit may differ because the compiled code of two threads
// may round a sum differently). The compiled build (dist/, made by `npm test` before vitest) holds
// the worker script, so this test imports from there.
import { fileURLToPath } from "node:url";
import { describe, expect, it } from "vitest";
import { SCENARIO_CAPTURES } from "../../src/scenario/index.js";

const dist = (p: string): string => new URL(`../../dist/${p}`, import.meta.url).href;
const capture = SCENARIO_CAPTURES.find((c) => c.id === "survey")!;
const path = fileURLToPath(new URL(`../../samples/${capture.fileName}`, import.meta.url));

interface SurveyRun { readonly measured: readonly { readonly figures: unknown }[]; readonly analysisWorkers: number }

async function surveyWith(workers: number): Promise<SurveyRun> {
  const { withAnalysedCapture } = (await import(dist("commands/analyseCapture.js"))) as typeof import("../../src/commands/analyseCapture.js");
  const { surveyCapture } = (await import(dist("survey/index.js"))) as typeof import("../../src/survey/index.js");
  return withAnalysedCapture(path, {}, {}, (a, source) => surveyCapture(source, a.span, a.pass1, { workers }));
}

/** The paths where two figure trees differ by more than `rel` (numbers) or at all (the rest). */
function differences(x: unknown, y: unknown, rel: number, at = ""): string[] {
  if (typeof x === "number" && typeof y === "number") {
    return x === y || Math.abs(x - y) <= rel * Math.max(Math.abs(x), Math.abs(y)) ? [] : [`${at}: ${x} vs ${y}`];
  }
  if (typeof x !== "object" || x === null || typeof y !== "object" || y === null) return x === y ? [] : [`${at}: ${String(x)} vs ${String(y)}`];
  const keys = new Set([...Object.keys(x), ...Object.keys(y)]);
  return [...keys].flatMap((k) => differences((x as Record<string, unknown>)[k], (y as Record<string, unknown>)[k], rel, `${at}.${k}`));
}

describe("survey analyses in worker threads", () => {
  it("give the figures of the same analyses run in this thread", async () => {
    const inline = await surveyWith(0);
    const threaded = await surveyWith(2);
    expect(inline.analysisWorkers).toBe(0);
    expect(threaded.analysisWorkers).toBe(2);
    expect(threaded.measured).toHaveLength(inline.measured.length);
    inline.measured.forEach((m, i) => {
      const d = differences(m.figures, threaded.measured[i]?.figures, 1e-12, `emission ${i}`);
      expect(d, d.slice(0, 5).join("\n")).toEqual([]);
    });
  }, 120_000);
});
