/**
 * The `measure` report (interface.md, "Report fields read by scripts"): every field of the
 * contract is present, `null` where it does not apply; uncertainties (k = 2) keyed by dotted
 * path; one method line per figure. Numbers only, no I/O.
 */
import type { CaptureMeta, SampleSpan } from "../capture/index.js";
import type { Pass1Result } from "../analysis/index.js";
import type { EmissionFigures } from "../analysis/emissionFigures.js";
import type { Measurement } from "../measure/index.js";
import type { PublishedFile } from "./folderWriter.js";
import { TOOL_NAME, TOOL_VERSION } from "../version.js";
import { captureSection, qualitySection, type CaptureSection, type QualitySection } from "./inspectReport.js";

type N = number | null;

export interface MeasureReport {
  readonly schema: "iqaudit/report/1";
  readonly tool: { readonly name: string; readonly version: string };
  readonly measuredAt: string;
  readonly capture: CaptureSection;
  readonly quality: QualitySection;
  readonly channel: EmissionFigures["channel"];
  readonly carrier: { readonly offsetHz: N; readonly frequencyHz: N; readonly errorPpm: N; readonly nominalHz: N };
  readonly bandwidth: {
    readonly occupiedHz: N; readonly lowerEdgeHz: N; readonly upperEdgeHz: N;
    readonly xDbHz: N; readonly xDb: number; readonly xDbLowerEdgeHz: N; readonly xDbUpperEdgeHz: N;
    /** The x-dB bandwidth's 0 dB reference and the trace of its edges: "average" (mean PSD) or "peak-hold" (max-hold). */
    readonly xDbReference: "average" | "peak-hold";
    readonly resolutionHz: number;
  };
  readonly power: { readonly channelDbfs: N; readonly snrDb: N };
  readonly modulation: { readonly class: string; readonly order: N; readonly confidence: number; readonly forced: boolean; readonly features: Readonly<Record<string, number>> };
  readonly fm: {
    readonly peakDeviationHz: N; readonly positiveDeviationHz: N; readonly negativeDeviationHz: N; readonly rmsDeviationHz: N;
    readonly rawPeakDeviationHz: N; readonly audioBandwidthHz: number;
    /** When the positive / negative peak happened, s from the start of the analysed span; what the peaks were taken over. */
    readonly positiveDeviationTimeS: N; readonly negativeDeviationTimeS: N; readonly peaksOver: "record" | "whole span";
    readonly modulatingFrequencyHz: N; readonly modulationIndex: N; readonly carsonBandwidthHz: N;
    readonly toneHz: N; readonly toneStandardHz: N; readonly toneDeviationHz: N; readonly besselNullIndex: N;
  } | null;
  readonly am: {
    readonly modulationDepthPercent: N; readonly positiveDepthPercent: N; readonly negativeDepthPercent: N;
    readonly modulatingFrequencyHz: N; readonly upperSidebandDbc: N; readonly lowerSidebandDbc: N;
  } | null;
  readonly digital: {
    readonly symbolRateBd: N; readonly evmRmsPercent: N; readonly evmPeakPercent: N; readonly merDb: N; readonly symbols: N;
    readonly iqOriginOffsetDb: N; readonly frequencyErrorHz: N; readonly rollOff: N; readonly constellation: string | null;
  };
  readonly fsk: { readonly shiftHz: N; readonly modulationIndex: N; readonly toneFrequenciesHz: readonly N[] | null };
  readonly ook: { readonly onOffRatioDb: N; readonly dutyCyclePercent: N; readonly onLevelDbfs: N };
  readonly emission: { readonly designator: string | null; readonly designatorBasis: "necessary" | "occupied" | null; readonly necessaryBandwidthHz: N };
  /** Every other file of the report folder with its SHA-256, in the order written; null when no folder is written. */
  readonly files: readonly PublishedFile[] | null;
  readonly uncertainty: Readonly<Record<string, number>>;
  readonly methods: Readonly<Record<string, string>>;
  /** Why a figure is null, keyed by its dotted path (a figure that does not apply is simply absent here). */
  readonly unavailable: Readonly<Record<string, string>>;
  readonly warnings: readonly string[];
}

