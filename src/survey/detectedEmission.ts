/** One emission found by detectEmissions. Frequencies are offsets from the capture centre. */
export interface DetectedEmission {
  /** 1, 2, … in order of offsetHz. */
  readonly id: number;
  /** Centre of the 99 % occupied band, (lowerEdgeHz + upperEdgeHz)/2. */
  readonly offsetHz: number;
  /** Expanded (k = 2) uncertainty of offsetHz: the edges' uncertainties in quadrature, halved. */
  readonly offsetUncertaintyHz: number;
  /** Edges of the 99 % occupied band (ITU-R SM.328) in the Welch PSD. */
  readonly lowerEdgeHz: number;
  readonly upperEdgeHz: number;
  readonly bandwidthHz: number;
  readonly bandwidthUncertaintyHz: number;
  /** Extent of the detected cells, spectrogram bin edges. */
  readonly detectedLowerHz: number;
  readonly detectedUpperHz: number;
  /** First burst's start and last burst's end, s from the first sample of the span. */
  readonly startS: number;
  readonly endS: number;
  /** Allowed error of startS and endS: one spectrogram row. */
  readonly timeUncertaintyS: number;
  readonly burstCount: number;
  /** Summed burst lengths over endS − startS, %. */
  readonly dutyCyclePercent: number;
  /** Bound on the duty cycle's error: one row per burst over the span, %. */
  readonly dutyCycleUncertaintyPercent: number;
  /** Mean channel power while on, over the detected bins, floor removed. */
  readonly powerDbfs: number;
  /** Expanded (k = 2) uncertainty of powerDbfs from the rows' noise and the floor's error (detectEmissions.ts). */
  readonly powerUncertaintyDb: number;
  /** Highest channel power of one spectrogram row. */
  readonly peakDbfs: number;
  /** Power while on over the floor's power in the 99 % band, dB. */
  readonly snrDb: number;
  /** powerUncertaintyDb plus the floor's error in the denominator, dB. */
  readonly snrUncertaintyDb: number;
  readonly artefact: null | "dc" | "image";
  /** For an image: the id of the emission it mirrors; else null. */
  readonly mirrorOfId: number | null;
}
