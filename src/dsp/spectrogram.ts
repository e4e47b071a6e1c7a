/**
 * A spectrogram with a fixed number of rows, streamed over blocks and mergeable across workers.
 *
 * The span of `totalSamples` samples is cut into F = floor(totalSamples / N) frames of N =
 * fftLength samples, no overlap (frame k starts at k·N; a trailing partial frame is dropped).
 * The row count R = min(requested rowCount, F) is fixed up front, so memory is R × N whatever the
 * capture length. Frame k goes to row r = floor(k·R / F); row r thus holds frames
 * ceil(r·F/R) .. ceil((r+1)·F/R) − 1, i.e. floor(F/R) or ceil(F/R) consecutive frames.
 * Each frame's periodogram is density-scaled as in welch.ts, |X[k]|²/(fs·Σw²) in FS²/Hz
 * (Heinzel et al. 2002, §9); each row keeps the mean and the maximum over its frames.
 * Blocks follow the contract of frameGrid.ts; frames past the span are ignored.
 */
import { fastFft, naturalBinIndex, naturalToSlots, slotsToNatural, type FastFft, type FloatStore, type FrameWindow } from "./fft.js";
import { checkBlock, frameGrid, framesInBlock, type FrameGrid } from "./frameGrid.js";
import { framesPerStage, stagedFrames } from "./framePower.js";
import { windowCoefficients, windowPowerSum, type WindowName } from "./windows.js";

/** Spectrogram rows. Row-major rowCount × fftLength, row 0 earliest, centred bin order, FS²/Hz. */
export interface Spectrogram {
  readonly rowCount: number;
  readonly fftLength: number;
  readonly sampleRateHz: number;
  /** fs/N, Hz. */
  readonly binWidthHz: number;
  readonly window: WindowName;
  /** Mean over the frames of each row. */
  readonly meanPerHz: Float32Array;
  /** Maximum over the frames of each row. */
  readonly maxPerHz: Float32Array;
  /** Frames that went into each row (0 for a row no block reached). */
  readonly framesPerRow: Uint32Array;
  /** Start of each row's first frame, s from the first sample of the span. */
  readonly rowStartS: Float64Array;
  /** End of each row's last frame, s. */
  readonly rowStopS: Float64Array;
}

/** Options of a SpectrogramAccumulator. Default window "hann". */
export interface SpectrogramOptions {
  /** Frame and transform length N, a power of two. */
  readonly fftLength: number;
  /** Rows requested (positive integer); fewer when the span holds fewer whole frames. */
  readonly rowCount: number;
  /** Samples in the analysed span. */
  readonly totalSamples: number;
  /** Sample rate fs, Hz (> 0). */
  readonly sampleRateHz: number;
  readonly window?: WindowName;
}

/** The accumulator's state: plain numbers and typed arrays, structured-cloneable. */
export interface SpectrogramState {
  readonly fftLength: number;
  readonly rowCount: number;
  readonly frameCount: number;
  readonly sampleRateHz: number;
  readonly window: WindowName;
  /** Σ |X[k]|² per row, natural bin order, unscaled; rowCount × fftLength, float32 (class comment). */
  readonly powerSum: Float32Array;
  /** max |X[k]|² per row, natural bin order, unscaled. */
  readonly powerMax: Float32Array;
  readonly framesPerRow: Uint32Array;
}

/**
 * Streams blocks into a fixed-row spectrogram: `push` blocks (frameGrid.ts contract),
 * `snapshot`/`merge` to combine workers, `finish` for the rows. Memory: 2 × R × N floats.
 * The rows are summed in float32 (a figure shown in dB): a row of m frames is within m·2^−24
 * (relative, worst case; about √m·2^−24 typically) of the double-precision sum, under 1e-5
 * for the 131 frames a row of a 1 GiB capture holds; the maxima are exact.
 */
