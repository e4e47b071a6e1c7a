/**
 * Every emission's channel record, from one more read of the file through the channelizer
 * (MultiChannelizer: one forward transform a block shared by all channels). On two cores the read
 * is cut at a block boundary into two halves, each read and channelized by its own worker thread
 * (extractionWorker.js; MultiChannelizer's `resumeAt` makes the halves give the samples of the
 * whole), both writing into one shared array a channel: the file is still read once in all, and
 * no record is copied or held twice.
 *
 * Each channel keeps its output over its emission's time span, the filter's settling left out, at
 * most `maxChannelSamples` (2^20 complex float32 = 8 MiB).
 */
import { existsSync } from "node:fs";
import { open } from "node:fs/promises";
import { availableParallelism } from "node:os";
import { fileURLToPath } from "node:url";
import { Worker } from "node:worker_threads";
import type { CaptureMeta, CaptureSource, SampleSpan } from "../capture/index.js";
import { fileSource } from "../capture/index.js";
import type { Pass2Result } from "../analysis/pass2.js";
import { MultiChannelizer, type ChannelSpec } from "../dsp/index.js";
import type { DetectedEmission } from "./detectedEmission.js";

/** Samples of one read block of the extraction. */
export const EXTRACTION_BLOCK_SAMPLES = 1 << 16;

/** One channel's kept outputs: output indices [first, first + count) into `out`. */
export interface KeptRange {
  readonly first: number;
  readonly count: number;
  /** Interleaved I,Q, 2·count floats (on a SharedArrayBuffer when workers share it). */
  readonly out: Float32Array;
}

/** What one part of the read does: samples [from, to) of the span through a channelizer resumed at `from`. */
export interface ExtractionPart {
  readonly meta: CaptureMeta;
  readonly span: SampleSpan;
  readonly channels: readonly ChannelSpec[];
  /** First new sample of this part, from the span's start (a multiple of the channelizer's block length). */
  readonly from: number;
  /** End of this part (exclusive), from the span's start. */
  readonly to: number;
  readonly kept: readonly KeptRange[];
}

/** The part's read: fills its share of each kept range; calls `progress` with input samples done. */
export async function extractPart(source: CaptureSource, part: ExtractionPart, progress: (samples: number) => void): Promise<void> {
  const bank = new MultiChannelizer({ sampleRateHz: part.meta.sampleRateHz, channels: part.channels, resumeAt: part.from, reuseOutput: true });
  const lead = part.from > 0 ? bank.overlapSamples : 0;
  const produced = bank.channels.map((c) => part.from / c.decimation);
  const consume = (outputs: readonly Float32Array[]): void => {
    outputs.forEach((y, i) => {
      produced[i] = store(part.kept[i] as KeptRange, y, produced[i] as number);
    });
  };
  const start = part.span.startSample + part.from - lead;
  const count = part.to - part.from + lead;
  for await (const block of source.blocks({ startSample: start, sampleCount: count }, EXTRACTION_BLOCK_SAMPLES, { reuse: true })) {
    consume(bank.push(block));
    progress(block.length >> 1);
  }
  if (part.to >= part.span.sampleCount) consume(bank.flush());
}

/** Copies the outputs y (output indices [at, at + n)) that fall in the kept range; returns at + n. */
function store(k: KeptRange, y: Float32Array, at: number): number {
  const n = y.length >> 1;
  const lo = Math.max(at, k.first);
  const hi = Math.min(at + n, k.first + k.count);
  if (hi > lo) k.out.set(y.subarray(2 * (lo - at), 2 * (hi - at)), 2 * (lo - k.first));
  return at + n;
}

/** Options of extractChannels. */
export interface ExtractOptions {
  readonly maxChannelSamples: number;
  /** Worker threads (0 = this thread); default 2 on a machine of 2 or more cores, 0 from sources. */
  readonly workers?: number | undefined;
  readonly onProgress?: ((doneSamples: number, totalSamples: number) => void) | undefined;
}

const WORKER_URL = new URL("./extractionWorker.js", import.meta.url);

