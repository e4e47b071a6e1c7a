// Type declarations for fft.js 4.x (the package ships none). Only dsp/fft.ts imports it.
declare module "fft.js" {
  export default class FFT {
    constructor(size: number);
    readonly size: number;
    createComplexArray(): number[];
    toComplexArray(input: ArrayLike<number>, storage?: number[]): number[];
    fromComplexArray(complex: ArrayLike<number>, storage?: number[]): number[];
    completeSpectrum(spectrum: number[]): void;
    /** Forward complex transform, interleaved re/im, unscaled. */
    transform(out: number[], data: ArrayLike<number>): void;
    realTransform(out: number[], data: ArrayLike<number>): void;
    /** Inverse complex transform, scaled by 1/N. */
    inverseTransform(out: number[], data: ArrayLike<number>): void;
  }
}
