/**
 * Pass 1: one streaming sweep over a capture. Reads the data file once, front to back: every
 * byte goes into the SHA-256, and the bytes of the analysed span are cut into blocks (each with
 * an overlap prefix) for the Welch PSD, the spectrogram rows and the health statistics, in up to
 * two worker threads; with `channel`, also each block's channel (pass 2 in the same read). Memory:
 * a fixed pool of block buffers plus the accumulators, O(FFT length × spectrogram rows), never
 * O(capture length). See docs/methods.md and docs/architecture.md.
 */
import { createHash, type Hash } from "node:crypto";
import { existsSync } from "node:fs";
import { open, type FileHandle } from "node:fs/promises";
import { availableParallelism } from "node:os";
import { fileURLToPath } from "node:url";
import { Worker } from "node:worker_threads";
import type { CaptureMeta, SampleSpan } from "../capture/source.js";
import { CaptureFormatError, ParameterError } from "../errors.js";
import { noiseFloor, type HealthFigures, type Spectrogram, type WelchPsd } from "../dsp/index.js";
import { formatInfo } from "../capture/sampleFormat.js";
import { Pass1Engine, prefixSamples, type ChannelChunk, type Pass1Config } from "./pass1Engine.js";
import { Pass2Collector, type Pass2Request, type Pass2Result } from "./pass2.js";
import { channelChunk, stateBuffers, type Pass1Figures, type WorkerReply, type WorkerRequest } from "./workerMessages.js";
import { spectrumPeak, type SpectrumPeak } from "./spectrumPeak.js";

export interface Pass1Options {
  /** Welch segment length, samples (default 4096). */
  readonly welchFftLength?: number | undefined;
  /** Welch overlap, samples (default half the segment: 50 %). */
  readonly welchOverlapLength?: number | undefined;
  /** Spectrogram frame length, samples (default 1024, frames do not overlap). */
  readonly spectrogramFftLength?: number | undefined;
  /** Spectrogram rows, whatever the duration (default 1000). */
  readonly spectrogramRows?: number | undefined;
  /** Worker threads: 0 = in this thread; "auto" (default) = 2 for long spans on a multi-core machine. */
  readonly workers?: number | "auto" | undefined;
  /** Samples per block (default 262 144). */
  readonly blockSamples?: number | undefined;
  /** Called after each block with the bytes read so far and the bytes to read in all. */
  readonly onProgress?: ((doneBytes: number, totalBytes: number) => void) | undefined;
  /**
   * A channel known before pass 1 (a measure with --channel): pass 2 of it in the same read,
   * each block's channel extracted where the block is processed (ChannelExtractor.pushOwned) and
   * the blocks' channel samples put end to end here; the result is `pass2`, what runPass2 with
   * these options gives, to the bit.
   */
  readonly channel?: Pass2Request | undefined;
}

export const PASS1_DEFAULTS = {
  welchFftLength: 4096,
  spectrogramFftLength: 1024,
  spectrogramRows: 1000,
  blockSamples: 262_144,
} as const;

export interface NoiseFloor {
  readonly densityPerHz: number;
  readonly dbfsPerHz: number;
  readonly method: string;
}

export interface Pass1Result {
  /** SHA-256 of the whole data file as stored, hex. */
  readonly sha256: string;
  readonly span: SampleSpan;
  readonly psd: WelchPsd;
  readonly spectrogram: Spectrogram;
  readonly health: HealthFigures;
  readonly noiseFloor: NoiseFloor;
  readonly peak: SpectrumPeak;
  /** Worker threads used (0 = the calling thread). */
  readonly workers: number;
  /** Pass 2 of `channel`, when asked for; else null. */
  readonly pass2: Pass2Result | null;
  readonly warnings: readonly string[];
}

