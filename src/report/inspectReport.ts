/**
 * The `inspect` report (interface.md, `inspect --json`): what the file is, whether it is
 * healthy, and where its strongest line is. Built from pass 1; numbers only, no I/O.
 */
import type { CaptureMeta, Origin, SampleSpan } from "../capture/index.js";
import type { Pass1Result } from "../analysis/index.js";
import { TOOL_NAME, TOOL_VERSION } from "../version.js";
import { absoluteFrequencyHz } from "../analysis/clockCorrection.js";
import { detectDcSpike } from "../measure/index.js";

export interface CaptureSection {
  readonly path: string;
  readonly sha256: string;
  /** SHA-256 of the .sigmf-meta file (it sets the rate and centre) for SigMF, else null. */
  readonly metadataSha256: string | null;
  readonly container: CaptureMeta["container"];
  readonly format: CaptureMeta["format"];
  readonly complex: boolean;
  readonly sampleRateHz: number;
  readonly centerHz: number | null;
  readonly ppm: number;
  readonly swapIq: boolean;
  readonly datetime: string | null;
  readonly startS: number;
  readonly samples: number;
  readonly fileSamples: number;
  readonly durationS: number;
  readonly fileDurationS: number;
  readonly fileBytes: number;
  readonly origin: { readonly format: Origin; readonly sampleRateHz: Origin; readonly centerHz: Origin };
}

export interface QualitySection {
  readonly clippingPercent: number;
  readonly dcOffsetDbfs: number;
  readonly iqGainImbalanceDb: number;
  readonly iqPhaseImbalanceDeg: number;
  readonly imageRejectionDb: number;
  readonly noiseFloorDbfsPerHz: number;
  readonly nonFiniteSamples: number;
  readonly meanPowerDbfs: number;
  /** Level of a receiver DC spike at 0 Hz (docs/methods.md, "DC spike"), or null when there is none. */
  readonly dcSpikeDbfs: number | null;
}

export interface InspectReport {
  readonly schema: "iqaudit/inspect/1";
  readonly tool: { readonly name: string; readonly version: string };
  readonly measuredAt: string;
  readonly capture: CaptureSection;
  readonly quality: QualitySection;
  readonly spectrum: {
    readonly peakOffsetHz: number;
    readonly peakFrequencyHz: number | null;
    readonly peakDbfs: number;
    readonly resolutionHz: number;
    readonly binWidthHz: number;
    readonly fftLength: number;
    readonly window: string;
    readonly segments: number;
  };
  /** A SigMF recording's description and annotations (null for raw and WAV). */
  readonly sigmf: SigmfSection | null;
  readonly uncertainty: Readonly<Record<string, number>>;
  readonly methods: Readonly<Record<string, string>>;
  readonly warnings: readonly string[];
}

export interface SigmfSection {
  readonly description: string | null;
  readonly annotations: readonly {
    readonly label: string | null;
    readonly comment: string | null;
    /** Absolute RF edges, Hz (core:freq_lower_edge, core:freq_upper_edge), or null. */
    readonly lowerFrequencyHz: number | null;
    readonly upperFrequencyHz: number | null;
    /** From the first sample of the file, s (core:sample_start / rate). */
    readonly startS: number;
    /** core:sample_count / rate, s, or null when the annotation runs to the end. */
    readonly durationS: number | null;
  }[];
}

/** The SigMF section of the inspect report: times at the capture's rate. */
export function sigmfSection(meta: CaptureMeta): SigmfSection | null {
  if (meta.sigmf === null) return null;
  const fs = meta.sampleRateHz;
  return {
    description: meta.sigmf.description,
    annotations: meta.sigmf.annotations.map((a) => ({
      label: a.label,
      comment: a.comment,
      lowerFrequencyHz: a.lowerFrequencyHz,
      upperFrequencyHz: a.upperFrequencyHz,
      startS: a.sampleStart / fs,
      durationS: a.sampleCount === null ? null : a.sampleCount / fs,
    })),
  };
}

