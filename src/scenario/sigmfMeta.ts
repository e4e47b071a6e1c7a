/**
 * SigMF metadata for a scenario capture (SigMF v1.2.x, REFERENCES.md §9): the global object,
 * one capture segment and one annotation per emission with its RF edges and label.
 */
import { emissionOffsetHz, emissionTransmitter, SCENARIO_SITE } from "./scenario.js";
import type { ScenarioCapture, Transmitter } from "./scenario.js";

/** The SigMF version written into core:version. */
export const SIGMF_VERSION = "1.2.5";

/**
 * The RF edges of a transmitter's emission, Hz, as annotated: for RRC PSK the absolute band
 * f ± (1 + α)Rs/2 (REFERENCES.md §7); for FM Carson's rule f ± (D + M) with M = 3000 Hz
 * (REFERENCES.md §2); for tone AM f ± fm; for 2-FSK f ± (shift/2 + Rb) (Carson's rule with the
 * NRZ fundamental Rb/2 and both first sidebands, common practice); for CW f ± 25 Hz (an
 * annotation window, not a bandwidth).
 */
export function emissionEdgesHz(tx: Transmitter): { lowerHz: number; upperHz: number } {
  const m = tx.modulation;
  let half: number;
  switch (m.kind) {
    case "psk":
      half = ((1 + m.rollOff) * m.symbolRateBd) / 2;
      break;
    case "fm":
      half = m.peakDeviationHz + 3000;
      break;
    case "am":
      half = m.modulatingFrequencyHz;
      break;
    case "fsk":
      half = m.shiftHz / 2 + m.symbolRateBd;
      break;
    case "cw":
      half = 25;
      break;
  }
  return { lowerHz: tx.frequencyHz - half, upperHz: tx.frequencyHz + half };
}

/** One-line comment for an annotation: the true parameters. */
export function emissionComment(tx: Transmitter): string {
  const m = tx.modulation;
  const err = `carrier error ${tx.carrierErrorHz} Hz from ${tx.nominalFrequencyHz} Hz`;
  switch (m.kind) {
    case "psk":
      return `QPSK ${m.symbolRateBd} Bd, root-raised-cosine roll-off ${m.rollOff}; ${err}`;
    case "fm":
      return `FM speech, peak deviation ${m.peakDeviationHz} Hz` +
        (m.ctcssToneHz === null ? "" : `, CTCSS ${m.ctcssToneHz.toFixed(1)} Hz at ${m.ctcssDeviationHz} Hz deviation`) +
        (m.overDeviation === null ? "" : `, voice ${m.voicePeakDeviationHz} Hz, one word at ${m.overDeviation.startS} s over-deviated`) + `; ${err}`;
    case "am":
      return `AM ${m.depthPercent} % depth, ${m.modulatingFrequencyHz} Hz tone; ${err}`;
    case "fsk":
      return `2-FSK ${m.symbolRateBd} Bd, shift ${m.shiftHz} Hz, bursts ${m.burst.onS * 1000} ms every ${m.burst.periodS * 1000} ms; ${err}`;
    case "cw":
      return `unmodulated carrier; ${err}`;
  }
}

/** The .sigmf-meta document of `capture` (a plain JSON object). */
export function sigmfMetadata(capture: ScenarioCapture): object {
  const annotations = capture.emissions.map((e) => {
    const tx = emissionTransmitter(e);
    const edges = emissionEdgesHz(tx);
    return {
      "core:sample_start": 0,
      "core:sample_count": capture.sampleCount,
      "core:freq_lower_edge": edges.lowerHz,
      "core:freq_upper_edge": edges.upperHz,
      "core:label": tx.label,
      "core:comment": `${emissionComment(tx)}; ${e.powerDbfs} dBFS, offset ${emissionOffsetHz(capture, tx)} Hz`,
      "core:generator": "iqaudit sample scenario",
    };
  });
  return {
    global: {
      "core:datatype": capture.format,
      "core:sample_rate": capture.sampleRateHz,
      "core:version": SIGMF_VERSION,
      "core:num_channels": 1,
      "core:description": `${SCENARIO_SITE} (invented scenario): ${capture.description}`,
      "core:recorder": "iqaudit sample scenario generator (synthetic)",
    },
    captures: [
      {
        "core:sample_start": 0,
        "core:frequency": capture.centerHz,
        "core:datetime": capture.datetime,
      },
    ],
    annotations,
  };
}

/** The exact text written to the .sigmf-meta file (2-space JSON plus a newline). */
export function sigmfMetadataText(capture: ScenarioCapture): string {
  return `${JSON.stringify(sigmfMetadata(capture), null, 2)}\n`;
}