/** Runs pass 1 over `span` of the capture described by `meta`. */
export async function runPass1(meta: CaptureMeta, span: SampleSpan, options: Pass1Options = {}): Promise<Pass1Result> {
  const warnings: string[] = [];
  const collector = options.channel === undefined ? null : new Pass2Collector(meta.sampleRateHz, span, options.channel, { extracts: false });
  const config = planPass1(meta, span, options, warnings, collector);
  const workerCount = chooseWorkers(options.workers, span.sampleCount, config.maxBlockSamples);
  const assembler = collector === null ? null : new ChannelAssembler(collector);
  const onChannel: ChannelSink = (chunk, release) => {
    if (chunk !== null && assembler !== null) assembler.add(chunk, release);
    else release();
  };
  const sink = workerCount > 0 ? new WorkerSink(config, workerCount, onChannel) : new InlineSink(config, onChannel);
  const handle = await open(meta.dataPath, "r");
  let sha256: string;
  try {
    sha256 = await sweep(handle, meta, span, config, sink, options.onProgress);
  } catch (e) {
    await sink.abort();
    throw e;
  } finally {
    await handle.close();
  }
  const { psd, spectrogram, health } = await sink.finish();
  const pass2 = assembler === null ? null : assembler.finish(span.sampleCount);
  return {
    sha256,
    span,
    psd,
    spectrogram,
    health,
    noiseFloor: noiseFloor(psd),
    peak: spectrumPeak(psd),
    workers: workerCount,
    pass2,
    warnings,
  };
}

/**
 * Puts the blocks' channel samples end to end: blocks finish in any order across workers; a
 * chunk that comes early waits until the ones before it are in, in the block buffer it came in
 * (held back from the pool until then: nothing is copied, and the waiting is bounded by the
 * blocks in flight); one in order is used at once, where it lies.
 */
class ChannelAssembler {
  private readonly waiting = new Map<number, { iq: Float32Array; release: () => void }>();
  private next = 0;
  constructor(private readonly collector: Pass2Collector) {}

  /** Takes a chunk; `release` is called once its samples are used (at once, or when its turn comes). */
  add(chunk: ChannelChunk, release: () => void): void {
    this.waiting.set(chunk.firstOutput, { iq: chunk.iq, release });
    for (let w = this.waiting.get(this.next); w !== undefined; w = this.waiting.get(this.next)) {
      this.waiting.delete(this.next);
      this.collector.push(w.iq);
      this.next += w.iq.length / 2;
      w.release();
    }
  }

  /** Pass 2's result; throws if a block's samples are missing (a fault of pass 1, not of the capture). */
  finish(inputSamples: number): Pass2Result {
    const expected = Math.ceil(inputSamples / this.collector.extractor.decimation);
    if (this.waiting.size > 0 || this.next !== expected) {
      throw new Error(`pass 1's channel samples stop at output ${this.next} of ${expected}`);
    }
    return this.collector.finish(inputSamples);
  }
}

/** Checks the FFT settings against the span; a segment longer than the span is shortened, with a warning. */
function planPass1(meta: CaptureMeta, span: SampleSpan, options: Pass1Options, warnings: string[], collector: Pass2Collector | null): Pass1Config {
  const n = span.sampleCount;
  if (n < 16) throw new CaptureFormatError(meta.path, `${n} samples in the analysed span; at least 16 are needed`);
  const fit = (name: string, wanted: number): number => {
    if (!Number.isInteger(wanted) || wanted < 16 || wanted > 1 << 20 || (wanted & (wanted - 1)) !== 0) {
      throw new ParameterError(name, `${wanted} is not a power of two between 16 and 1048576`);
    }
    if (wanted <= n) return wanted;
    let fitted = 16;
    while (fitted * 2 <= n) fitted *= 2;
    warnings.push(`${name} ${wanted} exceeds the ${n} samples analysed; ${fitted} is used instead`);
    return fitted;
  };
  const welchFftLength = fit("FFT length", options.welchFftLength ?? PASS1_DEFAULTS.welchFftLength);
  const spectrogramFftLength = fit("spectrogram FFT length", options.spectrogramFftLength ?? PASS1_DEFAULTS.spectrogramFftLength);
  const welchOverlapLength = options.welchOverlapLength ?? welchFftLength / 2;
  if (!Number.isInteger(welchOverlapLength) || welchOverlapLength < 0 || welchOverlapLength >= welchFftLength) {
    throw new ParameterError("overlap", `${welchOverlapLength} samples must be at least 0 and less than the segment length ${welchFftLength}`);
  }
  const rows = options.spectrogramRows ?? PASS1_DEFAULTS.spectrogramRows;
  if (!Number.isInteger(rows) || rows < 1) throw new ParameterError("rows", `${rows} must be a whole number of at least 1`);
  const blockSamples = options.blockSamples ?? PASS1_DEFAULTS.blockSamples;
  return {
    format: meta.format,
    swapIq: meta.swapIq,
    sampleRateHz: meta.sampleRateHz,
    totalSamples: n,
    welchFftLength,
    welchOverlapLength,
    spectrogramFftLength,
    spectrogramRows: rows,
    maxBlockSamples: Math.max(blockSamples, 1),
    channel: collector === null || options.channel === undefined ? null : {
      offsetHz: options.channel.offsetHz, bandwidthHz: options.channel.bandwidthHz, warmupSamples: collector.extractor.warmupSamples,
    },
  };
}

