/**
 * The measurement of one emission, after pass 1: find it in the pass-1 PSD (or take the user's
 * channel), tell a receiver DC spike from a carrier, extract its channel (pass 2), estimate its
 * PSD at a resolution that suits it, then bandwidth, power, class and the figures of its class,
 * each as a Measurement. Methods and sources: docs/methods.md.
 */
import type { CaptureMeta, CaptureSource, SampleSpan } from "../capture/index.js";
import { UsageError } from "../errors.js";
import { WelchAccumulator, type WelchPsd } from "../dsp/index.js";
import {
  amFigures,
  analogFeatures,
  bandLimit,
  besselNullIndex,
  channelPower,
  classifyAnalog,
  detectDcSpike,
  emissionDesignator,
  fmFigures,
  frequencyErrorPpmOf,
  locateEmission,
  removeLine,
  measurement,
  necessaryBandwidthAmHz,
  necessaryBandwidthFmHz,
  notAvailable,
  occupiedBandwidth,
  REFERENCE_NOT_INCLUDED,
  psdCentroidHz,
  toneFrequency,
  xDbBandwidth,
  classifyEmission,
  type Bursts,
  type Segments,
  type DesignatorClass,
  type Measurement,
  type XDbReference,
} from "../measure/index.js";
import type { Pass1Result } from "./pass1.js";
import { runPass2, type Pass2Request, type Pass2Result } from "./pass2.js";
import type { WholeSpanFigures } from "./wholeSpan.js";
import { correctedOffsetHz, reportedOffsetOfHz } from "./clockCorrection.js";
import { locateNearNominal } from "./nearNominal.js";
import type { AmFiguresOut, DigitalFiguresOut, EmissionFigures, FmFiguresOut, FskFiguresOut, OokFiguresOut } from "./emissionFigures.js";
import { digitalEmission } from "./digitalEmission.js";
import { audioNarrowedNote, dcSpikeNote } from "./measureNotes.js";
import { keyedBursts, keyedDecision, type KeyedDecision } from "./keyedEmission.js";

/** Classes `--mode` can force. */
export const MEASURE_MODES = ["cw", "am", "fm", "fsk", "ook", "psk", "qam"] as const;
export type MeasureMode = (typeof MEASURE_MODES)[number];

export interface MeasureEmissionOptions {
  /** The channel to measure (offset from the capture centre and width, Hz); default the emission nearest `nominalHz`, else the strongest. */
  readonly channel?: { readonly offsetHz: number; readonly widthHz: number } | undefined;
  /** Assigned frequency, Hz, for the error in ppm (needs the capture centre). */
  readonly nominalHz?: number | undefined;
  /** Stated uncertainty of the receiver's frequency reference, ppm (k = 2): carried into the
   * carrier's offset, frequency and ppm error (`--reference-ppm`). */
  readonly referencePpm?: number | undefined;
  /** Level below the spectral peak for the x-dB bandwidth, dB (default 26). */
  readonly xDb?: number | undefined;
  /** The x-dB bandwidth's 0 dB reference (xDbBandwidth.ts): default "peak-hold", the maximum of
   * the max-hold spectrum, with the edges on the max-hold trace (`--xdb-reference`). */
  readonly xDbReference?: XDbReference | undefined;
  /** Audio low-pass before FM peak deviation and AM depth, Hz (default 3000). */
  readonly audioBandwidthHz?: number | undefined;
  readonly mode?: MeasureMode | undefined;
  /** Hints for digital emissions: order (2, 4, 8, 16, 32, 64), symbol rate (Bd), RRC roll-off. */
  readonly order?: number | undefined;
  readonly symbolRateBd?: number | undefined;
  readonly rollOff?: number | undefined;
  /** Most decimated channel samples kept (default 2^20, PASS2_DEFAULTS). */
  readonly maxChannelSamples?: number | undefined;
  /**
   * The channel already extracted (a survey extracts every emission's channel in one read):
   * measured instead of a pass 2 of its own; its offset and width are the channel's, and
   * `channel` should name the same (it bounds where the emission is located in the pass-1 PSD).
   */
  readonly extractedChannel?: Pass2Result | undefined;
  /** Every input block of the span, for a stage that reads it beside pass 2 (Pass2Options.onInputBlock). */
  readonly onInputBlock?: ((block: Float32Array) => void) | undefined;
  readonly onProgress?: ((doneSamples: number, totalSamples: number) => void) | undefined;
}

export const MEASURE_DEFAULTS = { xDb: 26, xDbReference: "peak-hold", audioBandwidthHz: 3000 } as const;

