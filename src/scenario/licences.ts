/**
 * The licences of the scenario's transmitters that the demo checks (invented, like the rest of
 * the scenario): JSON in the contract's licence format (docs/interface.md, docs/licence.md).
 * The harbour launch channel holds a licence file of its own; the workboat is checked against
 * the 12.5 kHz land-mobile template with its assigned frequency (`--template ... --assigned`).
 */
import { writeFile } from "node:fs/promises";
import { join } from "node:path";

export interface ScenarioLicence {
  /** The transmitter (scenario.ts) it licenses. */
  readonly transmitterId: string;
  /** File name in samples/ and in the demo's captures folder, or null when a template stands for it. */
  readonly fileName: string | null;
  /** The licence file's fields; for a template, what the command line adds. */
  readonly licence: Readonly<Record<string, unknown>>;
  /** A template the check uses, or null. */
  readonly template: string | null;
}

export const SCENARIO_LICENCES: readonly ScenarioLicence[] = [
  {
    transmitterId: "launch",
    fileName: "launch-channel.licence.json",
    template: null,
    // A 25 kHz land-mobile channel (REFERENCES.md §4: 90.209 20 kHz authorised bandwidth, 90.210 mask C
    // without an audio low-pass filter, 90.213 5 ppm for a base station, ±5 kHz deviation of 16K0F3E).
    licence: {
      assignedFrequencyHz: 164_975_000,
      frequencyTolerancePpm: 5,
      emissionDesignator: "16K0F3E",
      maxDeviationHz: 5000,
      channelSpacingHz: 25_000,
      authorisedBandwidthHz: 20_000,
      mask: "cfr-90.210-c",
      maskReference: "carrier",
      maskDetector: "peak-hold",
      maskResolutionHz: 300,
    },
  },
  { transmitterId: "workboat", fileName: null, template: "vhf-land-mobile-12k5", licence: { assignedFrequencyHz: 165_137_500 } },
];

/** The licence file's text (two-space JSON and a final newline, as committed in samples/). */
export function scenarioLicenceText(l: ScenarioLicence): string {
  return `${JSON.stringify(l.licence, null, 2)}\n`;
}

/** Writes the scenario's licence files into `dir`; returns their paths. */
export async function writeScenarioLicences(dir: string): Promise<string[]> {
  const out: string[] = [];
  for (const l of SCENARIO_LICENCES) {
    if (l.fileName === null) continue;
    const p = join(dir, l.fileName);
    await writeFile(p, scenarioLicenceText(l));
    out.push(p);
  }
  return out;
}
