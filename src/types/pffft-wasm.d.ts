// Type declarations for @echogarden/pffft-wasm 0.4.x (the package ships none): the Emscripten
// factory. Only dsp/fft.ts imports it; dsp/fastFft.ts types the module it resolves to.
declare module "@echogarden/pffft-wasm/simd" {
  const factory: (options?: Record<string, unknown>) => Promise<unknown>;
  export default factory;
}