export async function measureEmission(
  source: CaptureSource,
  span: SampleSpan,
  pass1: Pass1Result,
  options: MeasureEmissionOptions,
): Promise<EmissionFigures> {
  const meta = source.meta;
  const fs = meta.sampleRateHz;
  const xDb = options.xDb ?? MEASURE_DEFAULTS.xDb;
  const xDbSpec = { xDb, reference: options.xDbReference ?? MEASURE_DEFAULTS.xDbReference };
  const audioBandwidthHz = options.audioBandwidthHz ?? MEASURE_DEFAULTS.audioBandwidthHz;
  checkMeasureOptions(options, meta, span);
  const warnings: string[] = [];
  const floor = usableFloor(pass1.psd, pass1.noiseFloor.densityPerHz);
  if (floor === null) {
    warnings.push("the analysed span holds no signal (every sample is zero, or was not finite and read as 0): nothing to measure");
    return noEmission(pass1, { present: false, levelDbfs: null, widthHz: null }, xDbSpec, options.nominalHz ?? null, warnings);
  }
  const dcOffsetDbfs = pass1.health.dcOffsetDbfs;
  const dc = detectDcSpike(pass1.psd, floor, { dcOffsetDbfs });
  const dcSpike = { present: dc.present, levelDbfs: dc.present ? dc.levelDbfs : null, widthHz: dc.present ? dc.widthHz : null };
  // --nominal without --channel: the emission nearest the nominal frequency (nearNominal.ts).
  const nominalOffsetHz = options.channel === undefined && options.nominalHz !== undefined ? reportedOffsetOfHz(meta, options.nominalHz) : null;
  const near = nominalOffsetHz === null ? null : locateNearNominal(pass1.psd, floor, nominalOffsetHz, options.nominalHz as number, dcOffsetDbfs);
  if (near?.warning != null) warnings.push(near.warning);
  const region = near === null ? locateEmission(pass1.psd, floor, { channel: options.channel, dcOffsetDbfs }) : near.region;
  if (region === null) {
    warnings.push("no emission stands above the noise floor: nothing to measure");
    return noEmission(pass1, dcSpike, xDbSpec, options.nominalHz ?? null, warnings);
  }

  // The channel to extract: the user's, or the region found with room for its skirts.
  const givenByUser = options.channel !== undefined && options.extractedChannel === undefined;
  const offsetHz = options.channel?.offsetHz ?? region.centerOffsetHz;
  // A found region narrower than an audio channel may be only the carrier of an AM emission
  // whose sidebands sit under the pass-1 threshold: the channel is at least 2.5 × the audio
  // bandwidth (two sidebands of --audio-bw with room for the filter's skirts), so they are kept.
  const minAutoHz = Math.max(16 * pass1.psd.binWidthHz, 2.5 * audioBandwidthHz);
  const widthHz = Math.min(options.channel?.widthHz ?? Math.max(region.widthHz * 1.6, minAutoHz), 0.9 * fs);
  const dcNote = dcSpikeNote({ skipped: region.dcSpikeSkipped, inside: region.dcSpikeInside, levelDbfs: dc.levelDbfs }, { offsetHz, widthHz });
  if (dcNote !== null) warnings.push(dcNote);
  const pass2 = options.extractedChannel
    ?? pass2FromPass1(pass1, offsetHz, widthHz, options)
    ?? await runPass2(source, span, { ...pass2Request(offsetHz, widthHz, options), onProgress: options.onProgress, onInputBlock: options.onInputBlock });
  warnings.push(...pass2.warnings);
  const fsc = pass2.sampleRateHz;
  // A record cut short of the span: the figures the worst moment decides come from the whole span.
  const whole = wholeSpanInUse(pass2, region.dcSpikeSkipped);
  // The receiver's DC line, set aside above, sits at −offsetHz in the channel: remove it there too.
  // Outside the channel's Nyquist band, what the decimation filter let through of it sits at its alias.
  if (region.dcSpikeSkipped) removeLine(pass2.iq, fsc, aliasHz(-offsetHz, fsc));
  const half = widthHz / 2;
  // The audio low-pass must fit below the channel's Nyquist frequency (with its transition band).
  const audioHz = Math.min(audioBandwidthHz, 0.39 * fsc);
  const psd = whole?.psd ?? channelPsd(pass2.iq, fsc, widthHz);
  if (psd === null) {
    warnings.push("the channel holds too few samples to estimate its spectrum");
    return noEmission(pass1, dcSpike, xDbSpec, options.nominalHz ?? null, warnings);
  }
  const obw = occupiedBandwidth(psd, { lowerHz: -half, upperHz: half, noiseFloorPerHz: floor });
  const xdb = xDbBandwidth(psd, { lowerHz: -half, upperHz: half, ...xDbSpec });
  const pw = channelPower(psd, { lowerHz: -half, upperHz: half, noiseFloorPerHz: floor, occupiedHz: obw.occupiedHz.value ?? undefined, occupiedUncertaintyHz: obw.occupiedHz.uncertainty });
  const features = analogFeatures(pass2.iq, fsc, psd, { noiseFloorPerHz: floor, snrDb: pw.snrDb.value, lowerHz: -half, upperHz: half, audioBandwidthHz: audioHz });
  const analog = classifyAnalog(features);
  const decided =
    options.mode === undefined
      ? classifyEmission(classificationRecord(pass2.iq, fsc, half), fsc, psd, { snrDb: pw.snrDb.value, analog, noiseFloorPerHz: floor })
      : { class: options.mode, order: options.order ?? null, confidence: 1, method: "given with --mode", features: null };
  let cls: DesignatorClass = decided.class;
  let order: number | null = options.order ?? decided.order;
  let confidence = decided.confidence;
  let classMethod = decided.method;
  let iq = pass2.iq;
  // A keyed envelope (a bursty link, or on-off keying) is decided by what is inside its bursts.
  let segments: Segments | undefined;
  // The SNR the class is bounded by: of a bursty link, while it is keyed on (the channel's SNR
  // averages its power over the gaps between bursts, where there is nothing to classify).
  let classSnrDb = pw.snrDb.value;
  const keyed = keyedBursts(pass2.iq, fsc);
  if (keyed !== null) {
    const inner = keyedFigures(keyed, options.mode, fsc, (x) => channelPsd(x, fsc, widthHz), floor, pw.snrDb.value, half);
    if (inner !== null) {
      cls = inner.class;
      order = options.order ?? inner.order;
      if (options.mode === undefined) { confidence = inner.confidence; classMethod = inner.method; }
      if (inner.bursts !== null) {
        iq = inner.bursts.iq;
        segments = inner.bursts.segments;
        if (classSnrDb !== null) classSnrDb += 10 * Math.log10(100 / Math.max(inner.bursts.dutyCyclePercent, 1e-3));
        warnings.push(`the emission is keyed in ${inner.bursts.burstCount} bursts (on ${inner.bursts.dutyCyclePercent.toFixed(1)} % of the time); its modulation was measured inside the bursts`);
      }
    }
  }

  if (options.mode === undefined) {
    const bounded = snrBoundedClass(cls, order, confidence, classMethod, classSnrDb);
    ({ cls, order, confidence, classMethod } = bounded);
  }

  // Figures of the class, and the carrier by the method that suits it (all relative to the channel centre).
  let carrier: Measurement;
  let fm: FmFiguresOut | null = null;
  let am: AmFiguresOut | null = null;
  let digital: DigitalFiguresOut | null = null;
  let fsk: FskFiguresOut | null = null;
  let ook: OokFiguresOut | null = null;
  let necessary: Measurement = notAvailable("Hz", "47 CFR 2.202(g) / ITU-R SM.1138", "no necessary-bandwidth formula applies to this class");
  // The audio low-pass only matters to the classes with audio figures.
  const audioNote = audioNarrowedNote(cls, audioBandwidthHz, audioHz, fsc);
  if (audioNote !== null) warnings.push(audioNote);
  if (cls === "fm") {
    const f = withWholeSpanPeaks(fmFigures(iq, fsc, { audioBandwidthHz: audioHz, noiseFloorPerHz: floor }), whole, offsetHz);
    carrier = f.carrierOffsetHz;
    const beta = f.modulationIndex.value;
    const fmod = f.modulatingFrequencyHz.value;
    const nullIndex =
      beta !== null && fmod !== null && f.toneHz.value === null
        ? besselNullIndex(iq, fsc, fmod, beta)
        : notAvailable("", "Bessel null of the carrier line (A&S Table 9.5)", "needs a single modulating tone");
    fm = {
      peakDeviationHz: f.peakDeviationHz,
      positiveDeviationHz: f.positiveDeviationHz,
      negativeDeviationHz: f.negativeDeviationHz,
      rmsDeviationHz: f.rmsDeviationHz,
      rawPeakDeviationHz: f.rawPeakDeviationHz,
      modulatingFrequencyHz: f.modulatingFrequencyHz,
      modulationIndex: f.modulationIndex,
      carsonBandwidthHz: f.carsonBandwidthHz,
      toneHz: f.toneHz,
      toneStandardHz: f.standardToneHz,
      toneDeviationHz: f.toneDeviationHz,
      besselNullIndex: nullIndex,
      audioBandwidthHz: f.audioBandwidthHz,
      positivePeakTimeS: pass2.wholeSpan?.positivePeak.timeS ?? null,
      negativePeakTimeS: pass2.wholeSpan?.negativePeak.timeS ?? null,
      peaksOver: whole === null ? "record" : "whole span",
      trace: { timeS: shiftTimes(f.trace.timeS, pass2.startS), min: f.trace.minHz, max: f.trace.maxHz },
    };
    const tone = singleTone(f.modulatingToneShare, fmod);
    if (tone === null) {
      const d = f.peakDeviationHz;
      const carsonMethod = `Carson's rule B = 2(Δf + M) with M = ${audioBandwidthHz.toFixed(0)} Hz, the audio bandwidth (the audio is not one tone)`;
      fm = {
        ...fm,
        modulationIndex: notAvailable("", f.modulationIndex.method, "the audio is not one tone (speech or several tones): a modulation index applies to one tone only"),
        carsonBandwidthHz: d.value === null ? notAvailable("Hz", carsonMethod, "no peak deviation") : measurement(2 * (d.value + audioBandwidthHz), "Hz", d.uncertainty === null ? null : 2 * d.uncertainty, carsonMethod),
      };
    }
    necessary = necessaryFm(f.peakDeviationHz, tone === null ? null : f.modulatingFrequencyHz, audioBandwidthHz);
  } else if (cls === "cw" || cls === "am") {
    carrier = toneFrequency(iq, fsc);
    if (cls === "am") {
      const a = amFigures(iq, fsc, { audioBandwidthHz: audioHz, noiseFloorPerHz: floor });
      const vc = a.carrierAmplitudeFs.value ?? 1;
      am = {
        modulationDepthPercent: a.modulationDepthPercent,
        positiveDepthPercent: a.positiveDepthPercent,
        negativeDepthPercent: a.negativeDepthPercent,
        modulatingFrequencyHz: a.modulatingFrequencyHz,
        upperSidebandDbc: a.sidebandLevelsDbc.upper,
        lowerSidebandDbc: a.sidebandLevelsDbc.lower,
        trace: {
          timeS: shiftTimes(a.trace.timeS, pass2.startS),
          min: Array.from(a.trace.minFs, (v) => (v / vc - 1) * 100),
          max: Array.from(a.trace.maxFs, (v) => (v / vc - 1) * 100),
        },
      };
      const tone = singleTone(a.modulatingToneShare, a.modulatingFrequencyHz.value);
      necessary = necessaryAm(tone === null ? null : a.modulatingFrequencyHz, audioBandwidthHz);
    }
  } else if (cls === "psk" || cls === "qam" || cls === "fsk" || cls === "ook") {
    const d = digitalEmission(iq, fsc, cls, order, obw.occupiedHz.value, { ...options, segments });
    digital = d.digital;
    fsk = d.fsk;
    ook = d.ook;
    order = d.order;
    warnings.push(...d.warnings);
    if (d.necessaryBandwidthHz !== null) necessary = d.necessaryBandwidthHz;
    carrier = d.carrierHz !== null && d.carrierHz.value !== null ? d.carrierHz : psdCentroidHz(psd, -half, half, floor);
  } else {
    carrier = psdCentroidHz(psd, -half, half, floor);
  }

  // From the channel to the capture: add the channel offset, then undo the receiver clock error.
  const toCapture = (m: Measurement): Measurement =>
    m.value === null ? m : { ...m, value: correctedOffsetHz(meta, m.value + offsetHz) };
  const carrierOffset = withReference(toCapture(carrier), meta.centerHz, options.referencePpm);
  const carrierRf =
    meta.centerHz === null || carrierOffset.value === null
      ? notAvailable("Hz", carrier.method, "the capture's centre frequency is unknown (give --center)")
      : { ...carrierOffset, value: meta.centerHz + carrierOffset.value };
  const nominalHz = options.nominalHz ?? null;
  const errorPpm =
    nominalHz === null
      ? notAvailable("Ppm", "(measured − assigned)/assigned × 1e6", "no assigned frequency (give --nominal)")
      : frequencyErrorPpmOf(carrierRf as Measurement<"Hz">, nominalHz);
  const basis = designatorBandwidth(necessary, obw.occupiedHz, psd.enbwHz);
  const designator = emissionDesignator({ class: cls, bandwidthHz: basis.bandwidthHz });
  const designatorReason = designator.reason === "no bandwidth to state" && basis.reason !== null ? basis.reason : designator.reason;
  if (designatorReason !== null) warnings.push(`no emission designator: ${designatorReason}`);
  // That reason already says the resolution bounds the occupied bandwidth: the bandwidth's own
  // resolution note would say it a second time.
  const occupied = basis.reason === null ? obw : withoutResolutionNote(obw);

  return {
    channel: {
      offsetHz,
      widthHz,
      givenByUser,
      sampleRateHz: fsc,
      decimation: pass2.decimation,
      measuredS: pass2.iq.length / 2 / fsc,
    },
    dcSpike,
    carrier: { offsetHz: carrierOffset, frequencyHz: carrierRf, errorPpm, nominalHz },
    bandwidth: {
      occupiedHz: occupied.occupiedHz,
      lowerEdgeHz: toCapture(occupied.lowerEdgeHz),
      upperEdgeHz: toCapture(occupied.upperEdgeHz),
      xDbHz: xdb.bandwidthHz,
      xDbLowerEdgeHz: toCapture(xdb.lowerEdgeHz),
      xDbUpperEdgeHz: toCapture(xdb.upperEdgeHz),
      xDb,
      xDbReference: xdb.reference,
      resolutionHz: psd.enbwHz,
    },
    power: { channelDbfs: pw.channelDbfs, snrDb: pw.snrDb },
    modulation: {
      class: cls,
      order: cls === "psk" || cls === "qam" || cls === "fsk" || cls === "ook" ? order : null,
      confidence,
      forced: options.mode !== undefined,
      method: classMethod,
      features: numericFeatures(features),
    },
    fm,
    am,
    digital,
    fsk: fsk === null ? null : { ...fsk, toneFrequenciesHz: fsk.toneFrequenciesHz.map(toCapture) },
    ook,
    emission: {
      designator: designator.designator,
      designatorBasis: designator.designator === null ? null : basis.basis,
      necessaryBandwidthHz: necessary,
      method: `ITU Radio Regulations Appendix 1: ${basis.method}; symbols from the class`,
    },
    channelPsd: psd,
    noiseFloorDbfsPerHz: pass1.noiseFloor.dbfsPerHz,
    wholeSpan: pass2.wholeSpan,
    warnings,
  };
}

