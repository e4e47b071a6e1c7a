// report.md's methods (docs/cli.md, "Report folders"): each method line once, with every figure
// it serves, and only for figures the report holds.
import { describe, expect, it } from "vitest";
import { methodLines } from "../../src/report/measureMarkdown.js";
import type { MeasureReport } from "../../src/report/measureReport.js";

/** Only the parts methodLines reads: an OOK result, whose EVM is null. */
const OOK = {
  bandwidth: { occupiedHz: 2000, lowerEdgeHz: -1000, upperEdgeHz: 1000 },
  digital: { evmRmsPercent: null, merDb: null, symbolRateBd: 1200 },
  ook: { onOffRatioDb: 40 },
  fsk: { toneFrequenciesHz: null },
  methods: {
    "bandwidth.occupiedHz": "99 % power bandwidth",
    "bandwidth.lowerEdgeHz": "99 % power bandwidth",
    "bandwidth.upperEdgeHz": "99 % power bandwidth",
    "digital.symbolRateBd": "symbol rate from the level transitions",
    "digital.evmRmsPercent": "EVM (3GPP TS 36.141 style)",
    "digital.merDb": "MER (ETSI TR 101 290)",
    "ook.onOffRatioDb": "on/off levels",
    "fsk.toneFrequenciesHz.0": "tone clustering",
  },
} as unknown as MeasureReport;

describe("methodLines(report)", () => {
  it("lists a shared method once with its figures, and no method of a figure the report does not hold", () => {
    const lines = methodLines(OOK);
    expect(lines).toEqual([
      "- `bandwidth.occupiedHz`, `bandwidth.lowerEdgeHz`, `bandwidth.upperEdgeHz`: 99 % power bandwidth",
      "- `digital.symbolRateBd`: symbol rate from the level transitions",
      "- `ook.onOffRatioDb`: on/off levels",
    ]);
    expect(lines.join("\n")).not.toMatch(/EVM|MER/);
  });
});
