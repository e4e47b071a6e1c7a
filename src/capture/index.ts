// The public surface of src/capture: re-exports only.
export * from "./source.js";
export * from "./sampleFormat.js";
export * from "./wavWriter.js";
export { openCapture } from "./openCapture.js";
export { checkCaptureOptions, type CaptureOptions } from "./captureOptions.js";
export { resolveSpan } from "./span.js";
export { DEFAULT_BLOCK_SAMPLES, fileSource } from "./fileSource.js";
export { extensionKind, fileExtension, fileNameTokens, type ExtensionKind, type FileNameTokens } from "./fileName.js";
export { parseSigmfMeta, type SigmfRecording } from "./sigmf.js";
export { parseSigmfDatatype, type SigmfDatatype } from "./sigmfDatatype.js";
export { isWavMagic, walkWavChunks, type WavChunk, type WavLayout } from "./wavChunks.js";
export { parseWavFmt, type WavFmt } from "./wavFmt.js";
