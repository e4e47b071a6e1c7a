/**
 * `iqaudit check <capture> --licence F | --template NAME [--assigned Hz]`: one emission against the
 * terms of its licence. The licence (a file, a template, or a template with a file's fields over
 * it) says what to check; the emission is measured by `measure` on a channel centred on the
 * assigned frequency and wide enough for the mask and the adjacent channels, with the whole-span
 * stage (carrier, peak deviation over every sample, OBW, max-hold spectrum at the mask's RBW);
 * src/licence judges each term with its uncertainty. Writes check.json (last), check.md,
 * mask.png and the measure report beside them with --out.
 */
import { basename } from "node:path";
import type { CaptureMeta, SampleSpan } from "../capture/index.js";
import { LicenceFileError, ParameterError, UsageError } from "../errors.js";
import { WholeSpanAccumulator, type HoldSpectra, type Pass1Options, type WholeSpanFigures } from "../analysis/index.js";
import { ChannelExtractor } from "../dsp/index.js";
import { checkMeasureOptions, measureEmission } from "../analysis/measureEmission.js";
import type { EmissionFigures } from "../analysis/emissionFigures.js";
import { correctedOffsetHz } from "../analysis/clockCorrection.js";
import { locateEmission } from "../measure/index.js";
import {
  evaluateLicence, findTemplate, licenceMask, mergeLicences, parseDesignator, readLicenceFile,
  type CheckInputs, type CheckOutcome, type Licence, type Mask, type MaskReading, type MergedLicence, type PeakFigure,
} from "../licence/index.js";
import { withAnalysedCapture, type AnalysedCapture, type CaptureArgs } from "./analyseCapture.js";
import { buildMeasureReport, type MeasureReport } from "../report/measureReport.js";
import { buildCheckReport, type CheckReport } from "../report/checkReport.js";
import { checkMarkdown } from "../report/checkMarkdown.js";
import { maskFigure } from "../report/maskFigure.js";
import { publishFolder, type FolderSpec, type FolderWriter } from "../report/index.js";
import { writeReportFolder } from "./measure.js";

export interface CheckOptions {
  readonly capture: CaptureArgs;
  /** A licence file (JSON, docs/licence.md). */
  readonly licencePath?: string | undefined;
  /** A template's name (iqaudit check --list-templates). */
  readonly template?: string | undefined;
  /** Assigned frequency, Hz: over the template's and the file's. */
  readonly assignedHz?: number | undefined;
  /** Uncertainty of the receiver's reference, ppm (k = 2), into the carrier's uncertainty. */
  readonly referencePpm?: number | undefined;
  readonly outDir?: string | undefined;
  /** Instead of outDir: a folder inside one being published (the demo's). */
  readonly outFolder?: FolderWriter | undefined;
  readonly pass1?: Pass1Options | undefined;
}

export interface CheckResult {
  readonly report: CheckReport;
  /** Files written, check.json last. */
  readonly files: readonly string[];
}

/** The check folder: check.json is its manifest, written last. */
export const CHECK_FOLDER: FolderSpec = {
  manifest: "check.json",
  legacyEntry: (name) => name === "check.md" || name === "report.json" || name === "report.md" || name.endsWith(".png"),
};

export async function checkCommand(path: string, options: CheckOptions): Promise<CheckResult> {
  const merged = await loadLicence(options);
  const mask = maskOf(merged, options);
  const { outDir, outFolder } = options;
  if (outFolder !== undefined) return checked(path, options, merged, mask, (r) => writeCheckFolder(outFolder, r));
  if (outDir === undefined) return checked(path, options, merged, mask, async (r) => ({ report: r.report, files: [] }));
  return publishFolder(outDir, CHECK_FOLDER, (w) => checked(path, options, merged, mask, (r) => writeCheckFolder(w, r)));
}

