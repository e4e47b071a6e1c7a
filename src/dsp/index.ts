export {
  fftPlan, fastFft, fftImplementation, pffftAvailable, setFftImplementation, sampleStore, kernelScrub, isFftSize, naturalBinIndex,
  toCentredOrder, transformInPlace, slotsToNatural, naturalToSlots, type FftPlan, type FastFft, type FftChoice,
  type FftImplementation, type FloatStore, type DoubleStore, type FrameWindow, type HeldSpectrum, type SpectrumLayout,
} from "./fft.js";
export {
  WINDOW_NAMES, isWindowName, windowCoefficients, coherentGain, enbwBins, windowPowerSum, type WindowName,
} from "./windows.js";
export { DB_FLOOR, DB_CEILING, powerToDb, dbToPower } from "./db.js";
export { frameGrid, wholeFrameCount, framesInBlock, checkBlock, type FrameGrid, type FrameRange } from "./frameGrid.js";
export { WelchAccumulator, binFrequencyHz, type WelchPsd, type WelchOptions, type WelchState } from "./welch.js";
export {
  SpectrogramAccumulator, type Spectrogram, type SpectrogramOptions, type SpectrogramState,
} from "./spectrogram.js";
export {
  HealthAccumulator, healthFigures, imageRejectionRatioDb, type HealthFigures, type HealthState,
} from "./health.js";
export {
  noiseFloor, equivalentDegreesOfFreedom, chiSquareQuantileOverNu, standardNormalQuantile,
  NOISE_FLOOR_DEFAULTS, type NoiseFloor, type NoiseFloorOptions,
} from "./noiseFloor.js";
export {
  designLowpass, firResponse, kaiserBeta, kaiserTapCount, besselI0, MAX_TAP_COUNT, type LowpassSpec,
} from "./firDesign.js";
export { Nco } from "./nco.js";
export { PolyphaseDecimator } from "./polyphaseDecimator.js";
export {
  ChannelExtractor, CHANNEL_EXTRACTOR_DEFAULTS, MIN_RATE_OVER_BANDWIDTH, type ChannelExtractorOptions,
} from "./channelExtractor.js";
export {
  constellation, qamGrid, CONSTELLATION_KINDS, CONSTELLATION_ORDER, type ConstellationKind,
} from "./constellations.js";
export { rootRaisedCosine, rootRaisedCosineTaps } from "./rootRaisedCosine.js";
export {
  MultiChannelizer, MULTI_CHANNELIZER_DEFAULTS, MIN_CHANNEL_RATE_OVER_BANDWIDTH, MAX_DECIMATION, MAX_FFT_SIZE,
  DESIGN_MARGIN_DB, toneLeakage, type ChannelSpec, type ChannelInfo, type MultiChannelizerOptions,
} from "./multiChannelizer.js";
export { StreamingFirPair, type FirSink } from "./streamingFir.js";
export {
  SpectrumHoldAccumulator, holdFrameLength, type SpectrumHold, type SpectrumHoldOptions,
} from "./spectrumHold.js";