export class SpectrogramAccumulator {
  /** Effective row count R = min(requested, whole frames). */
  readonly rowCount: number;
  /** Whole frames F in the span. */
  readonly frameCount: number;
  private readonly fftLength: number;
  private readonly sampleRateHz: number;
  private readonly window: WindowName;
  private readonly grid: FrameGrid;
  private readonly engine: FastFft;
  private readonly windowValues: Float64Array;
  private readonly frameWindow: FrameWindow;
  /**
   * Per row, Σ |X|² and max |X|² in the engine's slot order (natural order in states), in the
   * engine's stores (allocated here, not at the first push: an allocation may grow the engine's
   * memory and so detach the block a caller is pushing).
   */
  private powerSum: FloatStore;
  private powerMax: FloatStore;
  private framesPerRow: Uint32Array;

  constructor(options: SpectrogramOptions) {
    const { fftLength, rowCount, totalSamples, sampleRateHz } = options;
    this.engine = fastFft(fftLength);
    if (!Number.isInteger(rowCount) || rowCount < 1) {
      throw new RangeError(`rowCount ${rowCount} is not a positive integer`);
    }
    if (!Number.isInteger(totalSamples) || totalSamples < 0) {
      throw new RangeError(`totalSamples ${totalSamples} is not a non-negative integer`);
    }
    if (!(sampleRateHz > 0) || !Number.isFinite(sampleRateHz)) {
      throw new RangeError(`sampleRateHz ${sampleRateHz} is not a positive finite rate`);
    }
    this.fftLength = fftLength;
    this.sampleRateHz = sampleRateHz;
    this.window = options.window ?? "hann";
    this.grid = frameGrid(fftLength, fftLength);
    this.frameCount = Math.floor(totalSamples / fftLength);
    this.rowCount = Math.min(rowCount, this.frameCount);
    this.windowValues = windowCoefficients(this.window, fftLength);
    this.frameWindow = this.engine.prepareWindow(this.windowValues);
    this.powerSum = this.engine.createFloatStore(this.rowCount * fftLength);
    this.powerMax = this.engine.createFloatStore(this.rowCount * fftLength);
    this.framesPerRow = new Uint32Array(this.rowCount);
  }

  /** Adds every frame of the block that it owns (frameGrid.ts) to its row. */
  push(iq: Float32Array, dataStart: number, ownedStart: number = dataStart): void {
    const n = checkBlock(iq, dataStart, ownedStart);
    const { firstFrame, frameCount } = framesInBlock(this.grid, dataStart, n, ownedStart);
    const last = Math.min(firstFrame + frameCount, this.frameCount);
    const l = this.fftLength;
    const rows = this.rowCount;
    const frames = this.frameCount;
    if (last <= firstFrame) return;
    const engine = this.engine;
    const group = framesPerStage(l, l);
    for (let k0 = firstFrame; k0 < last; k0 += group) {
      const k1 = Math.min(last, k0 + group);
      const x = stagedFrames(engine, iq, k0 * l - dataStart, k1 - k0, l, l);
      for (let k = k0; k < k1; k++) {
        const row = Math.floor((k * rows) / frames);
        engine.loadWindowed(x, (k - k0) * l, this.frameWindow);
        engine.forward();
        engine.addPowerFloat(this.powerSum, this.powerMax, row * l);
        this.framesPerRow[row] = (this.framesPerRow[row] as number) + 1;
      }
    }
  }

  /** A copy of the state, for postMessage to the merging side. */
  snapshot(): SpectrogramState {
    return {
      fftLength: this.fftLength, rowCount: this.rowCount, frameCount: this.frameCount,
      sampleRateHz: this.sampleRateHz, window: this.window,
      powerSum: this.rows(this.powerSum, slotsToNatural), powerMax: this.rows(this.powerMax, slotsToNatural),
      framesPerRow: this.framesPerRow.slice(),
    };
  }

  /**
   * The state of an accumulator that is done (a worker's last message): the same as `snapshot`.
   * The rows live in the engine's memory, which is not given back while the process runs, so
   * there is nothing to hand over without a copy.
   */
  release(): SpectrogramState {
    return this.snapshot();
  }

