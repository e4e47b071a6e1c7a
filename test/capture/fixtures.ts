// Shared helpers for the capture tests: a temp folder, a closed-form test signal, hand-built
// RIFF chunks (written here byte by byte from the RIFF layout, not with our writer), and a
// reader that collects every block of a source.
import { mkdtempSync, rmSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { afterAll } from "vitest";
import type { CaptureSource, SampleSpan } from "../../src/capture/index.js";

export const dir = mkdtempSync(join(tmpdir(), "iqaudit-capture-"));
// Each test file imports this module once (forks pool), so each removes its own folder.
afterAll(() => rmSync(dir, { recursive: true, force: true }));

/** Writes `bytes` to `name` in the temp folder and returns the path. */
export function put(name: string, bytes: Uint8Array | string): string {
  const path = join(dir, name);
  writeFileSync(path, bytes);
  return path;
}

/**
 * z[n] = A·exp(j2π f n): interleaved I,Q in double precision (closed form, the reference the
 * quantised files are compared with). A = 0.9 keeps clear of the extreme codes.
 */
export function complexTone(samples: number, cyclesPerSample = 0.0371, amplitude = 0.9): Float64Array {
  const iq = new Float64Array(2 * samples);
  for (let n = 0; n < samples; n++) {
    iq[2 * n] = amplitude * Math.cos(2 * Math.PI * cyclesPerSample * n);
    iq[2 * n + 1] = amplitude * Math.sin(2 * Math.PI * cyclesPerSample * n);
  }
  return iq;
}

/** One RIFF chunk: id, u32 LE size, body, and a pad byte when the size is odd (RIFF rule). */
export function riffChunk(id: string, body: Uint8Array, declaredSize = body.byteLength): Buffer {
  const head = Buffer.alloc(8);
  head.write(id, 0, "latin1");
  head.writeUInt32LE(declaredSize, 4);
  return Buffer.concat([head, body, Buffer.alloc(body.byteLength % 2)]);
}

/** A 16-byte PCM/float WAVEFORMAT body (tag, channels, rate, bytes/s, block align, bits). */
export function fmtBody(tag: number, channels: number, rateHz: number, bits: number): Buffer {
  const b = Buffer.alloc(16);
  b.writeUInt16LE(tag, 0);
  b.writeUInt16LE(channels, 2);
  b.writeUInt32LE(rateHz, 4);
  b.writeUInt32LE((rateHz * channels * bits) / 8, 8);
  b.writeUInt16LE((channels * bits) / 8, 12);
  b.writeUInt16LE(bits, 14);
  return b;
}

/** "RIFF" size "WAVE" followed by the chunks. */
export function riffFile(chunks: readonly Buffer[], form = "RIFF"): Buffer {
  const body = Buffer.concat(chunks);
  const head = Buffer.alloc(12);
  head.write(form, 0, "latin1");
  head.writeUInt32LE(4 + body.byteLength, 4);
  head.write("WAVE", 8, "latin1");
  return Buffer.concat([head, body]);
}

/** Interleaved int16 little-endian bytes of s = round(x · 32768), saturated. */
export function int16le(iq: ArrayLike<number>): Buffer {
  const b = Buffer.alloc(2 * iq.length);
  for (let k = 0; k < iq.length; k++) b.writeInt16LE(Math.max(-32768, Math.min(32767, Math.round((iq[k] as number) * 32768))), 2 * k);
  return b;
}

/** Reads `span` of `source` in blocks of `blockSamples` and joins them. */
export async function readAll(source: CaptureSource, span?: SampleSpan, blockSamples?: number): Promise<Float32Array> {
  const s = span ?? { startSample: 0, sampleCount: source.meta.fileSamples };
  const out = new Float32Array(2 * s.sampleCount);
  let at = 0;
  for await (const block of source.blocks(s, blockSamples)) {
    out.set(block, at);
    at += block.length;
  }
  if (at !== out.length) throw new Error(`blocks gave ${at / 2} samples, expected ${s.sampleCount}`);
  return out;
}

/** Largest |a[k] − b[k]|. */
export function maxAbsDiff(a: ArrayLike<number>, b: ArrayLike<number>): number {
  if (a.length !== b.length) throw new Error(`lengths differ: ${a.length} vs ${b.length}`);
  let m = 0;
  for (let k = 0; k < a.length; k++) m = Math.max(m, Math.abs((a[k] as number) - (b[k] as number)));
  return m;
}

/** mulberry32 (a small public-domain PRNG) for reproducible random block sizes. */
export function seeded(seed: number): () => number {
  let a = seed >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}
