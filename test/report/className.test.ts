// displayClass(cls, order): the names of the trade for a modulation and its order (common
// practice in the literature and data sheets: BPSK/QPSK/8PSK for 2/4/8-PSK, M-QAM written 16QAM,
// M-FSK written 2FSK/4FSK; FM, AM, CW, OOK as letters).
import { describe, expect, it } from "vitest";
import { displayClass } from "../../src/report/index.js";

describe("displayClass(cls, order)", () => {
  const CASES: readonly [string | null, number | null, string][] = [
    ["psk", 2, "BPSK"], ["psk", 4, "QPSK"], ["psk", 8, "8PSK"],
    ["qam", 16, "16QAM"], ["qam", 32, "32QAM"], ["qam", 64, "64QAM"],
    ["fsk", 2, "2FSK"], ["fsk", 4, "4FSK"], ["ook", 2, "OOK"],
    ["fm", null, "FM"], ["am", null, "AM"], ["cw", null, "CW"],
    ["noise", null, "noise"], ["unknown", null, "unknown"], [null, null, "unknown"],
    ["psk", null, "PSK"], ["fsk", null, "FSK"],
  ];
  for (const [cls, order, name] of CASES) {
    it(`displayClass(${String(cls)}, ${String(order)}) is ${name}`, () => expect(displayClass(cls, order)).toBe(name));
  }
});
