/**
 * The sample scenario, as data: an invented harbour site, its transmitters with their true
 * parameters, and the captures that `writeScenario` generates from them. Docs and `iqaudit demo`
 * print this ground truth; tests compare measurements with it.
 *
 * Everything here is invented: the site "Ostrel Bay harbour mast", the transmitters (named by
 * what they do, no call signs), the frequencies (VHF land-mobile range, 25 kHz raster and one
 * 12.5 kHz channel) and the dates. Absolute frequencies are RF, Hz; a capture sees transmitter f
 * at offset f − centerHz.
 */
import type { Container, SampleFormat } from "../capture/source.js";
import type { BurstSchedule } from "./keying.js";
import type { OverDeviation } from "./overDeviation.js";
import type { ReceiverModel } from "./receiver.js";

/** How a transmitter is modulated, with its true parameters. `kind` is the report's modulation class. */
export type TransmitterModulation =
  | {
      readonly kind: "fm";
      /** Speech-like audio (audio.ts), peaks ±1 at 0.5 s and 1.0 s of every capture. */
      readonly audio: "speech-like";
      readonly voicePeakDeviationHz: number;
      /** Sub-audible CTCSS tone (REFERENCES.md §10), or null. */
      readonly ctcssToneHz: number | null;
      readonly ctcssDeviationHz: number | null;
      /**
       * One word in which the talker's level rises so that the deviation reaches
       * overDeviation.peakDeviationHz (overDeviation.ts), or null. Not combined with a CTCSS tone.
       */
      readonly overDeviation: OverDeviation | null;
      /**
       * The true total peak: voice plus tone (both peak together, so their sum, both polarities),
       * or the over-deviated word's peak where there is one.
       */
      readonly peakDeviationHz: number;
    }
  | { readonly kind: "am"; readonly modulatingFrequencyHz: number; readonly depthPercent: number }
  | { readonly kind: "cw" }
  | { readonly kind: "psk"; readonly order: 4; readonly symbolRateBd: number; readonly rollOff: number; readonly spanSymbols: number }
  | {
      readonly kind: "fsk";
      readonly order: 2;
      readonly symbolRateBd: number;
      /** Distance between the two tones, Hz (tones at carrier ± shiftHz/2). */
      readonly shiftHz: number;
      readonly bitsPerBurst: number;
      readonly burst: BurstSchedule;
    };

export interface Transmitter {
  readonly id: string;
  /** An invented descriptive label. */
  readonly label: string;
  readonly nominalFrequencyHz: number;
  /**
   * True carrier error, Hz: frequencyHz − nominalFrequencyHz. A capture may hear the transmitter
   * with another (CaptureEmission.carrierErrorHz: its oscillator has drifted between visits).
   */
  readonly carrierErrorHz: number;
  /** True carrier (or centre) frequency, Hz. */
  readonly frequencyHz: number;
  readonly channelSpacingHz: number;
  readonly modulation: TransmitterModulation;
}

/** One transmitter as heard in one capture. */
export interface CaptureEmission {
  readonly transmitterId: string;
  /** Mean power while on, dBFS (0 dBFS = full-scale complex tone, interface.md). */
  readonly powerDbfs: number;
  /**
   * True carrier error in this capture, Hz, where it differs from the transmitter's
   * (Transmitter.carrierErrorHz): the drift of its oscillator between visits. Default: the
   * transmitter's. Read it through `emissionTransmitter`.
   */
  readonly carrierErrorHz?: number;
}

export interface ScenarioCapture {
  readonly id: string;
  /** File name; for SigMF the .sigmf-meta name (the data file has the same stem). */
  readonly fileName: string;
  readonly container: Container;
  readonly format: SampleFormat;
  readonly sampleRateHz: number;
  readonly centerHz: number;
  readonly sampleCount: number;
  /** RFC 3339, Z offset (SigMF core:datetime). */
  readonly datetime: string;
  readonly description: string;
  /** Receiver noise, two-sided density, dBFS/Hz (total variance = 10^(x/10)·fs). */
  readonly noiseDbfsPerHz: number;
  /** Receiver imperfections, or null for an ideal receiver. */
  readonly receiver: ReceiverModel | null;
  readonly emissions: readonly CaptureEmission[];
  /** Seed of the capture's noise and data. */
  readonly seed: number;
}

function transmitter(t: Omit<Transmitter, "frequencyHz">): Transmitter {
  return { ...t, frequencyHz: t.nominalFrequencyHz + t.carrierErrorHz };
}

/** The site's name (invented). */
export const SCENARIO_SITE = "Ostrel Bay harbour mast";

