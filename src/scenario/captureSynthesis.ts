/**
 * Turns a scenario capture (scenario.ts) into samples, block by block: each transmitter is
 * synthesised at complex baseband, shifted to its offset and scaled to its power; receiver noise
 * is added, then the receiver model (DC, IQ imbalance). Memory: O(block) plus the symbol and bit
 * tables of the digital transmitters (a few ten thousand values).
 */
import { ParameterError } from "../errors.js";
import { fmFromAudio, amFromAudio } from "./analogModulation.js";
import { speechLikeAudio, toneAudio } from "./audio.js";
import { burstGate, burstStartS, nrzLevels } from "./keying.js";
import { frequencyShift, tone } from "./oscillator.js";
import { overDeviationGain } from "./overDeviation.js";
import { qpskSymbols, rrcPsk } from "./pulseShaping.js";
import { complexNoise, SeededRandom } from "./random.js";
import { applyReceiver } from "./receiver.js";
import { captureDurationS, emissionOffsetHz, emissionTransmitter } from "./scenario.js";
import type { CaptureEmission, ScenarioCapture, Transmitter } from "./scenario.js";

/** A sequential source of a capture's samples (interleaved I,Q, full scale 1.0, Float64). */
export interface SampleStream {
  readonly sampleCount: number;
  /** Samples produced so far. */
  readonly position: number;
  /** The next min(count, remaining) samples. */
  next(count: number): Float64Array;
}

/**
 * The samples of `capture`, in order. Deterministic: the same capture gives the same values for
 * any sequence of block sizes (all randomness comes from SeededRandom streams consumed in sample
 * order, and every waveform is a function of the absolute sample index or carries its phase).
 */
export function captureStream(capture: ScenarioCapture): SampleStream {
  const noiseRng = new SeededRandom(capture.seed);
  const noiseVariance = 10 ** (capture.noiseDbfsPerHz / 10) * capture.sampleRateHz;
  const emitters = capture.emissions.map((e, i) => emitter(capture, e, capture.seed + 7919 * (i + 1)));
  let position = 0;
  return {
    sampleCount: capture.sampleCount,
    get position() {
      return position;
    },
    next(count: number): Float64Array {
      const n = Math.max(0, Math.min(count, capture.sampleCount - position));
      const sum = new Float64Array(2 * n);
      complexNoise(noiseRng, sum, noiseVariance);
      for (const e of emitters) {
        const x = e(position, n);
        for (let k = 0; k < sum.length; k++) sum[k] = (sum[k] as number) + (x[k] as number);
      }
      position += n;
      return capture.receiver === null ? sum : applyReceiver(sum, capture.receiver);
    },
  };
}

type Emitter = (startSample: number, count: number) => Float64Array;

function emitter(capture: ScenarioCapture, emission: CaptureEmission, seed: number): Emitter {
  const tx = emissionTransmitter(emission);
  const fs = capture.sampleRateHz;
  const offsetHz = emissionOffsetHz(capture, tx);
  const power = 10 ** (emission.powerDbfs / 10);
  const m = tx.modulation;
  switch (m.kind) {
    case "cw":
      return (start, count) => tone(count, fs, offsetHz, { startSample: start, amplitude: Math.sqrt(power) });
    case "am": {
      // Mean power of tone AM: A²(1 + m²/2) (REFERENCES.md §5).
      const depth = m.depthPercent / 100;
      const a = Math.sqrt(power / (1 + (depth * depth) / 2));
      return (start, count) =>
        frequencyShift(amFromAudio(toneAudio(start, count, fs, m.modulatingFrequencyHz), m.depthPercent, a), fs, offsetHz, start);
    }
    case "fm":
      return fmEmitter(m, fs, offsetHz, Math.sqrt(power));
    case "psk": {
      const rng = new SeededRandom(seed);
      const count = Math.ceil(captureDurationS(capture) * m.symbolRateBd) + 2 * m.spanSymbols + 1;
      const symbols = qpskSymbols(rng, count);
      const options = {
        symbolRateBd: m.symbolRateBd,
        sampleRateHz: fs,
        rollOff: m.rollOff,
        spanSymbols: m.spanSymbols,
        // Start one pulse span early so the signal is fully on from sample 0.
        firstSymbolS: -m.spanSymbols / m.symbolRateBd,
        amplitude: Math.sqrt(power),
      };
      return (start, n) => frequencyShift(rrcPsk(symbols, start, n, options), fs, offsetHz, start);
    }
    case "fsk":
      return fskEmitter(capture, m, seed, offsetHz, Math.sqrt(power));
  }
}

