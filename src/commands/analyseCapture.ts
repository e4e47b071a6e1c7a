/**
 * The first steps every analysing command shares: open the capture with the user's options,
 * resolve the span to analyse, and run pass 1 over it.
 */
import { openCapture, resolveSpan, type CaptureMeta, type CaptureOptions, type CaptureSource, type SampleSpan } from "../capture/index.js";
import { runPass1, type Pass1Options, type Pass1Result } from "../analysis/index.js";

/** Capture options of the contract, already parsed into numbers. */
export interface CaptureArgs extends CaptureOptions {
  readonly startS?: number | undefined;
  readonly durationS?: number | undefined;
}

export interface AnalysedCapture {
  readonly meta: CaptureMeta;
  readonly span: SampleSpan;
  readonly pass1: Pass1Result;
  /** Reader, span and pass-1 warnings, in that order. */
  readonly warnings: readonly string[];
}

export async function analyseCapture(path: string, args: CaptureArgs, pass1: Pass1Options = {}): Promise<AnalysedCapture> {
  return withAnalysedCapture(path, args, pass1, async (a) => a);
}

/**
 * Opens the capture, checks the command's options against its metadata (`check`, before any
 * sample is read; it may return options to add to pass 1's), runs pass 1 over the span, and hands the result and the still-open source
 * to `use` (for a pass 2); the source is closed afterwards, whatever happens.
 */
export async function withAnalysedCapture<T>(
  path: string,
  args: CaptureArgs,
  pass1: Pass1Options,
  use: (a: AnalysedCapture, source: CaptureSource) => Promise<T>,
  check?: (meta: CaptureMeta, span: SampleSpan) => Pass1Options | void,
): Promise<T> {
  const source = await openCapture(path, args);
  try {
    const meta = source.meta;
    const { span, warnings: spanWarnings } = resolveSpan(meta, args.startS, args.durationS);
    // The command's options against the metadata, before a multi-GB pass 1 is spent on a typo.
    // It may also ask more of pass 1 (a channel to extract in the same read).
    const more = check?.(meta, span);
    const result = await runPass1(meta, span, more ? { ...pass1, ...more } : pass1);
    const warnings = [...meta.warnings, ...spanWarnings, ...result.warnings, ...healthWarnings(result)];
    return await use({ meta, span, pass1: result, warnings }, source);
  } finally {
    await source.close();
  }
}

/** Health findings a user must not miss, as warnings beside the figures. */
function healthWarnings(result: Pass1Result): string[] {
  const h = result.health;
  const out: string[] = [];
  if (h.nonFiniteSamples > 0) {
    out.push(`${h.nonFiniteSamples} samples with a NaN or infinite component were counted and read as 0`);
  }
  // Common practice: any clipping distorts the spectrum (intermodulation, spurious lines); above
  // about 0.01 % of components it is worth a warning.
  if (h.clippingPercent > 0.01) {
    out.push(`${h.clippingPercent.toFixed(3)} % of components are at full scale: the receiver was overloaded; reduce its gain or add attenuation`);
  }
  return out;
}