/** The transmitters of the scenario and their true parameters. */
export const TRANSMITTERS: readonly Transmitter[] = [
  transmitter({
    id: "launch",
    label: "harbour launch channel",
    nominalFrequencyHz: 164_975_000,
    carrierErrorHz: 180,
    channelSpacingHz: 25_000,
    modulation: { kind: "fm", audio: "speech-like", voicePeakDeviationHz: 4500, ctcssToneHz: null, ctcssDeviationHz: null, overDeviation: null, peakDeviationHz: 4500 },
  }),
  transmitter({
    id: "pilot",
    label: "pilot boarding channel (tone-coded)",
    nominalFrequencyHz: 165_325_000,
    carrierErrorHz: -95,
    channelSpacingHz: 25_000,
    modulation: { kind: "fm", audio: "speech-like", voicePeakDeviationHz: 3900, ctcssToneHz: 123.0, ctcssDeviationHz: 600, overDeviation: null, peakDeviationHz: 4500 },
  }),
  transmitter({
    id: "talkback",
    label: "crane-yard talk-back, test tone",
    nominalFrequencyHz: 165_050_000,
    carrierErrorHz: 40,
    channelSpacingHz: 25_000,
    modulation: { kind: "am", modulatingFrequencyHz: 1000, depthPercent: 70 },
  }),
  transmitter({
    id: "beacon",
    label: "breakwater light carrier beacon",
    nominalFrequencyHz: 165_500_000,
    carrierErrorHz: 312,
    channelSpacingHz: 25_000,
    modulation: { kind: "cw" },
  }),
  transmitter({
    id: "quaylink",
    label: "quay crane data link",
    nominalFrequencyHz: 165_400_000,
    carrierErrorHz: -60,
    channelSpacingHz: 50_000,
    modulation: { kind: "psk", order: 4, symbolRateBd: 19_200, rollOff: 0.35, spanSymbols: 8 },
  }),
  transmitter({
    id: "tidegauge",
    label: "tide-gauge burst telemetry",
    nominalFrequencyHz: 164_850_000,
    carrierErrorHz: -210,
    channelSpacingHz: 25_000,
    modulation: {
      kind: "fsk",
      order: 2,
      symbolRateBd: 4800,
      shiftHz: 3600,
      bitsPerBurst: 48,
      // 48 bits at 4800 Bd = 10 ms on every 125 ms: duty cycle 8 %.
      burst: { periodS: 0.125, onS: 0.01, firstStartS: 0.0205, rampS: 0.0002 },
    },
  }),
  transmitter({
    id: "workboat",
    label: "harbour workboat channel (12.5 kHz)",
    nominalFrequencyHz: 165_137_500,
    carrierErrorHz: 60,
    channelSpacingHz: 12_500,
    modulation: {
      kind: "fm",
      audio: "speech-like",
      voicePeakDeviationHz: 2200,
      ctcssToneHz: null,
      ctcssDeviationHz: null,
      // The talker shouts one word late in the recording: a peak of 3.4 kHz, over the ±2.5 kHz
      // of 12.5 kHz channels (trade practice, REFERENCES.md §4).
      overDeviation: { startS: 12.5, durationS: 0.8, rampS: 0.02, peakDeviationHz: 3400 },
      peakDeviationHz: 3400,
    },
  }),
];

