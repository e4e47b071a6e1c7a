// Synthetic transmitters for the `check` tests, written as cf32 files with their true parameters.
// Speech-like audio (src/scenario/audio.ts) reaches exactly +1 and −1 at 0.5 s and 1.0 s, so an
// FM transmitter of deviation D reaches exactly ±D: the truth of every deviation check.
import { writeFileSync } from "node:fs";
import { join } from "node:path";
import { encodeSamples } from "../../src/capture/index.js";
import { SeededRandom, amFromAudio, complexNoise, fmFromAudio, frequencyShift, speechLikeAudio } from "../../src/scenario/index.js";

export const CHECK_FS = 96_000;
/** The assigned frequency of the test licences, and the capture centre 10 kHz below it (off the receiver's DC). */
export const ASSIGNED_HZ = 160_000_000;
export const CENTRE_HZ = ASSIGNED_HZ - 10_000;

export interface TransmitterSpec {
  readonly seconds?: number;
  /** Carrier error, Hz (true carrier = assigned + error). */
  readonly carrierErrorHz: number;
  readonly modulation: { readonly kind: "fm"; readonly deviationHz: number } | { readonly kind: "am"; readonly depthPercent: number };
  /** A word where the deviation rises to exactly this, Hz, over [startS, startS + 0.8 s) (raiseWord). */
  readonly loudWord?: { readonly startS: number; readonly deviationHz: number } | undefined;
  /** A CW spur at this offset from the assigned frequency and level re the carrier's power, dB. */
  readonly spur?: { readonly offsetHz: number; readonly levelDbc: number } | undefined;
  /** Carrier amplitude (full scale 1); default 0.5 (−6 dBFS). */
  readonly amplitude?: number;
  /** Receiver noise, two-sided density, dBFS/Hz; default −125. */
  readonly noiseDbfsPerHz?: number;
  readonly seed?: number;
}

/** Baseband at the capture centre, interleaved I,Q (float64). */
export function transmitterIq(spec: TransmitterSpec): Float64Array {
  const fs = CHECK_FS;
  const n = Math.round((spec.seconds ?? 4) * fs);
  const audio = speechLikeAudio(0, n, fs);
  const a = spec.amplitude ?? 0.5;
  let iq: Float64Array;
  if (spec.modulation.kind === "fm") {
    const d = spec.modulation.deviationHz;
    const word = spec.loudWord;
    if (word !== undefined) raiseWord(audio, fs, word.startS, word.deviationHz / d);
    iq = fmFromAudio(audio, fs, d, 0, a).iq;
  } else {
    const env = amFromAudio(audio, spec.modulation.depthPercent, a);
    iq = new Float64Array(2 * n);
    for (let k = 0; k < n; k++) iq[2 * k] = env[k] as number;
  }
  iq = frequencyShift(iq, fs, ASSIGNED_HZ + spec.carrierErrorHz - CENTRE_HZ);
  if (spec.spur !== undefined) addTone(iq, fs, ASSIGNED_HZ + spec.spur.offsetHz - CENTRE_HZ, a * 10 ** (spec.spur.levelDbc / 20));
  const noise = new Float64Array(iq.length);
  complexNoise(new SeededRandom(spec.seed ?? 7), noise, 10 ** ((spec.noiseDbfsPerHz ?? -125) / 10) * fs);
  for (let k = 0; k < iq.length; k++) iq[k] = (iq[k] as number) + (noise[k] as number);
  return iq;
}

export function writeTransmitter(dir: string, name: string, spec: TransmitterSpec): string {
  const p = join(dir, `${name}_96ksps.cf32`);
  writeFileSync(p, encodeSamples("cf32_le", transmitterIq(spec)));
  return p;
}

/**
 * A louder word over [startS, startS + 0.8 s): the audio cross-fades (20 ms raised-cosine ramps)
 * into g times a speech-like audio whose +1 and −1 fall at startS + 0.15 s and startS + 0.65 s
 * (audio.ts: peakTimeS), so the word reaches exactly ±g and nothing exceeds g in magnitude.
 */
function raiseWord(audio: Float64Array, fs: number, startS: number, gain: number): void {
  const start = Math.round(startS * fs);
  const length = Math.round(0.8 * fs);
  const ramp = Math.round(0.02 * fs);
  const word = speechLikeAudio(start, length, fs, { peakTimeS: startS + 0.15 });
  for (let k = 0; k < length && start + k < audio.length; k++) {
    const edge = Math.min(k, length - 1 - k);
    const w = edge >= ramp ? 1 : 0.5 - 0.5 * Math.cos((Math.PI * edge) / ramp);
    audio[start + k] = (1 - w) * (audio[start + k] as number) + w * gain * (word[k] as number);
  }
}

function addTone(iq: Float64Array, fs: number, hz: number, amplitude: number): void {
  const step = (2 * Math.PI * hz) / fs;
  for (let k = 0; k < iq.length / 2; k++) {
    iq[2 * k] = (iq[2 * k] as number) + amplitude * Math.cos(step * k);
    iq[2 * k + 1] = (iq[2 * k + 1] as number) + amplitude * Math.sin(step * k);
  }
}

/** The 25 kHz-class licence of the tests (REFERENCES.md §4: 90.209 20 kHz authorised bandwidth, 90.213 5 ppm, mask C), with a 2.5 kHz deviation term. */
export const LICENCE_25K = {
  assignedFrequencyHz: ASSIGNED_HZ,
  frequencyTolerancePpm: 5,
  emissionDesignator: "16K0F3E",
  maxDeviationHz: 2500,
  authorisedBandwidthHz: 20_000,
  mask: "cfr-90.210-c",
  maskReference: "carrier",
  channelSpacingHz: 25_000,
} as const;

/** The 12.5 kHz-class licence (REFERENCES.md §4: 11.25 kHz authorised bandwidth, 2.5 ppm, mask D on the peak reference). */
export const LICENCE_12K5 = {
  assignedFrequencyHz: ASSIGNED_HZ,
  frequencyTolerancePpm: 2.5,
  emissionDesignator: "11K2F3E",
  maxDeviationHz: 2500,
  authorisedBandwidthHz: 11_250,
  mask: "cfr-90.210-d",
  maskReference: "peak",
  channelSpacingHz: 12_500,
} as const;
