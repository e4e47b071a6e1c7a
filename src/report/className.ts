/**
 * A modulation class as a person reads it in the text outputs: the order joined to the class in
 * the trade's usual way (BPSK, QPSK, 8PSK, 16QAM, 2FSK), letters for the analogue classes (FM, AM,
 * CW, OOK), words for "noise" and "unknown". The JSON keeps the contract's `class` and `order`.
 */

const PSK_NAMES: Readonly<Record<number, string>> = { 2: "BPSK", 4: "QPSK", 8: "8PSK" };

/** `cls` as in modulation.class ("psk", "qam", …), `order` as in modulation.order (null: not stated). */
export function displayClass(cls: string | null, order: number | null): string {
  switch (cls) {
    case null:
    case "unknown":
      return "unknown";
    case "noise":
      return "noise";
    case "psk":
      return order === null ? "PSK" : (PSK_NAMES[order] ?? `${order}PSK`);
    case "qam":
    case "fsk":
      return order === null ? cls.toUpperCase() : `${order}${cls.toUpperCase()}`;
    default:
      // cw, am, fm, ook: the order (OOK's is 2) adds nothing a person needs.
      return cls.toUpperCase();
  }
}
