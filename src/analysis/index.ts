export { runPass1, PASS1_DEFAULTS } from "./pass1.js";
export type { Pass1Options, Pass1Result, NoiseFloor } from "./pass1.js";
export type { SpectrumPeak } from "./spectrumPeak.js";
export { wholeSpanFigures, WholeSpanAccumulator, WHOLE_SPAN_DEFAULTS } from "./wholeSpan.js";
export type { WholeSpanOptions, WholeSpanFigures, DeviationPeak, HoldSpectra } from "./wholeSpan.js";