/** Speech-like FM, with an optional CTCSS tone or an over-deviated word (scenario.ts). */
function fmEmitter(m: Extract<Transmitter["modulation"], { kind: "fm" }>, fs: number, offsetHz: number, amplitude: number): Emitter {
  if (m.overDeviation !== null && m.ctcssToneHz !== null) {
    throw new ParameterError("overDeviation", "an over-deviated word with a CTCSS tone is not modelled");
  }
  const gain = m.overDeviation === null ? null : overDeviationGain(fs, m.overDeviation, m.voicePeakDeviationHz);
  let phase = 0;
  return (start, count) => {
    const voice = speechLikeAudio(start, count, fs);
    if (gain !== null) {
      const g = gain(start, count);
      for (let k = 0; k < count; k++) voice[k] = (voice[k] as number) * (g[k] as number);
    }
    const audio = new Float64Array(count);
    const toneHz = m.ctcssToneHz;
    const toneDev = m.ctcssDeviationHz ?? 0;
    // The CTCSS tone has its positive peak at 0.5 s like the voice, so both peaks add.
    const ctcss = toneHz === null ? null : toneAudio(start, count, fs, toneHz, 0.5);
    for (let k = 0; k < count; k++) {
      const c = ctcss === null ? 0 : toneDev * (ctcss[k] as number);
      audio[k] = (m.voicePeakDeviationHz * (voice[k] as number) + c) / m.peakDeviationHz;
    }
    const block = fmFromAudio(audio, fs, m.peakDeviationHz, phase, amplitude);
    phase = block.endPhaseRad;
    return frequencyShift(block.iq, fs, offsetHz, start);
  };
}

function fskEmitter(
  capture: ScenarioCapture,
  m: Extract<Transmitter["modulation"], { kind: "fsk" }>,
  seed: number,
  offsetHz: number,
  amplitude: number,
): Emitter {
  const fs = capture.sampleRateHz;
  const rng = new SeededRandom(seed);
  const bursts = Math.ceil(captureDurationS(capture) / m.burst.periodS) + 1;
  const bits: Uint8Array[] = [];
  for (let b = 0; b < bursts; b++) {
    const burstBits = new Uint8Array(m.bitsPerBurst);
    for (let j = 0; j < burstBits.length; j++) burstBits[j] = rng.integer(2);
    bits.push(burstBits);
  }
  let phase = 0;
  return (start, count) => {
    const audio = new Float64Array(count);
    const t0 = start / fs;
    const t1 = (start + count) / fs;
    for (let b = 0; b < bursts; b++) {
      const s = burstStartS(m.burst, b);
      if (s > t1 || s + m.burst.onS < t0) continue;
      const levels = nrzLevels(bits[b] as Uint8Array, m.symbolRateBd, fs, start, count, s);
      for (let k = 0; k < count; k++) audio[k] = (audio[k] as number) + (levels[k] as number);
    }
    const block = fmFromAudio(audio, fs, m.shiftHz / 2, phase, amplitude);
    phase = block.endPhaseRad;
    const gate = burstGate(start, count, fs, m.burst);
    const iq = block.iq;
    for (let k = 0; k < count; k++) {
      iq[2 * k] = (iq[2 * k] as number) * (gate[k] as number);
      iq[2 * k + 1] = (iq[2 * k + 1] as number) * (gate[k] as number);
    }
    return frequencyShift(iq, fs, offsetHz, start);
  };
}
