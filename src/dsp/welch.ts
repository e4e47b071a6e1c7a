/**
 * Welch's averaged, modified periodogram (P. D. Welch, "The use of fast Fourier transform for
 * the estimation of power spectra", IEEE Trans. Audio Electroacoust. AU-15(2), 1967), streamed
 * over blocks and mergeable across workers, with a max hold beside the mean.
 *
 * Segment m of length N (scipy's nperseg = nfft) starts at m·H, H = N − overlapLength
 * (scipy's noverlap); it is windowed by w and transformed: X_m[k] = Σ_n w[n]·z[mH + n]·e^(−j2πkn/N).
 * Density scaling, two-sided (complex input), FS²/Hz:
 *   P_m[k] = |X_m[k]|² / (fs·Σw²),   mean P[k] = (1/M)·Σ_m P_m[k],   max hold = max_m P_m[k]
 * (Heinzel, Rüdiger & Schilling 2002, §9, PSD = 2|X|²/(fs·S2) one-sided; scipy.signal.welch,
 * scaling="density", return_onesided=False). Integrating the PSD, Σ_k P[k]·fs/N, gives the mean
 * power E|z|² (Parseval). The resolution bandwidth is ENBW = N·Σw²/(Σw)² bins.
 * Blocks follow the contract of frameGrid.ts.
 */
import { fastFft, naturalToSlots, slotsToNatural, toCentredOrder, type DoubleStore, type FastFft, type FrameWindow } from "./fft.js";
import { accumulateFrames } from "./framePower.js";
import { checkBlock, frameGrid, framesInBlock, type FrameGrid } from "./frameGrid.js";
import { enbwBins, windowCoefficients, windowPowerSum, type WindowName } from "./windows.js";

/** A Welch PSD. Densities in FS²/Hz, two-sided, centred order: index i ↔ (i − N/2)·binWidthHz. */
export interface WelchPsd {
  readonly fftLength: number;
  /** Samples shared by consecutive segments (scipy's noverlap). */
  readonly overlapLength: number;
  readonly sampleRateHz: number;
  /** fs/N, Hz. */
  readonly binWidthHz: number;
  /** Resolution bandwidth: ENBW(bins) × binWidthHz, Hz. */
  readonly enbwHz: number;
  /** Segments averaged (M). Zero when the span held no whole segment; the densities are then 0. */
  readonly segmentCount: number;
  readonly window: WindowName;
  /** Mean PSD over the segments, FS²/Hz. */
  readonly densityPerHz: Float64Array;
  /** Per-bin maximum over the segments (max hold), FS²/Hz. */
  readonly maxHoldPerHz: Float64Array;
}

/** Options of a WelchAccumulator. Defaults: overlapLength = floor(fftLength/2), window "hann". */
export interface WelchOptions {
  /** Segment and transform length N, a power of two. */
  readonly fftLength: number;
  /** Samples shared by consecutive segments, 0 ≤ overlapLength < fftLength. */
  readonly overlapLength?: number;
  readonly window?: WindowName;
  /** Sample rate fs, Hz (> 0). */
  readonly sampleRateHz: number;
}

/** The accumulator's state: plain numbers and typed arrays, structured-cloneable. */
export interface WelchState {
  readonly fftLength: number;
  readonly overlapLength: number;
  readonly window: WindowName;
  readonly sampleRateHz: number;
  readonly segmentCount: number;
  /** Σ_m |X_m[k]|², natural bin order, unscaled. */
  readonly powerSum: Float64Array;
  /** max_m |X_m[k]|², natural bin order, unscaled. */
  readonly powerMax: Float64Array;
}

/** Frequency of centred bin `binIndex` of a PSD: (binIndex − N/2)·binWidthHz, Hz. */
export function binFrequencyHz(psd: WelchPsd, binIndex: number): number {
  return (binIndex - psd.fftLength / 2) * psd.binWidthHz;
}

/**
 * Streams blocks into a Welch PSD: `push` blocks (frameGrid.ts contract), `snapshot`/`merge` to
 * combine workers, `finish` for the result. Memory: 2 × fftLength doubles of state and the
 * engine's buffers (five of 2 × fftLength floats).
 */
export class WelchAccumulator {
  private readonly options: Required<WelchOptions>;
  private readonly grid: FrameGrid;
  private readonly engine: FastFft;
  private readonly windowValues: Float64Array;
  private readonly frameWindow: FrameWindow;
  /** Σ_m |X_m|² and max_m |X_m|², in the engine's slot order (natural order in snapshots). */
  private readonly powerSum: DoubleStore;
  private readonly powerMax: DoubleStore;
  private segmentCount = 0;

