/**
 * Emission designators (ITU Radio Regulations, Appendix 1; 47 CFR 2.201–2.202): the necessary
 * bandwidth as a four-character code followed by the classification symbols.
 *
 * Bandwidth code (RR Appendix 1 §2; 47 CFR 2.202(b)): three numerals and a letter standing
 * where the decimal point would be: H below 1000 Hz, K from 1 kHz, M from 1 MHz, G from 1 GHz;
 * three significant figures, halves rounded up (the official example 180.5 kHz → 181K); below
 * 1 Hz the letter comes first and three decimals follow (0.002 Hz → H002).
 *
 * Classification (RR Appendix 1 §4; 47 CFR 2.201): first symbol the modulation of the main
 * carrier (N unmodulated, A double-sideband AM, F frequency modulation), second the nature of
 * the modulating signal (0 none, 3 one analogue channel), third the information (N none,
 * E telephony). So an unmodulated carrier is N0N, AM telephony A3E, FM telephony F3E.
 *
 * Digital data (third symbol D, data/telemetry; second symbol 1, one channel of quantized or
 * digital information without a modulating sub-carrier): PSK is phase modulation, G1D; FSK is
 * frequency modulation, F1D; QAM changes amplitude and phase together, D1D (first symbol D,
 * "amplitude and angle modulated"); on-off keying of a carrier is double-sideband amplitude
 * keying, A1D. A sub-carrier-keyed emission (A2D, F2D, G2D) cannot be told from the RF samples
 * alone without its baseband structure, so the symbols assume no sub-carrier; the report says so.
 * Keyed Morse (A1A) is out of scope.
 */

/** Every class a designator is made for (interface.md `modulation.class`). */
export type DesignatorClass = "cw" | "am" | "fm" | "fsk" | "ook" | "psk" | "qam" | "noise" | "unknown";

const UNITS: ReadonlyArray<readonly [string, number]> = [["G", 1e9], ["M", 1e6], ["K", 1e3], ["H", 1]];

/**
 * The bandwidth code of `hz` (module comment), e.g. 16000 → "16K0". Throws RangeError outside
 * 0.001 Hz … 999 GHz (after rounding) or for a non-finite value.
 */
export function bandwidthCode(hz: number): string {
  if (!(hz > 0) || !Number.isFinite(hz)) throw new RangeError(`bandwidth ${hz} Hz is not a positive finite number`);
  let e = Math.floor(Math.log10(hz));
  let scaled = hz / 10 ** (e - 2);
  if (scaled >= 1000) { e += 1; scaled /= 10; }
  if (scaled < 100) { e -= 1; scaled *= 10; }
  // Halves up; the small allowance keeps 180.5 (stored as 180.49999…) rounding up.
  let digits = Math.floor(scaled + 0.5 + 1e-9);
  if (digits >= 1000) { digits = 100; e += 1; }
  if (e < 0) {
    const milli = Math.round(digits * 10 ** (e - 2) * 1000);
    if (milli < 1) throw new RangeError(`bandwidth ${hz} Hz is below the 0.001 Hz the code can state`);
    return `H${String(milli).padStart(3, "0")}`;
  }
  const unit = UNITS.find(([, scale]) => 10 ** e >= scale);
  if (unit === undefined || e >= 12) throw new RangeError(`bandwidth ${hz} Hz is above the 999 GHz the code can state`);
  const [letter, scale] = unit;
  const integerDigits = e - Math.round(Math.log10(scale)) + 1;
  const s = String(digits);
  return `${s.slice(0, integerDigits)}${letter}${s.slice(integerDigits)}`;
}

/** The three classification symbols of each class, or null where none applies. */
const CLASS_SYMBOLS: Readonly<Record<DesignatorClass, string | null>> = {
  cw: "N0N", am: "A3E", fm: "F3E", fsk: "F1D", ook: "A1D", psk: "G1D", qam: "D1D", noise: null, unknown: null,
};

/** An emission designator, or null with the reason. */
export interface EmissionDesignator {
  readonly designator: string | null;
  readonly reason: string | null;
}

/**
 * The designator for `class` and `bandwidthHz` (necessary or measured occupied bandwidth, Hz):
 * bandwidthCode(bandwidthHz) + symbols, e.g. { class: "fm", bandwidthHz: 16000 } → "16K0F3E".
 * Null with a reason for noise, unknown, or no bandwidth.
 */
export function emissionDesignator(input: { readonly class: DesignatorClass; readonly bandwidthHz: number | null }): EmissionDesignator {
  const symbols = CLASS_SYMBOLS[input.class];
  if (symbols === null) {
    return { designator: null, reason: input.class === "noise" ? "no emission above the noise" : "the modulation class is not known" };
  }
  const hz = input.bandwidthHz;
  if (hz === null || !(hz > 0)) return { designator: null, reason: "no bandwidth to state" };
  // The code states 0.001 Hz … 999 GHz (RR Appendix 1): outside it, no designator, and why.
  if (!Number.isFinite(hz) || hz < 0.0005 || hz >= 999.5e9) return { designator: null, reason: `the bandwidth ${hz} Hz is outside the 0.001 Hz to 999 GHz a designator can state` };
  return { designator: bandwidthCode(hz) + symbols, reason: null };
}
