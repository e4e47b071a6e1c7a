// The file-name convention of docs/formats.md (our own, so the expected values are the
// convention's worked examples) and the extension table of the brief.
import { describe, expect, it } from "vitest";
import { extensionKind, fileNameTokens } from "../../src/capture/index.js";

describe("fileNameTokens(path)", () => {
  it("fileNameTokens reads <number>[k|M|G]sps and <number>[k|M|G]Hz tokens exactly from their decimal text", () => {
    expect(fileNameTokens("/data/harbour_2.4Msps_156.8MHz.cu8")).toEqual({ sampleRateHz: 2400000, centerHz: 156800000, warnings: [] });
    expect(fileNameTokens("launch-250ksps-433.92mhz.cs16")).toMatchObject({ sampleRateHz: 250000, centerHz: 433920000 });
    expect(fileNameTokens("beacon 48000sps 1.2GHz.cf32")).toMatchObject({ sampleRateHz: 48000, centerHz: 1.2e9 });
    expect(fileNameTokens("x_2.4e6sps.cf32")).toMatchObject({ sampleRateHz: 2.4e6, centerHz: null });
    expect(fileNameTokens("fc=100MHz@1Msps.cu8")).toMatchObject({ sampleRateHz: 1e6, centerHz: 1e8 });
  });

  it("fileNameTokens ignores tokens that are not wholly a quantity, and the extension", () => {
    expect(fileNameTokens("rate2Msps_ch16_v2.cu8")).toEqual({ sampleRateHz: null, centerHz: null, warnings: [] });
    expect(fileNameTokens("dir_5Msps/plain.cf32")).toEqual({ sampleRateHz: null, centerHz: null, warnings: [] });
    expect(fileNameTokens("capture.2Msps")).toEqual({ sampleRateHz: null, centerHz: null, warnings: [] });
  });

  it("fileNameTokens reads a token with a signed exponent whole, or not at all (docs/formats.md convention)", () => {
    // 1e-300sps is one token: 1e-300 S/s, below the accepted range, so it is refused and never read as 300sps.
    expect(() => fileNameTokens("x_1e-300sps.cf32")).toThrow(/rate token 1e-300sps \(1e-300 S\/s\) is below 1 kS\/s/);
    expect(fileNameTokens("x_2.4e+6sps.cf32")).toMatchObject({ sampleRateHz: 2.4e6 });
    expect(fileNameTokens("x_2.5e-3GHz.cf32")).toMatchObject({ centerHz: 2.5e6 });
    // A sign after anything but <digit>e is still a separator.
    expect(fileNameTokens("site-250ksps-e-1MHz.cf32")).toMatchObject({ sampleRateHz: 250000, centerHz: 1e6 });
    // A token that only ends in a quantity is ignored whole.
    expect(fileNameTokens("run1e-5sps_48ksps.cf32")).toMatchObject({ sampleRateHz: 48000 });
  });

  it("fileNameTokens uses the first of two disagreeing tokens, with a warning", () => {
    const t = fileNameTokens("a_1Msps_2Msps.cu8");
    expect(t.sampleRateHz).toBe(1e6);
    expect(t.warnings).toEqual(["The file name gives two rate tokens (1Msps, 2Msps); 1Msps is used."]);
  });
});

describe("extensionKind(path)", () => {
  it("extensionKind maps the extensions of the brief, case-insensitively", () => {
    const table: Record<string, string> = {
      cu8: "cu8", u8: "cu8", cs8: "ci8", ci8: "ci8", s8: "ci8", cs16: "ci16_le", ci16: "ci16_le", s16: "ci16_le",
      cf32: "cf32_le", fc32: "cf32_le", cfile: "cf32_le", cf64: "cf64_le", fc64: "cf64_le", wav: "wav", WAV: "wav",
      "sigmf-meta": "sigmf-meta", "sigmf-data": "sigmf-data", sigmf: "sigmf-archive",
    };
    for (const [ext, kind] of Object.entries(table)) expect(extensionKind(`x.${ext}`), ext).toBe(kind);
    expect(extensionKind("x.iq")).toBeNull();
    expect(extensionKind("noextension")).toBeNull();
    expect(extensionKind(".cu8")).toBeNull(); // a hidden file's name, not an extension
  });
});
