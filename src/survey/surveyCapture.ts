/**
 * The survey of one capture: every emission found blind in the pass-1 figures
 * (detectEmissions.ts), every emission's channel extracted in one more read of the file (one
 * forward transform a block shared by all channels, MultiChannelizer), and each measured by the
 * `measure` analysis on its own channel over the time it is present (a bursty link inside its
 * bursts, as measureEmission does for any keyed envelope).
 *
 * Both cores: the extraction read is cut in two halves, one worker thread each
 * (extractChannels.ts), and the analyses run in a pool of two workers (analysisPool.ts); the
 * records are shared with the workers, never copied.
 *
 * Memory: the pass-1 figures, the detection's labels (8 bytes a spectrogram cell), per extraction
 * worker a channelizer (at most 8 MiB) and its read block, each channel's record kept up to
 * `maxChannelSamples` (2^20 complex float32 = 8 MiB) over the emission's time span, and per
 * analysis worker what one measurement allocates (docs/architecture.md).
 */
import type { CaptureSource, SampleSpan } from "../capture/index.js";
import type { Pass1Result } from "../analysis/index.js";
import { MEASURE_DEFAULTS } from "../analysis/measureEmission.js";
import type { EmissionFigures } from "../analysis/emissionFigures.js";
import { analysisContext } from "./analysisJob.js";
import { analyseAll, analysisWorkers } from "./analysisPool.js";
import { extractChannels } from "./extractChannels.js";
import { detectEmissions, type Detection, type DetectEmissionsOptions } from "./detectEmissions.js";
import type { DetectedEmission } from "./detectedEmission.js";

/** Options of surveyCapture. */
export interface SurveyOptions extends DetectEmissionsOptions {
  /** Audio bandwidth of the analogue figures, Hz (default 3000, as measure). */
  readonly audioBandwidthHz?: number | undefined;
  /** Most decimated samples kept per channel (default 2^20). */
  readonly maxChannelSamples?: number | undefined;
  /** Worker threads for the extraction read and the analyses (default: 2 on a machine of 2 or more cores; 0 = this thread). */
  readonly workers?: number | undefined;
  /** Input samples of the extraction read done, of the total. */
  readonly onProgress?: ((doneSamples: number, totalSamples: number) => void) | undefined;
}

/** One emission (not an artefact) and its measurement. */
export interface SurveyedEmission {
  readonly emission: DetectedEmission;
  readonly channel: { readonly offsetHz: number; readonly widthHz: number };
  readonly figures: EmissionFigures;
}

export interface SurveyResult {
  readonly detection: Detection;
  readonly measured: readonly SurveyedEmission[];
  readonly warnings: readonly string[];
  /** Wall time of each stage after pass 1, s (for `npm run bench`). */
  readonly timingS: { readonly detection: number; readonly extraction: number; readonly analyses: number };
  /** Worker threads the analyses ran in (0 = the calling thread). */
  readonly analysisWorkers: number;
}

export const SURVEY_DEFAULTS = { maxChannelSamples: 1 << 20 } as const;

/** The survey of `span` (module comment). */
export async function surveyCapture(source: CaptureSource, span: SampleSpan, pass1: Pass1Result, options: SurveyOptions = {}): Promise<SurveyResult> {
  const t0 = performance.now();
  const detection = detectEmissions(pass1, options);
  const t1 = performance.now();
  const fs = source.meta.sampleRateHz;
  const audioHz = options.audioBandwidthHz ?? MEASURE_DEFAULTS.audioBandwidthHz;
  const emissions = detection.emissions.filter((e) => e.artefact === null);
  const channels = emissions.map((e) => channelOf(e, fs, pass1.psd.binWidthHz, audioHz));
  const records = await extractChannels(source, span, emissions, channels, {
    maxChannelSamples: options.maxChannelSamples ?? SURVEY_DEFAULTS.maxChannelSamples, workers: options.workers, onProgress: options.onProgress,
  });
  const t2 = performance.now();
  const jobs = records.map((record, i) => ({ channel: channels[i] as { offsetHz: number; widthHz: number }, record }));
  const workers = analysisWorkers(jobs.length, options.workers);
  const figures = await analyseAll(analysisContext(source.meta, span, pass1, audioHz), jobs, workers);
  const measured: SurveyedEmission[] = emissions.map((emission, i) => ({
    emission, channel: channels[i] as { offsetHz: number; widthHz: number }, figures: figures[i] as EmissionFigures,
  }));
  const t3 = performance.now();
  return { detection, measured, warnings: detection.warnings, timingS: { detection: (t1 - t0) / 1e3, extraction: (t2 - t1) / 1e3, analyses: (t3 - t2) / 1e3 }, analysisWorkers: workers };
}

/**
 * The channel an emission is measured in: its 99 % band × 1.6 for the skirts, at least 2.5 × the
 * audio bandwidth and 16 pass-1 bins (as measure's own channel), inside ±0.45·fs.
 */
function channelOf(e: DetectedEmission, fs: number, binHz: number, audioHz: number): { offsetHz: number; widthHz: number } {
  const wanted = Math.max(1.6 * (e.bandwidthHz ?? 0), 2.5 * audioHz, 16 * binHz);
  const room = 2 * Math.min(0.45 * fs - e.offsetHz, e.offsetHz + 0.45 * fs);
  return { offsetHz: e.offsetHz, widthHz: Math.max(16 * binHz, Math.min(wanted, room, 0.9 * fs)) };
}
