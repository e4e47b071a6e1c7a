import { describe, expect, it } from "vitest";
import { noiseFloor } from "../../src/dsp/index.js";
import { detectDcSpike, lineWidthBoundBins, locateEmission } from "../../src/measure/index.js";
import { amFromAudio, toneAudio, tone } from "../../src/scenario/index.js";
import { addNoise, bandNoise, psdOf } from "./emissionStimuli.js";

const FS = 48000;
const N = 1 << 17;

describe("detectDcSpike(psd, floor) and locateEmission(psd, floor)", () => {
  it("set aside a DC spike stronger than an off-centre carrier and pick the carrier (zero-IF practice, docs/methods.md)", () => {
    // Receiver DC offset 0.3 FS (−10.5 dBFS) and a carrier at +7.3 kHz of amplitude 0.1 (−20 dBFS).
    const iq = addNoise(tone(N, FS, 7300, { amplitude: 0.1 }), 1e-4, 1);
    for (let k = 0; k < N; k++) iq[2 * k] = (iq[2 * k] as number) + 0.3;
    const psd = psdOf(iq, 1024, FS);
    const floor = noiseFloor(psd).densityPerHz;
    const spike = detectDcSpike(psd, floor);
    expect(spike.present).toBe(true);
    // An on-bin line with Hann covers 3 bins (the DFT of the periodic Hann window: −¼, ½, −¼).
    expect(spike.widthHz).toBeLessThanOrEqual(3 * psd.binWidthHz);
    // Its power: 0.09 FS² = −10.46 dBFS (Parseval over its bins), ±0.1 dB.
    expect(Math.abs(spike.levelDbfs - 10 * Math.log10(0.09))).toBeLessThan(0.1);
    const r = locateEmission(psd, floor);
    expect(r).not.toBeNull();
    expect(r?.dcSpikeSkipped).toBe(true);
    // The carrier lies inside the region, which is a few bins wide: the line stands ~64 dB above
    // the floor per bin, and Hann sidelobes (−31 dB, falling 18 dB/octave; Harris 1978 Table 1)
    // stay above floor + 3 dB for about ±4–5 bins.
    expect((r?.lowerEdgeHz as number) < 7300 && (r?.upperEdgeHz as number) > 7300).toBe(true);
    expect(r?.widthHz as number).toBeLessThan(12 * psd.binWidthHz);
  });

  it("keeps an AM carrier at 0 Hz with its sidebands as the emission (sidebands mirror about 0 Hz, RR App. 1 A3E)", () => {
    const audio = toneAudio(0, N, FS, 3000);
    const iq = addNoise(amFromAudio(audio, 60, 0.3), 1e-5, 2);
    const psd = psdOf(iq, 1024, FS);
    const floor = noiseFloor(psd).densityPerHz;
    const r = locateEmission(psd, floor);
    expect(r?.dcSpikeSkipped).toBe(false);
    // The region spans both sidebands at ±3 kHz (and so the carrier between them).
    expect(r?.lowerEdgeHz as number).toBeLessThan(-3000);
    expect(r?.upperEdgeHz as number).toBeGreaterThan(3000);
  });

  it("does not call a wideband emission centred at 0 Hz a spike, and returns the channel when one is given", () => {
    const iq = bandNoise(N, FS, -4000, 4000, 0.1, 1e-8, 3);
    const psd = psdOf(iq, 1024, FS);
    const floor = noiseFloor(psd).densityPerHz;
    expect(detectDcSpike(psd, floor).present).toBe(false);
    const r = locateEmission(psd, floor);
    // Brick-wall band ±4 kHz: the region's edges lie at the band edges within the Hann skirt (±2 bins).
    expect(Math.abs((r?.lowerEdgeHz as number) + 4000)).toBeLessThan(3 * psd.binWidthHz);
    expect(Math.abs((r?.upperEdgeHz as number) - 4000)).toBeLessThan(3 * psd.binWidthHz);
    const c = locateEmission(psd, floor, { channel: { offsetHz: 1000, widthHz: 2000 } });
    expect(c?.lowerEdgeHz).toBe(0);
    expect(c?.upperEdgeHz).toBe(2000);
    expect(() => locateEmission(psd, floor, { channel: { offsetHz: 30000, widthHz: 2000 } })).toThrow(RangeError);
  });

  it("returns null for noise alone", () => {
    const iq = bandNoise(N, FS, 0, 1, 0, 1e-6, 4);
    const psd = psdOf(iq, 1024, FS);
    expect(locateEmission(psd, noiseFloor(psd).densityPerHz)).toBeNull();
  });
});

