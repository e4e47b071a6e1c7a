/**
 * The figures of a digital emission in its channel baseband: symbol rate (given, or blind from
 * the cyclostationary line), then for PSK/QAM the matched-filter recovery with EVM/MER, for FSK
 * the tones, shift and index, for OOK the on/off figures. Each as Measurements; see
 * docs/methods.md ("Digital: ...").
 */
import type { ConstellationKind } from "../dsp/index.js";
import {
  fskFigures,
  necessaryBandwidthFmHz,
  notAvailable,
  measurement,
  ookFigures,
  recoverSymbols,
  recoveryFloorPercent,
  symbolRateBlind,
  type Measurement,
  type Segments,
} from "../measure/index.js";
import type { DigitalFiguresOut, FskFiguresOut, OokFiguresOut } from "./emissionFigures.js";

export interface DigitalHints {
  readonly order?: number | undefined;
  readonly symbolRateBd?: number | undefined;
  readonly rollOff?: number | undefined;
  /** The bursts of a bursty link joined in `iq` (FSK: each burst keeps its own symbol clock). */
  readonly segments?: Segments | undefined;
}

export interface DigitalResult {
  readonly digital: DigitalFiguresOut;
  readonly fsk: FskFiguresOut | null;
  readonly ook: OokFiguresOut | null;
  /** Carrier (or centre) offset from the channel centre, Hz, by the method that suits the class. */
  readonly carrierHz: Measurement | null;
  readonly order: number | null;
  readonly necessaryBandwidthHz: Measurement | null;
  readonly warnings: readonly string[];
}

/**
 * 99 % OBW of RRC-shaped linear modulation over Rs, by roll-off (REFERENCES.md §3, computed from
 * the raised-cosine power spectrum). Inverted by linear interpolation to estimate α from a
 * measured OBW and symbol rate.
 */
const RRC_OBW_TABLE: readonly (readonly [number, number])[] = [
  [0.2, 1.0731], [0.22, 1.0849], [0.25, 1.1031], [0.35, 1.1667], [0.5, 1.268], [1.0, 1.633],
];

export function rollOffFromObw(obwHz: number, symbolRateBd: number): number {
  const ratio = obwHz / symbolRateBd;
  const t = RRC_OBW_TABLE;
  if (ratio <= (t[0] as readonly [number, number])[1]) return (t[0] as readonly [number, number])[0];
  for (let i = 1; i < t.length; i++) {
    const [a1, r1] = t[i] as readonly [number, number];
    const [a0, r0] = t[i - 1] as readonly [number, number];
    if (ratio <= r1) return a0 + ((ratio - r0) / (r1 - r0)) * (a1 - a0);
  }
  return 1;
}

/** The symbol-rate line is found on at most this many samples (bounds its transform to 2^20 points). */
const RATE_MAX_SAMPLES = 1 << 19;

const PSK_KIND: Readonly<Record<number, ConstellationKind>> = { 2: "bpsk", 4: "qpsk", 8: "8psk" };
const QAM_KIND: Readonly<Record<number, ConstellationKind>> = { 16: "16qam", 32: "32qam", 64: "64qam" };
const KIND_ORDER: Readonly<Record<ConstellationKind, number>> = { bpsk: 2, qpsk: 4, "8psk": 8, "16qam": 16, "32qam": 32, "64qam": 64 };

