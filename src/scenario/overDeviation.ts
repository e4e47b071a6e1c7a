/**
 * An over-deviated word of an FM talker: for a stretch of the speech-like audio the talker's
 * level rises (a shout), so the peak deviation inside it passes the transmitter's normal voice
 * peak. The level follows a gain envelope with raised-cosine ramps at both ends, so the audio
 * and hence the instantaneous frequency stay smooth; the stretch's gain is set on the capture's
 * sample grid so that the sampled peak deviation inside it is exactly the stated value.
 */
import { ParameterError } from "../errors.js";
import { speechLikeAudio } from "./audio.js";
import { requirePositive } from "./checks.js";

/** The over-deviated stretch of a transmitter's speech, times from the start of its capture. */
export interface OverDeviation {
  /** Start of the word, s: the gain envelope starts to rise here. */
  readonly startS: number;
  /** Length of the word, s, ramps included: the envelope is back at 0 at startS + durationS. */
  readonly durationS: number;
  /** Length of each raised-cosine ramp, s (≤ durationS/2). */
  readonly rampS: number;
  /** Peak deviation reached inside the word, Hz (more than the voice peak). */
  readonly peakDeviationHz: number;
}

/**
 * The word's gain envelope e(t) ∈ [0, 1] at t = n/fs for n = startSample … startSample+count−1:
 *   e = ½(1 − cos(π(t − s)/r))        for s ≤ t < s + r            (rise)
 *   e = 1                             for s + r ≤ t ≤ s + d − r    (plateau)
 *   e = ½(1 − cos(π(s + d − t)/r))    for s + d − r < t ≤ s + d    (fall)
 *   e = 0                             elsewhere,
 * with s = startS, d = durationS, r = rampS: continuous, with slope at most π/(2r) per second.
 */
export function overDeviationEnvelope(startSample: number, count: number, sampleRateHz: number, word: OverDeviation): Float64Array {
  requirePositive("sampleRateHz", sampleRateHz);
  checkWord(word);
  const out = new Float64Array(count);
  const endS = word.startS + word.durationS;
  for (let k = 0; k < count; k++) {
    const t = (startSample + k) / sampleRateHz;
    if (t < word.startS || t > endS) continue;
    const edgeS = Math.min(t - word.startS, endS - t);
    out[k] = edgeS >= word.rampS ? 1 : 0.5 * (1 - Math.cos((Math.PI * edgeS) / word.rampS));
  }
  return out;
}

/**
 * The talker's gain g[n] = 1 + (G − 1)·e[n] for a transmitter whose speech-like audio
 * (audio.ts) peaks at voicePeakDeviationHz, as a function of the absolute sample index. G is the
 * smallest gain for which max over the word of |a[n]|·g[n]·voicePeakDeviationHz reaches
 * word.peakDeviationHz: each sample reaches it at G_n = (R − |a_n|(1 − e_n)) / (|a_n|·e_n),
 * R = peakDeviationHz/voicePeakDeviationHz, and the first to reach it sets G = min G_n.
 */
export function overDeviationGain(
  sampleRateHz: number,
  word: OverDeviation,
  voicePeakDeviationHz: number,
): (startSample: number, count: number) => Float64Array {
  const level = wordLevel(sampleRateHz, word, voicePeakDeviationHz);
  return (startSample, count) => {
    const e = overDeviationEnvelope(startSample, count, sampleRateHz, word);
    for (let k = 0; k < count; k++) e[k] = 1 + (level - 1) * (e[k] as number);
    return e;
  };
}

/** G of `overDeviationGain`, from the audio and envelope over the word's samples. */
function wordLevel(sampleRateHz: number, word: OverDeviation, voicePeakDeviationHz: number): number {
  requirePositive("voicePeakDeviationHz", voicePeakDeviationHz);
  const ratio = word.peakDeviationHz / voicePeakDeviationHz;
  if (!(ratio > 1)) {
    throw new ParameterError("overDeviation.peakDeviationHz", `${word.peakDeviationHz} must exceed the voice peak ${voicePeakDeviationHz} Hz`);
  }
  const first = Math.ceil(word.startS * sampleRateHz);
  const count = Math.floor((word.startS + word.durationS) * sampleRateHz) - first + 1;
  const audio = speechLikeAudio(first, count, sampleRateHz);
  const e = overDeviationEnvelope(first, count, sampleRateHz, word);
  let level = Infinity;
  for (let k = 0; k < count; k++) {
    const a = Math.abs(audio[k] as number);
    const ek = e[k] as number;
    if (a * ek > 0) level = Math.min(level, (ratio - a * (1 - ek)) / (a * ek));
  }
  if (!Number.isFinite(level)) {
    throw new ParameterError("overDeviation.startS", `${word.startS}: the speech is silent for the whole word`);
  }
  return level;
}

function checkWord(word: OverDeviation): void {
  requirePositive("overDeviation.durationS", word.durationS);
  requirePositive("overDeviation.rampS", word.rampS);
  if (!(word.startS >= 0)) throw new ParameterError("overDeviation.startS", `${word.startS} must be ≥ 0`);
  if (word.rampS > word.durationS / 2) {
    throw new ParameterError("overDeviation.rampS", `${word.rampS} exceeds half the word's ${word.durationS} s`);
  }
}
