/**
 * Worker thread of pass 1: owns one Pass1Engine, processes the blocks it is sent, hands each
 * block's buffer back for reuse (so memory stays a fixed pool), and returns its state at the end.
 */
import { parentPort, workerData } from "node:worker_threads";
import { Pass1Engine, type Pass1Config } from "./pass1Engine.js";
import type { WorkerRequest, WorkerReply } from "./workerMessages.js";

const port = parentPort;
if (port === null) throw new Error("pass1Worker must run in a worker thread");
const engine = new Pass1Engine(workerData as Pass1Config);

port.on("message", (message: WorkerRequest) => {
  if (message.type === "block") {
    const raw = new Uint8Array(message.buffer, message.byteOffset, message.byteLength);
    engine.processBlock(raw, message.prefixFrames, message.ownedStart);
    const reply: WorkerReply = { type: "done", buffer: message.buffer };
    port.postMessage(reply, [message.buffer]);
  } else {
    // The engine is done: its own arrays are handed over (transferred, neither copied nor cloned).
    const state = engine.release();
    const reply: WorkerReply = { type: "state", state };
    port.postMessage(reply, transferables(state));
  }
});

function transferables(state: ReturnType<Pass1Engine["release"]>): ArrayBuffer[] {
  const arrays = [state.welch.powerSum, state.welch.powerMax, state.spectrogram.powerSum, state.spectrogram.powerMax, state.spectrogram.framesPerRow];
  return arrays.map((a) => a.buffer as ArrayBuffer);
}