/** Collects uncertainty and method of each figure under its dotted path while reading its value. */
class Ledger {
  readonly uncertainty: Record<string, number> = {};
  readonly methods: Record<string, string> = {};
  readonly unavailable: Record<string, string> = {};
  /** Each warning once, with every figure path that gave it (an OBW and its two edges share one). */
  private readonly warningPaths = new Map<string, string[]>();
  get warnings(): string[] {
    return [...this.warningPaths].map(([w, paths]) => `${[...new Set(paths.map(figureOf))].join(", ")}: ${w}`);
  }
  take(path: string, m: Measurement): N {
    if (m.value !== null && m.uncertainty !== null) this.uncertainty[path] = m.uncertainty;
    if (m.method !== "") this.methods[path] = m.method;
    if (m.value === null) {
      if (m.warnings.length > 0) this.unavailable[path] = m.warnings.join("; ");
    } else {
      for (const w of m.warnings) {
        const paths = this.warningPaths.get(w);
        if (paths === undefined) this.warningPaths.set(w, [path]);
        else if (!paths.includes(path)) paths.push(path);
      }
    }
    return m.value;
  }
}

/** The figure an edge belongs to (a bandwidth's note is said once, of the bandwidth, not of each edge). */
function figureOf(path: string): string {
  return EDGE_FIGURES[path] ?? path;
}
const EDGE_FIGURES: Readonly<Record<string, string>> = {
  "bandwidth.lowerEdgeHz": "bandwidth.occupiedHz",
  "bandwidth.upperEdgeHz": "bandwidth.occupiedHz",
  "bandwidth.xDbLowerEdgeHz": "bandwidth.xDbHz",
  "bandwidth.xDbUpperEdgeHz": "bandwidth.xDbHz",
};