/** The captures `writeScenario` writes (about 9.2 MB together). */
export const SCENARIO_CAPTURES: readonly ScenarioCapture[] = [
  {
    id: "survey",
    fileName: "ostrel-bay-survey_165.2MHz_1Msps.cu8",
    container: "raw",
    format: "cu8",
    sampleRateHz: 1_000_000,
    centerHz: 165_200_000,
    sampleCount: 1_500_000,
    datetime: "2024-09-17T06:40:00Z",
    description: "site survey, 1 MHz wide: the six site transmitters, receiver DC spike and IQ imbalance",
    noiseDbfsPerHz: -96,
    receiver: { dcI: 0.002, dcQ: -0.0012, gainImbalanceDb: 0.25, phaseImbalanceDeg: 1.5 },
    emissions: [
      { transmitterId: "launch", powerDbfs: -14 },
      { transmitterId: "pilot", powerDbfs: -17 },
      { transmitterId: "talkback", powerDbfs: -20 },
      { transmitterId: "beacon", powerDbfs: -30 },
      { transmitterId: "quaylink", powerDbfs: -22 },
      { transmitterId: "tidegauge", powerDbfs: -16 },
    ],
    seed: 0x05731001,
  },
  {
    id: "launch",
    fileName: "launch-channel_164.975MHz.wav",
    container: "wav",
    format: "ci16_le",
    sampleRateHz: 48_000,
    centerHz: 164_975_000,
    sampleCount: 192_000,
    datetime: "2024-09-17T07:05:00Z",
    description: "licence check of the harbour launch channel: FM speech, 4 s",
    noiseDbfsPerHz: -100,
    receiver: null,
    emissions: [{ transmitterId: "launch", powerDbfs: -8 }],
    seed: 0x05731002,
  },
  {
    id: "pilot",
    fileName: "pilot-channel_165.325MHz_50ksps.cf32",
    container: "raw",
    format: "cf32_le",
    sampleRateHz: 50_000,
    centerHz: 165_325_000,
    sampleCount: 150_000,
    datetime: "2024-09-17T07:12:00Z",
    description: "licence check of the pilot channel: FM speech with a 123.0 Hz CTCSS tone, 3 s",
    noiseDbfsPerHz: -104,
    receiver: null,
    emissions: [{ transmitterId: "pilot", powerDbfs: -10 }],
    seed: 0x05731003,
  },
  {
    id: "quay",
    fileName: "quay-links.sigmf-meta",
    container: "sigmf",
    format: "ci16_le",
    sampleRateHz: 250_000,
    centerHz: 165_450_000,
    sampleCount: 375_000,
    datetime: "2024-09-17T07:30:00Z",
    description: "quay crane data link (QPSK 19.2 kBd, RRC 0.35) and the breakwater beacon, 1.5 s",
    noiseDbfsPerHz: -90,
    receiver: null,
    emissions: [
      { transmitterId: "quaylink", powerDbfs: -12 },
      { transmitterId: "beacon", powerDbfs: -26 },
    ],
    seed: 0x05731004,
  },
  {
    id: "workboat",
    fileName: "workboat-channel_165.1375MHz.wav",
    container: "wav",
    format: "ci16_le",
    sampleRateHz: 32_000,
    centerHz: 165_137_500,
    sampleCount: 480_000,
    datetime: "2024-09-17T07:41:00Z",
    description: "licence check of the workboat channel: FM speech, 15 s, one over-deviated word at 12.5 s",
    noiseDbfsPerHz: -104,
    receiver: null,
    emissions: [{ transmitterId: "workboat", powerDbfs: -8 }],
    seed: 0x05731005,
  },
  {
    id: "launch-revisit",
    fileName: "launch-channel-revisit_164.975MHz.wav",
    container: "wav",
    format: "ci16_le",
    sampleRateHz: 48_000,
    centerHz: 164_975_000,
    sampleCount: 192_000,
    datetime: "2025-03-18T09:20:00Z",
    description: "second visit to the harbour launch channel, six months later: FM speech, 4 s, the carrier 80 Hz higher",
    noiseDbfsPerHz: -100,
    receiver: null,
    // The launch's oscillator has aged: +260 Hz (+1.58 ppm) against +180 Hz at the first visit.
    emissions: [{ transmitterId: "launch", powerDbfs: -8, carrierErrorHz: 260 }],
    seed: 0x05731006,
  },
];

/** The transmitter with id `id`; throws for an unknown id (a defect in the scenario table). */
export function scenarioTransmitter(id: string): Transmitter {
  const t = TRANSMITTERS.find((x) => x.id === id);
  if (t === undefined) throw new Error(`scenario: no transmitter "${id}"`);
  return t;
}

/**
 * The transmitter as heard in one capture: its TRANSMITTERS entry with the emission's own
 * carrier error, and so its own frequencyHz, where the emission gives one.
 */
export function emissionTransmitter(emission: CaptureEmission): Transmitter {
  const tx = scenarioTransmitter(emission.transmitterId);
  return emission.carrierErrorHz === undefined ? tx : transmitter({ ...tx, carrierErrorHz: emission.carrierErrorHz });
}

/**
 * Offset of `transmitter` from the centre of `capture`, Hz (negative below the centre), at its
 * frequency in that capture (emissionTransmitter) when the capture holds it, else at its
 * TRANSMITTERS frequency.
 */
export function emissionOffsetHz(capture: ScenarioCapture, transmitter: Transmitter): number {
  const emission = capture.emissions.find((e) => e.transmitterId === transmitter.id);
  const frequencyHz = emission === undefined ? transmitter.frequencyHz : emissionTransmitter(emission).frequencyHz;
  return frequencyHz - capture.centerHz;
}

/** Duration of `capture`, s. */
export function captureDurationS(capture: ScenarioCapture): number {
  return capture.sampleCount / capture.sampleRateHz;
}