const WORKER_URL = new URL("./pass1Worker.js", import.meta.url);

/** Young-generation size of a pass-1 worker's heap, MiB (see WorkerSink). */
const WORKER_YOUNG_GENERATION_MIB = 2;

function chooseWorkers(requested: number | "auto" | undefined, samples: number, blockSamples: number): number {
  // The worker script exists only in the compiled build (dist/); from sources, run inline.
  if (!existsSync(fileURLToPath(WORKER_URL))) return 0;
  if (requested === undefined || requested === "auto") {
    return samples >= 4 * blockSamples && availableParallelism() >= 2 ? 2 : 0;
  }
  return Math.max(0, Math.min(8, Math.floor(requested)));
}

/**
 * Reads the file front to back: hashes every byte, hands the span's bytes to the sink in blocks.
 * The read of the next block is started before the current one is handed on, so reading and
 * computing overlap even in one thread. Each block buffer holds the samples at a fixed offset of
 * `prefix` frames, preceded by the previous block's last frames (the overlap prefix).
 */
async function sweep(
  handle: FileHandle,
  meta: CaptureMeta,
  span: SampleSpan,
  config: Pass1Config,
  sink: BlockSink,
  onProgress: Pass1Options["onProgress"],
): Promise<string> {
  const hash = createHash("sha256");
  const fb = meta.frameBytes;
  const spanStartByte = meta.dataOffsetBytes + span.startSample * fb;
  const spanEndByte = spanStartByte + span.sampleCount * fb;
  const total = meta.fileBytes;
  await hashRange(handle, hash, 0, spanStartByte, meta.path);
  const prefix = prefixSamples(config);
  const dataOffset = prefix * fb;
  const tail = new Uint8Array(prefix * fb);
  let tailFrames = 0;
  const readBlock = async (owned: number): Promise<{ buffer: ArrayBuffer; owned: number; n: number }> => {
    const n = Math.min(config.maxBlockSamples, span.sampleCount - owned);
    const buffer = await sink.acquire();
    await readFully(handle, new Uint8Array(buffer), dataOffset, n * fb, spanStartByte + owned * fb, meta.path);
    return { buffer, owned, n };
  };
  let next: Promise<{ buffer: ArrayBuffer; owned: number; n: number }> | null = span.sampleCount > 0 ? readBlock(0) : null;
  try {
    while (next !== null) {
      const { buffer, owned, n } = await next;
      const end = owned + n;
      next = end < span.sampleCount ? readBlock(end) : null;
      // Let the next read reach the file system before this thread turns to computing.
      if (next !== null) await new Promise<void>((resolve) => setImmediate(resolve));
      const bytes = new Uint8Array(buffer);
      hash.update(bytes.subarray(dataOffset, dataOffset + n * fb));
      const from = dataOffset - tailFrames * fb;
      bytes.set(tail.subarray(0, tailFrames * fb), from);
      const keepFrames = Math.min(prefix, tailFrames + n);
      const stop = dataOffset + n * fb;
      tail.set(bytes.subarray(stop - keepFrames * fb, stop), 0);
      sink.submit(buffer, from, stop - from, tailFrames, owned);
      tailFrames = keepFrames;
      onProgress?.(spanStartByte + end * fb, total);
    }
  } finally {
    // A failed block leaves its successor's read running: let it settle before the file closes.
    if (next !== null) await (next as Promise<unknown>).catch(() => undefined);
  }
  await hashRange(handle, hash, spanEndByte, total, meta.path);
  onProgress?.(total, total);
  return hash.digest("hex");
}

