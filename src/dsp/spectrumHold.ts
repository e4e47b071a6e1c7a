/**
 * A max-hold and an average (mean-power) spectrum over frames at a chosen resolution bandwidth,
 * in spectrum scaling, streamed over blocks (frameGrid.ts contract).
 *
 * Frame m of length L starts at m·H; it is windowed by the periodic window w of length L,
 * zero-padded to N (the next power of two ≥ L, so the bins lie no further apart than fs/L) and
 * transformed. Spectrum scaling, FS² in the resolution bandwidth:
 *   S_m[k] = |X_m[k]|² / (Σw)²,   average S[k] = (1/M)·Σ_m S_m[k],   max hold = max_m S_m[k]
 * (Heinzel, Rüdiger & Schilling 2002, §9, "power spectrum"; REFERENCES.md §8: a complex tone of
 * amplitude A on a bin reads A², noise reads its density × ENBW). The resolution bandwidth is
 * the window's ENBW, fs·Σw²/(Σw)² Hz (Harris 1978 eq. 11; it depends on L, not on the padding):
 * for Hann 1.5·fs/L, so L = round(1.5·fs/RBW) gives the RBW asked for (`holdFrameLength`).
 * Zero padding leaves each bin the DTFT of the windowed frame at k·fs/N: the padding only
 * interpolates between the bins of length L.
 *
 * Beside each bin's maximum the accumulator keeps the frame it came from. With `bandHz` it also
 * keeps the largest power any one frame holds within ±bandHz/2 of 0 Hz, integrated over the
 * bins, P_m = Σ_k S_m[k]·(fs/N)/RBW (density S/RBW times the bin spacing), and that frame's
 * number: the reference "highest emission in a resolution bandwidth as wide as the band".
 * Memory: four arrays
 * of N doubles and the fast engine's buffers (five of 2N floats), fixed at construction. The
 * spectrum is read through the engine's layout (fastFft.ts), so the sums stay in natural order.
 */
import { fastFft, toCentredOrder, type FastFft, type FrameWindow } from "./fft.js";
import { checkBlock, frameGrid, framesInBlock, type FrameGrid } from "./frameGrid.js";
import { framesPerStage, stagedFrames } from "./framePower.js";
import { enbwBins, windowCoefficients, type WindowName } from "./windows.js";

/** Options of a SpectrumHoldAccumulator. Defaults: hop floor(L/2), window "hann". */
export interface SpectrumHoldOptions {
  /** Frame length L (samples, ≥ 2). */
  readonly frameLength: number;
  readonly hopLength?: number;
  readonly window?: WindowName;
  /** Sample rate fs, Hz. */
  readonly sampleRateHz: number;
  /** Width of a band centred on 0 Hz whose per-frame integrated power's maximum is kept (module comment). */
  readonly bandHz?: number;
}

/** The result, centred order: index i ↔ (i − N/2)·binWidthHz. Powers in FS² within the RBW. */
export interface SpectrumHold {
  readonly frameLength: number;
  readonly hopLength: number;
  readonly fftLength: number;
  readonly sampleRateHz: number;
  /** fs/N, Hz. */
  readonly binWidthHz: number;
  /** Window ENBW, fs·Σw²/(Σw)², Hz. */
  readonly resolutionHz: number;
  readonly frameCount: number;
  readonly window: WindowName;
  /** Mean over the frames of |X|²/(Σw)², FS² in the RBW. */
  readonly averageFs2: Float64Array;
  /** Maximum over the frames, FS² in the RBW. */
  readonly maxHoldFs2: Float64Array;
  /** The frame number m (start m·H) of each bin's maximum; −1 where no frame was seen. */
  readonly maxFrame: Float64Array;
  /** With `bandHz`: the largest per-frame power within the band, FS², and its frame (−1 without). */
  readonly bandPeakFs2: number;
  readonly bandPeakFrame: number;
}

/**
 * The Hann frame length whose ENBW is `resolutionHz` at `sampleRateHz`: round(1.5·fs/RBW)
 * (Harris 1978 Table 1, Hann ENBW 1.50 bins). Throws RangeError when it would be under 2.
 */
export function holdFrameLength(resolutionHz: number, sampleRateHz: number): number {
  const l = Math.round((1.5 * sampleRateHz) / resolutionHz);
  if (!(l >= 2) || !Number.isFinite(l)) throw new RangeError(`resolution ${resolutionHz} Hz at ${sampleRateHz} S/s gives a frame of ${l} samples (at least 2 needed)`);
  return l;
}