export function captureSection(meta: CaptureMeta, span: SampleSpan, sha256: string): CaptureSection {
  return {
    path: meta.path,
    sha256,
    metadataSha256: meta.sigmf?.metaSha256 ?? null,
    container: meta.container,
    format: meta.format,
    complex: meta.complex,
    sampleRateHz: meta.sampleRateHz,
    centerHz: meta.centerHz,
    ppm: meta.ppm,
    swapIq: meta.swapIq,
    datetime: meta.datetime,
    startS: span.startSample / meta.sampleRateHz,
    samples: span.sampleCount,
    fileSamples: meta.fileSamples,
    durationS: span.sampleCount / meta.sampleRateHz,
    fileDurationS: meta.fileSamples / meta.sampleRateHz,
    fileBytes: meta.fileBytes,
    origin: meta.origin,
  };
}

export function qualitySection(pass1: Pass1Result): QualitySection {
  const h = pass1.health;
  return {
    clippingPercent: h.clippingPercent,
    dcOffsetDbfs: h.dcOffsetDbfs,
    iqGainImbalanceDb: h.iqGainImbalanceDb,
    iqPhaseImbalanceDeg: h.iqPhaseImbalanceDeg,
    imageRejectionDb: h.imageRejectionDb,
    noiseFloorDbfsPerHz: pass1.noiseFloor.dbfsPerHz,
    nonFiniteSamples: h.nonFiniteSamples,
    meanPowerDbfs: h.meanPowerDbfs,
    dcSpikeDbfs: dcSpikeDbfs(pass1),
  };
}

function dcSpikeDbfs(pass1: Pass1Result): number | null {
  // A capture with no noise (all zero) has no floor to stand a spike above.
  const floor = pass1.noiseFloor.densityPerHz;
  if (!(floor > 0) || !Number.isFinite(floor)) return null;
  const spike = detectDcSpike(pass1.psd, floor);
  return spike.present ? spike.levelDbfs : null;
}

export function buildInspectReport(
  meta: CaptureMeta,
  span: SampleSpan,
  pass1: Pass1Result,
  warnings: readonly string[],
  measuredAt: Date = new Date(),
): InspectReport {
  const { psd, peak } = pass1;
  // Peak frequency: parabolic interpolation of the dB values; its error is bounded by half a
  // bin, taken as a rectangular distribution (GUM 4.3.7): u = w/(2√3), expanded k = 2.
  const peakU = (2 * psd.binWidthHz) / (2 * Math.sqrt(3));
  return {
    schema: "iqaudit/inspect/1",
    tool: { name: TOOL_NAME, version: TOOL_VERSION },
    measuredAt: measuredAt.toISOString(),
    capture: captureSection(meta, span, pass1.sha256),
    quality: qualitySection(pass1),
    spectrum: {
      peakOffsetHz: peak.offsetHz,
      peakFrequencyHz: absoluteFrequencyHz(meta, peak.offsetHz),
      peakDbfs: peak.dbfs,
      resolutionHz: psd.enbwHz,
      binWidthHz: psd.binWidthHz,
      fftLength: psd.fftLength,
      window: psd.window,
      segments: psd.segmentCount,
    },
    sigmf: sigmfSection(meta),
    uncertainty: {
      "spectrum.peakOffsetHz": peakU,
      ...(meta.centerHz === null ? {} : { "spectrum.peakFrequencyHz": peakU }),
    },
    methods: {
      psd: `Welch: ${psd.window} window, ${psd.fftLength}-point segments, 50 % overlap, ${psd.segmentCount} segments averaged, density scaling (FS²/Hz)`,
      noiseFloor: pass1.noiseFloor.method,
      health: "second-order moments of I and Q after DC removal (gain, phase); image rejection from gain and phase",
      peak: "highest PSD bin, parabolic interpolation of dB values; power = density × ENBW",
      sha256: "SHA-256 of the whole data file as stored, computed during the same read",
      ...(meta.sigmf === null ? {} : { metadataSha256: "SHA-256 of the .sigmf-meta file as stored, computed as it was read" }),
    },
    warnings: noSignal(pass1) ? [...warnings, "the analysed span holds no signal (every sample is zero, or was not finite and read as 0): its health figures and strongest line mean nothing"] : warnings,
  };
}

/** Whether the PSD holds no power at all (an all-zero span). */
function noSignal(pass1: Pass1Result): boolean {
  return !pass1.psd.densityPerHz.some((v) => v > 0);
}
