/**
 * The survey's per-emission analyses on both cores: a pool of worker threads (analysisWorker.js,
 * only in the compiled build; from sources, or on one core, they run in this thread). Each job's
 * record is shared with its worker (a SharedArrayBuffer from the extraction) or transferred to it,
 * never copied, so the channel records are held once; the
 * longest records go first, so that the two workers finish close together.
 *
 * Memory: each worker holds its copy of the context (the pass-1 PSD, about 100 kB), the record it
 * is measuring (at most 8 MiB) and what one measurement allocates (docs/architecture.md).
 */
import { existsSync } from "node:fs";
import { availableParallelism } from "node:os";
import { fileURLToPath } from "node:url";
import { Worker } from "node:worker_threads";
import type { EmissionFigures } from "../analysis/emissionFigures.js";
import { runAnalysisJob, type AnalysisContext, type AnalysisJob } from "./analysisJob.js";

export type AnalysisReply = { readonly ok: true; readonly figures: EmissionFigures } | { readonly ok: false; readonly message: string };

const WORKER_URL = new URL("./analysisWorker.js", import.meta.url);

/** Worker threads for `jobs` analyses: `requested`, else 2 on a machine of 2 or more cores; 0 from sources. */
export function analysisWorkers(jobs: number, requested?: number): number {
  if (!existsSync(fileURLToPath(WORKER_URL))) return 0;
  const wanted = requested ?? (availableParallelism() >= 2 ? 2 : 0);
  return Math.max(0, Math.min(wanted, jobs, 8));
}

/** The figures of every job, in the order of `jobs`. */
export async function analyseAll(context: AnalysisContext, jobs: readonly AnalysisJob[], workers: number): Promise<EmissionFigures[]> {
  const results: EmissionFigures[] = new Array(jobs.length);
  if (workers <= 0) {
    for (let i = 0; i < jobs.length; i++) results[i] = await runAnalysisJob(context, jobs[i] as AnalysisJob);
    return results;
  }
  const queue = jobs.map((_, i) => i).sort((a, b) => recordLength(jobs[b]) - recordLength(jobs[a]));
  await Promise.all(Array.from({ length: workers }, () => drain(context, jobs, queue, results)));
  return results;
}

function recordLength(job: AnalysisJob | undefined): number {
  return job?.record.iq.length ?? 0;
}

/** One worker taking jobs from the shared queue until it is empty. */
function drain(context: AnalysisContext, jobs: readonly AnalysisJob[], queue: number[], results: EmissionFigures[]): Promise<void> {
  return new Promise<void>((resolve, reject) => {
    const worker = new Worker(WORKER_URL, { workerData: context });
    let current = -1;
    const fail = (error: Error): void => { void worker.terminate(); reject(error); };
    const next = (): void => {
      const i = queue.shift();
      if (i === undefined) { void worker.terminate().then(() => resolve()); return; }
      current = i;
      const job = jobs[i] as AnalysisJob;
      const buffer = job.record.iq.buffer;
      worker.postMessage(job, buffer instanceof ArrayBuffer ? [buffer] : []);
    };
    worker.on("message", (reply: AnalysisReply) => {
      if (!reply.ok) { fail(new Error(reply.message)); return; }
      results[current] = reply.figures;
      next();
    });
    worker.on("error", fail);
    next();
  });
}
