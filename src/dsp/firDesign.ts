/**
 * Low-pass FIR design by the window method with a Kaiser window (J. F. Kaiser, "Nonrecursive
 * digital filter design using the I0-sinh window function", Proc. IEEE ISCAS 1974; the same
 * formulas in Oppenheim & Schafer, Discrete-Time Signal Processing, 3rd ed., §7.6.1,
 * eqs. 7.62–7.63).
 *
 * Specification: passband [0, cutoffHz], stopband [cutoffHz + transitionHz, fs/2], the same
 * deviation δ = 10^(−A/20) in both bands (a property of window designs), A = stopbandDb. Then
 *
 *   β = 0.1102·(A − 8.7)                          A > 50
 *   β = 0.5842·(A − 21)^0.4 + 0.07886·(A − 21)    21 ≤ A ≤ 50
 *   β = 0                                         A < 21
 *   M = ⌈(A − 8) / (2.285·Δω)⌉, Δω = 2π·transitionHz/fs   (order; rounded up to even)
 *   h[n] = sin(ωc·(n − M/2)) / (π·(n − M/2)) · I0(β·√(1 − (2n/M − 1)²)) / I0(β),  n = 0..M
 *
 * with ωc at the middle of the transition band, 2π·(cutoffHz + transitionHz/2)/fs. The M + 1
 * taps (odd) are symmetric, so the phase is linear with a delay of M/2 samples, and they are
 * scaled to sum to 1 (unity DC gain). Kaiser's order formula is an estimate (Oppenheim & Schafer
 * §7.6.1 give it as accurate to about ±2 taps; at A = 80 dB it falls some 10 % short in our
 * trials, e.g. 77 taps estimated, 85 needed for Δf = fs/15); `designLowpass` checks the result on a dense
 * grid (an FFT) and lengthens it two taps at a time until the stopband is met (past 16 steps by a
 * doubling search and bisection, for long filters), so the spec is a promise.
 * Passband ripple is then about ±δ, i.e. ±8.7e-4 dB at A = 80 dB.
 */
import { fftPlan, transformInPlace } from "./fft.js";

/** The specification of a Kaiser-window low-pass (all frequencies in Hz, attenuation in dB). */
export interface LowpassSpec {
  /** Passband edge in Hz: the response is within ±δ of 1 over [0, cutoffHz]. */
  readonly cutoffHz: number;
  /** Width of the transition band in Hz; the stopband starts at cutoffHz + transitionHz. */
  readonly transitionHz: number;
  /** Minimum stopband attenuation A in dB (positive); δ = 10^(−A/20). */
  readonly stopbandDb: number;
  /** Sample rate in Hz of the signal the filter runs on. */
  readonly sampleRateHz: number;
}

/** Factor (−0.09 dB) on δ covering a sidelobe peak that falls between FFT grid points. */
const GRID_MARGIN = 0.99;

/** Largest check run through a cached fft.js plan; longer filters (over 4096 taps) use transformInPlace. */
const LARGEST_PLANNED_CHECK = 1 << 16;

/** Largest tap count `designLowpass` will produce, a guard against absurd specs (memory). */
export const MAX_TAP_COUNT = 1 << 20;

/**
 * Kaiser's β for a stopband attenuation of `stopbandDb` dB (Kaiser 1974; Oppenheim & Schafer
 * eq. 7.62). Dimensionless.
 */
export function kaiserBeta(stopbandDb: number): number {
  const a = stopbandDb;
  if (a > 50) return 0.1102 * (a - 8.7);
  if (a >= 21) return 0.5842 * Math.pow(a - 21, 0.4) + 0.07886 * (a - 21);
  return 0;
}

/**
 * Kaiser's estimate of the tap count for attenuation `stopbandDb` dB and a transition band of
 * `transitionHz` at `sampleRateHz`: M + 1 with M = ⌈(A − 8)/(2.285·Δω)⌉ rounded up to even
 * (Kaiser 1974; Oppenheim & Schafer eq. 7.63), so the count is odd. At least 3.
 */
