/**
 * The inner loops shared by the Welch, spectrogram and max-hold accumulators (not part of the
 * public surface). Kept as small monomorphic functions: V8 optimises them once, for one set of
 * types. The frame is windowed straight into the fast engine's time buffer, and the power is
 * summed from its spectrum buffer in the engine's slot order (fastFft.ts): no copy per frame.
 */
import type { DoubleStore, FastFft, FrameWindow } from "./fastFft.js";

/**
 * Windows `count` consecutive frames of `iq` (interleaved float32) and adds their periodograms
 * |X_k|² (unscaled, in the engine's slot order) into sum[base + j], keeping the per-slot maximum
 * in max[base + j]. Frame f starts at complex sample `firstSample + f·hop` of `iq`. The window
 * and stores are the engine's own (prepareWindow, createStore).
 */
export function accumulateFrames(
  engine: FastFft,
  iq: Float32Array,
  firstSample: number,
  count: number,
  hop: number,
  window: FrameWindow,
  sum: DoubleStore,
  max: DoubleStore | null,
  base: number,
): void {
  for (let f = 0; f < count; f++) {
    engine.loadWindowed(iq, firstSample + f * hop, window);
    engine.forward();
    engine.addPower(sum, max, base);
  }
}
