/**
 * mask.png: the spectrum the mask was judged on (max hold or average at the mask's RBW, dB
 * relative to the reference) against offset from the assigned frequency, the mask drawn as a
 * line, the reference level (0 dB) and the noise's reading marked, every span outside the mask
 * shaded, and the worst point labelled with its margin.
 */
import { renderLineFigure, SERIES_COLOURS, type MarkerLine, type PointNote, type ShadedSpan } from "../render/index.js";
import type { CheckOutcome, MaskReading } from "../licence/index.js";
import type { CheckReport } from "./checkReport.js";
import { formatHz } from "./format.js";

export interface MaskFigureInput {
  readonly report: CheckReport;
  readonly outcome: CheckOutcome;
  readonly reading: MaskReading | null;
  readonly captureName: string;
  readonly widthPx?: number;
  readonly heightPx?: number;
}

const VIOLATION_SHADE: [number, number, number] = [250, 205, 205];
const MASK_COLOUR: [number, number, number] = [178, 34, 52];
// The reference line takes the palette's second colour (the measured levels take the first).
const REFERENCE_COLOUR = SERIES_COLOURS[1] ?? MASK_COLOUR;

export function maskFigure(input: MaskFigureInput): Buffer {
  const m = input.outcome.mask;
  const r = input.reading;
  const section = input.report.mask;
  if (m === null || r === null || section === null) throw new Error("maskFigure: no mask result to draw");
  const { xs, levels, allowed } = covered(r, m.allowedDb);
  const halfBin = xs.length > 1 ? Math.abs((xs[1] as number) - (xs[0] as number)) / 2 : 0;
  const shaded: ShadedSpan[] = m.violations.map((v) => ({ fromX: v.fromHz - halfBin, toX: v.toHz + halfBin, colour: VIOLATION_SHADE }));
  const notes: PointNote[] = [];
  if (m.worst !== null) {
    const w = m.worst;
    notes.push({ x: w.offsetHz, y: w.levelDb, text: `worst ${formatHz(w.offsetHz)}: margin ${w.marginDb >= 0 ? "+" : ""}${w.marginDb.toFixed(1)} dB` });
  }
  const markers: MarkerLine[] = [
    { orientation: "horizontal", value: 0, label: `reference ${r.referenceDbfs.toFixed(1)} dBFS (${r.reference})`, colour: REFERENCE_COLOUR },
    { orientation: "horizontal", value: r.noiseDb, label: "noise reading", colour: [96, 100, 108] },
  ];
  const lowest = Math.min(r.noiseDb - 10, ...allowed.filter((v) => Number.isFinite(v)).map((v) => v - 5));
  return renderLineFigure({
    title: `Spectral mask: ${input.captureName}`,
    subtitle: `mask ${section.name} (${section.source}); ${r.detector} at ${formatHz(r.resolutionHz)} RBW; ` +
      `${m.violations.length === 0 ? "no point outside the mask" : `${m.violations.length} span(s) outside the mask, shaded`}`,
    x: { name: "Offset from the assigned frequency", quantity: { kind: "hertz" } },
    y: { name: "Level re reference", quantity: { kind: "linear", unit: "dB" }, min: Math.max(lowest, -140), max: 10 },
    series: [
      { label: `${r.detector === "peak-hold" ? "max hold" : "average"}, dB re reference`, xValues: xs, yValues: levels },
      { label: "mask (highest allowed)", xValues: xs, yValues: allowed, colour: MASK_COLOUR, dashed: true },
    ],
    markers,
    shaded,
    notes,
    widthPx: input.widthPx ?? 1200,
    heightPx: input.heightPx ?? 700,
  }).png;
}

/** The points inside the covered offsets; the mask NaN where it sets no limit (the line breaks there). */
function covered(r: MaskReading, allowedDb: readonly (number | null)[]): { xs: Float64Array; levels: Float64Array; allowed: Float64Array } {
  const keep: number[] = [];
  for (let i = 0; i < r.offsetHz.length; i++) if (Math.abs(r.offsetHz[i] as number) <= r.coveredHz) keep.push(i);
  const xs = new Float64Array(keep.length);
  const levels = new Float64Array(keep.length);
  const allowed = new Float64Array(keep.length);
  keep.forEach((i, j) => {
    xs[j] = r.offsetHz[i] as number;
    levels[j] = r.levelDb[i] as number;
    allowed[j] = allowedDb[i] ?? NaN;
  });
  return { xs, levels, allowed };
}
