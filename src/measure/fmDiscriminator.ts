/**
 * The FM discriminator: instantaneous frequency from the phase step between samples.
 */
import { fastAtan2 } from "./fastAtan2.js";

/**
 * Instantaneous frequency in Hz of complex baseband `iq` (interleaved I,Q, n samples at
 * `sampleRateHz`):
 *
 *   f[k] = arg(x[k+1]·conj(x[k]))·fs/(2π),   k = 0 … n − 2,
 *
 * the quadricorrelator / polar discriminator (e.g. Lyons, Understanding Digital Signal Processing,
 * 3rd ed., §13.22, "frequency demodulation"). The result has n − 1 values; value k belongs to the
 * interval between samples k and k + 1, i.e. to the time (k + ½)/fs. It lies in [−fs/2, fs/2]:
 * a phase step beyond ±π aliases. The product is formed in double precision and the angle by
 * `fastAtan2` (|error| < 2e-6 rad, i.e. < 3.2e-7·fs Hz). A zero sample gives 0 Hz at both of its
 * steps. Throws RangeError for a non-positive rate or an odd-length `iq`.
 */
export function instantaneousFrequencyHz(iq: Float32Array, sampleRateHz: number): Float32Array {
  if (!(Number.isFinite(sampleRateHz) && sampleRateHz > 0)) {
    throw new RangeError(`sampleRateHz ${sampleRateHz} is not a positive finite rate`);
  }
  if (iq.length % 2 !== 0) throw new RangeError(`iq length ${iq.length} is odd: not interleaved I,Q`);
  const n = iq.length >> 1;
  if (n < 2) return new Float32Array(0);
  const out = new Float32Array(n - 1);
  const scale = sampleRateHz / (2 * Math.PI);
  let pi = iq[0] as number;
  let pq = iq[1] as number;
  for (let k = 1; k < n; k++) {
    const ci = iq[2 * k] as number;
    const cq = iq[2 * k + 1] as number;
    // x[k]·conj(x[k−1])
    const re = ci * pi + cq * pq;
    const im = cq * pi - ci * pq;
    out[k - 1] = scale * fastAtan2(im, re);
    pi = ci;
    pq = cq;
  }
  return out;
}