describe("the DC-spike rule when the DC line is the strongest thing and spurs stand beside it", () => {
  it("bounds a line's equivalent width by ENBW × scallop factor (Harris 1978 Table 1: Hann 1.50 bins, 1.42 dB; rectangular 1.00, 3.92 dB)", () => {
    // Table values to 2–3 digits: 1.50·10^0.142 = 2.08, 1.00·10^0.392 = 2.47.
    expect(Math.abs(lineWidthBoundBins("hann", 1024) - 2.08)).toBeLessThan(0.01);
    expect(Math.abs(lineWidthBoundBins("rectangular", 1024) - 2.47)).toBeLessThan(0.01);
  });

  /** DC 0.3 FS on I (−10.5 dBFS) and a carrier at +7.3 kHz (−20 dBFS), noise 1e-4. */
  function dcAndCarrier(seed: number): Float64Array {
    const iq = addNoise(tone(N, FS, 7300, { amplitude: 0.1 }), 1e-4, seed);
    for (let k = 0; k < N; k++) iq[2 * k] = (iq[2 * k] as number) + 0.3;
    return iq;
  }

  it("finds the spike with sparse spurs beside it (8-bit quantiser products: the median of the guard is the noise)", () => {
    const iq = dcAndCarrier(11);
    // Spurs 25 dB above the floor per bin at 3, 5 and 9 bins from DC on each side (amplitude 0.003).
    const df = FS / 1024;
    for (const b of [-9, -5, -3, 3, 5, 9]) {
      const s = tone(N, FS, b * df, { amplitude: 0.003 });
      for (let k = 0; k < 2 * N; k++) iq[k] = (iq[k] as number) + (s[k] as number);
    }
    const psd = psdOf(iq, 1024, FS);
    const floor = noiseFloor(psd).densityPerHz;
    expect(detectDcSpike(psd, floor).present).toBe(true);
    const r = locateEmission(psd, floor);
    expect(r?.dcSpikeSkipped).toBe(true);
    expect((r?.lowerEdgeHz as number) < 7300 && (r?.upperEdgeHz as number) > 7300).toBe(true);
  });

  it("does not take a line for the DC spike when the capture's mean disagrees (pass-1 health: a DC offset is the mean)", () => {
    const psd = psdOf(dcAndCarrier(12), 1024, FS);
    const floor = noiseFloor(psd).densityPerHz;
    // The line holds 0.09 FS² = −10.46 dBFS; a mean 10 dB weaker is not this line.
    expect(detectDcSpike(psd, floor, { dcOffsetDbfs: -10.46 }).present).toBe(true);
    expect(detectDcSpike(psd, floor, { dcOffsetDbfs: -20.46 }).present).toBe(false);
  });

  it("keeps the carrier's region clear of weak harmonic spurs within the merge gap (they hold < 0.1 % of its power)", () => {
    const iq = dcAndCarrier(13);
    // Spurs at 7.9 and 8.5 kHz, 35 dB below the carrier (about 13 dB above the floor per bin, so
    // they seed runs) and inside the 960 Hz merge gap (2 % of fs); together they hold 0.06 %.
    for (const f of [7900, 8500]) {
      const s = tone(N, FS, f, { amplitude: 0.1 * 10 ** (-35 / 20) });
      for (let k = 0; k < 2 * N; k++) iq[k] = (iq[k] as number) + (s[k] as number);
    }
    const psd = psdOf(iq, 1024, FS);
    const r = locateEmission(psd, noiseFloor(psd).densityPerHz);
    expect((r?.lowerEdgeHz as number) < 7300 && (r?.upperEdgeHz as number) > 7300).toBe(true);
    expect(r?.upperEdgeHz as number).toBeLessThan(7900);
  });

  it("with a channel holding 0 Hz and an emission beside it, sets the spike aside inside the channel", () => {
    const psd = psdOf(dcAndCarrier(14), 1024, FS);
    const floor = noiseFloor(psd).densityPerHz;
    const r = locateEmission(psd, floor, { channel: { offsetHz: 4000, widthHz: 10_000 } });
    expect(r?.dcSpikeInside).toBe(true);
    expect(r?.dcSpikeSkipped).toBe(true);
    // The peak bin is the carrier's (7300 Hz ± half a bin), not the DC line's.
    expect(Math.abs(((r?.peakBinIndex as number) - 512) * psd.binWidthHz - 7300)).toBeLessThan(psd.binWidthHz);
  });
});

describe("locateEmission(psd, floor, { near })", () => {
  // Two carriers: a strong one at +15 kHz (amplitude 0.3, −10.5 dBFS) and a weak one at −9 kHz
  // (amplitude 0.01, −40 dBFS), both far above the 1e-4 FS noise (−80 dBFS per component pair).
  const strong = tone(N, FS, 15_000, { amplitude: 0.3 });
  const weak = tone(N, FS, -9_000, { amplitude: 0.01 });
  const sum = strong.map((v, k) => v + (weak[k] as number));
  const psd = psdOf(addNoise(sum, 1e-4, 7), 1024, FS);
  const floor = noiseFloor(psd).densityPerHz;

  it("without near picks the strongest region (the +15 kHz carrier)", () => {
    const r = locateEmission(psd, floor);
    expect((r?.lowerEdgeHz as number) < 15_000 && (r?.upperEdgeHz as number) > 15_000).toBe(true);
  });

  it("with a window around −9 kHz picks the weak carrier there, not the stronger one outside it", () => {
    const r = locateEmission(psd, floor, { near: { offsetHz: -9_100, halfWidthHz: 1_000 } });
    expect((r?.lowerEdgeHz as number) < -9_000 && (r?.upperEdgeHz as number) > -9_000).toBe(true);
  });

  it("returns null when no region reaches into the window (nothing at 0 ± 2 kHz)", () => {
    expect(locateEmission(psd, floor, { near: { offsetHz: 0, halfWidthHz: 2_000 } })).toBeNull();
  });
});