/** The licence to check against: a template, a file over it, and --assigned over both. */
async function loadLicence(options: CheckOptions): Promise<MergedLicence> {
  if (options.licencePath === undefined && options.template === undefined) {
    throw new UsageError("--licence", "give a licence file (--licence FILE) or a template (--template NAME; iqaudit check --list-templates)");
  }
  const template = options.template === undefined ? null : findTemplate(options.template);
  let file: { path: string; licence: Licence } | null = null;
  if (options.licencePath !== undefined) {
    file = { path: options.licencePath, licence: await readLicenceFile(options.licencePath) };
  }
  const merged = mergeLicences(template, file);
  const withAssigned = options.assignedHz === undefined ? merged : assignedOver(merged, options.assignedHz);
  if (checkableTerms(withAssigned.licence).length === 0) {
    throw new UsageError(options.licencePath === undefined ? "--template" : options.licencePath, "the licence holds no term to check (tolerance, designator, deviation, bandwidth, mask or channel spacing)");
  }
  return withAssigned;
}

function assignedOver(merged: MergedLicence, hz: number): MergedLicence {
  if (!(hz > 0 && Number.isFinite(hz))) throw new UsageError("--assigned", `${hz} Hz must be a positive frequency`);
  return {
    ...merged,
    licence: { ...merged.licence, assignedFrequencyHz: hz },
    origins: [...merged.origins.filter((o) => o.field !== "assignedFrequencyHz"), { field: "assignedFrequencyHz", origin: "option", source: "--assigned", status: null, note: null }],
  };
}

function checkableTerms(l: Licence): string[] {
  const terms = [l.frequencyTolerancePpm, l.frequencyToleranceHz, l.emissionDesignator, l.maxDeviationHz, l.authorisedBandwidthHz, l.mask, l.channelSpacingHz];
  return terms.filter((t) => t !== undefined).map(String);
}

/** The licence's mask; a rule mask that lacks a field it needs is a licence problem naming the field. */
function maskOf(merged: MergedLicence, options: CheckOptions): Mask | null {
  try {
    return licenceMask(merged.licence);
  } catch (e) {
    if (e instanceof ParameterError) throw new LicenceFileError(options.licencePath ?? `template ${options.template ?? ""}`, e.subject, e.message.slice(e.subject.length + 2));
    throw e;
  }
}

interface Checked {
  readonly report: CheckReport;
  readonly outcome: CheckOutcome;
  readonly measure: MeasureReport;
  readonly analysed: AnalysedCapture;
  readonly figures: EmissionFigures;
  readonly inputs: CheckInputs;
}

async function checked<T>(
  path: string, options: CheckOptions, merged: MergedLicence, mask: Mask | null,
  then: (r: Checked) => Promise<T>,
): Promise<T> {
  const licence = merged.licence;
  return withAnalysedCapture(path, options.capture, options.pass1 ?? {}, async (a, source) => {
    const placement = placeChannel(a, licence, mask);
    // The wide channel (mask, adjacent channels) is read in the same pass as measure's own.
    const wide = wideChannel(a, placement, licence);
    const figures = await measureEmission(source, a.span, a.pass1, {
      channel: { offsetHz: placement.offsetHz, widthHz: placement.measureWidthHz },
      nominalHz: licence.assignedFrequencyHz,
      referencePpm: options.referencePpm,
      onInputBlock: wide.push,
    });
    const measure = buildMeasureReport(a.meta, a.span, a.pass1, figures, a.warnings);
    const inputs = checkInputs(a, figures, wide.finish(), licence, placement);
    const outcome = evaluateLicence(licence, mask, inputs);
    const report = buildCheckReport({ merged, mask, outcome, measure, placement, inputs });
    return then({ report, outcome, measure, analysed: a, figures, inputs });
  }, (meta, span) => checkBefore(meta, span, licence, options));
}

/** Before any sample is read: what the licence needs of the capture. */
function checkBefore(meta: CaptureMeta, span: SampleSpan, licence: Licence, options: CheckOptions): void {
  if (licence.assignedFrequencyHz !== undefined && meta.centerHz === null) {
    throw new UsageError("--center", `the licence's assigned frequency needs the capture's centre frequency: give --center (${meta.path} does not say it)`);
  }
  if (licence.assignedFrequencyHz !== undefined && meta.centerHz !== null) {
    const offset = licence.assignedFrequencyHz - meta.centerHz;
    if (Math.abs(offset) >= 0.45 * meta.sampleRateHz) {
      throw new UsageError("--assigned", `${licence.assignedFrequencyHz} Hz lies ${offset.toFixed(0)} Hz from the capture's centre, outside its ±${(0.45 * meta.sampleRateHz).toFixed(0)} Hz usable band`);
    }
  }
  checkMeasureOptions({ referencePpm: options.referencePpm }, meta, span);
}

