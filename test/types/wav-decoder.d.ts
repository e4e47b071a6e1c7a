// Types for wav-decoder 1.3.0 (it ships none), used by the tests as the reference WAV decoder.
declare module "wav-decoder" {
  interface AudioData {
    readonly sampleRate: number;
    readonly numberOfChannels: number;
    readonly length: number;
    readonly channelData: Float32Array[];
  }
  interface DecodeOptions {
    /** Divide by 2^(bits−1) (8-bit: (u − 127.5)/127.5) instead of the asymmetric default. */
    readonly symmetric?: boolean;
  }
  interface Decode {
    (buffer: ArrayBuffer | Uint8Array, options?: DecodeOptions): Promise<AudioData>;
    sync(buffer: ArrayBuffer | Uint8Array, options?: DecodeOptions): AudioData;
  }
  const WavDecoder: { readonly decode: Decode };
  export default WavDecoder;
}
