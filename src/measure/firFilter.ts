/**
 * Running a linear-phase FIR over a whole real signal, by FFT overlap-add (Oppenheim & Schafer,
 * Discrete-Time Signal Processing, 3rd ed., §8.7.3), with the delay of the filter removed.
 * Module-internal: the measurement files use it for their audio low-passes.
 */
import { fftPlan } from "../dsp/index.js";

/**
 * y[n] = Σ_k h[k]·(x[n + D − k] − offset), D = (L − 1)/2, for n = 0 … N − 1 (x − offset taken as
 * 0 outside 0 … N − 1): the output lines up in time with the input for the symmetric odd-length
 * taps of `designLowpass`. The first and last D outputs see the zero padding (the filter's
 * transient); `transientLength` says how many to skip. `offset` (default 0) is subtracted from
 * each input as it is read, so a caller need not make a copy of x − offset. Cost O(N log L).
 */
export function filterLinearPhase(x: ArrayLike<number>, taps: Float64Array, offset = 0): Float64Array {
  const n = x.length;
  const tapCount = taps.length;
  const delay = (tapCount - 1) >> 1;
  const out = new Float64Array(n);
  if (n === 0) return out;
  let size = 2;
  while (size < 4 * tapCount) size *= 2;
  const block = size - tapCount + 1;
  const plan = fftPlan(size);
  const hBuf = plan.createBuffer();
  const hSpec = plan.createBuffer();
  for (let k = 0; k < tapCount; k++) hBuf[2 * k] = taps[k] as number;
  plan.forward(hSpec, hBuf);
  const xBuf = plan.createBuffer();
  const xSpec = plan.createBuffer();
  const yBuf = plan.createBuffer();
  // Full convolution c[m] = Σ h[k] x[m − k]; y[n] = c[n + delay].
  for (let start = 0; start < n; start += block) {
    const len = Math.min(block, n - start);
    xBuf.fill(0);
    for (let i = 0; i < len; i++) xBuf[2 * i] = (x[start + i] as number) - offset;
    plan.forward(xSpec, xBuf);
    for (let k = 0; k < size; k++) {
      const ar = xSpec[2 * k] as number;
      const ai = xSpec[2 * k + 1] as number;
      const br = hSpec[2 * k] as number;
      const bi = hSpec[2 * k + 1] as number;
      xSpec[2 * k] = ar * br - ai * bi;
      xSpec[2 * k + 1] = ar * bi + ai * br;
    }
    plan.inverse(yBuf, xSpec);
    const used = len + tapCount - 1;
    for (let i = 0; i < used; i++) {
      const target = start + i - delay;
      if (target >= 0 && target < n) out[target] = (out[target] as number) + (yBuf[2 * i] as number);
    }
  }
  return out;
}

/** Outputs at each end of `filterLinearPhase` that see the zero padding: (L − 1)/2. */
export function transientLength(taps: Float64Array): number {
  return (taps.length - 1) >> 1;
}
