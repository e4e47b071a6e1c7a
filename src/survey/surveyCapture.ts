/**
 * The survey of one capture: every emission found blind in the pass-1 figures
 * (detectEmissions.ts), every emission's channel extracted in one more read of the file (one
 * forward transform a block shared by all channels, MultiChannelizer), and each measured by the
 * `measure` analysis on its own channel over the time it is present (a bursty link inside its
 * bursts, as measureEmission does for any keyed envelope).
 *
 * Memory: the pass-1 figures, the detection's labels (8 bytes a spectrogram cell), the
 * channelizer's block transform (at most 8 MiB) and each channel's record, kept up to
 * `maxChannelSamples` (2^20 complex float32 = 8 MiB) over the emission's time span: at most
 * 8 MiB an emission plus what one measurement allocates (docs/architecture.md).
 *
 * The analyses run in worker threads on both cores (analysisPool.ts), each record transferred
 * to its worker, not copied.
 */
import type { CaptureSource, SampleSpan } from "../capture/index.js";
import type { Pass1Result } from "../analysis/index.js";
import type { Pass2Result } from "../analysis/pass2.js";
import { MEASURE_DEFAULTS } from "../analysis/measureEmission.js";
import type { EmissionFigures } from "../analysis/emissionFigures.js";
import { analysisContext } from "./analysisJob.js";
import { analyseAll, analysisWorkers } from "./analysisPool.js";
import { MultiChannelizer } from "../dsp/index.js";
import { detectEmissions, type Detection, type DetectEmissionsOptions } from "./detectEmissions.js";
import type { DetectedEmission } from "./detectedEmission.js";

/** Options of surveyCapture. */
export interface SurveyOptions extends DetectEmissionsOptions {
  /** Audio bandwidth of the analogue figures, Hz (default 3000, as measure). */
  readonly audioBandwidthHz?: number | undefined;
  /** Most decimated samples kept per channel (default 2^20). */
  readonly maxChannelSamples?: number | undefined;
  /** Worker threads for the analyses (default: 2 on a machine of 2 or more cores; 0 = this thread). */
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

export const SURVEY_DEFAULTS = { maxChannelSamples: 1 << 20, blockSamples: 1 << 16 } as const;

/** The survey of `span` (module comment). */
export async function surveyCapture(source: CaptureSource, span: SampleSpan, pass1: Pass1Result, options: SurveyOptions = {}): Promise<SurveyResult> {
  const t0 = performance.now();
  const detection = detectEmissions(pass1, options);
  const t1 = performance.now();
  const fs = source.meta.sampleRateHz;
  const audioHz = options.audioBandwidthHz ?? MEASURE_DEFAULTS.audioBandwidthHz;
  const emissions = detection.emissions.filter((e) => e.artefact === null);
  const channels = emissions.map((e) => channelOf(e, fs, pass1.psd.binWidthHz, audioHz));
  const records = await extractChannels(source, span, emissions, channels, options);
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

/** Every channel's record over its emission's time span, from one read through the channelizer. */
async function extractChannels(
  source: CaptureSource, span: SampleSpan, emissions: readonly DetectedEmission[],
  channels: readonly { offsetHz: number; widthHz: number }[], options: SurveyOptions,
): Promise<Pass2Result[]> {
  if (channels.length === 0) return [];
  const fs = source.meta.sampleRateHz;
  const bank = new MultiChannelizer({ sampleRateHz: fs, channels: channels.map((c) => ({ offsetHz: c.offsetHz, bandwidthHz: c.widthHz })) });
  const cap = options.maxChannelSamples ?? SURVEY_DEFAULTS.maxChannelSamples;
  const kept = bank.channels.map((info, i) => {
    const e = emissions[i] as DetectedEmission;
    // Output m is input time m·D/fs − delay: keep [startS, endS], the filter's settling left out.
    const first = Math.max(Math.ceil(2 * info.delayS * info.outputRateHz), Math.floor((e.startS + info.delayS) * info.outputRateHz));
    const last = Math.ceil((e.endS + info.delayS) * info.outputRateHz);
    const count = Math.max(0, Math.min(cap, last - first));
    return { first, out: new Float32Array(2 * count), filled: 0, produced: 0 };
  });
  let done = 0;
  const consume = (outputs: readonly Float32Array[]): void => {
    outputs.forEach((y, i) => {
      const k = kept[i] as (typeof kept)[number];
      const n = y.length >> 1;
      const from = Math.max(0, k.first - k.produced);
      const room = (k.out.length >> 1) - k.filled;
      const take = Math.max(0, Math.min(n - from, room));
      if (take > 0) k.out.set(y.subarray(2 * from, 2 * (from + take)), 2 * k.filled);
      k.filled += take;
      k.produced += n;
    });
  };
  for await (const block of source.blocks(span, SURVEY_DEFAULTS.blockSamples, { reuse: true })) {
    consume(bank.push(block));
    done += block.length >> 1;
    options.onProgress?.(done, span.sampleCount);
  }
  consume(bank.flush());
  return bank.channels.map((info, i) => {
    const k = kept[i] as (typeof kept)[number];
    const c = channels[i] as { offsetHz: number; widthHz: number };
    const warnings = k.filled < (k.out.length >> 1) ? [`the channel's record ended ${(k.out.length / 2 - k.filled)} samples short of the emission's time span`] : [];
    return {
      iq: k.out.subarray(0, 2 * k.filled), sampleRateHz: info.outputRateHz, decimation: info.decimation,
      offsetHz: c.offsetHz, bandwidthHz: c.widthHz, startS: k.first / info.outputRateHz - info.delayS,
      inputSamples: span.sampleCount, warnings,
    };
  });
}
