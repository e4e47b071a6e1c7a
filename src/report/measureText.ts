/** The `measure` report as a short text for a person on stdout (report.md is the full one). */
import type { MeasureReport } from "./measureReport.js";
import { alignedRows, formatHz, formatHzUncertainty, formatUncertainty } from "./format.js";
import { displayClass } from "./className.js";

/** The value with its uncertainty; `unit` and `digits` set how the uncertainty is shown
 * (never as 0: formatUncertainty), Hz scaled as the value is. */
function withU(r: MeasureReport, path: string, value: number | null, show: (x: number) => string, unit = "Hz", digits = 1): string {
  if (value === null) return "n/a";
  const u = r.uncertainty[path];
  if (u === undefined) return show(value);
  return `${show(value)} ${unit === "Hz" ? `± ${formatHzUncertainty(u)}` : formatUncertainty(u, digits, unit)}`;
}

export function measureText(r: MeasureReport, files: readonly string[]): string {
  const hz = (x: number): string => formatHz(x, 3);
  const rows: [string, string][] = [
    ["class", `${displayClass(r.modulation.class, r.modulation.order)}${r.modulation.forced ? " (given)" : `, confidence ${(r.modulation.confidence * 100).toFixed(0)} %`}`],
    ["designator", r.emission.designator ?? "n/a"],
    ["channel", `${formatHz(r.channel.offsetHz)} offset, ${formatHz(r.channel.widthHz)} wide (${r.channel.givenByUser ? "given" : "found"})`],
    ["nominal frequency", r.carrier.nominalHz === null ? "not given (--nominal)" : formatHz(r.carrier.nominalHz)],
    ["necessary bandwidth", withU(r, "emission.necessaryBandwidthHz", r.emission.necessaryBandwidthHz, hz)],
    ["carrier offset", withU(r, "carrier.offsetHz", r.carrier.offsetHz, hz)],
    ...(r.carrier.frequencyHz === null ? [] : ([["carrier frequency", withU(r, "carrier.frequencyHz", r.carrier.frequencyHz, hz)]] as [string, string][])),
    ...(r.carrier.errorPpm === null ? [] : ([["frequency error", withU(r, "carrier.errorPpm", r.carrier.errorPpm, (x) => `${x.toFixed(3)} ppm`, "ppm", 3)]] as [string, string][])),
    ["occupied bandwidth", withU(r, "bandwidth.occupiedHz", r.bandwidth.occupiedHz, hz)],
    [`${r.bandwidth.xDb} dB bandwidth (${r.bandwidth.xDbReference})`, withU(r, "bandwidth.xDbHz", r.bandwidth.xDbHz, hz)],
    ["channel power", withU(r, "power.channelDbfs", r.power.channelDbfs, (x) => `${x.toFixed(2)} dBFS`, "dBFS", 2)],
    ["SNR", withU(r, "power.snrDb", r.power.snrDb, (x) => `${x.toFixed(1)} dB`, "dB", 1)],
  ];
  if (r.fm !== null) {
    rows.push(
      ["peak deviation", `${withU(r, "fm.peakDeviationHz", r.fm.peakDeviationHz, hz)} (audio ≤ ${formatHz(r.fm.audioBandwidthHz)})`],
      ["  + / −", `${withU(r, "fm.positiveDeviationHz", r.fm.positiveDeviationHz, hz)} / ${withU(r, "fm.negativeDeviationHz", r.fm.negativeDeviationHz, hz)}`],
      ["  at", `${r.fm.positiveDeviationTimeS === null ? "n/a" : `${r.fm.positiveDeviationTimeS.toFixed(3)} s`} / ${r.fm.negativeDeviationTimeS === null ? "n/a" : `${r.fm.negativeDeviationTimeS.toFixed(3)} s`} (peaks over the ${r.fm.peaksOver})`],
      ["RMS deviation", withU(r, "fm.rmsDeviationHz", r.fm.rmsDeviationHz, hz)],
      ["modulating frequency", withU(r, "fm.modulatingFrequencyHz", r.fm.modulatingFrequencyHz, hz)],
      ["modulation index", withU(r, "fm.modulationIndex", r.fm.modulationIndex, (x) => x.toFixed(3), "", 3)],
      ["Carson bandwidth", withU(r, "fm.carsonBandwidthHz", r.fm.carsonBandwidthHz, hz)],
      ["sub-audible tone", r.fm.toneHz === null ? "none found" : `${r.fm.toneHz.toFixed(2)} Hz${r.fm.toneStandardHz === null ? "" : ` (standard ${r.fm.toneStandardHz.toFixed(1)} Hz)`}, deviation ${r.fm.toneDeviationHz === null ? "n/a" : formatHz(r.fm.toneDeviationHz)}`],
    );
  }
  if (r.am !== null) {
    rows.push(
      ["modulation depth", withU(r, "am.modulationDepthPercent", r.am.modulationDepthPercent, (x) => `${x.toFixed(1)} %`, "%", 1)],
      ["  m+ / m−", `${withU(r, "am.positiveDepthPercent", r.am.positiveDepthPercent, (x) => `${x.toFixed(1)} %`, "%", 1)} / ${withU(r, "am.negativeDepthPercent", r.am.negativeDepthPercent, (x) => `${x.toFixed(1)} %`, "%", 1)}`],
      ["modulating frequency", withU(r, "am.modulatingFrequencyHz", r.am.modulatingFrequencyHz, hz)],
    );
  }
  const d = r.digital;
  const pct = (x: number): string => `${x.toFixed(2)} %`;
  if (d.symbolRateBd !== null) rows.push(["symbol rate", withU(r, "digital.symbolRateBd", d.symbolRateBd, (x) => `${x.toFixed(2)} Bd`, "Bd", 2)]);
  if (d.evmRmsPercent !== null) {
    rows.push(
      ["constellation", `${d.constellation ?? "?"}, roll-off ${d.rollOff?.toFixed(3) ?? "?"}, ${d.symbols ?? 0} symbols`],
      ["EVM RMS / peak", `${withU(r, "digital.evmRmsPercent", d.evmRmsPercent, pct, "%", 2)} / ${d.evmPeakPercent === null ? "n/a" : pct(d.evmPeakPercent)}`],
      ["MER", withU(r, "digital.merDb", d.merDb, (x) => `${x.toFixed(2)} dB`, "dB", 2)],
    );
  }
  if (r.fsk.shiftHz !== null) {
    rows.push(["FSK shift / h", `${withU(r, "fsk.shiftHz", r.fsk.shiftHz, hz)} / ${r.fsk.modulationIndex === null ? "n/a" : r.fsk.modulationIndex.toFixed(3)}`]);
  }
  if (r.ook.dutyCyclePercent !== null) {
    rows.push(["OOK duty cycle", withU(r, "ook.dutyCyclePercent", r.ook.dutyCyclePercent, (x) => `${x.toFixed(1)} %`, "%", 1)]);
    rows.push(["OOK on/off ratio", withU(r, "ook.onOffRatioDb", r.ook.onOffRatioDb, (x) => `${x.toFixed(1)} dB`, "dB", 1)]);
  }
  const out = files.length === 0 ? "" : `\nWritten: ${files.join(", ")}\n`;
  return `${r.capture.path}\n${alignedRows(rows)}\n${out}Results are indicative; see iqaudit --help for cautions.\n`;
}
