/**
 * The frame grid shared by every frame-based accumulator, and the block contract.
 *
 * Sample indices count from the first sample of the analysed span (index 0). Frames of length L
 * start every hop H samples, at s = k·H for frame number k = 0, 1, 2, ... A block holds samples
 * [dataStart, dataStart + n) and owns the samples from `ownedStart` on; the orchestrator gives
 * each block a prefix of at least L samples before `ownedStart`. A block processes frame k when
 * the frame lies wholly inside the block (s ≥ dataStart, s + L ≤ dataStart + n) and its end is
 * owned by the block (s + L > ownedStart). With contiguous owned ranges and full prefixes, every
 * whole frame of the span is then processed by exactly one block, whatever the block sizes; a
 * trailing incomplete frame is dropped, as in Welch's method.
 */

/** Frame length L and hop H, in samples. */
export interface FrameGrid {
  readonly frameLength: number;
  readonly hopLength: number;
}

/** The frames a block processes: numbers firstFrame .. firstFrame + frameCount − 1. */
export interface FrameRange {
  readonly firstFrame: number;
  readonly frameCount: number;
}

/** A checked grid. Throws RangeError unless L and H are positive integers. */
export function frameGrid(frameLength: number, hopLength: number): FrameGrid {
  if (!Number.isInteger(frameLength) || frameLength < 1) {
    throw new RangeError(`frameLength ${frameLength} is not a positive integer`);
  }
  if (!Number.isInteger(hopLength) || hopLength < 1) {
    throw new RangeError(`hopLength ${hopLength} is not a positive integer`);
  }
  return { frameLength, hopLength };
}

/** Whole frames in a span of `sampleCount` samples: floor((n − L)/H) + 1, or 0 when n < L. */
export function wholeFrameCount(grid: FrameGrid, sampleCount: number): number {
  if (sampleCount < grid.frameLength) return 0;
  return Math.floor((sampleCount - grid.frameLength) / grid.hopLength) + 1;
}

/**
 * The frames of the grid that the block [dataStart, dataStart + sampleCount), owning samples
 * from ownedStart on, must process (see the module comment):
 * k ≥ ceil(dataStart/H), k ≥ floor((ownedStart − L)/H) + 1, k ≤ floor((dataStart + n − L)/H).
 */
export function framesInBlock(
  grid: FrameGrid,
  dataStart: number,
  sampleCount: number,
  ownedStart: number,
): FrameRange {
  const { frameLength: l, hopLength: h } = grid;
  const first = Math.max(0, Math.ceil(dataStart / h), Math.floor((ownedStart - l) / h) + 1);
  const end = dataStart + sampleCount - l;
  if (end < 0) return { firstFrame: first, frameCount: 0 };
  const last = Math.floor(end / h);
  return { firstFrame: first, frameCount: Math.max(0, last - first + 1) };
}

/**
 * Checks the arguments of a `push(iq, dataStart, ownedStart)` call and returns the number of
 * complex samples in `iq`. Throws RangeError for an odd-length `iq`, a dataStart that is not a
 * non-negative integer, or an ownedStart outside [dataStart, dataStart + n].
 */
export function checkBlock(iq: Float32Array, dataStart: number, ownedStart: number): number {
  if (iq.length % 2 !== 0) {
    throw new RangeError(`iq holds ${iq.length} values, not a whole number of I,Q pairs`);
  }
  const n = iq.length / 2;
  if (!Number.isInteger(dataStart) || dataStart < 0) {
    throw new RangeError(`dataStart ${dataStart} is not a non-negative integer`);
  }
  if (!Number.isInteger(ownedStart) || ownedStart < dataStart || ownedStart > dataStart + n) {
    throw new RangeError(`ownedStart ${ownedStart} lies outside the block [${dataStart}, ${dataStart + n}]`);
  }
  return n;
}