/**
 * The wide channel's whole-span stage, fed with the capture's input blocks as measure reads them:
 * max-hold and average spectra at the mask's RBW, the peak reference, and the PSD of the adjacent channels.
 */
function wideChannel(a: AnalysedCapture, placement: Placement, licence: Licence): { push: (block: Float32Array) => void; finish: () => WholeSpanFigures | null } {
  const extractor = new ChannelExtractor({ sampleRateHz: a.meta.sampleRateHz, offsetHz: placement.offsetHz, bandwidthHz: placement.widthHz, reuseOutput: true });
  const acc = new WholeSpanAccumulator(extractor, a.span.sampleCount, {
    offsetHz: placement.offsetHz, bandwidthHz: placement.widthHz,
    maskResolutionHz: licence.maskResolutionHz ?? 300, referenceBandHz: placement.referenceBandHz,
    // The emission's deviation is measured in its own channel; this one is read for its spectra only.
    deviation: false,
  });
  let pushed = 0;
  return {
    push: (block) => { pushed += block.length; acc.push(extractor.push(block)); },
    finish: () => (pushed === 0 ? null : acc.finish()),
  };
}

/** Where the check's channels sit and how wide they are. */
export interface Placement {
  /** Channel centre, Hz from the capture centre (as recorded). */
  readonly offsetHz: number;
  /** The wide channel of the mask and the adjacent channels, Hz. */
  readonly widthHz: number;
  /** The channel the emission is measured in (deviation, carrier, class, OBW): 1.5 × its band, Hz. */
  readonly measureWidthHz: number;
  /** The mask's origin in the channel's frequencies, Hz (the assigned frequency; 0 without one). */
  readonly originInChannelHz: number;
  /** Where the channel centre came from. */
  readonly centredOn: "assigned frequency" | "strongest emission";
  /** Width of the band of the "peak" reference and the bandwidth figures: authorised, else designated, bandwidth. */
  readonly referenceBandHz: number | undefined;
}

/**
 * The channels, centred on the assigned frequency (else the strongest emission). The wide one's
 * half-width is the farthest offset a term needs (the mask's last point or 250 % of the
 * authorised bandwidth plus 10 %, the adjacent channel and its band, 1.5 × the bandwidth), within
 * the capture's ±45 %; the emission is measured in 1.5 × its authorised (else designated, else
 * 12.5 kHz) bandwidth, so that the discriminator sees no more noise than the emission needs.
 */
function placeChannel(a: AnalysedCapture, licence: Licence, mask: Mask | null): Placement {
  const fs = a.meta.sampleRateHz;
  const band = licence.authorisedBandwidthHz ?? (licence.emissionDesignator === undefined ? undefined : parseDesignator(licence.emissionDesignator).bandwidthHz);
  const assigned = licence.assignedFrequencyHz;
  const centre = a.meta.centerHz;
  const offsetHz = assigned !== undefined && centre !== null ? assigned - centre : strongestOffsetHz(a);
  const needs = [1.5 * (band ?? 12_500), 12_500];
  if (mask !== null) needs.push(maskExtentHz(mask, band));
  if (licence.channelSpacingHz !== undefined) needs.push(1.1 * (licence.channelSpacingHz + (band ?? licence.channelSpacingHz) / 2));
  const half = Math.min(Math.max(...needs), 0.45 * fs - Math.abs(offsetHz));
  // The assigned frequency as the channel sees it: the channel is at the recorded offset; --ppm moves the truth.
  const originInChannelHz = assigned !== undefined && centre !== null ? (assigned - centre) - correctedOffsetHz(a.meta, offsetHz) : 0;
  return {
    offsetHz, widthHz: 2 * half, measureWidthHz: measureWidthHz(a, offsetHz, half, licence, band), originInChannelHz,
    centredOn: assigned !== undefined && centre !== null ? "assigned frequency" : "strongest emission",
    referenceBandHz: band,
  };
}

/**
 * The emission's channel: 1.5 × the licence's band, or wider when the emission found in pass 1
 * reaches further (an emission wider than its licence is measured whole), with 20 % room for its
 * skirts. The emission is looked for within its own channel (± half the spacing, at least
 * ± 0.75 × the band and 6.25 kHz), regions joined only across 3 bins, so that a neighbour is
 * not taken for part of it; at most the wide channel.
 */
