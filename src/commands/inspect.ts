/** `iqaudit inspect <capture>`: what the file is and whether it is healthy. */
import { analyseCapture, type CaptureArgs } from "./analyseCapture.js";
import { buildInspectReport, type InspectReport } from "../report/inspectReport.js";
import type { Pass1Options } from "../analysis/index.js";

export interface InspectOptions {
  readonly capture: CaptureArgs;
  readonly pass1?: Pass1Options;
}

export async function inspectCommand(path: string, options: InspectOptions): Promise<InspectReport> {
  const a = await analyseCapture(path, options.capture, options.pass1 ?? {});
  return buildInspectReport(a.meta, a.span, a.pass1, a.warnings);
}