  constructor(options: WelchOptions) {
    const { fftLength, sampleRateHz } = options;
    const overlapLength = options.overlapLength ?? Math.floor(fftLength / 2);
    this.engine = fastFft(fftLength);
    if (!Number.isInteger(overlapLength) || overlapLength < 0 || overlapLength >= fftLength) {
      throw new RangeError(`overlapLength ${overlapLength} is outside [0, fftLength ${fftLength})`);
    }
    if (!(sampleRateHz > 0) || !Number.isFinite(sampleRateHz)) {
      throw new RangeError(`sampleRateHz ${sampleRateHz} is not a positive finite rate`);
    }
    this.options = { fftLength, overlapLength, window: options.window ?? "hann", sampleRateHz };
    this.grid = frameGrid(fftLength, fftLength - overlapLength);
    this.windowValues = windowCoefficients(this.options.window, fftLength);
    this.frameWindow = this.engine.prepareWindow(this.windowValues);
    this.powerSum = this.engine.createStore(fftLength);
    this.powerMax = this.engine.createStore(fftLength);
  }

  /** Adds every segment of the block that it owns (frameGrid.ts). `iq` is interleaved I,Q. */
  push(iq: Float32Array, dataStart: number, ownedStart: number = dataStart): void {
    const n = checkBlock(iq, dataStart, ownedStart);
    const { firstFrame, frameCount } = framesInBlock(this.grid, dataStart, n, ownedStart);
    if (frameCount === 0) return;
    const h = this.grid.hopLength;
    accumulateFrames(this.engine, iq, firstFrame * h - dataStart, frameCount, h, this.frameWindow, this.powerSum, this.powerMax, 0);
    this.segmentCount += frameCount;
  }

  /** A copy of the state, for postMessage to the merging side. */
  snapshot(): WelchState {
    return { ...this.options, segmentCount: this.segmentCount, powerSum: this.natural(this.powerSum), powerMax: this.natural(this.powerMax) };
  }

  /** Adds another accumulator's state. Throws RangeError if its settings differ from these. */
  merge(state: WelchState): void {
    const o = this.options;
    if (state.fftLength !== o.fftLength || state.overlapLength !== o.overlapLength
      || state.window !== o.window || state.sampleRateHz !== o.sampleRateHz) {
      throw new RangeError(
        `welch state (${state.fftLength}, ${state.overlapLength}, ${state.window}, ${state.sampleRateHz} Hz) `
        + `does not match (${o.fftLength}, ${o.overlapLength}, ${o.window}, ${o.sampleRateHz} Hz)`,
      );
    }
    const sum = new Float64Array(o.fftLength);
    const max = new Float64Array(o.fftLength);
    naturalToSlots(this.engine.layout, state.powerSum, 0, sum, 0);
    naturalToSlots(this.engine.layout, state.powerMax, 0, max, 0);
    const ownSum = this.powerSum.view();
    const ownMax = this.powerMax.view();
    for (let j = 0; j < o.fftLength; j++) {
      ownSum[j] = (ownSum[j] as number) + (sum[j] as number);
      if ((max[j] as number) > (ownMax[j] as number)) ownMax[j] = max[j] as number;
    }
    this.segmentCount += state.segmentCount;
  }

  /** The PSD of everything pushed and merged so far (the accumulator stays usable). */
  finish(): WelchPsd {
    const { fftLength, sampleRateHz } = this.options;
    const densityScale = 1 / (sampleRateHz * windowPowerSum(this.windowValues));
    const m = this.segmentCount;
    const binWidthHz = sampleRateHz / fftLength;
    return {
      ...this.options,
      binWidthHz,
      enbwHz: enbwBins(this.windowValues) * binWidthHz,
      segmentCount: m,
      densityPerHz: toCentredOrder(this.natural(this.powerSum), m > 0 ? densityScale / m : 0),
      maxHoldPerHz: toCentredOrder(this.natural(this.powerMax), densityScale),
    };
  }

  /** A natural-order copy of slot-order values. */
  private natural(store: DoubleStore): Float64Array {
    const out = new Float64Array(store.length);
    slotsToNatural(this.engine.layout, store.view(), 0, out, 0);
    return out;
  }
}