/**
 * The whole-span figures to measure with instead of the record's, or null: only when the record
 * was cut short of the span (otherwise the record holds every sample and its own estimators, with
 * their fuller uncertainty budgets, see the same samples), and not when a receiver DC line was
 * removed from the record (the whole-span stage did not remove it).
 */
function wholeSpanInUse(pass2: Pass2Result, dcLineRemoved: boolean): WholeSpanFigures | null {
  const ws = pass2.wholeSpan;
  if (ws === null || pass2.complete || dcLineRemoved || ws.psd.segmentCount < 8) return null;
  return ws;
}

/**
 * fmFigures with the carrier and the peak deviations taken from the whole span (the same audio
 * low-pass over every sample, wholeSpan.ts), when it is in use; carrier relative to the channel centre.
 */
function withWholeSpanPeaks<T extends ReturnType<typeof fmFigures>>(f: T, whole: WholeSpanFigures | null, channelOffsetHz: number): T {
  if (whole === null || whole.peak.deviationHz.value === null || whole.carrierOffsetHz.value === null) return f;
  return {
    ...f,
    carrierOffsetHz: { ...whole.carrierOffsetHz, value: whole.carrierOffsetHz.value - channelOffsetHz },
    peakDeviationHz: whole.peak.deviationHz,
    positiveDeviationHz: whole.positivePeak.deviationHz,
    negativeDeviationHz: whole.negativePeak.deviationHz,
  };
}

