import { describe, expect, it } from "vitest";
import { applyReceiver, imageRejectionDb, tone } from "../../src/scenario/index.js";
import { lineAmplitude } from "./lines.js";

// Image-rejection ratio of a quadrature receiver with Q-branch gain g and phase error φ:
//   IRR = (1 + 2g cos φ + g²)/(1 − 2g cos φ + g²)
// (Razavi, "RF Microelectronics", image-reject receivers; from memory). With φ = 0 it reduces to
// ((1 + g)/(1 − g))², the gain-only case.
function irrTextbook(gainDb: number, phaseDeg: number): number {
  const g = 10 ** (gainDb / 20);
  const c = Math.cos((phaseDeg * Math.PI) / 180);
  return (1 + 2 * g * c + g * g) / (1 - 2 * g * c + g * g);
}

describe("applyReceiver(iq, model)", () => {
  const fs = 100_000;
  const f = 12_500; // 1250 whole periods in the 10 000-sample record

  it.each([
    [0.25, 1.5],
    [0.5, 0],
    [0, 2],
  ])("with %s dB / %s° puts the image of a tone at −f, IRR below it (textbook formula)", (gainDb, phaseDeg) => {
    const model = { dcI: 0, dcQ: 0, gainImbalanceDb: gainDb, phaseImbalanceDeg: phaseDeg };
    const y = applyReceiver(tone(10_000, fs, f), model);
    const wanted = lineAmplitude(y, fs, f).abs;
    const image = lineAmplitude(y, fs, -f).abs;
    const measuredDb = 20 * Math.log10(wanted / image);
    // Lines read over whole periods are exact to rounding: 1e-6 dB.
    expect(measuredDb).toBeCloseTo(10 * Math.log10(irrTextbook(gainDb, phaseDeg)), 6);
    expect(imageRejectionDb(model)).toBeCloseTo(10 * Math.log10(irrTextbook(gainDb, phaseDeg)), 9);
  });

  it("leaves a balanced receiver's tone without image and adds the DC offset as a line at 0 Hz", () => {
    const model = { dcI: 0.002, dcQ: -0.0012, gainImbalanceDb: 0, phaseImbalanceDeg: 0 };
    const y = applyReceiver(tone(10_000, fs, f, { amplitude: 0.5 }), model);
    expect(lineAmplitude(y, fs, -f).abs).toBeLessThan(1e-12);
    const dc = lineAmplitude(y, fs, 0);
    expect(dc.re).toBeCloseTo(0.002, 12);
    expect(dc.im).toBeCloseTo(-0.0012, 12);
  });
});
