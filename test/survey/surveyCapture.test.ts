// The survey of the bundled site capture (samples/, made by src/scenario from its stated truth):
// issue 9 asks the blind survey to find all six transmitters with the right class each, the
// bursty FSK link with its symbol rate and duty cycle, to mark the receiver's DC spike and the
// IQ-imbalance images of the strong carriers as artefacts, and to report nothing else. The truth
// is the scenario's definition (SCENARIO_CAPTURES, TRANSMITTERS), the invented ground truth the
// capture was generated from.
import { fileURLToPath } from "node:url";
import { describe, expect, it } from "vitest";
import { withAnalysedCapture } from "../../src/commands/analyseCapture.js";
import { SCENARIO_CAPTURES, emissionOffsetHz, scenarioTransmitter } from "../../src/scenario/index.js";
import { surveyCapture, type SurveyResult } from "../../src/survey/index.js";

const capture = SCENARIO_CAPTURES.find((c) => c.id === "survey")!;
const path = fileURLToPath(new URL(`../../samples/${capture.fileName}`, import.meta.url));

describe("surveyCapture on the bundled site capture (issue 9's demo requirement)", () => {
  let result: SurveyResult;
  let binHz = 0;
  it("runs pass 1, the detection, one extraction read and the analyses", async () => {
    result = await withAnalysedCapture(path, {}, {}, async (a, source) => {
      binHz = a.pass1.spectrogram.binWidthHz;
      return surveyCapture(source, a.span, a.pass1, {});
    });
    expect(result.measured.length).toBeGreaterThan(0);
  }, 60_000);

  it("finds each of the six transmitters once, at its offset, with its class", () => {
    const real = result.detection.emissions.filter((e) => e.artefact === null);
    expect(real).toHaveLength(capture.emissions.length);
    for (const ce of capture.emissions) {
      const t = scenarioTransmitter(ce.transmitterId);
      const offset = emissionOffsetHz(capture, t);
      const found = result.measured.find((m) => Math.abs(m.emission.offsetHz - offset) <= Math.max(2 * binHz, 0.02 * m.emission.bandwidthHz));
      expect(found, `${t.label} at ${offset} Hz`).toBeDefined();
      const f = found!.figures;
      expect(f.modulation.class, t.label).toBe(t.modulation.kind);
      if (t.modulation.kind === "psk" || t.modulation.kind === "fsk") expect(f.modulation.order, t.label).toBe(t.modulation.order);
      if (t.modulation.kind === "fsk") {
        // The scenario's keying: its symbol rate, and the duty cycle of its burst schedule.
        const m = t.modulation;
        expect(Math.abs((f.digital?.symbolRateBd.value as number) / m.symbolRateBd - 1)).toBeLessThan(0.005);
        expect(Math.abs((found!.emission.dutyCyclePercent as number) - (100 * m.burst.onS) / m.burst.periodS)).toBeLessThan(5);
      }
    }
  });

  it("marks the DC spike and the images, each image the mirror of a found emission, and nothing else", () => {
    const artefacts = result.detection.emissions.filter((e) => e.artefact !== null);
    expect(artefacts.filter((e) => e.artefact === "dc")).toHaveLength(1);
    for (const im of artefacts.filter((e) => e.artefact === "image")) {
      const parent = result.detection.emissions.find((e) => e.id === im.mirrorOfId);
      expect(parent?.artefact).toBeNull();
      expect(Math.abs((parent?.offsetHz as number) + im.offsetHz)).toBeLessThanOrEqual(Math.max(2 * binHz, 0.05 * (parent?.bandwidthHz as number)));
    }
  });
});