/** Below this in-channel SNR, dB, the class is given as unknown (the tentative class in its method). */
export const CLASS_MIN_SNR_DB = 10;
/** From CLASS_MIN_SNR_DB up to this SNR, dB, the confidence is capped on a ramp from 0.5 to 0.9. */
export const CLASS_FULL_SNR_DB = 20;

/**
 * The class decision bounded by the SNR. The classifiers' thresholds leave room for the error of
 * their noise corrections from about 15 dB (classifyAnalog.ts, classifyEmission.ts); below 10 dB
 * the features no longer separate the classes, so the class is unknown, with the tentative one in
 * the method line; from 10 to 20 dB the confidence is at most 0.5 + 0.4·(SNR − 10)/10, below the
 * 0.9 that a user may act on. The SNR is the channel's, or of a bursty link the SNR while keyed on
 * (the channel's plus 10·log10(100/duty %)). The evaluation set (docs/classification.md) reports how this holds.
 */
function snrBoundedClass(
  cls: DesignatorClass, order: number | null, confidence: number, method: string, snrDb: number | null,
): { cls: DesignatorClass; order: number | null; confidence: number; classMethod: string } {
  if (cls === "noise" || cls === "unknown" || snrDb === null || snrDb >= CLASS_FULL_SNR_DB) return { cls, order, confidence, classMethod: method };
  if (snrDb < CLASS_MIN_SNR_DB) {
    const tentative = `${cls}${order === null ? "" : ` ${order}`}`;
    return { cls: "unknown", order: null, confidence: 0.5, classMethod: `${method}; tentatively ${tentative}, but at ${snrDb.toFixed(1)} dB SNR (below ${CLASS_MIN_SNR_DB} dB) the features do not decide` };
  }
  const cap = 0.5 + (0.4 * (snrDb - CLASS_MIN_SNR_DB)) / (CLASS_FULL_SNR_DB - CLASS_MIN_SNR_DB);
  return { cls, order, confidence: Math.min(confidence, cap), classMethod: confidence > cap ? `${method}; confidence capped at ${cap.toFixed(2)} by the ${snrDb.toFixed(1)} dB SNR` : method };
}