export function buildMeasureReport(
  meta: CaptureMeta,
  span: SampleSpan,
  pass1: Pass1Result,
  f: EmissionFigures,
  warnings: readonly string[],
  measuredAt: Date = new Date(),
): MeasureReport {
  const l = new Ledger();
  const fm = f.fm;
  const am = f.am;
  const report: MeasureReport = {
    schema: "iqaudit/report/1",
    tool: { name: TOOL_NAME, version: TOOL_VERSION },
    measuredAt: measuredAt.toISOString(),
    capture: captureSection(meta, span, pass1.sha256),
    quality: qualitySection(pass1),
    channel: f.channel,
    carrier: {
      offsetHz: l.take("carrier.offsetHz", f.carrier.offsetHz),
      frequencyHz: l.take("carrier.frequencyHz", f.carrier.frequencyHz),
      errorPpm: l.take("carrier.errorPpm", f.carrier.errorPpm),
      nominalHz: f.carrier.nominalHz,
    },
    bandwidth: {
      occupiedHz: l.take("bandwidth.occupiedHz", f.bandwidth.occupiedHz),
      lowerEdgeHz: l.take("bandwidth.lowerEdgeHz", f.bandwidth.lowerEdgeHz),
      upperEdgeHz: l.take("bandwidth.upperEdgeHz", f.bandwidth.upperEdgeHz),
      xDbHz: l.take("bandwidth.xDbHz", f.bandwidth.xDbHz),
      xDb: f.bandwidth.xDb,
      xDbReference: f.bandwidth.xDbReference,
      xDbLowerEdgeHz: l.take("bandwidth.xDbLowerEdgeHz", f.bandwidth.xDbLowerEdgeHz),
      xDbUpperEdgeHz: l.take("bandwidth.xDbUpperEdgeHz", f.bandwidth.xDbUpperEdgeHz),
      resolutionHz: f.bandwidth.resolutionHz,
    },
    power: {
      channelDbfs: l.take("power.channelDbfs", f.power.channelDbfs),
      snrDb: l.take("power.snrDb", f.power.snrDb),
    },
    modulation: {
      class: f.modulation.class,
      order: f.modulation.order,
      confidence: f.modulation.confidence,
      forced: f.modulation.forced,
      features: f.modulation.features,
    },
    fm:
      fm === null
        ? null
        : {
            peakDeviationHz: l.take("fm.peakDeviationHz", fm.peakDeviationHz),
            positiveDeviationHz: l.take("fm.positiveDeviationHz", fm.positiveDeviationHz),
            negativeDeviationHz: l.take("fm.negativeDeviationHz", fm.negativeDeviationHz),
            rmsDeviationHz: l.take("fm.rmsDeviationHz", fm.rmsDeviationHz),
            rawPeakDeviationHz: l.take("fm.rawPeakDeviationHz", fm.rawPeakDeviationHz),
            audioBandwidthHz: fm.audioBandwidthHz,
            positiveDeviationTimeS: fm.positivePeakTimeS,
            negativeDeviationTimeS: fm.negativePeakTimeS,
            peaksOver: fm.peaksOver,
            modulatingFrequencyHz: l.take("fm.modulatingFrequencyHz", fm.modulatingFrequencyHz),
            modulationIndex: l.take("fm.modulationIndex", fm.modulationIndex),
            carsonBandwidthHz: l.take("fm.carsonBandwidthHz", fm.carsonBandwidthHz),
            toneHz: l.take("fm.toneHz", fm.toneHz),
            toneStandardHz: fm.toneStandardHz,
            toneDeviationHz: l.take("fm.toneDeviationHz", fm.toneDeviationHz),
            besselNullIndex: l.take("fm.besselNullIndex", fm.besselNullIndex),
          },
    am:
      am === null
        ? null
        : {
            modulationDepthPercent: l.take("am.modulationDepthPercent", am.modulationDepthPercent),
            positiveDepthPercent: l.take("am.positiveDepthPercent", am.positiveDepthPercent),
            negativeDepthPercent: l.take("am.negativeDepthPercent", am.negativeDepthPercent),
            modulatingFrequencyHz: l.take("am.modulatingFrequencyHz", am.modulatingFrequencyHz),
            upperSidebandDbc: l.take("am.upperSidebandDbc", am.upperSidebandDbc),
            lowerSidebandDbc: l.take("am.lowerSidebandDbc", am.lowerSidebandDbc),
          },
    digital: {
      symbolRateBd: f.digital === null ? null : l.take("digital.symbolRateBd", f.digital.symbolRateBd),
      evmRmsPercent: f.digital === null ? null : l.take("digital.evmRmsPercent", f.digital.evmRmsPercent),
      evmPeakPercent: f.digital === null ? null : l.take("digital.evmPeakPercent", f.digital.evmPeakPercent),
      merDb: f.digital === null ? null : l.take("digital.merDb", f.digital.merDb),
      symbols: f.digital?.symbols ?? null,
      iqOriginOffsetDb: f.digital === null ? null : l.take("digital.iqOriginOffsetDb", f.digital.iqOriginOffsetDb),
      frequencyErrorHz: f.digital === null ? null : l.take("digital.frequencyErrorHz", f.digital.frequencyErrorHz),
      rollOff: f.digital?.rollOff ?? null,
      constellation: f.digital?.constellation ?? null,
    },
    fsk: {
      shiftHz: f.fsk === null ? null : l.take("fsk.shiftHz", f.fsk.shiftHz),
      modulationIndex: f.fsk === null ? null : l.take("fsk.modulationIndex", f.fsk.modulationIndex),
      toneFrequenciesHz: f.fsk === null ? null : f.fsk.toneFrequenciesHz.map((t, i) => l.take(`fsk.toneFrequenciesHz.${i}`, t)),
    },
    ook: {
      onOffRatioDb: f.ook === null ? null : l.take("ook.onOffRatioDb", f.ook.onOffRatioDb),
      dutyCyclePercent: f.ook === null ? null : l.take("ook.dutyCyclePercent", f.ook.dutyCyclePercent),
      onLevelDbfs: f.ook === null ? null : l.take("ook.onLevelDbfs", f.ook.onLevelDbfs),
    },
    emission: {
      designator: f.emission.designator,
      designatorBasis: f.emission.designatorBasis,
      necessaryBandwidthHz: l.take("emission.necessaryBandwidthHz", f.emission.necessaryBandwidthHz),
    },
    files: null,
    uncertainty: l.uncertainty,
    methods: {
      ...l.methods,
      "modulation.class": f.modulation.method,
      "emission.designator": f.emission.method,
      ...(f.digital?.rollOffMethod == null ? {} : { "digital.rollOff": f.digital.rollOffMethod }),
    },
    unavailable: l.unavailable,
    warnings: [...new Set([...warnings, ...f.warnings, ...l.warnings])],
  };
  return report;
}
