/**
 * The `measure` report for a person (report.md): who measured what, from which file (with its
 * SHA-256 so that the file can be checked again), the figures in a table with units and
 * uncertainty, and the method of each in one line. Built from the JSON report alone, so the two
 * never disagree.
 */
import { basename } from "node:path";
import type { MeasureReport } from "./measureReport.js";
import { formatHz, formatRate, formatSeconds, formatUncertainty, groupDigits, uncertaintyDecimals } from "./format.js";
import { REFERENCE_NOT_INCLUDED } from "../measure/index.js";
import { displayClass } from "./className.js";

interface Row {
  readonly label: string;
  readonly path: string;
  readonly value: number | null;
  readonly unit: string;
  readonly digits: number;
}

function cell(r: MeasureReport, row: Row): [string, string, string] | null {
  if (row.value === null) return null;
  const u = r.uncertainty[row.path];
  // The value to the same decimal place as its uncertainty (GUM §7.2.6).
  const digits = u === undefined ? row.digits : uncertaintyDecimals(u, row.digits);
  // An absolute frequency in MHz, grouped in threes (formatHz), to the same decimal place in Hz.
  const value = row.unit === "Hz" && Math.abs(row.value) >= 1e6
    ? `${groupDigits((row.value / 1e6).toFixed(digits + 6))} MHz`
    : `${row.value.toFixed(digits)} ${row.unit}`.trim();
  const unc = u === undefined ? "" : formatUncertainty(u, row.digits, row.unit);
  return [row.label, value, unc];
}