/**
 * Audio whose dominant line holds at least this share of its power is one test tone (a
 * sinusoid keeps > 99 % within its Hann main lobe; speech spreads over the band). Common practice.
 */
const SINGLE_TONE_SHARE = 0.8;

function singleTone(share: number | null, hz: number | null): number | null {
  return share !== null && hz !== null && share >= SINGLE_TONE_SHARE ? hz : null;
}

/**
 * 47 CFR 2.202(g) F3E: Bn = 2M + 2DK, K = 1, M the maximum modulating frequency: the test tone
 * when the audio is one tone, else the audio bandwidth (`--audio-bw`, 3 kHz for telephony).
 */
function necessaryFm(d: Measurement, tone: Measurement | null, audioBandwidthHz: number): Measurement {
  if (d.value === null) return notAvailable("Hz", "47 CFR 2.202(g) F3E: 2M + 2DK", "no peak deviation");
  const m = tone?.value ?? audioBandwidthHz;
  const u = 2 * Math.hypot(d.uncertainty ?? 0, tone?.uncertainty ?? 0);
  const what = tone === null ? `M = ${m.toFixed(0)} Hz, the audio bandwidth (--audio-bw)` : `M = ${m.toFixed(1)} Hz, the measured test tone`;
  return measurement(necessaryBandwidthFmHz(m, d.value), "Hz", u > 0 ? u : null, `47 CFR 2.202(g) F3E: 2M + 2DK, K = 1, ${what}, D = ${d.value.toFixed(0)} Hz measured peak deviation`);
}

