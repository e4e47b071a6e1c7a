/**
 * Blind detection of every emission in a wideband capture from the figures of pass 1: the
 * spectrogram rows (src/dsp/spectrogram.ts), the Welch PSD and the health figures.
 *
 * 1. The floor per bin and its error (noiseFloorPerBin.ts).
 * 2. Per row of K frames, the seed factor for the per-cell false-alarm probability `pfa` and the
 *    grow factor for `growPfa`, the floor's error included (rowThreshold.ts, docs/methods.md).
 * 3. Hysteresis regions connected in frequency and time (hysteresisRegions.ts), gathered into
 *    emissions (mergeRegions.ts), sidebands cut off from their carrier joined (sidebandTriple.ts).
 * 4. Each emission's 99 % bandwidth (emissionBandwidth.ts), bursts, duty cycle and levels
 *    (burstTiming.ts); specks below `minBandwidthHz` or `minDurationS` (summed burst length) dropped.
 * 5. Receiver artefacts marked (markArtefacts.ts).
 * The expected number of false seed cells in noise alone is Σ_rows N·pfa = cells·pfa, an upper
 * bound on the expected number of false regions (each needs a seed).
 * Memory: the spectrogram (read in place) plus an Int32 label and an Int32 queue entry a cell and
 * R bytes an emission: O(R × N), whatever the capture's length.
 */
import { DB_CEILING, noiseFloor, powerToDb, type HealthFigures, type Spectrogram, type WelchPsd } from "../dsp/index.js";
import { ParameterError } from "../errors.js";
import { detectDcSpike, mainLobeHalfWidthBins } from "../measure/index.js";
import { burstTiming } from "./burstTiming.js";
import type { DetectedEmission } from "./detectedEmission.js";
import { emissionBandwidth, floorAt } from "./emissionBandwidth.js";
import { hysteresisRegions } from "./hysteresisRegions.js";
import { markArtefacts } from "./markArtefacts.js";
import { mergeRegions, unionGroups, type RegionGroup } from "./mergeRegions.js";
import { binPowerCorrelation, noiseFloorPerBin, type NoiseFloorPerBin, type NoiseFloorPerBinOptions } from "./noiseFloorPerBin.js";
import { rowThresholdFactor } from "./rowThreshold.js";
import { sidebandTriple } from "./sidebandTriple.js";

/** The figures of pass 1 that detection reads (a Pass1Result has them all). */
export interface SurveyInput {
  readonly spectrogram: Spectrogram;
  readonly psd: WelchPsd;
  readonly health: HealthFigures;
}

/** Options of detectEmissions, defaults in DETECT_EMISSIONS_DEFAULTS. */
export interface DetectEmissionsOptions {
  /** False-alarm probability per spectrogram cell of the seed threshold, (0, 1). */
  readonly pfa?: number;
  /** False-alarm probability per cell of the grow threshold, [pfa, 1). */
  readonly growPfa?: number;
  /** Emissions narrower than this (99 % bandwidth), Hz, are dropped. */
  readonly minBandwidthHz?: number;
  /** Emissions on for less than this in all, s, are dropped. */
  readonly minDurationS?: number;
  /** Fragments this far apart in frequency (empty bins between them) are joined, Hz; default the window's main-lobe half-width. */
  readonly mergeGapHz?: number;
  /** Allowed difference between an image's level below its emission and the image rejection ratio, dB. */
  readonly imageToleranceDb?: number;
  readonly floor?: NoiseFloorPerBinOptions;
}

export const DETECT_EMISSIONS_DEFAULTS = { pfa: 1e-6, growPfa: 1e-3, minBandwidthHz: 0, minDurationS: 0, imageToleranceDb: 3 } as const;

/** The thresholds used for rows of `frames` frames: factors over the floor. */
export interface RowThreshold {
  readonly frames: number;
  readonly seedFactor: number;
  readonly growFactor: number;
}

/** What detectEmissions found, and how. */
export interface Detection {
  /** Emissions and artefacts (artefact ≠ null), in order of offsetHz. */
  readonly emissions: readonly DetectedEmission[];
  readonly floor: NoiseFloorPerBin;
  readonly thresholds: readonly RowThreshold[];
  /** cells · pfa: the expected number of false seed cells in noise alone. */
  readonly expectedFalseSeeds: number;
  readonly warnings: readonly string[];
}