async function hashRange(handle: FileHandle, hash: Hash, from: number, to: number, path: string): Promise<void> {
  const chunk = new Uint8Array(Math.min(4 << 20, Math.max(to - from, 1)));
  for (let pos = from; pos < to; ) {
    const n = Math.min(chunk.length, to - pos);
    await readFully(handle, chunk, 0, n, pos, path);
    hash.update(chunk.subarray(0, n));
    pos += n;
  }
}

async function readFully(handle: FileHandle, into: Uint8Array, offset: number, length: number, position: number, path: string): Promise<void> {
  let done = 0;
  while (done < length) {
    const { bytesRead } = await handle.read(into, offset + done, length - done, position + done);
    if (bytesRead === 0) throw new CaptureFormatError(path, `file ended at byte ${position + done} while reading (it changed during the run?)`, position + done);
    done += bytesRead;
  }
}

/** Takes a block's channel samples (or null) and calls `release` once they are used: the block's buffer may then be reused. */
type ChannelSink = (chunk: ChannelChunk | null, release: () => void) => void;

/** Where blocks go: this thread, or a pool of workers. */
interface BlockSink {
  acquire(): Promise<ArrayBuffer>;
  /** Hands on the block held in buffer[byteOffset, byteOffset + byteLength). */
  submit(buffer: ArrayBuffer, byteOffset: number, byteLength: number, prefixFrames: number, ownedStart: number): void;
  finish(): Promise<{ psd: WelchPsd; spectrogram: Spectrogram; health: HealthFigures }>;
  abort(): Promise<void>;
}

function blockBytes(config: Pass1Config): number {
  return (config.maxBlockSamples + prefixSamples(config)) * formatInfo(config.format).frameBytes;
}

/** Blocks processed in this thread; two buffers, one being read while the other is processed. */
class InlineSink implements BlockSink {
  private readonly engine: Pass1Engine;
  private readonly buffers: ArrayBuffer[];
  private turn = 0;
  constructor(config: Pass1Config, private readonly onChannel: ChannelSink) {
    this.engine = new Pass1Engine(config);
    this.buffers = [new ArrayBuffer(blockBytes(config)), new ArrayBuffer(blockBytes(config))];
  }
  async acquire(): Promise<ArrayBuffer> {
    this.turn ^= 1;
    return this.buffers[this.turn] as ArrayBuffer;
  }
  submit(buffer: ArrayBuffer, byteOffset: number, byteLength: number, prefixFrames: number, ownedStart: number): void {
    // Blocks come in order here, so the chunk (a view of the extractor's array) is used at once.
    let used = false;
    this.onChannel(this.engine.processBlock(new Uint8Array(buffer, byteOffset, byteLength), prefixFrames, ownedStart), () => { used = true; });
    if (!used) throw new Error("pass 1's channel samples came out of order in one thread");
  }
  async finish(): Promise<{ psd: WelchPsd; spectrogram: Spectrogram; health: HealthFigures }> {
    return this.engine.finish();
  }
  async abort(): Promise<void> {}
}

/**
 * Blocks go to worker threads, each given the block with the fewest blocks in flight. Buffers
 * come back with each "done" reply: a pool of 2 buffers a worker (+1 being filled) bounds memory.
 */
class WorkerSink implements BlockSink {
  private readonly workers: Worker[] = [];
  private readonly inFlight: number[] = [];
  private readonly free: ArrayBuffer[] = [];
  private readonly waiting: ((b: ArrayBuffer) => void)[] = [];
  private failure: Error | null = null;

