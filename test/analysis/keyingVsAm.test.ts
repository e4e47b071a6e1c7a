// On-off keying with soft (raised-cosine) edges through pass 1 and measureEmission: a keyed
// carrier whose envelope sits at the noise for its off share is ook with its rate, not AM of a
// depth over 100 % (theory: the envelope of AM of depth ≤ 100 % reaches zero only at the troughs
// of m = 1, arcsine law; docs/methods.md, digital classification).
import { mkdtempSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { describe, expect, it } from "vitest";
import { encodeSamples } from "../../src/capture/index.js";
import { measureCommand } from "../../src/commands/measure.js";
import { SeededRandom, complexNoise, frequencyShift } from "../../src/scenario/index.js";
import { softKeyingEnvelope } from "../measure/digitalStimuli.js";

const dir = mkdtempSync(join(tmpdir(), "iqaudit-keying-"));
const fs = 250_000;
const n = 500_000; // 2 s

/** Random bits at rb Bd, amplitude 0.3, raised-cosine edges over a share `edge` of a symbol. */
function softOok(rb: number, edge: number, seed: number): Float64Array {
  const rng = new SeededRandom(seed);
  const bits = Array.from({ length: Math.ceil((n / fs) * rb) + 2 }, () => rng.integer(2));
  const envelope = softKeyingEnvelope(bits, rb, fs, n, edge);
  const iq = new Float64Array(2 * n);
  for (let k = 0; k < n; k++) iq[2 * k] = 0.3 * (envelope[k] as number);
  return iq;
}

describe("soft-keyed OOK in the measure command", () => {
  for (const [rb, edge, snrDb, seed] of [[2400, 0.25, 35, 9101], [1200, 0.3, 40, 9102]] as const) {
    it(`reads ${rb} Bd OOK with ${100 * edge} % edges at ${snrDb} dB as ook, its rate within 1 %, no AM figures`, async () => {
      const x = frequencyShift(softOok(rb, edge, seed), fs, 20_000);
      // SNR over the A1A necessary bandwidth 5·rb (47 CFR 2.202(g)) of the mean power 0.09/2.
      const noise = new Float64Array(x.length);
      complexNoise(new SeededRandom(seed + 1), noise, (0.045 / 10 ** (snrDb / 10)) * (fs / (5 * rb)));
      for (let k = 0; k < x.length; k++) x[k] = (x[k] as number) + (noise[k] as number);
      const p = join(dir, `ook${rb}_250ksps.cf32`);
      writeFileSync(p, encodeSamples("cf32_le", x));
      const { report } = await measureCommand(p, { capture: {} });
      expect(report.modulation.class).toBe("ook");
      expect(report.am).toBeNull();
      expect(Math.abs((report.digital.symbolRateBd as number) - rb) / rb).toBeLessThan(0.01);
    });
  }
});