/** Finds the emissions of `input` (module comment). Throws ParameterError for options out of bounds. */
export function detectEmissions(input: SurveyInput, options: DetectEmissionsOptions = {}): Detection {
  const s = input.spectrogram;
  const o = checkedOptions(options, s);
  const floor = noiseFloorPerBin(s, o.floor);
  const { seed, grow, thresholds } = rowFactors(s, o.pfa, o.growPfa, floor);
  const map = hysteresisRegions(s, floor.floorPerHz, seed, grow);
  const groups = mergeRegions(map, s.rowCount, s.fftLength, Math.round(o.mergeGapHz / s.binWidthHz));
  const figures = joinSidebands(input, floor, groups)
    .filter((e) => e.bandwidthHz >= o.minBandwidthHz && onDurationS(e) >= o.minDurationS)
    .sort((a, b) => a.offsetHz - b.offsetHz)
    .map((e, i) => ({ ...e, id: i + 1 }));
  const psdFloor = noiseFloor(input.psd).densityPerHz;
  const dc = detectDcSpike(input.psd, psdFloor, { dcOffsetDbfs: input.health.dcOffsetDbfs });
  const emissions = markArtefacts(figures, {
    dcSpikePresent: dc.present, imageRejectionDb: input.health.imageRejectionDb, binWidthHz: s.binWidthHz,
    rowDurationS: typicalRowS(s), toleranceDb: o.imageToleranceDb,
  });
  let cells = 0;
  for (let r = 0; r < s.rowCount; r++) if ((s.framesPerRow[r] as number) > 0) cells += s.fftLength;
  const warnings = map.regions.length > 10_000 ? [`${map.regions.length} regions above the threshold: the floor may be wrong`] : [];
  return { emissions, floor, thresholds, expectedFalseSeeds: cells * o.pfa, warnings };
}

/** The figures of every group, sideband triples (sidebandTriple.ts) joined until none is left. */
function joinSidebands(input: SurveyInput, floor: NoiseFloorPerBin, groups: RegionGroup[]): DetectedEmission[] {
  const s = input.spectrogram;
  let figures = groups.map((g) => emissionFigures(input, floor, g));
  for (;;) {
    const triple = sidebandTriple(figures, s.binWidthHz, typicalRowS(s));
    if (triple === null) return figures;
    const joined = unionGroups(triple.map((i) => groups[i] as RegionGroup));
    groups = [joined, ...groups.filter((_, i) => !triple.includes(i))];
    figures = [emissionFigures(input, floor, joined), ...figures.filter((_, i) => !triple.includes(i))];
  }
}

function checkedOptions(options: DetectEmissionsOptions, s: Spectrogram) {
  const pfa = options.pfa ?? DETECT_EMISSIONS_DEFAULTS.pfa;
  const growPfa = options.growPfa ?? DETECT_EMISSIONS_DEFAULTS.growPfa;
  if (!(pfa > 0 && pfa < 1)) throw new ParameterError("pfa", `${pfa} is not a probability between 0 and 1`);
  if (!(growPfa >= pfa && growPfa < 1)) throw new ParameterError("growPfa", `${growPfa} must lie in [pfa ${pfa}, 1)`);
  const minBandwidthHz = options.minBandwidthHz ?? DETECT_EMISSIONS_DEFAULTS.minBandwidthHz;
  const minDurationS = options.minDurationS ?? DETECT_EMISSIONS_DEFAULTS.minDurationS;
  if (!(minBandwidthHz >= 0) || !Number.isFinite(minBandwidthHz)) throw new ParameterError("minBandwidthHz", `${minBandwidthHz} must be a finite number ≥ 0`);
  if (!(minDurationS >= 0) || !Number.isFinite(minDurationS)) throw new ParameterError("minDurationS", `${minDurationS} must be a finite number ≥ 0`);
  const lobe = mainLobeHalfWidthBins({ window: s.window } as WelchPsd);
  const mergeGapHz = options.mergeGapHz ?? lobe * s.binWidthHz;
  if (!(mergeGapHz >= 0) || !Number.isFinite(mergeGapHz)) throw new ParameterError("mergeGapHz", `${mergeGapHz} must be a finite number ≥ 0`);
  const imageToleranceDb = options.imageToleranceDb ?? DETECT_EMISSIONS_DEFAULTS.imageToleranceDb;
  return { pfa, growPfa, minBandwidthHz, minDurationS, mergeGapHz, imageToleranceDb, floor: options.floor ?? {} };
}

/** Seed and grow factors for every row, computed once per distinct frame count. */
function rowFactors(s: Spectrogram, pfa: number, growPfa: number, floor: NoiseFloorPerBin) {
  const seed = new Float64Array(s.rowCount);
  const grow = new Float64Array(s.rowCount);
  const byFrames = new Map<number, RowThreshold>();
  for (let r = 0; r < s.rowCount; r++) {
    const k = s.framesPerRow[r] as number;
    if (k === 0) continue;
    let t = byFrames.get(k);
    if (t === undefined) {
      t = { frames: k, seedFactor: rowThresholdFactor(k, pfa, floor.error), growFactor: rowThresholdFactor(k, growPfa, floor.error) };
      byFrames.set(k, t);
    }
    seed[r] = t.seedFactor;
    grow[r] = t.growFactor;
  }
  return { seed, grow, thresholds: [...byFrames.values()].sort((a, b) => a.frames - b.frames) };
}

