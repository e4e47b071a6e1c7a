// The notes of a measurement said only where they apply (docs/methods.md, "Warnings").
// A zero-IF receiver's DC spike sits at 0 Hz, the capture centre (common practice; docs/methods.md,
// "DC spike"); the audio low-pass is applied before FM deviation and AM depth only (docs/methods.md,
// "FM deviation", "AM depth"), so only those classes are touched by its narrowing.
import { describe, expect, it } from "vitest";
import { audioNarrowedNote, channelHoldsDc, dcSpikeNote } from "../../src/analysis/measureNotes.js";

const SKIPPED = { skipped: true, inside: false, levelDbfs: -40 };

describe("channelHoldsDc(channel)", () => {
  it("is true when |offset| ≤ width/2 (the edge counts) and false beyond", () => {
    expect(channelHoldsDc({ offsetHz: 0, widthHz: 100 })).toBe(true);
    expect(channelHoldsDc({ offsetHz: 50, widthHz: 100 })).toBe(true);
    expect(channelHoldsDc({ offsetHz: -50.001, widthHz: 100 })).toBe(false);
    expect(channelHoldsDc({ offsetHz: 125_000, widthHz: 25_000 })).toBe(false);
  });
});

describe("dcSpikeNote(spike, channel)", () => {
  it("says nothing of a spike outside the measured channel (a channel 125 kHz off centre, 25 kHz wide)", () => {
    expect(dcSpikeNote(SKIPPED, { offsetHz: 125_000, widthHz: 25_000 })).toBeNull();
    expect(dcSpikeNote({ ...SKIPPED, skipped: false, inside: true }, { offsetHz: 125_000, widthHz: 25_000 })).toBeNull();
  });
  it("names a spike set aside inside the channel, with its level", () => {
    expect(dcSpikeNote(SKIPPED, { offsetHz: 5_000, widthHz: 25_000 })).toMatch(/DC spike at 0 Hz \(-40\.0 dBFS\).*not taken/);
  });
  it("warns that a line at 0 Hz measured as the carrier may be the spike", () => {
    expect(dcSpikeNote({ skipped: false, inside: true, levelDbfs: -12.34 }, { offsetHz: 0, widthHz: 16_000 })).toMatch(/-12\.3 dBFS.*may be the receiver's DC spike/);
  });
  it("says nothing when there is no spike", () => {
    expect(dcSpikeNote({ skipped: false, inside: false, levelDbfs: -200 }, { offsetHz: 0, widthHz: 16_000 })).toBeNull();
  });
});

describe("audioNarrowedNote(cls, wantedHz, usedHz, fscHz)", () => {
  it("is said for FM and AM when the low-pass was narrowed (3000 → 0.39 × 6250 = 2437.5 Hz)", () => {
    for (const cls of ["fm", "am"]) expect(audioNarrowedNote(cls, 3000, 0.39 * 6250, 6250)).toMatch(/from 3000 Hz to 2438 Hz to fit the 6250 S\/s/);
  });
  it("is not said for classes without audio figures, nor when the low-pass fits", () => {
    for (const cls of ["cw", "psk", "qam", "fsk", "ook"]) expect(audioNarrowedNote(cls, 3000, 1950, 5000)).toBeNull();
    expect(audioNarrowedNote("fm", 3000, 3000, 48_000)).toBeNull();
  });
});
