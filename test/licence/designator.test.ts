import { describe, expect, it } from "vitest";
import { parseDesignator } from "../../src/licence/index.js";

describe("parseDesignator(s)", () => {
  it("reads the bandwidth code with the letter as the decimal point (RR Appendix 1 §2; 47 CFR 2.202(b))", () => {
    // REFERENCES.md §2 and §4 worked designators (status V): 16K0F3E = 2M + 2DK with M = 3 kHz,
    // D = 5 kHz (47 CFR 2.202(g)); 6K00A3E = 2M, M = 3 kHz; 180KF3E = mono FM broadcast.
    expect(parseDesignator("16K0F3E")).toEqual({
      text: "16K0F3E", bandwidthHz: 16000, classSymbols: "F3E", first: "F", second: "3", third: "E", extraSymbols: "",
    });
    expect(parseDesignator("6K00A3E").bandwidthHz).toBe(6000);
    expect(parseDesignator("180KF3E").bandwidthHz).toBe(180000);
    // 11K2F3E: the designator usual on 12.5 kHz FM licences (REFERENCES.md §4, common practice).
    expect(parseDesignator("11K2F3E").bandwidthHz).toBe(11200);
    // The official examples of RR Appendix 1 / 47 CFR 2.202(b)(3) (REFERENCES.md §2, V), read back.
    const OFFICIAL: Array<[string, number]> = [
      ["H002", 0.002], ["H100", 0.1], ["25H3", 25.3], ["400H", 400], ["2K40", 2400], ["12K5", 12500],
      ["1M25", 1.25e6], ["2M00", 2e6], ["10M0", 10e6], ["202M", 202e6], ["5G65", 5.65e9],
    ];
    for (const [code, hz] of OFFICIAL) expect(parseDesignator(`${code}N0N`).bandwidthHz, code).toBeCloseTo(hz, 9);
    // 2M50 = 2.5 MHz; 2K70J3E the SSB example of REFERENCES.md §2 (V2).
    expect(parseDesignator("2M50F3E").bandwidthHz).toBe(2.5e6);
    expect(parseDesignator("2K70J3E").first).toBe("J");
  });

  it("accepts every first, second and third symbol of RR Appendix 1 §4 (REFERENCES.md §2, V)", () => {
    for (const c of "NAHRJBCFGDPKLMQVWX") expect(parseDesignator(`16K0${c}3E`).first).toBe(c);
    for (const c of "0123789X") expect(parseDesignator(`16K0F${c}E`).second).toBe(c);
    for (const c of "NABCDEFWX") expect(parseDesignator(`16K0F3${c}`).third).toBe(c);
  });

  it("keeps the optional fourth and fifth symbols apart from the three class symbols", () => {
    const d = parseDesignator("16K0F3EJN");
    expect(d.classSymbols).toBe("F3E");
    expect(d.extraSymbols).toBe("JN");
  });

  it("refuses a code that is not exactly four characters with one unit letter, saying so", () => {
    // RR Appendix 1 §2: three numerals and one letter; "16KF3E" lacks the fourth character.
    expect(() => parseDesignator("16KF3E")).toThrow(/bandwidth code "16K" has 3 characters/);
    expect(() => parseDesignator("16K00F3E")).toThrow(/a digit follows the bandwidth code "16K0"/);
    expect(() => parseDesignator("1600F3E")).toThrow(/"1600" is not a bandwidth code/);
    expect(() => parseDesignator("16X0F3E")).toThrow(/"X" in "16X0" is not a unit letter/);
    expect(() => parseDesignator("16K0")).toThrow(/three classification symbols/);
    expect(() => parseDesignator("")).toThrow(RangeError);
  });

  it("refuses a first character 0, K, M or G (RR Appendix 1 §2; REFERENCES.md §2)", () => {
    expect(() => parseDesignator("0K50F3E")).toThrow(/begins with 0/);
    expect(() => parseDesignator("K160F3E")).toThrow(/begins with K/);
    expect(() => parseDesignator("M100F3E")).toThrow(/begins with M/);
    expect(() => parseDesignator("H000N0N")).toThrow(/states 0 Hz/);
  });

  it("refuses symbols outside their sets, naming the position and the allowed set", () => {
    expect(() => parseDesignator("16K0Z3E")).toThrow(/"Z" is not a first symbol/);
    expect(() => parseDesignator("16K0F4E")).toThrow(/"4" is not a second symbol/);
    expect(() => parseDesignator("16K0F3Y")).toThrow(/"Y" is not a third symbol/);
    expect(() => parseDesignator("16K0F3EJN7")).toThrow(/at most five symbols/);
    expect(() => parseDesignator("16K0F3E1")).toThrow(/fourth and fifth symbols are capital letters/);
  });

  it("refuses lower case and surrounding spaces (designators are written in capitals)", () => {
    expect(() => parseDesignator("16k0f3e")).toThrow(/lower-case.*16K0F3E/);
    expect(() => parseDesignator(" 16K0F3E")).toThrow(/spaces/);
  });
});
