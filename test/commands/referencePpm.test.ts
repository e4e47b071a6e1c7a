// --reference-ppm: the stated (k = 2) uncertainty of the receiver's frequency reference joins the
// carrier's uncertainty in quadrature, as an uncorrelated input quantity (GUM, JCGM 100:2008,
// 5.1.2), scaled to the carrier's RF frequency; without it the report says it is not included.
import { fileURLToPath } from "node:url";
import { describe, expect, it } from "vitest";
import { measureCommand } from "../../src/commands/measure.js";
import { REFERENCE_NOT_INCLUDED } from "../../src/measure/index.js";

const pilot = fileURLToPath(new URL("../../samples/pilot-channel_165.325MHz_50ksps.cf32", import.meta.url));

describe("measure --reference-ppm", () => {
  it("adds u_ref = ppm·1e-6·f_RF in quadrature to the carrier frequency's uncertainty, and says so", async () => {
    const without = (await measureCommand(pilot, { capture: {} })).report;
    const withRef = (await measureCommand(pilot, { capture: {}, referencePpm: 0.5 })).report;
    const f = without.carrier.frequencyHz as number;
    const u0 = without.uncertainty["carrier.frequencyHz"] as number;
    const u1 = withRef.uncertainty["carrier.frequencyHz"] as number;
    expect(withRef.carrier.frequencyHz).toBe(f);
    expect(u1).toBeCloseTo(Math.hypot(u0, 0.5e-6 * f), 6);
    // 0.5 ppm at 165 MHz is 83 Hz, far above the carrier's own uncertainty of a few Hz.
    expect(u1).toBeGreaterThan(80);
    expect(without.methods["carrier.frequencyHz"]).toContain(REFERENCE_NOT_INCLUDED);
    expect(withRef.methods["carrier.frequencyHz"]).toMatch(/receiver reference ±0.5 ppm \(k = 2\) included in quadrature/);
  }, 60_000);
});