function measureWidthHz(a: AnalysedCapture, offsetHz: number, half: number, licence: Licence, band: number | undefined): number {
  const floor = a.pass1.noiseFloor.densityPerHz;
  const own = Math.min(half, Math.max((licence.channelSpacingHz ?? 0) / 2, 0.75 * (band ?? 0), 6250));
  const region = floor > 0
    ? locateEmission(a.pass1.psd, floor, { channel: { offsetHz, widthHz: 2 * own }, mergeGapHz: 3 * a.pass1.psd.binWidthHz, dcOffsetDbfs: a.pass1.health.dcOffsetDbfs })
    : null;
  const reach = region === null ? 0 : Math.max(Math.abs(region.upperEdgeHz - offsetHz), Math.abs(region.lowerEdgeHz - offsetHz));
  return Math.min(2 * half, Math.max(1.5 * (band ?? 12_500), 2.4 * reach));
}

function maskExtentHz(mask: Mask, band: number | undefined): number {
  let far = 1.1 * 2.5 * (band ?? 12_500);
  for (let f = 1000; f <= 400_000; f *= 1.05) if (mask.allowedDb(f) !== null && f > far) { far = f; break; }
  return far;
}

function strongestOffsetHz(a: AnalysedCapture): number {
  const floor = a.pass1.noiseFloor.densityPerHz;
  const region = floor > 0 ? locateEmission(a.pass1.psd, floor, { dcOffsetDbfs: a.pass1.health.dcOffsetDbfs }) : null;
  if (region === null) throw new UsageError("--assigned", "no emission stands above the noise and the licence gives no assigned frequency: nothing to check");
  return region.centerOffsetHz;
}

/** The figures the checks judge, from the measurement and its whole-span stage. */
function checkInputs(a: AnalysedCapture, f: EmissionFigures, wide: WholeSpanFigures | null, licence: Licence, placement: Placement): CheckInputs {
  const ws = f.wholeSpan;
  const fm = f.modulation.class === "fm" ? f.fm : null;
  const peak = (side: "positive" | "negative"): PeakFigure => {
    if (fm !== null) {
      const m = side === "positive" ? fm.positiveDeviationHz : fm.negativeDeviationHz;
      return { value: m.value, uncertainty: m.uncertainty, method: m.method, timeS: side === "positive" ? fm.positivePeakTimeS : fm.negativePeakTimeS };
    }
    const p = ws === null ? null : side === "positive" ? ws.positivePeak : ws.negativePeak;
    if (p === null) return { value: null, uncertainty: null, method: "no whole-span figures", timeS: null };
    return { value: p.deviationHz.value, uncertainty: p.deviationHz.uncertainty, method: `${p.deviationHz.method} (the class is ${f.modulation.class}: the discriminator over every sample)`, timeS: p.timeS };
  };
  const c = f.carrier.frequencyHz;
  const o = f.bandwidth.occupiedHz;
  return {
    carrierFrequencyHz: { value: c.value, uncertainty: c.uncertainty, method: c.method },
    positiveDeviationHz: peak("positive"),
    negativeDeviationHz: peak("negative"),
    occupiedBandwidthHz: { value: o.value, uncertainty: o.uncertainty, method: o.method },
    emissionClass: f.modulation.class,
    designator: f.emission.designator,
    classConfidence: f.modulation.confidence,
    classMethod: f.modulation.method,
    maskSpectrum: wide?.hold == null ? null : maskSpectrum(a, f, wide, wide.hold, licence, placement),
    adjacent: wide === null ? null : { psd: wide.psd, centreHz: placement.originInChannelHz, noiseDensityPerHz: a.pass1.noiseFloor.densityPerHz },
  };
}

/**
 * The max-hold (or average) spectrum at the mask's RBW, relative to the reference, on the mask's
 * origin. Reference "carrier": the emission's total mean power (channel power less the noise in
 * the channel); "peak": the highest power one frame held in the reference band. Uncertainty of a
 * point (k = 2, dB): the reference's, plus the Hann scallop loss at half the bin spacing (a line
 * between two bins reads low by up to it; REFERENCES.md §8, 1.42 dB at half an L-point bin), added.
 */