/** Every channel's record over its emission's time span (module comment). */
export async function extractChannels(
  source: CaptureSource, span: SampleSpan, emissions: readonly DetectedEmission[],
  channels: readonly { offsetHz: number; widthHz: number }[], options: ExtractOptions,
): Promise<Pass2Result[]> {
  if (channels.length === 0) return [];
  const specs = channels.map((c) => ({ offsetHz: c.offsetHz, bandwidthHz: c.widthHz }));
  const bank = new MultiChannelizer({ sampleRateHz: source.meta.sampleRateHz, channels: specs });
  const cuts = partCuts(span.sampleCount, bank.blockSamples, extractionWorkers(span.sampleCount, bank.blockSamples, options.workers));
  const shared = cuts.length > 2;
  const kept = bank.channels.map((info, i) => keptRange(emissions[i] as DetectedEmission, info, options.maxChannelSamples, shared));
  const parts = cuts.slice(1).map((to, p) => ({ meta: source.meta, span, channels: specs, from: cuts[p] as number, to, kept }));
  let done = 0;
  const progress = (n: number): void => { done += n; options.onProgress?.(Math.min(done, span.sampleCount), span.sampleCount); };
  if (shared) await Promise.all(parts.map((part) => inWorker(part, progress)));
  else await extractPart(source, parts[0] as ExtractionPart, progress);
  return bank.channels.map((info, i) => {
    const k = kept[i] as KeptRange;
    // After the flush, channel i has given ⌈T/D⌉ outputs in all.
    const filled = Math.max(0, Math.min(k.count, Math.ceil(span.sampleCount / info.decimation) - k.first));
    const c = channels[i] as { offsetHz: number; widthHz: number };
    const warnings = filled < k.count ? [`the channel's record ended ${k.count - filled} samples short of the emission's time span`] : [];
    return {
      iq: k.out.subarray(0, 2 * filled), sampleRateHz: info.outputRateHz, decimation: info.decimation,
      offsetHz: c.offsetHz, bandwidthHz: c.widthHz, startS: k.first / info.outputRateHz - info.delayS,
      inputSamples: span.sampleCount, complete: filled === k.count, wholeSpan: null, warnings,
    };
  });
}

/** Worker threads for the read: 2 on two cores for a span of 8 blocks or more, from the build only. */
function extractionWorkers(samples: number, blockSamples: number, requested: number | undefined): number {
  if (!existsSync(fileURLToPath(WORKER_URL))) return 0;
  const wanted = requested ?? (availableParallelism() >= 2 ? 2 : 0);
  return samples >= 8 * blockSamples ? Math.max(0, Math.min(wanted, 2)) : 0;
}

/** Part boundaries [0, c1, ..., T]: the span cut at block boundaries into `workers` parts (one if 0). */
function partCuts(total: number, blockSamples: number, workers: number): number[] {
  const parts = Math.max(1, workers);
  const blocks = Math.ceil(total / blockSamples);
  const cuts = [0];
  for (let p = 1; p < parts; p++) cuts.push(Math.round((p * blocks) / parts) * blockSamples);
  cuts.push(total);
  return cuts;
}

/** Output m is input time m·D/fs − delay: keep [startS, endS], the filter's settling left out. */
function keptRange(e: DetectedEmission, info: MultiChannelizer["channels"][number], cap: number, shared: boolean): KeptRange {
  const first = Math.max(Math.ceil(2 * info.delayS * info.outputRateHz), Math.floor((e.startS + info.delayS) * info.outputRateHz));
  const last = Math.ceil((e.endS + info.delayS) * info.outputRateHz);
  const count = Math.max(0, Math.min(cap, last - first));
  const bytes = 8 * count;
  return { first, count, out: shared ? new Float32Array(new SharedArrayBuffer(bytes)) : new Float32Array(2 * count) };
}

/** One part in a worker thread; resolves when its share of every kept range is written. */
function inWorker(part: ExtractionPart, progress: (samples: number) => void): Promise<void> {
  return new Promise<void>((resolve, reject) => {
    const worker = new Worker(WORKER_URL, { workerData: part });
    worker.on("message", (m: ExtractionReply) => {
      if (m.type === "progress") progress(m.samples);
      else if (m.type === "done") { void worker.terminate().then(() => resolve()); }
      else { void worker.terminate(); reject(new Error(m.message)); }
    });
    worker.on("error", reject);
  });
}

export type ExtractionReply =
  | { readonly type: "progress"; readonly samples: number }
  | { readonly type: "done" }
  | { readonly type: "error"; readonly message: string };

/** The part's read in this thread, from the file named by its description (for the worker). */
export async function extractPartFromFile(part: ExtractionPart, progress: (samples: number) => void): Promise<void> {
  const handle = await open(part.meta.dataPath, "r");
  try {
    await extractPart(fileSource(part.meta, handle), part, progress);
  } finally {
    await handle.close();
  }
}
