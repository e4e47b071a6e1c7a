// Synthetic wideband captures for the survey tests, built from the scenario blocks and run
// through the real pass 1 (a ci16 file in a temp folder). Each capture is a few MB.
import { mkdtempSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { encodeSamples, openCapture, resolveSpan } from "../../src/capture/index.js";
import { runPass1, type Pass1Result } from "../../src/analysis/index.js";

const dir = mkdtempSync(join(tmpdir(), "iqaudit-survey-"));

/** Adds `x` (interleaved I,Q) into `into`, optionally times a real gate per sample. */
export function addInto(into: Float64Array, x: Float64Array, gate?: Float64Array): void {
  for (let k = 0; k < into.length; k += 2) {
    const g = gate === undefined ? 1 : (gate[k >> 1] as number);
    into[k] = (into[k] as number) + g * (x[k] as number);
    into[k + 1] = (into[k + 1] as number) + g * (x[k + 1] as number);
  }
}

/** Writes iq as ci16 and runs pass 1 over all of it, in this thread. */
export async function pass1Of(name: string, iq: Float64Array, sampleRateHz: number, fftLength: number, rows: number): Promise<Pass1Result> {
  const path = join(dir, `${name}_${Math.round(sampleRateHz)}sps.ci16`);
  writeFileSync(path, encodeSamples("ci16_le", iq));
  const source = await openCapture(path, { format: "ci16_le", sampleRateHz });
  const { span } = resolveSpan(source.meta, undefined, undefined);
  await source.close();
  return runPass1(source.meta, span, { spectrogramFftLength: fftLength, spectrogramRows: rows, workers: 0 });
}
