// The public surface of src/capture: re-exports only.
export * from "./source.js";
export * from "./sampleFormat.js";
export * from "./wavWriter.js";