/** 47 CFR 2.202(g) A3E: Bn = 2M, M the test tone when the audio is one tone, else the audio bandwidth. */
function necessaryAm(tone: Measurement | null, audioBandwidthHz: number): Measurement {
  const m = tone?.value ?? audioBandwidthHz;
  const what = tone === null ? `M = ${m.toFixed(0)} Hz, the audio bandwidth (--audio-bw)` : `M = ${m.toFixed(1)} Hz, the measured test tone`;
  const u = tone === null ? null : 2 * (tone.uncertainty ?? 0);
  return measurement(necessaryBandwidthAmHz(m), "Hz", u !== null && u > 0 ? u : null, `47 CFR 2.202(g) A3E: 2M, ${what}`);
}

/**
 * The bandwidth of the designator: the necessary bandwidth where a 47 CFR 2.202 formula gave one
 * (RR Appendix 1 designators carry the necessary bandwidth), else the 99 % occupied bandwidth
 * (as 47 CFR 90.209(a) allows), but not when that is limited by the resolution (bin wider than
 * 5 % of it): then it is only an upper bound, and no bandwidth digit is made from the window.
 */
function designatorBandwidth(
  necessary: Measurement, occupied: Measurement, resolutionHz: number,
): { bandwidthHz: number | null; basis: "necessary" | "occupied"; method: string; reason: string | null } {
  if (necessary.value !== null && necessary.value > 0) {
    return { bandwidthHz: necessary.value, basis: "necessary", method: "bandwidth code from the necessary bandwidth (47 CFR 2.202(g) formula with the measured parameters)", reason: null };
  }
  const obw = occupied.value;
  const method = "bandwidth code from the measured 99 % occupied bandwidth (47 CFR 90.209(a)), no necessary-bandwidth formula applies";
  if (obw !== null && resolutionHz > 0.05 * obw) {
    return { bandwidthHz: null, basis: "occupied", method, reason: `the occupied bandwidth ${obw.toFixed(1)} Hz is an upper bound set by the ${resolutionHz.toFixed(2)} Hz resolution: no bandwidth code` };
  }
  return { bandwidthHz: obw, basis: "occupied", method, reason: null };
}

/** The occupied bandwidth and its edges without the note that the resolution widens them. */
function withoutResolutionNote<T extends Record<"occupiedHz" | "lowerEdgeHz" | "upperEdgeHz", Measurement>>(obw: T): T {
  const strip = (m: Measurement): Measurement => ({ ...m, warnings: m.warnings.filter((w) => !w.startsWith("resolution ")) });
  return { ...obw, occupiedHz: strip(obw.occupiedHz), lowerEdgeHz: strip(obw.lowerEdgeHz), upperEdgeHz: strip(obw.upperEdgeHz) };
}

/**
 * The class inside the bursts of a keyed envelope (keyedEmission.ts): blind, or for a forced
 * FSK/PSK/QAM mode just the bursts to measure in (other modes measure the whole record).
 */
function keyedFigures(
  keyed: Bursts, mode: MeasureMode | undefined, fs: number, psdOf: (iq: Float32Array) => WelchPsd | null,
  floor: number, snrDb: number | null, half: number,
): KeyedDecision | null {
  if (mode === undefined) return keyedDecision(keyed, fs, psdOf, floor, snrDb, half);
  if (mode !== "fsk" && mode !== "psk" && mode !== "qam") return null;
  return { class: mode, order: null, confidence: 1, method: "given with --mode", bursts: keyed };
}

/**
 * The receiver's reference in the carrier's uncertainty: an error of u ppm moves its local
 * oscillator, and so every reported offset, by u·1e-6·f_RF (clockCorrection.ts), f_RF ≈ the
 * capture centre; u (k = 2) is added in quadrature. Without u, or without the centre, the
 * method says that the reference is not included.
 */
function withReference(m: Measurement, centerHz: number | null, referencePpm: number | undefined): Measurement {
  if (m.value === null) return m;
  if (referencePpm === undefined) return { ...m, method: `${m.method}; ${REFERENCE_NOT_INCLUDED}` };
  if (centerHz === null) return { ...m, method: `${m.method}; ${REFERENCE_NOT_INCLUDED} (the centre frequency is unknown)` };
  const uRef = referencePpm * 1e-6 * Math.abs(centerHz + m.value);
  return { ...m, uncertainty: Math.hypot(m.uncertainty ?? 0, uRef), method: `${m.method}; receiver reference ±${referencePpm} ppm (k = 2) included in quadrature` };
}

/**
 * The narrowest channel measured, Hz: four bins of the default pass-1 spectrum (fs/1024, so that
 * the emission can be located in it) and 400/T over an analysed span of T s (a channel sampled at
 * about 2.5 × its width then holds at least 1000 samples for its spectrum and figures).
 */
export function minimumChannelWidthHz(sampleRateHz: number, spanS: number): number {
  return Math.max(sampleRateHz / 1024, 400 / spanS);
}

