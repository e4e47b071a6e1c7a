/** The `inspect` report as text for a person (the JSON form is the contract; this is its reading). */
import type { InspectReport, SigmfSection } from "./inspectReport.js";
import { alignedRows, formatBytes, formatHz, formatRate, formatSeconds } from "./format.js";

const ORIGIN_WORDS: Record<string, string> = {
  flag: "from the command line",
  sigmf: "from the SigMF metadata",
  "wav-header": "from the WAV header",
  "file-name": "from the file name",
  default: "default",
  unknown: "unknown",
};

export function inspectText(r: InspectReport): string {
  const c = r.capture;
  const q = r.quality;
  const s = r.spectrum;
  const fmt = (x: number, d: number, unit: string): string => `${x.toFixed(d)} ${unit}`;
  const capture = alignedRows([
    ["file", c.path],
    ["SHA-256", c.sha256],
    ...(c.metadataSha256 !== null ? ([["metadata SHA-256", `${c.metadataSha256}  (the .sigmf-meta)`]] as [string, string][]) : []),
    ["container", `${c.container}, ${c.format}${c.complex ? "" : " (real signal)"}  (${ORIGIN_WORDS[c.origin.format]})`],
    ["sample rate", `${formatRate(c.sampleRateHz)}  (${ORIGIN_WORDS[c.origin.sampleRateHz]})`],
    ["centre", c.centerHz === null ? "unknown (give --center for absolute frequencies)" : `${formatHz(c.centerHz)}  (${ORIGIN_WORDS[c.origin.centerHz]})`],
    ...(c.ppm !== 0 ? ([["clock correction", `${c.ppm} ppm`]] as [string, string][]) : []),
    ...(c.datetime !== null ? ([["recorded", c.datetime]] as [string, string][]) : []),
    ["size", `${c.fileSamples} samples, ${formatSeconds(c.fileDurationS)}, ${formatBytes(c.fileBytes)}`],
    ["analysed", `${c.samples} samples from ${formatSeconds(c.startS)}, ${formatSeconds(c.durationS)}`],
  ]);
  const health = alignedRows([
    ["clipping", `${q.clippingPercent.toFixed(4)} % of components at full scale`],
    ["non-finite samples", `${q.nonFiniteSamples}`],
    ["DC offset", fmt(q.dcOffsetDbfs, 1, "dBFS")],
    ["DC spike", q.dcSpikeDbfs === null ? "none" : `${q.dcSpikeDbfs.toFixed(1)} dBFS at 0 Hz (a receiver artefact, not an emission)`],
    ["mean power", fmt(q.meanPowerDbfs, 1, "dBFS")],
    ["IQ gain imbalance", fmt(q.iqGainImbalanceDb, 3, "dB")],
    ["IQ phase imbalance", fmt(q.iqPhaseImbalanceDeg, 3, "°")],
    ["image rejection", fmt(q.imageRejectionDb, 1, "dB")],
    ["noise floor", fmt(q.noiseFloorDbfsPerHz, 1, "dBFS/Hz")],
  ]);
  const peakAbs = s.peakFrequencyHz === null ? "" : `  (${formatHz(s.peakFrequencyHz)})`;
  const spectrum = alignedRows([
    ["strongest line", `${formatHz(s.peakOffsetHz)} offset${peakAbs}, ${fmt(s.peakDbfs, 1, "dBFS")} in ${formatHz(s.resolutionHz)} RBW`],
    ["PSD", `${s.fftLength}-point ${s.window}, ${s.segments} segments, bin ${formatHz(s.binWidthHz)}`],
  ]);
  const warnings = r.warnings.length === 0 ? "" : `\nWarnings\n${r.warnings.map((w) => `  - ${w}`).join("\n")}\n`;
  return `Capture\n${capture}\n${sigmfText(r.sigmf)}\nHealth\n${health}\n\nSpectrum\n${spectrum}\n${warnings}`;
}

/** The recording's description and one line an annotation: label, edges, time span, comment. */
function sigmfText(s: SigmfSection | null): string {
  if (s === null) return "";
  const lines = s.annotations.map((a, k) => {
    const edges = a.lowerFrequencyHz === null || a.upperFrequencyHz === null
      ? "no frequency edges"
      : `${formatHz(a.lowerFrequencyHz)} – ${formatHz(a.upperFrequencyHz)}`;
    const span = a.durationS === null ? `from ${formatSeconds(a.startS)} to the end` : `${formatSeconds(a.startS)} – ${formatSeconds(a.startS + a.durationS)}`;
    const comment = a.comment === null ? "" : `\n       ${a.comment}`;
    return `  ${k + 1}. ${a.label ?? "(no label)"}: ${edges}, ${span}${comment}`;
  });
  const description = s.description === null ? [] : [`  description: ${s.description}`];
  const annotations = lines.length === 0 ? ["  no annotations"] : [`  annotations (${lines.length}):`, ...lines.map((l) => `  ${l}`)];
  return `\nSigMF recording\n${[...description, ...annotations].join("\n")}\n`;
}
