/**
 * Worker thread of the survey's extraction read: reads its part of the span from the file and
 * writes its share of every channel's kept range into the arrays it shares with the main thread
 * (extractChannels.ts). Progress is posted about every 4 Mi input samples.
 */
import { parentPort, workerData } from "node:worker_threads";
import { extractPartFromFile, type ExtractionPart, type ExtractionReply } from "./extractChannels.js";

const port = parentPort;
if (port === null) throw new Error("extractionWorker must run in a worker thread");
let pending = 0;
const post = (m: ExtractionReply): void => port.postMessage(m);
extractPartFromFile(workerData as ExtractionPart, (n) => {
  pending += n;
  if (pending >= 1 << 22) { post({ type: "progress", samples: pending }); pending = 0; }
}).then(
  () => { if (pending > 0) post({ type: "progress", samples: pending }); post({ type: "done" }); },
  (error: unknown) => post({ type: "error", message: error instanceof Error ? error.message : String(error) }),
);