  constructor(config: Pass1Config, count: number, onChannel: ChannelSink) {
    const bytes = blockBytes(config);
    for (let k = 0; k < 2 * count + 1; k++) this.free.push(new ArrayBuffer(bytes));
    for (let k = 0; k < count; k++) {
      // A worker's garbage is a few small objects a block: a 2 MiB young generation (V8's default
      // is several times that) is plenty and takes 5-10 MiB off the peak RSS of pass 1 (measured).
      const worker = new Worker(WORKER_URL, { workerData: config, resourceLimits: { maxYoungGenerationSizeMb: WORKER_YOUNG_GENERATION_MIB } });
      worker.on("message", (reply: WorkerReply) => {
        if (reply.type === "done") {
          this.inFlight[k] = (this.inFlight[k] as number) - 1;
          // The buffer goes back to the pool once its channel samples are used.
          try {
            onChannel(reply.channel === null ? null : channelChunk(reply.channel, reply.buffer), () => this.release(reply.buffer));
          } catch (e) {
            this.fail(e);
            this.release(reply.buffer);
          }
        }
      });
      worker.on("error", (e) => this.fail(e));
      this.workers.push(worker);
      this.inFlight.push(0);
    }
  }

  /** Remembers the first failure and wakes whoever waits for a buffer, so that it sees it. */
  private fail(e: unknown): void {
    this.failure ??= e instanceof Error ? e : new Error(String(e));
    for (const w of this.waiting.splice(0)) w(new ArrayBuffer(0));
  }

  private release(buffer: ArrayBuffer): void {
    const next = this.waiting.shift();
    if (next) next(buffer);
    else this.free.push(buffer);
  }

  async acquire(): Promise<ArrayBuffer> {
    if (this.failure) throw this.failure;
    const b = this.free.pop();
    const buffer = b ?? (await new Promise<ArrayBuffer>((resolve) => this.waiting.push(resolve)));
    if (this.failure) throw this.failure;
    return buffer;
  }

  submit(buffer: ArrayBuffer, byteOffset: number, byteLength: number, prefixFrames: number, ownedStart: number): void {
    let k = 0;
    for (let j = 1; j < this.workers.length; j++) if ((this.inFlight[j] as number) < (this.inFlight[k] as number)) k = j;
    this.inFlight[k] = (this.inFlight[k] as number) + 1;
    const request: WorkerRequest = { type: "block", buffer, byteOffset, byteLength, prefixFrames, ownedStart };
    (this.workers[k] as Worker).postMessage(request, [buffer]);
  }

  /**
   * The other workers' states (their arrays transferred, not copied) go to the first worker,
   * which merges them into its own and returns the figures; the block pool goes with them. The
   * large arrays of the end of pass 1 thus die with the workers (freed when they are
   * terminated), rather than lingering in this thread as garbage until a full collection.
   */
  async finish(): Promise<Pass1Figures> {
    try {
      const [first, ...others] = this.workers as [Worker, ...Worker[]];
      const states = await Promise.all(others.map((worker) => this.ask<"state">(worker, { type: "finish" }, "state")));
      if (this.failure) throw this.failure;
      // The others are done: their memory is freed before the first one merges.
      await Promise.all(others.map((w) => w.terminate()));
      const discard = this.free.splice(0);
      const request: WorkerRequest = { type: "mergeAndFinish", states: states.map((s) => s.state), discard };
      const transfer = [...discard, ...states.flatMap((s) => stateBuffers(s.state))];
      const reply = await this.ask<"figures">(first, request, "figures", transfer);
      if (this.failure) throw this.failure;
      return reply.figures;
    } finally {
      await this.abort();
    }
  }

  /** Sends `request` to `worker` and waits for its reply of type `type`. */
  private ask<T extends WorkerReply["type"]>(worker: Worker, request: WorkerRequest, type: T, transfer: ArrayBuffer[] = []): Promise<WorkerReply & { type: T }> {
    return new Promise((resolve, reject) => {
      worker.on("message", (reply: WorkerReply) => {
        if (reply.type === type) resolve(reply as WorkerReply & { type: T });
      });
      worker.once("error", reject);
      worker.postMessage(request, transfer);
    });
  }

  async abort(): Promise<void> {
    await Promise.all(this.workers.map((w) => w.terminate()));
  }
}