/** Fewest symbols a span must hold for a symbol rate to be measured or used (pskQamRecovery.ts needs 64). */
export const MIN_SYMBOLS = 64;

/** The pass 2 measureEmission runs for the channel offsetHz ± widthHz/2. */
function pass2Request(offsetHz: number, widthHz: number, options: MeasureEmissionOptions): Pass2Request {
  const audioBandwidthHz = options.audioBandwidthHz ?? MEASURE_DEFAULTS.audioBandwidthHz;
  // The whole-span stage runs whenever measureEmission reads the channel itself; measure needs no spectra from it.
  return { offsetHz, bandwidthHz: widthHz, maxSamples: options.maxChannelSamples, wholeSpan: { audioBandwidthHz, hold: false } };
}

/**
 * The pass 2 to ask of pass 1 (Pass1Options.channel), when the channel is known before it (given
 * with --channel) and nothing else reads the span beside pass 2: extracted in pass 1's read,
 * it is what measureEmission would read itself, and it takes it from there. Else undefined.
 */
export function pass2BesidePass1(options: MeasureEmissionOptions, meta: CaptureMeta): Pass2Request | undefined {
  const c = options.channel;
  if (c === undefined || options.extractedChannel !== undefined || options.onInputBlock !== undefined) return undefined;
  return pass2Request(c.offsetHz, Math.min(c.widthHz, 0.9 * meta.sampleRateHz), options);
}

/** Pass 1's pass 2 (pass2BesidePass1), when it is of this channel and nothing reads beside it; else undefined. */
function pass2FromPass1(pass1: Pass1Result, offsetHz: number, widthHz: number, options: MeasureEmissionOptions): Pass2Result | undefined {
  const p = pass1.pass2;
  if (p === null || options.onInputBlock !== undefined || p.offsetHz !== offsetHz || p.bandwidthHz !== widthHz) return undefined;
  return p;
}

/**
 * Checks the options against the capture's metadata and the span, before any sample is read
 * (measureCommand calls it right after opening the capture): UsageError naming the option.
 */
export function checkMeasureOptions(options: MeasureEmissionOptions, meta: CaptureMeta, span: SampleSpan): void {
  const fs = meta.sampleRateHz;
  const spanS = span.sampleCount / fs;
  const c = options.channel;
  if (c !== undefined) {
    if (!(c.widthHz > 0)) throw new UsageError("--channel", `width ${c.widthHz} Hz must be greater than 0`);
    const least = minimumChannelWidthHz(fs, spanS);
    if (c.widthHz < least) {
      throw new UsageError("--channel", `width ${c.widthHz.toPrecision(3)} Hz is narrower than the ${least.toFixed(0)} Hz this capture allows (the larger of fs/1024 and 400/T for ${spanS.toFixed(2)} s analysed)`);
    }
    if (c.offsetHz - c.widthHz / 2 < -fs / 2 || c.offsetHz + c.widthHz / 2 > fs / 2) {
      throw new UsageError(
        "--channel",
        `${c.offsetHz} Hz ± ${c.widthHz / 2} Hz reaches outside the capture's ±${fs / 2} Hz (rate ${fs} S/s of ${meta.path})`,
      );
    }
  }
  if (options.nominalHz !== undefined && meta.centerHz === null) {
    throw new UsageError("--nominal", `needs the capture's centre frequency: give --center (${meta.path} does not say it)`);
  }
  const allowed: Record<string, readonly number[]> = { psk: [2, 4, 8], qam: [16, 32, 64], fsk: [2, 4], ook: [2] };
  if (options.order !== undefined) {
    const ok = options.mode === undefined ? [2, 4, 8, 16, 32, 64] : allowed[options.mode];
    if (ok === undefined || !ok.includes(options.order)) {
      throw new UsageError("--order", `${options.order} is not an order of ${options.mode ?? "any digital class"} (${ok === undefined ? "no order applies" : ok.join(", ")})`);
    }
  }
  const rs = options.symbolRateBd;
  if (rs !== undefined) {
    if (!(rs > 0 && rs <= fs / 2)) {
      throw new UsageError("--symbol-rate", `${rs} Bd must be above 0 and at most half the sample rate, ${fs / 2} Bd (2 samples a symbol)`);
    }
    if (rs * spanS < MIN_SYMBOLS) {
      throw new UsageError("--symbol-rate", `${rs} Bd gives ${(rs * spanS).toFixed(1)} symbols in the ${spanS.toFixed(2)} s analysed; at least ${MIN_SYMBOLS} are needed (at least ${(MIN_SYMBOLS / spanS).toFixed(1)} Bd)`);
    }
  }
  if (options.rollOff !== undefined && !(options.rollOff > 0 && options.rollOff <= 1)) {
    throw new UsageError("--rolloff", `${options.rollOff} must be above 0 and at most 1`);
  }
  if (options.referencePpm !== undefined && !(options.referencePpm > 0 && Number.isFinite(options.referencePpm))) {
    throw new UsageError("--reference-ppm", `${options.referencePpm} ppm must be a finite number above 0 (leave the option out when the reference is unknown)`);
  }
  if (options.xDb !== undefined && !(options.xDb > 0 && options.xDb <= 100)) {
    throw new UsageError("--xdb", `${options.xDb} dB must be between 0 and 100`);
  }
  if (options.audioBandwidthHz !== undefined && !(options.audioBandwidthHz >= 100)) {
    throw new UsageError("--audio-bw", `${options.audioBandwidthHz} Hz must be at least 100 Hz`);
  }
}