export function kaiserTapCount(stopbandDb: number, transitionHz: number, sampleRateHz: number): number {
  const deltaOmega = (2 * Math.PI * transitionHz) / sampleRateHz;
  let order = Math.ceil((stopbandDb - 8) / (2.285 * deltaOmega));
  if (order < 2) order = 2;
  if (order % 2 === 1) order += 1;
  return order + 1;
}

/**
 * The modified Bessel function of the first kind, order zero, by its power series
 * I0(x) = Σ_k ((x/2)^k / k!)² (Abramowitz & Stegun 9.6.12), summed until a term no longer
 * changes the double-precision sum. All terms are positive, so there is no cancellation.
 */
export function besselI0(x: number): number {
  const half = x / 2;
  let term = 1;
  let sum = 1;
  for (let k = 1; k < 1000; k++) {
    const f = half / k;
    term *= f * f;
    sum += term;
    if (term < sum * 1e-17) break;
  }
  return sum;
}

/**
 * The Kaiser-window low-pass for `spec` (see the file comment for the formulas): an odd number
 * of symmetric taps summing to 1, delay (length − 1)/2 samples. Throws RangeError for a
 * non-positive or non-finite parameter, or a stopband edge above fs/2.
 */
export function designLowpass(spec: LowpassSpec): Float64Array {
  const { cutoffHz, transitionHz, stopbandDb, sampleRateHz } = spec;
  positive("sampleRateHz", sampleRateHz);
  positive("cutoffHz", cutoffHz);
  positive("transitionHz", transitionHz);
  positive("stopbandDb", stopbandDb);
  if (cutoffHz + transitionHz > sampleRateHz / 2) {
    throw new RangeError(
      `cutoffHz + transitionHz ${cutoffHz + transitionHz} exceeds half the sample rate ${sampleRateHz / 2}`,
    );
  }
  const beta = kaiserBeta(stopbandDb);
  const centreHz = cutoffHz + transitionHz / 2;
  const limit = Math.pow(10, -stopbandDb / 20);
  // The long filters' checks share one transform array (see peakStopbandGain).
  const scratch: { x: Float64Array | null } = { x: null };
  const meets = (tapCount: number): Float64Array | null => {
    if (tapCount > MAX_TAP_COUNT) {
      throw new RangeError(`tap count ${tapCount} for this spec exceeds ${MAX_TAP_COUNT}: widen transitionHz`);
    }
    const taps = kaiserSinc(tapCount, centreHz / sampleRateHz, beta);
    return peakStopbandGain(taps, (cutoffHz + transitionHz) / sampleRateHz, scratch) <= GRID_MARGIN * limit ? taps : null;
  };
  return shortestMeeting(kaiserTapCount(stopbandDb, transitionHz, sampleRateHz), meets);
}

/** Steps of 2 taps tried one by one before the search gallops. */
const LINEAR_STEPS = 16;

/**
 * The first odd tap count from `start` on, in steps of 2, whose design `meets` the stopband: the
 * first LINEAR_STEPS steps one by one (every short filter), then, since each check costs a
 * transform of 16 points a tap, by doubling steps and bisection back to the shortest passing
 * count, which is the same count where the stopband peak falls with length (Kaiser designs
 * of one β: a longer window, a steeper transition).
 */
function shortestMeeting(start: number, meets: (tapCount: number) => Float64Array | null): Float64Array {
  let tapCount = start;
  for (let i = 0; i < LINEAR_STEPS; i++, tapCount += 2) {
    const taps = meets(tapCount);
    if (taps !== null) return taps;
  }
  let failing = tapCount - 2;
  let step = 4;
  let passing: Float64Array | null = null;
  while (passing === null) {
    tapCount = failing + step;
    passing = meets(tapCount);
    if (passing === null) failing = tapCount;
    step *= 2;
  }
  let good = tapCount;
  while (good - failing > 2) {
    const middle = failing + 2 * Math.floor((good - failing) / 4);
    const taps = meets(middle);
    if (taps !== null) {
      good = middle;
      passing = taps;
    } else failing = middle;
  }
  return passing;
}

/**
 * |H(f)| = |Σ_n h[n]·e^(−j2πfn/fs)|, the magnitude of the complex gain of real or complex-valued
 * real taps at `frequencyHz` (any sign) for a filter run at `sampleRateHz`. Dimensionless; the
 * DTFT of the taps (Oppenheim & Schafer eq. 2.131).
 */
