// The classification targets of issue 7 on a fixed subset of the evaluation set (src/eval/plans.ts,
// subsetPlan: 54 captures, three of each variant in the 5–10, 15–20 and 20–30 dB bands, a seed of
// its own). Each capture is measured exactly as `iqaudit measure <file>` with no hints. The truth
// is the generator's parameters (theory); the thresholds are the issue's targets.
import { mkdtempSync, rmSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { runCases, subsetPlan, targetCheck, type CaseResult } from "../../src/eval/index.js";

const describeCase = (r: CaseResult): string =>
  `${r.id} (${r.truth.format}${r.truth.dcSpikeDbc === null ? "" : `, DC +${r.truth.dcSpikeDbc.toFixed(1)} dB`}, ${r.truth.snrDb.toFixed(1)} dB): ` +
  `${r.truth.label} measured ${r.measuredLabel} at confidence ${r.confidence.toFixed(2)}`;

describe("evaluation subset: classification targets (issue 7)", () => {
  const dir = mkdtempSync(join(tmpdir(), "iqaudit-eval-subset-"));
  let results: CaseResult[] = [];

  beforeAll(async () => {
    results = await runCases(subsetPlan(), { dir, workers: 0 });
  }, 120_000);
  afterAll(() => rmSync(dir, { recursive: true, force: true }));

  it("measures every capture without an error", () => {
    expect(results.length).toBe(54);
    expect(results.filter((r) => r.error !== null).map((r) => `${r.id}: ${r.error}`)).toEqual([]);
  });

  it("classifies at least 95 % correctly in every class at in-band SNR ≥ 15 dB (issue target)", () => {
    const t = targetCheck(results);
    const below: string[] = [];
    for (const [label, a] of t.accuracyAt15) {
      // Issue target: ≥ 95 % per class, pooled over the class's variants in the subset.
      if (a.correct < 0.95 * a.cases) {
        const wrong = results.filter((r) => r.truth.label === label && r.truth.snrDb >= 15 && r.measuredLabel !== label);
        below.push(`${label} ${a.correct}/${a.cases}: ${wrong.map(describeCase).join("; ")}`);
      }
    }
    expect(t.accuracyAt15.size).toBe(12);
    expect(below).toEqual([]);
  });

  it("never states a wrong class with confidence ≥ 0.9 at SNR ≥ 20 dB (issue target)", () => {
    expect(targetCheck(results).confidentWrongAt20.map(describeCase)).toEqual([]);
  });

  it("below 20 dB answers \"unknown\" rather than a confident wrong class (issue target; confident = 0.9 or more, as at 20 dB)", () => {
    expect(targetCheck(results).confidentWrongBelow20.map(describeCase)).toEqual([]);
  });
});