/**
 * Welch PSD of the channel baseband, with bins narrow enough to resolve its bandwidth (about
 * 1/400 of the channel width, common practice: RBW ≤ 1 % of the OBW, REFERENCES.md §3) and at
 * least 8 segments. Null when the channel holds fewer than 256 samples.
 */
function channelPsd(iq: Float32Array, fs: number, widthHz: number): WelchPsd | null {
  const samples = iq.length / 2;
  if (samples < 256) return null;
  let n = 256;
  while (n < 65536 && fs / n > widthHz / 400) n *= 2;
  while (n > 256 && samples < 4.5 * n) n /= 2;
  const welch = new WelchAccumulator({ fftLength: n, sampleRateHz: fs });
  welch.push(iq, 0);
  return welch.finish();
}

/**
 * The part of the channel the classifier looks at: its first 2^16 samples (about a second at the
 * usual channel rates; thousands of symbols of any data link). The digital features (cumulants,
 * keying histograms, the symbol-rate line) are then bounded in time and memory whatever the span.
 */
/** The first CLASSIFY_MAX_SAMPLES of the channel, limited to the channel's width (the decimation filter's transition band and what aliases into it left out). */
function classificationRecord(iq: Float32Array, fs: number, halfWidthHz: number): Float32Array {
  const head = iq.subarray(0, Math.min(iq.length, 2 * CLASSIFY_MAX_SAMPLES));
  return halfWidthHz < fs / 2 ? bandLimit(head, fs, -halfWidthHz, halfWidthHz) : head;
}

/** f folded into [−fs/2, fs/2). */
function aliasHz(f: number, fs: number): number {
  return f - fs * Math.floor(f / fs + 0.5);
}
const CLASSIFY_MAX_SAMPLES = 1 << 16;

function shiftTimes(t: ArrayLike<number>, startS: number): Float64Array {
  const out = new Float64Array(t.length);
  for (let i = 0; i < t.length; i++) out[i] = (t[i] as number) + startS;
  return out;
}

function numericFeatures(features: object): Record<string, number> {
  const out: Record<string, number> = {};
  for (const [k, v] of Object.entries(features)) if (typeof v === "number" && Number.isFinite(v)) out[k] = v;
  return out;
}

/**
 * The noise density to measure against: the pass-1 floor, or where that is 0 (a capture with no
 * noise, e.g. mostly zero samples) the smallest positive PSD bin, so that a signal in it is still
 * measured. Null when the PSD holds no power at all.
 */
function usableFloor(psd: WelchPsd, floor: number): number | null {
  if (floor > 0 && Number.isFinite(floor)) return floor;
  let least = Infinity;
  for (const v of psd.densityPerHz) if (v > 0 && v < least) least = v;
  return Number.isFinite(least) ? least : null;
}

function noEmission(
  pass1: Pass1Result,
  dcSpike: EmissionFigures["dcSpike"],
  { xDb, reference }: { readonly xDb: number; readonly reference: XDbReference },
  nominalHz: number | null,
  warnings: string[],
): EmissionFigures {
  const none = (unit: string, what: string): Measurement => notAvailable(unit, what, "no emission to measure");
  return {
    channel: { offsetHz: 0, widthHz: 0, givenByUser: false, sampleRateHz: 0, decimation: 1, measuredS: 0 },
    dcSpike,
    carrier: { offsetHz: none("Hz", "carrier"), frequencyHz: none("Hz", "carrier"), errorPpm: none("Ppm", "frequency error"), nominalHz },
    bandwidth: {
      occupiedHz: none("Hz", "ITU-R SM.328 99 % power"),
      lowerEdgeHz: none("Hz", "OBW edge"),
      upperEdgeHz: none("Hz", "OBW edge"),
      xDbHz: none("Hz", "x-dB bandwidth"),
      xDbLowerEdgeHz: none("Hz", "x-dB edge"),
      xDbUpperEdgeHz: none("Hz", "x-dB edge"),
      xDb,
      xDbReference: reference,
      resolutionHz: pass1.psd.enbwHz,
    },
    power: { channelDbfs: none("Dbfs", "channel power"), snrDb: none("Db", "SNR") },
    modulation: { class: "noise", order: null, confidence: 1, forced: false, method: "no region of the PSD stands 10 dB above the noise floor", features: {} },
    fm: null,
    am: null,
    digital: null,
    fsk: null,
    ook: null,
    emission: { designator: null, designatorBasis: null, necessaryBandwidthHz: none("Hz", "necessary bandwidth"), method: "no emission" },
    channelPsd: null,
    noiseFloorDbfsPerHz: pass1.noiseFloor.dbfsPerHz,
    wholeSpan: null,
    warnings,
  };
}