export function firResponse(taps: Float64Array, frequencyHz: number, sampleRateHz: number): number {
  const w = (2 * Math.PI * frequencyHz) / sampleRateHz;
  // The rotation is stepped by angle addition in double precision and renewed every 256 taps,
  // so the error stays at rounding level for any length.
  let re = 0;
  let im = 0;
  const cw = Math.cos(w);
  const sw = Math.sin(w);
  let c = 1;
  let s = 0;
  for (let n = 0; n < taps.length; n++) {
    if ((n & 255) === 0) {
      c = Math.cos(w * n);
      s = -Math.sin(w * n);
    }
    const h = taps[n] as number;
    re += h * c;
    im += h * s;
    const c2 = c * cw + s * sw;
    s = s * cw - c * sw;
    c = c2;
  }
  return Math.hypot(re, im);
}

/** Kaiser-windowed sinc of `tapCount` (odd) taps, cutoff at `centre` cycles/sample, sum 1. */
function kaiserSinc(tapCount: number, centre: number, beta: number): Float64Array {
  const taps = new Float64Array(tapCount);
  const half = (tapCount - 1) / 2;
  const i0Beta = besselI0(beta);
  let sum = 0;
  for (let n = 0; n < tapCount; n++) {
    const m = n - half;
    const ideal = m === 0 ? 2 * centre : Math.sin(2 * Math.PI * centre * m) / (Math.PI * m);
    const r = m / half;
    const w = besselI0(beta * Math.sqrt(Math.max(0, 1 - r * r))) / i0Beta;
    taps[n] = ideal * w;
    sum += ideal * w;
  }
  for (let n = 0; n < tapCount; n++) taps[n] = (taps[n] as number) / sum;
  return taps;
}

/**
 * The largest |H| over [stopEdge, 0.5] cycles/sample, read from a zero-padded FFT of at least 16
 * points per 1/length, which resolves every sidelobe (each about 1/length wide): between grid
 * points a sidelobe peak can be at most about 1 % higher (a quadratic peak sampled at 1/16 of its
 * width), which the caller's margin covers.
 */
function peakStopbandGain(taps: Float64Array, stopEdge: number, scratch: { x: Float64Array | null }): number {
  let size = 1024;
  while (size < 16 * taps.length) size *= 2;
  if (size > LARGEST_PLANNED_CHECK) {
    // A long filter: one Float64Array, reused by the checks of one design, transformed in place
    // (16 bytes a point, where an uncached plan and its two buffers take 48 and were garbage
    // after each check: a 24 000-tap filter's checks of 2^19 points peaked near 100 MiB of them).
    if (scratch.x?.length !== 2 * size) scratch.x = new Float64Array(2 * size);
    const x = scratch.x;
    x.fill(0);
    for (let n = 0; n < taps.length; n++) x[2 * n] = taps[n] as number;
    transformInPlace(x, "forward");
    return peakOnGrid(x, size, taps, stopEdge);
  }
  const plan = fftPlan(size);
  const input = plan.createBuffer();
  const out = plan.createBuffer();
  for (let n = 0; n < taps.length; n++) input[2 * n] = taps[n] as number;
  plan.forward(out, input);
  return peakOnGrid(out, size, taps, stopEdge);
}

/** The largest |H| over the grid points of the transform `spectrum` (size points) at or above `stopEdge`, and at the edge itself. */
function peakOnGrid(spectrum: ArrayLike<number>, size: number, taps: Float64Array, stopEdge: number): number {
  // The response still falls steeply at the edge itself, between grid points: evaluate it there.
  let peak = firResponse(taps, stopEdge, 1);
  for (let k = Math.floor(stopEdge * size); k <= size / 2; k++) {
    if (k / size < stopEdge) continue;
    const g = Math.hypot(spectrum[2 * k] as number, spectrum[2 * k + 1] as number);
    if (g > peak) peak = g;
  }
  return peak;
}

function positive(name: string, value: number): void {
  if (!(Number.isFinite(value) && value > 0)) {
    throw new RangeError(`${name} ${value} is not a positive finite number`);
  }
}
