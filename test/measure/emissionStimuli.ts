// Stimuli and a PSD helper shared by the emission tests (carrier, bandwidth, power, class).
import { fftPlan, WelchAccumulator, type WelchPsd, type WindowName } from "../../src/dsp/index.js";
import { SeededRandom } from "../../src/scenario/index.js";

/** Welch PSD of a whole record (Hann, 50 % overlap unless told). */
export function psdOf(iq: Float32Array | Float64Array, fftLength: number, sampleRateHz: number, window: WindowName = "hann"): WelchPsd {
  const acc = new WelchAccumulator({ fftLength, sampleRateHz, window });
  acc.push(iq instanceof Float32Array ? iq : Float32Array.from(iq), 0);
  return acc.finish();
}

/**
 * Circular complex Gaussian noise of n = 2^m samples with a flat density over [lowHz, highHz)
 * holding total power `bandPower`, plus white noise of density `floorPerHz` over ±fs/2,
 * synthesised in the frequency domain (one inverse DFT, scaled 1/n): the densities are exact
 * in expectation by Parseval.
 */
export function bandNoise(n: number, fs: number, lowHz: number, highHz: number, bandPower: number, floorPerHz: number, seed: number): Float64Array {
  const plan = fftPlan(n);
  const rng = new SeededRandom(seed);
  const spec = plan.createBuffer();
  const df = fs / n;
  const inBandBins = Math.round((highHz - lowHz) / df);
  for (let k = 0; k < n; k++) {
    const f = (k < n / 2 ? k : k - n) * df;
    const inBand = f >= lowHz && f < highHz;
    // x = IDFT(X)/n, so E|x|² = Σ E|X_k|²/n²: a bin holding power p_k needs E|X_k|² = n²·p_k.
    const pk = floorPerHz * df + (inBand ? bandPower / inBandBins : 0);
    const s = n * Math.sqrt(pk / 2);
    spec[2 * k] = s * rng.gaussian();
    spec[2 * k + 1] = s * rng.gaussian();
  }
  const time = plan.createBuffer();
  plan.inverse(time, spec);
  return Float64Array.from(time);
}

/** Adds circular white noise of total power `power` to `iq` in place. */
export function addNoise(iq: Float64Array, power: number, seed: number): Float64Array {
  const rng = new SeededRandom(seed);
  const s = Math.sqrt(power / 2);
  for (let k = 0; k < iq.length; k++) iq[k] = (iq[k] as number) + s * rng.gaussian();
  return iq;
}

/** Mean power E|z|² of a record. */
export function meanPower(iq: ArrayLike<number>): number {
  let s = 0;
  for (let k = 0; k < iq.length; k++) s += (iq[k] as number) ** 2;
  return s / (iq.length / 2);
}
