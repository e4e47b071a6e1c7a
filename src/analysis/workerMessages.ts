/** Messages between pass 1 and its worker threads. */
import type { Pass1EngineState } from "./pass1Engine.js";

export type WorkerRequest =
  | {
      readonly type: "block";
      readonly buffer: ArrayBuffer;
      readonly byteOffset: number;
      readonly byteLength: number;
      readonly prefixFrames: number;
      readonly ownedStart: number;
    }
  | { readonly type: "finish" };

export type WorkerReply =
  | { readonly type: "done"; readonly buffer: ArrayBuffer }
  | { readonly type: "state"; readonly state: Pass1EngineState };
