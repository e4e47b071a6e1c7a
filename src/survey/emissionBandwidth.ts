/**
 * The 99 % occupied bandwidth of one detected emission, from the Welch PSD of pass 1 (finer bins
 * than the spectrogram's) over the emission's detected range widened by `marginHz` each side.
 * The floor of the survey (per spectrogram bin, interpolated linearly to each PSD bin) is taken
 * out and replaced by its mean over the range, so that occupiedBandwidth (ITU-R SM.328, β/2 each
 * side, src/measure/occupiedBandwidth.ts) sees a flat floor of known level even under a sloped one.
 */
import { binFrequencyHz, type Spectrogram, type WelchPsd } from "../dsp/index.js";
import { occupiedBandwidth, type OccupiedBandwidth } from "../measure/index.js";

/** The occupied bandwidth of psd between lowerHz and upperHz, the survey floor removed (module comment). */
export function emissionBandwidth(
  psd: WelchPsd,
  s: Spectrogram,
  floorPerHz: Float64Array,
  lowerHz: number,
  upperHz: number,
): OccupiedBandwidth {
  const flattened = new Float64Array(psd.fftLength);
  let floorSum = 0;
  let floorCount = 0;
  for (let i = 0; i < psd.fftLength; i++) {
    const f = binFrequencyHz(psd, i);
    const floor = floorAt(s, floorPerHz, f);
    flattened[i] = (psd.densityPerHz[i] as number) - floor;
    if (f >= lowerHz && f <= upperHz) {
      floorSum += floor;
      floorCount++;
    }
  }
  const mean = floorCount > 0 ? floorSum / floorCount : 0;
  for (let i = 0; i < flattened.length; i++) flattened[i] = (flattened[i] as number) + mean;
  return occupiedBandwidth({ ...psd, densityPerHz: flattened }, { lowerHz, upperHz, noiseFloorPerHz: mean });
}

/** The survey floor at offset f, Hz: linear between spectrogram bin centres, held beyond the end ones. */
export function floorAt(s: Spectrogram, floorPerHz: Float64Array, offsetHz: number): number {
  const x = offsetHz / s.binWidthHz + s.fftLength / 2;
  const i = Math.floor(x);
  if (i < 0) return floorPerHz[0] as number;
  if (i >= s.fftLength - 1) return floorPerHz[s.fftLength - 1] as number;
  const u = x - i;
  return (1 - u) * (floorPerHz[i] as number) + u * (floorPerHz[i + 1] as number);
}
