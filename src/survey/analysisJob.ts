/**
 * One emission's analysis, as the survey hands it to a worker thread or runs it in this one:
 * the `measure` analysis (measureEmission) on a channel record already extracted, with the few
 * pass-1 figures it reads (the PSD, the noise floor, the health figures) and the capture's
 * description. Nothing here reads the file.
 */
import type { CaptureMeta, CaptureSource, SampleSpan } from "../capture/index.js";
import type { Pass1Result } from "../analysis/index.js";
import type { Pass2Result } from "../analysis/pass2.js";
import { measureEmission } from "../analysis/measureEmission.js";
import type { EmissionFigures } from "../analysis/emissionFigures.js";

/** What every analysis of one survey shares (sent once to each worker). */
export interface AnalysisContext {
  readonly meta: CaptureMeta;
  readonly span: SampleSpan;
  /** pass 1 without its spectrogram (measureEmission does not read it): about 100 kB. */
  readonly pass1: Omit<Pass1Result, "spectrogram">;
  readonly audioBandwidthHz: number;
}

/** One emission's channel and its record. */
export interface AnalysisJob {
  readonly channel: { readonly offsetHz: number; readonly widthHz: number };
  readonly record: Pass2Result;
}

/** The context of one survey's analyses, trimmed of what they never read. */
export function analysisContext(meta: CaptureMeta, span: SampleSpan, pass1: Pass1Result, audioBandwidthHz: number): AnalysisContext {
  const { spectrogram: _unused, ...rest } = pass1;
  return { meta, span, pass1: rest, audioBandwidthHz };
}

/** measureEmission on the job's record; the source stands for the file only by its description. */
export async function runAnalysisJob(context: AnalysisContext, job: AnalysisJob): Promise<EmissionFigures> {
  const source = { meta: context.meta } as CaptureSource;
  return measureEmission(source, context.span, context.pass1 as Pass1Result, {
    channel: job.channel, extractedChannel: job.record, audioBandwidthHz: context.audioBandwidthHz,
  });
}
