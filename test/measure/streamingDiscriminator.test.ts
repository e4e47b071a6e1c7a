// StreamingDiscriminator: the same values as instantaneousFrequencyHz on the whole record,
// whatever the blocks (the phase step across a block boundary included).
import { describe, expect, it } from "vitest";
import { StreamingDiscriminator, instantaneousFrequencyHz } from "../../src/measure/index.js";
import { complexNoise, SeededRandom } from "../../src/scenario/index.js";

describe("StreamingDiscriminator(fs)", () => {
  it("matches the whole-record discriminator across any blocks, n − 1 values for n samples (fmDiscriminator.ts)", () => {
    const n = 10_000;
    const iq = new Float32Array(2 * n);
    complexNoise(new SeededRandom(8), iq, 1);
    const whole = instantaneousFrequencyHz(iq, 25_000);
    const d = new StreamingDiscriminator(25_000);
    const got: number[] = [];
    const rng = new SeededRandom(1);
    for (let s = 0; s < n;) {
      const e = Math.min(n, s + rng.integer(500));
      for (const v of d.push(iq.subarray(2 * s, 2 * e))) got.push(v);
      s = e;
    }
    expect(got.length).toBe(n - 1);
    // float32 storage of the whole-record values: 6e-8 relative of at most fs/2.
    for (let k = 0; k < got.length; k++) expect(Math.abs((got[k] as number) - (whole[k] as number))).toBeLessThan(2e-3);
  });

  it("reads a complex tone at f as f (arg of e^(j2πf/fs))", () => {
    const fs = 48_000;
    const iq = new Float32Array(2 * 1000);
    for (let k = 0; k < 1000; k++) { iq[2 * k] = Math.cos((2 * Math.PI * 1234 * k) / fs); iq[2 * k + 1] = Math.sin((2 * Math.PI * 1234 * k) / fs); }
    const f = new StreamingDiscriminator(fs).push(iq);
    // fastAtan2 within 2e-6 rad: 0.015 Hz at 48 kS/s; float32 samples add ~1e-7 rad.
    for (const v of f) expect(Math.abs(v - 1234)).toBeLessThan(0.05);
  });
});
