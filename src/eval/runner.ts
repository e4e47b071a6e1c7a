/**
 * Runs a plan of evaluation cases: generates each capture into a folder, measures it (measureCase)
 * and deletes it, in this thread or in worker threads (worker.js, only in the compiled build).
 */
import { availableParallelism } from "node:os";
import { rm } from "node:fs/promises";
import { Worker } from "node:worker_threads";
import { writeCase, type CaseSpec } from "./generator.js";
import { measureCase, type CaseResult } from "./measureCase.js";

/** One case: write its capture, measure it as `iqaudit measure` does, remove the file. */
export async function runCase(dir: string, spec: CaseSpec): Promise<CaseResult> {
  const c = await writeCase(dir, spec);
  try {
    return await measureCase(c);
  } finally {
    await rm(c.path, { force: true });
  }
}

export interface RunOptions {
  /** Folder for the captures while they are measured. */
  readonly dir: string;
  /** Worker threads (0 = this thread); default: 2 on a machine with 2 or more cores. */
  readonly workers?: number | undefined;
  readonly onResult?: ((r: CaseResult, done: number, total: number) => void) | undefined;
}

export function defaultWorkers(): number {
  return Math.min(2, availableParallelism()) >= 2 ? 2 : 0;
}

/** Results in the order of `specs`. */
export async function runCases(specs: readonly CaseSpec[], options: RunOptions): Promise<CaseResult[]> {
  const workers = Math.min(options.workers ?? defaultWorkers(), specs.length);
  const results: CaseResult[] = new Array(specs.length);
  let done = 0;
  const record = (i: number, r: CaseResult): void => {
    results[i] = r;
    done += 1;
    options.onResult?.(r, done, specs.length);
  };
  if (workers <= 0) {
    for (let i = 0; i < specs.length; i++) record(i, await runCase(options.dir, specs[i] as CaseSpec));
    return results;
  }
  let next = 0;
  const url = new URL("./worker.js", import.meta.url);
  await Promise.all(Array.from({ length: workers }, () => new Promise<void>((resolve, reject) => {
    const w = new Worker(url, { workerData: { dir: options.dir } });
    let current = -1;
    const feed = (): void => {
      if (next >= specs.length) { void w.terminate().then(() => resolve()); return; }
      current = next++;
      w.postMessage(specs[current]);
    };
    w.on("message", (r: CaseResult) => { record(current, r); feed(); });
    w.on("error", reject);
    feed();
  })));
  return results;
}
