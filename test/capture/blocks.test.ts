// CaptureSource.blocks(span, blockSamples): reading in blocks of any size gives the same
// samples as one read (the any-length contract of streaming readers, common practice), from
// any start sample, for every container; and resolveSpan's arithmetic (t = 0 at sample 0).
import { describe, expect, it } from "vitest";
import { ParameterError } from "../../src/errors.js";
import { encodeWav, openCapture, resolveSpan, type CaptureSource } from "../../src/capture/index.js";
import { complexTone, int16le, put, readAll, seeded } from "./fixtures.js";

const N = 4099; // prime, so no block size divides it
const TONE = complexTone(N, 0.0123, 0.8);

async function sources(): Promise<CaptureSource[]> {
  const raw = await openCapture(put("blocks_1Msps.cs16", int16le(TONE)));
  const wav = await openCapture(put("blocks.wav", encodeWav({ format: "ci24_le", sampleRateHz: 1e6, extraChunks: [{ id: "LIST", data: new Uint8Array(7) }] }, TONE)));
  put("blocks.sigmf-data", Buffer.concat([Buffer.alloc(12, 0xff), Buffer.from(new Float32Array(TONE).buffer)]));
  const sigmf = await openCapture(
    put(
      "blocks.sigmf-meta",
      JSON.stringify({
        global: { "core:datatype": "cf32_le", "core:sample_rate": 1e6, "core:version": "1.2.0" },
        captures: [{ "core:sample_start": 0, "core:header_bytes": 12 }],
        annotations: [],
      }),
    ),
  );
  return [raw, wav, sigmf];
}

describe("source.blocks(span, blockSamples)", () => {
  it("blocks() in random block sizes from random starts equals one read of the same span", async () => {
    const rng = seeded(20240611);
    for (const source of await sources()) {
      const whole = await readAll(source, { startSample: 0, sampleCount: N }, N);
      for (let trial = 0; trial < 20; trial++) {
        const startSample = Math.floor(rng() * N);
        const sampleCount = Math.floor(rng() * (N - startSample + 1));
        const blockSamples = 1 + Math.floor(rng() * 700);
        const parts: Float32Array[] = [];
        for await (const block of source.blocks({ startSample, sampleCount }, blockSamples)) {
          expect(block.length).toBeLessThanOrEqual(2 * blockSamples);
          parts.push(block);
        }
        const joined = new Float32Array(parts.reduce((n, p) => n + p.length, 0));
        let at = 0;
        for (const p of parts) {
          joined.set(p, at);
          at += p.length;
        }
        expect(joined, `${source.meta.container} start ${startSample} count ${sampleCount} block ${blockSamples}`).toEqual(
          whole.subarray(2 * startSample, 2 * (startSample + sampleCount)),
        );
      }
      await source.close();
    }
  });

  it("blocks() with reuse hands out views of one array, each holding the same samples as one read", async () => {
    for (const source of await sources()) {
      const whole = await readAll(source, { startSample: 0, sampleCount: N }, N);
      const got: number[] = [];
      const buffers = new Set<ArrayBufferLike>();
      for await (const block of source.blocks({ startSample: 7, sampleCount: N - 7 }, 500, { reuse: true })) {
        got.push(...block); // copied before the next block overwrites it
        buffers.add(block.buffer);
      }
      expect(buffers.size, source.meta.container).toBe(1);
      expect(Float32Array.from(got)).toEqual(whole.subarray(14));
      await source.close();
    }
  });

  it("blocks() iterations interleaved on one source do not disturb each other (reads are positioned)", async () => {
    for (const source of await sources()) {
      const whole = await readAll(source, undefined, N);
      const a = source.blocks({ startSample: 0, sampleCount: N }, 333)[Symbol.asyncIterator]();
      const b = source.blocks({ startSample: 1000, sampleCount: 2000 }, 101)[Symbol.asyncIterator]();
      const gotA: number[] = [];
      const gotB: number[] = [];
      for (;;) {
        const [ra, rb] = await Promise.all([a.next(), b.next()]);
        if (!ra.done) gotA.push(...ra.value);
        if (!rb.done) gotB.push(...rb.value);
        if (ra.done === true && rb.done === true) break;
      }
      expect(Float32Array.from(gotA)).toEqual(whole);
      expect(Float32Array.from(gotB)).toEqual(whole.subarray(2000, 6000));
      await source.close();
    }
  });

  it("blocks() with a span outside the file or a block size below 1 throws a ParameterError", async () => {
    const [source] = await sources();
    const s = source as CaptureSource;
    expect(() => s.blocks({ startSample: N + 1, sampleCount: 0 })).toThrow(ParameterError);
    expect(() => s.blocks({ startSample: 10, sampleCount: N })).toThrow(ParameterError);
    expect(() => s.blocks({ startSample: 0, sampleCount: 10 }, 0)).toThrow(ParameterError);
    expect(() => s.blocks({ startSample: 0.5, sampleCount: 10 })).toThrow(ParameterError);
    // An empty span yields nothing.
    const none: Float32Array[] = [];
    for await (const b of s.blocks({ startSample: N, sampleCount: 0 })) none.push(b);
    expect(none).toEqual([]);
    await s.close();
    await s.close(); // safe twice (source.ts contract)
  });
});

describe("resolveSpan(meta, startS, durationS)", () => {
  it("resolveSpan rounds seconds to the nearest sample, t = 0 at sample 0", async () => {
    const source = await openCapture(put("span_1ksps.cf32", Buffer.alloc(8 * 1000)));
    const meta = source.meta;
    await source.close();
    expect(resolveSpan(meta)).toEqual({ span: { startSample: 0, sampleCount: 1000 }, warnings: [] });
    expect(resolveSpan(meta, 0.25)).toEqual({ span: { startSample: 250, sampleCount: 750 }, warnings: [] });
    expect(resolveSpan(meta, 0.1004, 0.2)).toEqual({ span: { startSample: 100, sampleCount: 200 }, warnings: [] });
    expect(resolveSpan(meta, 0, 0.0001).span.sampleCount).toBe(1); // never an empty span
    const clamped = resolveSpan(meta, 0.9, 0.5);
    expect(clamped.span).toEqual({ startSample: 900, sampleCount: 100 });
    expect(clamped.warnings).toEqual([`--duration 0.5 s runs past the end of ${meta.path}; the 0.1 s (100 samples) up to the end are used.`]);
  });
});
