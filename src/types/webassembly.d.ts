// The few WebAssembly JS-API declarations dsp/fft.ts, dsp/frameKernels.ts and dsp/chainKernels.ts use (the ES2022 lib
// has none, and the DOM lib is not wanted in a Node tool). WebAssembly JS API, W3C.
declare namespace WebAssembly {
  class Memory {
    constructor(descriptor: { initial: number; maximum?: number });
    readonly buffer: ArrayBuffer;
    grow(pages: number): number;
  }
  class Module {
    constructor(bytes: ArrayBufferView | ArrayBuffer);
  }
  class Instance {
    constructor(module: Module, imports?: Record<string, Record<string, unknown>>);
    readonly exports: Record<string, unknown>;
  }
}
