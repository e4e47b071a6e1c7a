/** `iqaudit spectrogram <capture> -o out.png`: the picture, written atomically. */
import { basename, join } from "node:path";
import { analyseCapture, type CaptureArgs } from "./analyseCapture.js";
import { spectrogramFigure } from "../report/spectrogramFigure.js";
import { checkFileTarget, writeFileAtomic, type FolderWriter } from "../report/index.js";
import type { Pass1Options } from "../analysis/index.js";
import { spectrogramPlotRows } from "../render/index.js";

export interface SpectrogramOptions {
  readonly capture: CaptureArgs;
  /** The PNG to write; with `outFolder`, its name inside that folder. */
  readonly outputPath: string;
  /** A folder being published (the demo's): the PNG is written into it instead of on its own. */
  readonly outFolder?: FolderWriter | undefined;
  /** Frame length of the spectrogram rows, samples (default 1024). */
  readonly fftLength?: number | undefined;
  readonly rows?: number | undefined;
  readonly widthPx?: number | undefined;
  readonly heightPx?: number | undefined;
  readonly dbRange?: { readonly minDb: number; readonly maxDb: number } | undefined;
  /** How the frames of a row are combined: their mean (default) or their maximum. */
  readonly reduce?: "mean" | "max" | undefined;
  readonly pass1?: Pass1Options | undefined;
}

export interface SpectrogramSummary {
  readonly outputPath: string;
  readonly widthPx: number;
  readonly heightPx: number;
  readonly rows: number;
  readonly fftLength: number;
  readonly dbRange: { readonly minDb: number; readonly maxDb: number };
  /** SHA-256 of the capture's data file (not of the PNG), and of its .sigmf-meta for SigMF (else null). */
  readonly captureSha256: string;
  readonly captureMetadataSha256: string | null;
  /** The plot area in image pixels, and the offsets (Hz) of its left and right edges. */
  readonly plot: { readonly x: number; readonly y: number; readonly width: number; readonly height: number };
  readonly frequencySpanHz: readonly [number, number];
  readonly warnings: readonly string[];
}

/** Defaults; the row count is one per pixel row of the plot (spectrogramPlotRows). */
export const SPECTROGRAM_DEFAULTS = { fftLength: 1024, widthPx: 1200, heightPx: 800, reduce: "mean" } as const;

export async function spectrogramCommand(path: string, options: SpectrogramOptions): Promise<SpectrogramSummary> {
  const folder = options.outFolder;
  if (folder === undefined) await checkFileTarget(options.outputPath); // before the work, not after
  const a = await analyseCapture(path, options.capture, {
    ...options.pass1,
    spectrogramFftLength: options.fftLength ?? SPECTROGRAM_DEFAULTS.fftLength,
    // Default: one row per pixel row of the plot (fewer when the span holds fewer frames).
    spectrogramRows: options.rows ?? spectrogramPlotRows(options.widthPx ?? SPECTROGRAM_DEFAULTS.widthPx, options.heightPx ?? SPECTROGRAM_DEFAULTS.heightPx),
  });
  const figure = spectrogramFigure(a, {
    title: basename(path),
    widthPx: options.widthPx ?? SPECTROGRAM_DEFAULTS.widthPx,
    heightPx: options.heightPx ?? SPECTROGRAM_DEFAULTS.heightPx,
    dbRange: options.dbRange,
    reduce: options.reduce ?? SPECTROGRAM_DEFAULTS.reduce,
  });
  if (folder === undefined) await writeFileAtomic(options.outputPath, figure.png);
  else await folder.write(options.outputPath, figure.png);
  return {
    outputPath: folder === undefined ? options.outputPath : join(folder.target, options.outputPath),
    widthPx: options.widthPx ?? SPECTROGRAM_DEFAULTS.widthPx,
    heightPx: options.heightPx ?? SPECTROGRAM_DEFAULTS.heightPx,
    rows: a.pass1.spectrogram.rowCount,
    fftLength: a.pass1.spectrogram.fftLength,
    dbRange: figure.dbRange,
    captureSha256: a.pass1.sha256,
    captureMetadataSha256: a.meta.sigmf?.metaSha256 ?? null,
    plot: figure.plot,
    frequencySpanHz: figure.frequencySpanHz,
    warnings: a.warnings,
  };
}