  /**
   * Adds another accumulator's state. Throws RangeError if its settings differ from these.
   * The state's rows are put in the engine's slot order one row at a time (fastFft.ts).
   */
  merge(state: SpectrogramState): void {
    if (state.fftLength !== this.fftLength || state.rowCount !== this.rowCount || state.frameCount !== this.frameCount
      || state.sampleRateHz !== this.sampleRateHz || state.window !== this.window
      || state.powerSum.length !== this.rowCount * this.fftLength || state.powerMax.length !== state.powerSum.length
      || state.framesPerRow.length !== this.rowCount) {
      throw new RangeError(
        `spectrogram state (${state.fftLength} × ${state.rowCount} rows of ${state.frameCount} frames, ${state.window}) `
        + `does not match (${this.fftLength} × ${this.rowCount} rows of ${this.frameCount} frames, ${this.window})`,
      );
    }
    // Row by row through one row of scratch: no second R × N copy of the state.
    const l = this.fftLength;
    const layout = this.engine.layout;
    const sum = new Float32Array(l);
    const max = new Float32Array(l);
    for (let base = 0; base < state.powerSum.length; base += l) {
      naturalToSlots(layout, state.powerSum, base, sum, 0);
      naturalToSlots(layout, state.powerMax, base, max, 0);
      const ownSum = this.powerSum.view();
      const ownMax = this.powerMax.view();
      for (let j = 0; j < l; j++) {
        ownSum[base + j] = (ownSum[base + j] as number) + (sum[j] as number);
        if ((max[j] as number) > (ownMax[base + j] as number)) ownMax[base + j] = max[j] as number;
      }
    }
    for (let r = 0; r < this.rowCount; r++) {
      this.framesPerRow[r] = (this.framesPerRow[r] as number) + (state.framesPerRow[r] as number);
    }
  }

  /** The rows of everything pushed and merged so far (the accumulator stays usable). */
  finish(): Spectrogram {
    const l = this.fftLength;
    const rows = this.rowCount;
    const scale = 1 / (this.sampleRateHz * windowPowerSum(this.windowValues));
    const meanPerHz = new Float32Array(rows * l);
    const maxPerHz = new Float32Array(rows * l);
    const rowStartS = new Float64Array(rows);
    const rowStopS = new Float64Array(rows);
    const powerSum = this.powerSum.view();
    const powerMax = this.powerMax.view();
    const frameS = l / this.sampleRateHz;
    for (let r = 0; r < rows; r++) {
      const count = this.framesPerRow[r] as number;
      const meanScale = count > 0 ? scale / count : 0;
      const base = r * l;
      const binSlot = this.engine.layout.binSlot;
      for (let i = 0; i < l; i++) {
        const b = base + (binSlot[naturalBinIndex(i, l)] as number);
        meanPerHz[base + i] = meanScale * ((powerSum[b] ?? 0) as number);
        maxPerHz[base + i] = scale * ((powerMax[b] ?? 0) as number);
      }
      rowStartS[r] = Math.ceil((r * this.frameCount) / rows) * frameS;
      rowStopS[r] = Math.ceil(((r + 1) * this.frameCount) / rows) * frameS;
    }
    return {
      rowCount: rows, fftLength: l, sampleRateHz: this.sampleRateHz, binWidthHz: this.sampleRateHz / l,
      window: this.window, meanPerHz, maxPerHz, framesPerRow: this.framesPerRow.slice(), rowStartS, rowStopS,
    };
  }

  /** A copy of R rows of N values with each row permuted by `reorder` (slot ↔ natural order). */
  private rows(store: FloatStore, reorder: typeof slotsToNatural): Float32Array {
    const l = this.fftLength;
    const values = store.view();
    const out = new Float32Array(this.rowCount * l);
    if (values.length === 0) return out;
    for (let base = 0; base < values.length; base += l) reorder(this.engine.layout, values, base, out, base);
    return out;
  }
}