/** Streams blocks into a max-hold and average spectrum (module comment). */
export class SpectrumHoldAccumulator {
  private readonly options: Required<Omit<SpectrumHoldOptions, "bandHz">>;
  /** Bins k ≤ bandBins and k ≥ N − bandBins lie in the band; −1 without one. */
  private readonly bandBins: number;
  private bandPeak = 0;
  private bandPeakAt = -1;
  private readonly grid: FrameGrid;
  private readonly engine: FastFft;
  private readonly windowValues: Float64Array;
  private readonly frameWindow: FrameWindow;
  private readonly sum: Float64Array;
  private readonly max: Float64Array;
  private readonly maxAt: Float64Array;
  private frames = 0;

  constructor(options: SpectrumHoldOptions) {
    const { frameLength, sampleRateHz } = options;
    if (!(Number.isInteger(frameLength) && frameLength >= 2)) throw new RangeError(`frameLength ${frameLength} is not an integer ≥ 2`);
    if (!(sampleRateHz > 0 && Number.isFinite(sampleRateHz))) throw new RangeError(`sampleRateHz ${sampleRateHz} is not a positive finite rate`);
    const hopLength = options.hopLength ?? Math.floor(frameLength / 2);
    this.options = { frameLength, hopLength, window: options.window ?? "hann", sampleRateHz };
    this.grid = frameGrid(frameLength, hopLength);
    let n = 2;
    while (n < frameLength) n *= 2;
    this.engine = fastFft(n);
    this.windowValues = windowCoefficients(this.options.window, frameLength);
    this.frameWindow = this.engine.prepareWindow(this.windowValues);
    this.sum = new Float64Array(n);
    this.max = new Float64Array(n);
    this.maxAt = new Float64Array(n).fill(-1);
    const band = options.bandHz;
    if (band !== undefined && !(band > 0 && Number.isFinite(band))) throw new RangeError(`bandHz ${band} is not a positive finite width`);
    this.bandBins = band === undefined ? -1 : Math.min(n / 2 - 1, Math.floor(band / 2 / (sampleRateHz / n)));
  }

  /** The lengths of every array the accumulator holds (fixed at construction). */
  stateLengths(): number[] {
    const buffer = 2 * this.engine.size;
    return [buffer, buffer, buffer, buffer, buffer, this.sum.length, this.max.length, this.maxAt.length, this.windowValues.length];
  }

  /** Adds every frame of the block that it owns (frameGrid.ts). `iq` is interleaved I,Q. */
  push(iq: Float32Array, dataStart: number, ownedStart: number = dataStart): void {
    const n = checkBlock(iq, dataStart, ownedStart);
    const { firstFrame, frameCount } = framesInBlock(this.grid, dataStart, n, ownedStart);
    const h = this.grid.hopLength;
    const length = this.frameWindow.length;
    const group = framesPerStage(length, h);
    for (let f0 = 0; f0 < frameCount; f0 += group) {
      const g = Math.min(group, frameCount - f0);
      const x = stagedFrames(this.engine, iq, (firstFrame + f0) * h - dataStart, g, h, length);
      for (let f = 0; f < g; f++) {
        this.engine.loadWindowed(x, f * h, this.frameWindow);
        this.engine.forward();
        this.addFrame(firstFrame + f0 + f);
      }
    }
    this.frames += frameCount;
  }

  private addFrame(frame: number): void {
    const x = this.engine.spectrum();
    const { realIndex, imagOffset } = this.engine.layout;
    const n = this.sum.length;
    const b = this.bandBins;
    let band = 0;
    for (let k = 0; k < n; k++) {
      const i = realIndex[k] as number;
      const p = (x[i] as number) ** 2 + (x[i + imagOffset] as number) ** 2;
      this.sum[k] = (this.sum[k] as number) + p;
      if (k <= b || k >= n - b) band += p;
      if (p > (this.max[k] as number)) {
        this.max[k] = p;
        this.maxAt[k] = frame;
      }
    }
    if (b >= 0 && band > this.bandPeak) {
      this.bandPeak = band;
      this.bandPeakAt = frame;
    }
  }

  /** The spectra of everything pushed so far (the accumulator stays usable). */
  finish(): SpectrumHold {
    const { frameLength, hopLength, window, sampleRateHz } = this.options;
    const n = this.sum.length;
    let s1 = 0;
    for (const v of this.windowValues) s1 += v;
    const scale = 1 / (s1 * s1);
    const m = this.frames;
    const resolutionHz = (enbwBins(this.windowValues) * sampleRateHz) / frameLength;
    return {
      frameLength, hopLength, fftLength: n, sampleRateHz, window,
      binWidthHz: sampleRateHz / n,
      resolutionHz,
      bandPeakFs2: this.bandPeak * scale * (sampleRateHz / n / resolutionHz),
      bandPeakFrame: this.bandPeakAt,
      frameCount: m,
      averageFs2: toCentredOrder(this.sum, m > 0 ? scale / m : 0),
      maxHoldFs2: toCentredOrder(this.max, scale),
      maxFrame: toCentredOrder(this.maxAt),
    };
  }
}
