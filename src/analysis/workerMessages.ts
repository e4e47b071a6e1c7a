/** Messages between pass 1 and its worker threads, and their transfer lists. */
import type { HealthFigures, Spectrogram, WelchPsd } from "../dsp/index.js";
import type { ChannelChunk, Pass1EngineState } from "./pass1Engine.js";

/** What pass 1 computes from its accumulators. */
export interface Pass1Figures {
  readonly psd: WelchPsd;
  readonly spectrogram: Spectrogram;
  readonly health: HealthFigures;
}

export type WorkerRequest =
  | {
      readonly type: "block";
      readonly buffer: ArrayBuffer;
      readonly byteOffset: number;
      readonly byteLength: number;
      readonly prefixFrames: number;
      readonly ownedStart: number;
    }
  | { readonly type: "finish" }
  /** Merge the other workers' states into this worker's engine and reply with the figures;
   * `discard` are buffers handed over only to be freed with the worker. */
  | { readonly type: "mergeAndFinish"; readonly states: readonly Pass1EngineState[]; readonly discard: readonly ArrayBuffer[] };

export interface ChannelReply {
  readonly firstOutput: number;
  readonly floats: number;
  readonly iq: Float32Array | null;
}

/**
 * The reply of a block: its channel samples go back in the block's own buffer (its raw bytes are
 * decoded and no longer needed), so that a block allocates nothing; a copy where they do not fit.
 */
export function channelReply(chunk: ChannelChunk | null, buffer: ArrayBuffer): ChannelReply | null {
  if (chunk === null) return null;
  const floats = chunk.iq.length;
  if (4 * floats > buffer.byteLength) return { firstOutput: chunk.firstOutput, floats, iq: chunk.iq.slice() };
  new Float32Array(buffer, 0, floats).set(chunk.iq);
  return { firstOutput: chunk.firstOutput, floats, iq: null };
}

/** The chunk a reply carries: a view into the block's buffer (valid until the buffer is reused) or its copy. */
export function channelChunk(reply: ChannelReply, buffer: ArrayBuffer): ChannelChunk {
  return { firstOutput: reply.firstOutput, iq: reply.iq ?? new Float32Array(buffer, 0, reply.floats) };
}

export type WorkerReply =
  /** `channel`: the block's channel samples, in `buffer` from byte 0 on (`floats` floats), or in `iq` where they do not fit. */
  | { readonly type: "done"; readonly buffer: ArrayBuffer; readonly channel: ChannelReply | null }
  | { readonly type: "state"; readonly state: Pass1EngineState }
  | { readonly type: "figures"; readonly figures: Pass1Figures };

/** The buffers of an engine state's arrays, to transfer it (neither copied nor cloned). */
export function stateBuffers(state: Pass1EngineState): ArrayBuffer[] {
  const { welch, spectrogram } = state;
  return buffersOf([welch.powerSum, welch.powerMax, spectrogram.powerSum, spectrogram.powerMax, spectrogram.framesPerRow]);
}

/** The buffers of the figures' arrays, to transfer them. */
export function figureBuffers(figures: Pass1Figures): ArrayBuffer[] {
  const { psd, spectrogram: s } = figures;
  return buffersOf([psd.densityPerHz, psd.maxHoldPerHz, s.meanPerHz, s.maxPerHz, s.framesPerRow, s.rowStartS, s.rowStopS]);
}

/** The distinct buffers under `arrays` (a transfer list may name each only once). */
function buffersOf(arrays: readonly ArrayBufferView[]): ArrayBuffer[] {
  return [...new Set(arrays.map((a) => a.buffer as ArrayBuffer))];
}