export function digitalEmission(
  iq: Float32Array,
  sampleRateHz: number,
  cls: "psk" | "qam" | "fsk" | "ook",
  order: number | null,
  obwHz: number | null,
  hints: DigitalHints,
): DigitalResult {
  const warnings: string[] = [];
  const none = (unit: string, what: string, why: string): Measurement => notAvailable(unit, what, why);
  if (cls === "fsk") {
    const fskOrder = order === 4 ? 4 : 2;
    const f = fskFigures(iq, sampleRateHz, {
      order: fskOrder,
      ...(hints.symbolRateBd === undefined ? {} : { symbolRateBd: hints.symbolRateBd }),
      ...(hints.segments === undefined ? {} : { segments: hints.segments }),
    });
    const tones = f.toneFrequenciesHz.map((t) => t.value).filter((v): v is number => v !== null);
    const centre = tones.length > 0 ? tones.reduce((a, b) => a + b, 0) / tones.length : null;
    const rate = f.symbolRateBd.value;
    const shift = f.shiftHz.value;
    return {
      digital: emptyDigital(f.symbolRateBd, "no constellation: frequency keying"),
      fsk: { shiftHz: f.shiftHz, modulationIndex: f.modulationIndex, toneFrequenciesHz: f.toneFrequenciesHz, histogram: f.histogram },
      ook: null,
      carrierHz: centre === null ? null : measurement(centre, "Hz", f.toneFrequenciesHz[0]?.uncertainty ?? null, "centre of the FSK tones (mean of the tone frequencies)"),
      order: fskOrder,
      necessaryBandwidthHz:
        rate !== null && shift !== null
          ? measurement(
              necessaryBandwidthFmHz(rate / 2, ((fskOrder - 1) * shift) / 2, 1.2),
              "Hz",
              null,
              `47 CFR 2.202(g) F1B: 2M + 2DK with M = B/2 = ${(rate / 2).toFixed(0)} Hz, D = ${(((fskOrder - 1) * shift) / 2).toFixed(0)} Hz, K = 1.2`,
            )
          : null,
      warnings,
    };
  }
  if (cls === "ook") {
    const o = ookFigures(iq, sampleRateHz, hints.symbolRateBd === undefined ? {} : { symbolRateBd: hints.symbolRateBd });
    return {
      digital: emptyDigital(o.symbolRateBd, "no constellation: on-off keying"),
      fsk: null,
      ook: { onOffRatioDb: o.onOffRatioDb, dutyCyclePercent: o.dutyCyclePercent, onLevelDbfs: o.onLevelDbfs },
      carrierHz: null,
      order: 2,
      necessaryBandwidthHz: ookNecessary(o.symbolRateBd),
      warnings,
    };
  }
  // PSK / QAM: rate, roll-off, recovery.
  const rate =
    hints.symbolRateBd !== undefined
      ? measurement(hints.symbolRateBd, "Bd", null, "given with --symbol-rate")
      : blindRate(iq, sampleRateHz, obwHz);
  const rs = rate.value;
  if (rs === null) {
    warnings.push("no symbol rate: the constellation could not be recovered");
    return { digital: emptyDigital(rate, "no symbol rate"), fsk: null, ook: null, carrierHz: null, order, necessaryBandwidthHz: null, warnings };
  }
  const rollOff = hints.rollOff ?? (obwHz === null ? 0.35 : Math.min(1, Math.max(0.1, rollOffFromObw(obwHz, rs))));
  const rollOffMethod =
    hints.rollOff !== undefined
      ? "given with --rolloff"
      : obwHz === null
        ? "default 0.35"
        : `from the 99 % OBW over the symbol rate, ${(obwHz / rs).toFixed(4)}, through the RRC table (raised-cosine spectrum)`;
  const unusable = recoveryRefusal(rs, sampleRateHz, iq.length >> 1);
  if (unusable !== null) {
    warnings.push(`no constellation: ${unusable}`);
    return { digital: emptyDigital(rate, unusable), fsk: null, ook: null, carrierHz: null, order, necessaryBandwidthHz: null, warnings };
  }
  if (hints.symbolRateBd !== undefined && obwHz !== null && !(obwHz / rs >= 0.8 && obwHz / rs <= 2.2)) {
    warnings.push(`the given symbol rate ${rs} Bd does not fit the occupied bandwidth ${obwHz.toFixed(0)} Hz (RRC signalling has 1.0-1.7 × Rs, REFERENCES.md §3): check --symbol-rate`);
  }
  const kind = order === null ? undefined : cls === "psk" ? PSK_KIND[order] : QAM_KIND[order];
  const r = recoverSymbols(iq, sampleRateHz, { symbolRateBd: rs, rollOff, ...(kind === undefined ? {} : { order: { kind } }) });
  warnings.push(...r.warnings);
  const floored = withRecoveryFloor(r.evm.evmRmsPercent, r.evm.merDb, recoveryFloorPercent(r.kind, sampleRateHz / rs, rollOff, r.evm.symbols));
  return {
    digital: {
      symbolRateBd: rate,
      evmRmsPercent: floored.evm,
      evmPeakPercent: r.evm.evmPeakPercent,
      merDb: floored.mer,
      iqOriginOffsetDb: r.evm.iqOriginOffsetDb,
      frequencyErrorHz: r.frequencyErrorHz,
      symbols: r.evm.symbols,
      rollOff,
      rollOffMethod,
      constellation: r.kind,
      recovered: { symbols: r.symbols, ideal: r.ideal },
    },
    fsk: null,
    ook: null,
    carrierHz: r.frequencyErrorHz,
    order: KIND_ORDER[r.kind],
    necessaryBandwidthHz: null,
    warnings,
  };

  function emptyDigital(symbolRate: Measurement, why: string): DigitalFiguresOut {
    return {
      symbolRateBd: symbolRate,
      evmRmsPercent: none("Percent", "EVM (3GPP TS 36.141 style)", why),
      evmPeakPercent: none("Percent", "peak EVM", why),
      merDb: none("Db", "MER (ETSI TR 101 290)", why),
      iqOriginOffsetDb: none("Db", "IQ origin offset", why),
      frequencyErrorHz: none("Hz", "carrier frequency error", why),
      symbols: null,
      rollOff: null,
      rollOffMethod: null,
      constellation: null,
      recovered: null,
    };
  }
}

