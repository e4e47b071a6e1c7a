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

/**
 * The same discriminator over a stream: `push` a block (interleaved I,Q, consecutive with the
 * last) and it writes f for every phase step that ends in the block, the first one across the
 * boundary from the previous block's last sample, into its own reused array (valid until the
 * next push). The first sample of the stream has no step before it, so n samples in all give
 * n − 1 values, as `instantaneousFrequencyHz` does on the whole record.
 */
export class StreamingDiscriminator {
  private readonly scale: number;
  private out = new Float64Array(0);
  private pi = 0;
  private pq = 0;
  private started = false;

  /** Throws RangeError for a non-positive rate. */
  constructor(sampleRateHz: number) {
    if (!(Number.isFinite(sampleRateHz) && sampleRateHz > 0)) {
      throw new RangeError(`sampleRateHz ${sampleRateHz} is not a positive finite rate`);
    }
    this.scale = sampleRateHz / (2 * Math.PI);
  }

  /** f in Hz of the steps completed by `iq` (a view of the discriminator's array). */
  push(iq: Float32Array): Float64Array {
    if (iq.length % 2 !== 0) throw new RangeError(`iq length ${iq.length} is odd: not interleaved I,Q`);
    const n = iq.length >> 1;
    if (this.out.length < n) this.out = new Float64Array(n);
    let k = 0;
    let count = 0;
    if (!this.started && n > 0) {
      this.pi = iq[0] as number;
      this.pq = iq[1] as number;
      this.started = true;
      k = 1;
    }
    let pi = this.pi;
    let pq = this.pq;
    for (; k < n; k++) {
      const ci = iq[2 * k] as number;
      const cq = iq[2 * k + 1] as number;
      this.out[count++] = this.scale * fastAtan2(cq * pi - ci * pq, ci * pi + cq * pq);
      pi = ci;
      pq = cq;
    }
    this.pi = pi;
    this.pq = pq;
    return this.out.subarray(0, count);
  }
}