function maskSpectrum(a: AnalysedCapture, f: EmissionFigures, ws: WholeSpanFigures, h: HoldSpectra, licence: Licence, placement: Placement): MaskReading {
  const detector = licence.maskDetector ?? "peak-hold";
  const referenceKind = licence.maskReference ?? "carrier";
  const n0 = a.pass1.noiseFloor.densityPerHz;
  const ref = referenceLevel(f, h, referenceKind, n0, placement.measureWidthHz);
  const levels = detector === "peak-hold" ? h.maxHoldDbfs : h.averageDbfs;
  const offsetHz = new Float64Array(h.frequencyHz.length);
  const levelDb = new Float64Array(h.frequencyHz.length);
  for (let i = 0; i < offsetHz.length; i++) {
    offsetHz[i] = (h.frequencyHz[i] as number) - placement.originInChannelHz;
    levelDb[i] = (levels[i] as number) - ref.dbfs;
  }
  // The noise's reading: density × RBW, and for a max hold over M frames the expected maximum of M exponential variates, H_M ≈ ln M + 0.5772.
  const holdGain = detector === "peak-hold" ? 10 * Math.log10(Math.log(Math.max(h.frameCount, 1)) + 0.5772) : 0;
  const noiseDb = 10 * Math.log10(n0 * h.resolutionHz) + holdGain - ref.dbfs;
  const scallop = hannScallopDb(h.frameLength / (2 * h.linear.fftLength));
  return {
    offsetHz, levelDb, timeS: h.maxTimeS, noiseDb,
    coveredHz: placement.widthHz / 2 - Math.abs(placement.originInChannelHz),
    uncertaintyDb: (ref.uncertaintyDb ?? 0) + scallop,
    referenceDbfs: ref.dbfs, reference: referenceKind, detector, resolutionHz: h.resolutionHz,
    method: `${detector} over ${h.frameCount} Hann frames at ${h.resolutionHz.toFixed(1)} Hz RBW (${ws.durationS.toFixed(2)} s), relative to ${ref.description} ${ref.dbfs.toFixed(2)} dBFS; ± ${ref.uncertaintyDb === null ? "(reference: not stated)" : `${ref.uncertaintyDb.toFixed(2)} dB reference`} + ${scallop.toFixed(2)} dB scallop (k = 2)`,
  };
}

function referenceLevel(f: EmissionFigures, hold: HoldSpectra, kind: "carrier" | "peak", n0: number, widthHz: number): { dbfs: number; uncertaintyDb: number | null; description: string } {
  const p = f.power.channelDbfs;
  // A channel power without a stated uncertainty adds none here; the method line says so.
  const u = p.uncertainty;
  if (kind === "peak" && hold.bandPeakDbfs !== null) {
    return { dbfs: hold.bandPeakDbfs, uncertaintyDb: u, description: "the highest emission in the authorised bandwidth (per-frame power)" };
  }
  const total = p.value === null ? NaN : 10 ** (p.value / 10) - n0 * widthHz;
  const dbfs = total > 0 ? 10 * Math.log10(total) : (p.value ?? NaN);
  return { dbfs, uncertaintyDb: u, description: "the emission's total mean power (channel power less the noise)" };
}

/** Loss of a Hann window's response at ν bins off a line, dB: |sin πν / (πν (1 − ν²))| (Harris 1978). */
export function hannScallopDb(nu: number): number {
  if (nu <= 0) return 0;
  const x = Math.PI * nu;
  return -20 * Math.log10(Math.abs(Math.sin(x) / (x * (1 - nu * nu))));
}

/** The measure report's files, then mask.png, check.md and check.json (last, listing the others). */
async function writeCheckFolder(w: FolderWriter, r: Checked): Promise<CheckResult> {
  await writeReportFolder(w, r.analysed, r.figures, r.measure);
  if (r.outcome.mask !== null && r.inputs.maskSpectrum !== null) {
    await w.write("mask.png", maskFigure({ report: r.report, outcome: r.outcome, reading: r.inputs.maskSpectrum, captureName: basename(r.analysed.meta.path) }));
  }
  await w.write("check.md", checkMarkdown(r.report, w.files().map((f) => f.path)));
  const report: CheckReport = { ...r.report, files: w.files() };
  await w.write("check.json", `${JSON.stringify(report, null, 2)}\n`);
  return { report, files: w.files().map((file) => `${w.target}/${file.path}`) };
}