export function measureMarkdown(r: MeasureReport, figures: readonly string[]): string {
  const c = r.capture;
  const rows: Row[] = [
    { label: "Carrier offset", path: "carrier.offsetHz", value: r.carrier.offsetHz, unit: "Hz", digits: 1 },
    { label: "Carrier frequency", path: "carrier.frequencyHz", value: r.carrier.frequencyHz, unit: "Hz", digits: 1 },
    { label: "Frequency error", path: "carrier.errorPpm", value: r.carrier.errorPpm, unit: "ppm", digits: 3 },
    { label: "Occupied bandwidth (99 %)", path: "bandwidth.occupiedHz", value: r.bandwidth.occupiedHz, unit: "Hz", digits: 0 },
    { label: "OBW lower edge (offset)", path: "bandwidth.lowerEdgeHz", value: r.bandwidth.lowerEdgeHz, unit: "Hz", digits: 0 },
    { label: "OBW upper edge (offset)", path: "bandwidth.upperEdgeHz", value: r.bandwidth.upperEdgeHz, unit: "Hz", digits: 0 },
    { label: `${r.bandwidth.xDb} dB bandwidth (${r.bandwidth.xDbReference === "peak-hold" ? "re max-hold maximum" : "re mean PSD maximum"})`, path: "bandwidth.xDbHz", value: r.bandwidth.xDbHz, unit: "Hz", digits: 0 },
    { label: "Channel power", path: "power.channelDbfs", value: r.power.channelDbfs, unit: "dBFS", digits: 2 },
    { label: "SNR (in channel)", path: "power.snrDb", value: r.power.snrDb, unit: "dB", digits: 1 },
  ];
  if (r.fm !== null) {
    rows.push(
      { label: `Peak deviation (audio ≤ ${formatHz(r.fm.audioBandwidthHz)})`, path: "fm.peakDeviationHz", value: r.fm.peakDeviationHz, unit: "Hz", digits: 0 },
      { label: "Positive deviation", path: "fm.positiveDeviationHz", value: r.fm.positiveDeviationHz, unit: "Hz", digits: 0 },
      { label: "Negative deviation", path: "fm.negativeDeviationHz", value: r.fm.negativeDeviationHz, unit: "Hz", digits: 0 },
      { label: `Time of the positive peak (from the span start; peaks over the ${r.fm.peaksOver})`, path: "fm.positiveDeviationTimeS", value: r.fm.positiveDeviationTimeS, unit: "s", digits: 3 },
      { label: "Time of the negative peak", path: "fm.negativeDeviationTimeS", value: r.fm.negativeDeviationTimeS, unit: "s", digits: 3 },
      { label: "RMS deviation", path: "fm.rmsDeviationHz", value: r.fm.rmsDeviationHz, unit: "Hz", digits: 0 },
      { label: "Peak deviation, unfiltered", path: "fm.rawPeakDeviationHz", value: r.fm.rawPeakDeviationHz, unit: "Hz", digits: 0 },
      { label: "Modulating frequency", path: "fm.modulatingFrequencyHz", value: r.fm.modulatingFrequencyHz, unit: "Hz", digits: 1 },
      { label: "Modulation index", path: "fm.modulationIndex", value: r.fm.modulationIndex, unit: "", digits: 3 },
      { label: "Carson bandwidth", path: "fm.carsonBandwidthHz", value: r.fm.carsonBandwidthHz, unit: "Hz", digits: 0 },
      { label: "Sub-audible tone", path: "fm.toneHz", value: r.fm.toneHz, unit: "Hz", digits: 2 },
      { label: "Sub-audible tone deviation", path: "fm.toneDeviationHz", value: r.fm.toneDeviationHz, unit: "Hz", digits: 0 },
      { label: "Index from the carrier null", path: "fm.besselNullIndex", value: r.fm.besselNullIndex, unit: "", digits: 3 },
    );
  }
  if (r.am !== null) {
    rows.push(
      { label: "Modulation depth", path: "am.modulationDepthPercent", value: r.am.modulationDepthPercent, unit: "%", digits: 1 },
      { label: "Positive peak depth m+", path: "am.positiveDepthPercent", value: r.am.positiveDepthPercent, unit: "%", digits: 1 },
      { label: "Negative peak depth m−", path: "am.negativeDepthPercent", value: r.am.negativeDepthPercent, unit: "%", digits: 1 },
      { label: "Modulating frequency", path: "am.modulatingFrequencyHz", value: r.am.modulatingFrequencyHz, unit: "Hz", digits: 1 },
      { label: "Upper sideband", path: "am.upperSidebandDbc", value: r.am.upperSidebandDbc, unit: "dBc", digits: 2 },
      { label: "Lower sideband", path: "am.lowerSidebandDbc", value: r.am.lowerSidebandDbc, unit: "dBc", digits: 2 },
    );
  }
  const d = r.digital;
  rows.push(
    { label: "Symbol rate", path: "digital.symbolRateBd", value: d.symbolRateBd, unit: "Bd", digits: 2 },
    { label: "EVM (RMS)", path: "digital.evmRmsPercent", value: d.evmRmsPercent, unit: "%", digits: 2 },
    { label: "EVM (peak)", path: "digital.evmPeakPercent", value: d.evmPeakPercent, unit: "%", digits: 2 },
    { label: "MER", path: "digital.merDb", value: d.merDb, unit: "dB", digits: 2 },
    { label: "IQ origin offset", path: "digital.iqOriginOffsetDb", value: d.iqOriginOffsetDb, unit: "dB", digits: 1 },
    { label: "Carrier frequency error (recovery)", path: "digital.frequencyErrorHz", value: d.frequencyErrorHz, unit: "Hz", digits: 1 },
    { label: "Symbols used", path: "digital.symbols", value: d.symbols, unit: "", digits: 0 },
    { label: "Roll-off used", path: "digital.rollOff", value: d.rollOff, unit: "", digits: 3 },
    { label: "FSK shift", path: "fsk.shiftHz", value: r.fsk.shiftHz, unit: "Hz", digits: 1 },
    { label: "FSK modulation index h", path: "fsk.modulationIndex", value: r.fsk.modulationIndex, unit: "", digits: 3 },
    ...(r.fsk.toneFrequenciesHz ?? []).map((t, i) => ({ label: `FSK tone ${i + 1} (offset)`, path: `fsk.toneFrequenciesHz.${i}`, value: t, unit: "Hz", digits: 1 })),
    { label: "OOK on/off ratio", path: "ook.onOffRatioDb", value: r.ook.onOffRatioDb, unit: "dB", digits: 1 },
    { label: "OOK duty cycle", path: "ook.dutyCyclePercent", value: r.ook.dutyCyclePercent, unit: "%", digits: 1 },
    { label: "OOK on level", path: "ook.onLevelDbfs", value: r.ook.onLevelDbfs, unit: "dBFS", digits: 1 },
  );
  rows.push({ label: "Necessary bandwidth (formula)", path: "emission.necessaryBandwidthHz", value: r.emission.necessaryBandwidthHz, unit: "Hz", digits: 0 });
  const table = rows
    .map((row) => cell(r, row))
    .filter((x): x is [string, string, string] => x !== null)
    .map(([a, b, u]) => `| ${a} | ${b} | ${u} |`);
  const methods = methodLines(r);
  const q = r.quality;
  const lines = [
    `# Emission measurement: ${basename(c.path)}`,
    "",
    `| | |`,
    `| --- | --- |`,
    `| File | \`${c.path}\` |`,
    `| SHA-256 | \`${c.sha256}\` |`,
    ...(c.metadataSha256 === null ? [] : [`| SHA-256 of the .sigmf-meta | \`${c.metadataSha256}\` |`]),
    `| Format | ${c.container}, ${c.format} |`,
    `| Sample rate | ${formatRate(c.sampleRateHz)} |`,
    `| Centre | ${c.centerHz === null ? "unknown" : formatHz(c.centerHz)}${c.ppm !== 0 ? `, receiver clock corrected by ${c.ppm} ppm` : ""} |`,
    `| Analysed | ${formatSeconds(c.durationS)} from ${formatSeconds(c.startS)} (${c.samples} of ${c.fileSamples} samples) |`,
    ...(c.datetime === null ? [] : [`| Recorded | ${c.datetime} |`]),
    `| Channel | ${formatHz(r.channel.offsetHz)} offset, ${formatHz(r.channel.widthHz)} wide${r.channel.givenByUser ? " (given)" : " (found)"}, decimated ×${r.channel.decimation} to ${formatRate(r.channel.sampleRateHz)} |`,
    `| Measured | ${r.measuredAt} with ${r.tool.name} ${r.tool.version} |`,
    "",
    `## Result`,
    "",
    `Class **${displayClass(r.modulation.class, r.modulation.order)}**${r.modulation.forced ? " (given with --mode)" : ` (confidence ${(r.modulation.confidence * 100).toFixed(0)} %)`}` +
      (r.emission.designator === null
        ? ", no emission designator."
        : `, emission designator **${r.emission.designator}** (bandwidth from the ${r.emission.designatorBasis === "necessary" ? "necessary bandwidth, 47 CFR 2.202(g)" : "99 % occupied bandwidth, 47 CFR 90.209(a)"}).`),
    "",
    `| Figure | Value | Uncertainty (k = 2) |`,
    `| --- | --- | --- |`,
    ...table,
    "",
    ...xDbNote(r),
    ...referenceNote(r),
    `## Capture health`,
    "",
    `Clipping ${q.clippingPercent.toFixed(4)} % · DC offset ${q.dcOffsetDbfs.toFixed(1)} dBFS` +
      `${q.dcSpikeDbfs === null ? "" : ` (receiver DC spike at ${q.dcSpikeDbfs.toFixed(1)} dBFS, not taken for the carrier)`}` +
      ` · IQ imbalance ${q.iqGainImbalanceDb.toFixed(2)} dB / ${q.iqPhaseImbalanceDeg.toFixed(2)}° (image rejection ${q.imageRejectionDb.toFixed(1)} dB)` +
      ` · noise floor ${q.noiseFloorDbfsPerHz.toFixed(1)} dBFS/Hz · non-finite samples ${q.nonFiniteSamples}`,
    "",
    `## Methods`,
    "",
    ...methods,
    "",
    ...(r.warnings.length === 0 ? [] : [`## Warnings`, "", ...r.warnings.map((w) => `- ${w}`), ""]),
    ...(Object.keys(r.unavailable).length === 0
      ? []
      : [`## Figures not given`, "", ...Object.entries(r.unavailable).map(([k, v]) => `- \`${k}\`: ${v}`), ""]),
    ...(figures.length === 0 ? [] : [`## Figures`, "", ...figures.map((f) => `![${f}](${f})`), ""]),
    `---`,
    "",
    `Results are indicative. They come from a recording and depend on the receiver's calibration (frequency`,
    `reference, gain flatness, IQ balance, dynamic range). The licence and local regulation decide what applies;`,
    `formal compliance evidence comes from an accredited test laboratory.`,
    "",
  ];
  return lines.join("\n");
}