function typicalRowS(s: Spectrogram): number {
  let longest = 0;
  for (let r = 0; r < s.rowCount; r++) longest = Math.max(longest, (s.rowStopS[r] as number) - (s.rowStartS[r] as number));
  return longest;
}

function onDurationS(e: DetectedEmission): number {
  return ((e.endS - e.startS) * e.dutyCyclePercent) / 100;
}

/** The figures of one group (id 0 until numbered). */
function emissionFigures(input: SurveyInput, floor: NoiseFloorPerBin, g: RegionGroup): DetectedEmission {
  const s = input.spectrogram;
  const floorPerHz = floor.floorPerHz;
  const df = s.binWidthHz;
  const detectedLowerHz = (g.binFirst - s.fftLength / 2 - 0.5) * df;
  const detectedUpperHz = (g.binLast - s.fftLength / 2 + 0.5) * df;
  const margin = (mainLobeHalfWidthBins(input.psd) + 1) * df;
  const obw = emissionBandwidth(input.psd, s, floorPerHz, detectedLowerHz - margin, detectedUpperHz + margin);
  const lower = obw.lowerEdgeHz.value ?? detectedLowerHz;
  const upper = obw.upperEdgeHz.value ?? detectedUpperHz;
  const timing = burstTiming(s, floorPerHz, g.binFirst, g.binLast, g.onRows);
  let floorSum = 0;
  let floorCount = 0;
  for (let f = lower; f <= upper; f += input.psd.binWidthHz) {
    floorSum += floorAt(s, floorPerHz, f);
    floorCount++;
  }
  const noiseInBand = floorCount > 0 ? (floorSum / floorCount) * (upper - lower) : 0;
  const u = powerUncertaintyDb(s, floor, g, timing.onPower, timing.onRowCount);
  const floorDb = 10 * Math.log10(1 + Math.abs(floor.error.biasRel) + 2 * floor.error.sdRel);
  return {
    id: 0,
    offsetHz: (lower + upper) / 2,
    offsetUncertaintyHz: 0.5 * Math.hypot(obw.lowerEdgeHz.uncertainty ?? df, obw.upperEdgeHz.uncertainty ?? df),
    lowerEdgeHz: lower,
    upperEdgeHz: upper,
    bandwidthHz: upper - lower,
    bandwidthUncertaintyHz: obw.occupiedHz.uncertainty ?? 2 * df,
    detectedLowerHz,
    detectedUpperHz,
    startS: timing.startS,
    endS: timing.endS,
    timeUncertaintyS: typicalRowS(s),
    burstCount: timing.burstCount,
    dutyCyclePercent: timing.dutyCyclePercent,
    dutyCycleUncertaintyPercent: Math.min(100, (100 * timing.burstCount * typicalRowS(s)) / Math.max(timing.endS - timing.startS, typicalRowS(s))),
    powerDbfs: powerToDb(timing.onPower),
    powerUncertaintyDb: u,
    peakDbfs: powerToDb(timing.peakPower),
    snrDb: noiseInBand > 0 ? powerToDb(timing.onPower / noiseInBand) : powerToDb(0),
    snrUncertaintyDb: u + floorDb,
    artefact: null,
    mirrorOfId: null,
  };
}

/**
 * Expanded (k = 2) uncertainty of the power while on, dB: twice the standard deviation of the mean
 * of n row powers of noise, Δf·√(c·Σ_b S_b²/K)/√n (c = 1 + 2·Σ_{d≥1} ρ_d for the correlation of
 * neighbouring bins, noiseFloorPerBin.ts; Hann 1.94), plus the floor's error on the noise under the
 * detected bins, (|b| + 2σ)·Σ_b S_b·Δf (a one-sided bias, added, not in quadrature). Skirts below
 * the grow threshold, left out of the detected bins, are not in it.
 */
function powerUncertaintyDb(s: Spectrogram, floor: NoiseFloorPerBin, g: RegionGroup, onPower: number, onRows: number): number {
  const rho = binPowerCorrelation(s.window, s.fftLength, 8);
  let c = 1;
  for (let d = 1; d < rho.length; d++) c += 2 * (rho[d] as number);
  let sumSq = 0;
  let sum = 0;
  for (let b = g.binFirst; b <= g.binLast; b++) {
    sumSq += (floor.floorPerHz[b] as number) ** 2;
    sum += floor.floorPerHz[b] as number;
  }
  const statistical = (2 * s.binWidthHz * Math.sqrt((c * sumSq) / floor.framesPerRow)) / Math.sqrt(Math.max(1, onRows));
  const floorPart = (Math.abs(floor.error.biasRel) + 2 * floor.error.sdRel) * sum * s.binWidthHz;
  return onPower > 0 ? 10 * Math.log10(1 + (statistical + floorPart) / onPower) : DB_CEILING;
}
