/**
 * Worker thread of pass 1: owns one Pass1Engine, processes the blocks it is sent, hands each
 * block's buffer back for reuse (so memory stays a fixed pool), and at the end either returns
 * its state or merges the other workers' states into its own and returns the figures.
 */
import { parentPort, workerData } from "node:worker_threads";
import { Pass1Engine, type Pass1Config } from "./pass1Engine.js";
import { channelReply, figureBuffers, stateBuffers, type WorkerRequest, type WorkerReply } from "./workerMessages.js";

const port = parentPort;
if (port === null) throw new Error("pass1Worker must run in a worker thread");
const engine = new Pass1Engine(workerData as Pass1Config);

port.on("message", (message: WorkerRequest) => {
  if (message.type === "block") {
    const raw = new Uint8Array(message.buffer, message.byteOffset, message.byteLength);
    const channel = channelReply(engine.processBlock(raw, message.prefixFrames, message.ownedStart), message.buffer);
    const reply: WorkerReply = { type: "done", buffer: message.buffer, channel };
    port.postMessage(reply, channel?.iq == null ? [message.buffer] : [message.buffer, channel.iq.buffer as ArrayBuffer]);
  } else if (message.type === "finish") {
    // The engine is done: its state is copied out of the engine's memory once and transferred.
    const state = engine.snapshot();
    const reply: WorkerReply = { type: "state", state };
    port.postMessage(reply, stateBuffers(state));
  } else {
    // Merged here, so that the states' arrays die with this worker instead of lingering as
    // garbage in the main thread; only the figures go back.
    for (const state of message.states) engine.merge(state);
    const figures = engine.finish();
    const reply: WorkerReply = { type: "figures", figures };
    port.postMessage(reply, figureBuffers(figures));
  }
});