/**
 * The methods, each line once with every figure it serves (an OBW and its edges share one), and
 * only for figures the report holds: a method of a figure that is null (an EVM under an OOK
 * result) is left out; why it is null is under "Figures not given".
 */
export function methodLines(r: MeasureReport): string[] {
  const paths = new Map<string, string[]>();
  for (const [path, method] of Object.entries(r.methods)) {
    if (valueAt(r, path) == null) continue;
    const group = paths.get(method);
    if (group === undefined) paths.set(method, [path]);
    else group.push(path);
  }
  return [...paths].map(([method, group]) => `- ${group.map((p) => `\`${p}\``).join(", ")}: ${method}`);
}

/** The report's value at a dotted path ("fsk.toneFrequenciesHz.0"), undefined where there is none. */
function valueAt(r: MeasureReport, path: string): unknown {
  let v: unknown = r;
  for (const key of path.split(".")) v = v !== null && typeof v === "object" ? (v as Record<string, unknown>)[key] : undefined;
  return v;
}

/** What the x-dB bandwidth is measured against (ITU-R SM.443 Annex 2: x dB below the maximum of the spectrum). */
function xDbNote(r: MeasureReport): string[] {
  if (r.bandwidth.xDbHz === null) return [];
  const trace = r.bandwidth.xDbReference === "peak-hold"
    ? "the maximum of the max-hold spectrum (the highest level each frequency reached over the span), with the edges on the max-hold trace"
    : "the maximum of the mean (Welch) PSD, with the edges on the mean PSD; for FM this is the carrier line, and the figure reads narrower than a max-hold one";
  return [`The ${r.bandwidth.xDb} dB bandwidth is measured ${r.bandwidth.xDb} dB below ${trace} (ITU-R SM.443 Annex 2: x dB below the maximum of the spectrum).`, ""];
}

/** One line on whether the carrier's uncertainty holds the receiver's frequency reference. */
function referenceNote(r: MeasureReport): string[] {
  const m = r.methods["carrier.offsetHz"];
  if (r.carrier.offsetHz === null || m === undefined) return [];
  if (m.includes(REFERENCE_NOT_INCLUDED)) {
    return ["Carrier uncertainties are those of the method: the receiver's frequency reference is not included (state it with --reference-ppm).", ""];
  }
  const given = /receiver reference ±([^ ]+) ppm/.exec(m);
  return given === null ? [] : [`Carrier uncertainties include the receiver's frequency reference, ±${given[1]} ppm (k = 2) as stated.`, ""];
}
