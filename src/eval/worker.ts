/** Worker thread of the evaluation runner: measures the cases it is sent, one at a time. */
import { parentPort, workerData } from "node:worker_threads";
import { runCase } from "./runner.js";
import type { CaseSpec } from "./generator.js";

const { dir } = workerData as { dir: string };
parentPort?.on("message", (spec: CaseSpec) => {
  void runCase(dir, spec).then((r) => parentPort?.postMessage(r));
});
