// survey.md: the table a person reads (issue 9: number, frequency, bandwidth, power, SNR, time
// span, duty, class, designator, notes), numbered as the figure, artefacts set aside apart.
import { describe, expect, it } from "vitest";
import { surveyMarkdown, type SurveyEmission, type SurveyReport } from "../../src/report/index.js";

const base: Omit<SurveyEmission, "id" | "offsetHz" | "frequencyHz"> = {
  bandwidthHz: 11_000, powerDbfs: -32.5, peakDbfs: -30.1, snrDb: 41.2, startS: 0, endS: 1.5,
  dutyCyclePercent: 100, class: "fm", order: null, designator: "15K0F3E", artefact: null, report: null,
};

const report = {
  schema: "iqaudit/survey/1",
  tool: { name: "iqaudit", version: "0.1.0" },
  measuredAt: "2026-12-02T12:00:00.000Z",
  capture: { path: "/data/site_165.2MHz_1Msps.cu8", sha256: "ab".repeat(32), sampleRateHz: 1e6, centerHz: 165.2e6, durationS: 1.5 },
  quality: {},
  emissions: [
    { ...base, id: 1, offsetHz: -225_000, frequencyHz: 164.975e6 },
    { ...base, id: 2, offsetHz: 45_000, frequencyHz: 165.245e6, class: "fsk", order: 2, designator: "9K12F1D", dutyCyclePercent: 8, burstCount: 12, startS: 0.017, endS: 1.392 },
    { ...base, id: 3, offsetHz: 225_000, frequencyHz: 165.425e6, bandwidthHz: null, class: null, designator: null, artefact: "image", imageOf: 1, report: null },
    { ...base, id: 4, offsetHz: 0, frequencyHz: 165.2e6, class: null, designator: null, artefact: "dc", report: null },
  ],
  methods: {},
  warnings: ["one warning | with a bar"],
} as unknown as SurveyReport;

describe("surveyMarkdown(report)", () => {
  const md = surveyMarkdown(report);
  const rows = md.split("\n").filter((l) => /^\| \d+ \|/.test(l));

  it("has one table row per emission, artefacts left out of the table, with the issue's columns", () => {
    expect(md).toContain("| No. | Frequency | Bandwidth (99 %) | Power | SNR | On from – to | Duty | Class | Designator | Notes |");
    expect(rows.map((r) => r.split(" | ")[0])).toEqual(["| 1", "| 2"]);
    for (const r of rows) expect(r.split(" | ")).toHaveLength(10);
  });

  it("gives units, the bursts of a bursty link and the class with its order", () => {
    expect(rows[1]).toMatch(/\| 2FSK \|/); // displayClass: M-FSK written 2FSK (common practice)
    expect(rows[1]).toMatch(/9K12F1D/);
    expect(rows[1]).toMatch(/12 bursts/);
    expect(rows[1]).toMatch(/8 %/);
    expect(rows[0]).toMatch(/-32\.5 dBFS/);
    expect(rows[0]).toMatch(/41\.2 dB/);
  });

  it("lists the artefacts apart, the image with the emission it mirrors", () => {
    expect(md).toMatch(/## Receiver artefacts set aside \(2\)/);
    expect(md).toMatch(/- 3: an IQ-imbalance image of emission 1/);
    expect(md).toMatch(/- 4: the receiver's DC spike/);
  });

  it("names the capture's hash and says results are indicative", () => {
    expect(md).toContain("ab".repeat(32));
    expect(md).toMatch(/indicative/);
  });
});
