/**
 * Worker thread of the survey's analyses: receives the survey's context once (workerData), then
 * one job at a time, and answers each with the emission's figures (or the error's message).
 */
import { parentPort, workerData } from "node:worker_threads";
import { runAnalysisJob, type AnalysisContext, type AnalysisJob } from "./analysisJob.js";
import type { AnalysisReply } from "./analysisPool.js";

const port = parentPort;
if (port === null) throw new Error("analysisWorker must run in a worker thread");
const context = workerData as AnalysisContext;

port.on("message", (job: AnalysisJob) => {
  runAnalysisJob(context, job).then(
    (figures) => port.postMessage({ ok: true, figures } satisfies AnalysisReply),
    (error: unknown) => port.postMessage({ ok: false, message: error instanceof Error ? error.message : String(error) } satisfies AnalysisReply),
  );
});