/**
 * On-off keying: Bn = B·K with K = 5 (47 CFR 2.202(g) / ITU-R SM.1138 A1A telegraphy, K = 5 for
 * a fading circuit; REFERENCES.md §2), B the measured keying rate in Bd.
 */
function ookNecessary(rate: Measurement): Measurement | null {
  const b = rate.value;
  if (b === null) return null;
  return measurement(5 * b, "Hz", rate.uncertainty === null ? null : 5 * rate.uncertainty, `47 CFR 2.202(g) A1A: B·K, K = 5, with the measured B = ${b.toFixed(1)} Bd`);
}

/**
 * EVM and MER with the recovery's own floor F (recoveryFloor.ts) in their uncertainty: the EVM
 * read is high by at most F²/(2·EVM), the MER low by 20·log10(1 + F²/(2·EVM²)) dB (one-sided,
 * added to the statistical part).
 */
function withRecoveryFloor(evm: Measurement, mer: Measurement, floorPercent: number): { evm: Measurement; mer: Measurement } {
  const e = evm.value;
  if (e === null || !(e > 0) || !(floorPercent > 0)) return { evm, mer };
  const bias = (floorPercent * floorPercent) / (2 * e);
  const merBias = 20 * Math.log10(1 + bias / e);
  const note = `; + the recovery's own floor ${floorPercent.toFixed(3)} % (EVM of an ideal record of the same rate, roll-off and constellation), which raises the EVM by up to F²/(2·EVM)`;
  return {
    evm: { ...evm, uncertainty: (evm.uncertainty ?? 0) + bias, method: evm.method + note },
    mer: { ...mer, uncertainty: mer.uncertainty === null ? null : mer.uncertainty + merBias, method: mer.method + note },
  };
}

/** Most samples a symbol the recovery works at: its RRC filters span 24 symbols, so its cost grows with it. */
const MAX_SAMPLES_PER_SYMBOL = 256;

/**
 * Why the constellation cannot be recovered at `rateBd` from `count` channel samples at `fs`,
 * or null: at least 2 and at most MAX_SAMPLES_PER_SYMBOL samples a symbol, at least 64 symbols.
 */
function recoveryRefusal(rateBd: number, fs: number, count: number): string | null {
  const sps = fs / rateBd;
  if (sps < 2) return `${rateBd} Bd needs at least 2 samples a symbol, and the ${fs.toFixed(0)} S/s channel gives ${sps.toFixed(2)}: widen --channel`;
  if (sps > MAX_SAMPLES_PER_SYMBOL) return `${rateBd} Bd is under 1/${MAX_SAMPLES_PER_SYMBOL} of the ${fs.toFixed(0)} S/s channel: narrow --channel to the emission`;
  const symbols = Math.floor(count / sps);
  if (symbols < 64) return `the channel holds ${symbols} symbols at ${rateBd} Bd; at least 64 are needed`;
  return null;
}

/**
 * Blind symbol rate of a PSK/QAM record, searched in [OBW/1.7, OBW] (RRC signalling, module
 * comment of docs/methods.md) and never above fs/2; not available when that range is empty.
 */
function blindRate(iq: Float32Array, fs: number, obwHz: number | null): Measurement {
  const record = iq.subarray(0, Math.min(iq.length, 2 * RATE_MAX_SAMPLES));
  if (obwHz === null) return symbolRateBlind(record, fs);
  const maxBd = Math.min(obwHz, fs / 2);
  if (!(maxBd > obwHz / 1.7)) return notAvailable("Bd", "symbol-rate line", `the occupied bandwidth ${obwHz.toFixed(0)} Hz fills the ${fs.toFixed(0)} S/s channel: no rate range to search`);
  return symbolRateBlind(record, fs, { minBd: obwHz / 1.7, maxBd });
}
