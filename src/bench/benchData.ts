/**
 * Benchmark captures: cf32_le files of a given size with receiver noise, a few carriers and one
 * 25 kHz-wide FM emission (so later benchmarks can measure it), written block by block and kept
 * outside the repository (reused when present with the right size).
 */
import { open, rename, stat, mkdir } from "node:fs/promises";
import { join } from "node:path";
import { tmpdir } from "node:os";
import { SeededRandom, frequencyShift, qpskSymbols, rrcPsk } from "../scenario/index.js";

export const BENCH_RATE_HZ = 2.4e6;

export function benchDir(): string {
  return process.env.IQAUDIT_BENCH_DIR ?? join(tmpdir(), "iqaudit-bench");
}

/** Writes (or reuses) `<benchDir>/bench_<MiB>MiB_2.4Msps.cf32`; returns its path. */
export async function benchCapture(mebibytes: number): Promise<string> {
  const dir = benchDir();
  await mkdir(dir, { recursive: true });
  const path = join(dir, `bench_${mebibytes}MiB_2.4Msps.cf32`);
  const bytes = mebibytes * 2 ** 20;
  const existing = await stat(path).catch(() => null);
  if (existing !== null && existing.size === bytes) return path;
  const temp = `${path}.tmp-${process.pid}`;
  const handle = await open(temp, "w");
  const rng = new SeededRandom(2026);
  const blockSamples = 1 << 18;
  const block = new Float32Array(2 * blockSamples);
  const fs = BENCH_RATE_HZ;
  const noise = Math.sqrt(1e-5 / 2); // -50 dBFS of noise over 2.4 MHz
  let phaseFm = 0;
  let n = 0;
  const total = bytes / 8;
  try {
    while (n < total) {
      const m = Math.min(blockSamples, total - n);
      for (let k = 0; k < m; k++) {
        const t = (n + k) / fs;
        // FM at +300 kHz: 1 kHz tone, 5 kHz peak deviation (about 25 kHz wide by Carson's rule, with the tone sidebands).
        phaseFm += (2 * Math.PI * (300e3 + 5e3 * Math.sin(2 * Math.PI * 1e3 * t))) / fs;
        const a = 0.1;
        let i = a * Math.cos(phaseFm) + 0.02 * Math.cos(2 * Math.PI * -412.5e3 * t);
        let q = a * Math.sin(phaseFm) + 0.02 * Math.sin(2 * Math.PI * -412.5e3 * t);
        i += noise * rng.gaussian();
        q += noise * rng.gaussian();
        block[2 * k] = i;
        block[2 * k + 1] = q;
      }
      if (phaseFm > 1e6) phaseFm %= 2 * Math.PI;
      await handle.write(new Uint8Array(block.buffer, 0, 8 * m));
      n += m;
    }
  } finally {
    await handle.close();
  }
  await rename(temp, path);
  return path;
}

/**
 * Writes (or reuses) `<benchDir>/bench_qpsk_<MiB>MiB_1Msps.cf32`: QPSK at 50 kBd, RRC roll-off
 * 0.35, at +120 kHz, about 30 dB Es/N0, built block by block.
 */
export async function benchQpskCapture(mebibytes: number): Promise<string> {
  const dir = benchDir();
  await mkdir(dir, { recursive: true });
  const path = join(dir, `bench_qpsk_${mebibytes}MiB_1Msps.cf32`);
  const bytes = mebibytes * 2 ** 20;
  const existing = await stat(path).catch(() => null);
  if (existing !== null && existing.size === bytes) return path;
  const fs = 1e6;
  const total = bytes / 8;
  const rng = new SeededRandom(4242);
  const symbols = qpskSymbols(rng, Math.ceil((total / fs) * 50e3) + 16);
  const temp = `${path}.tmp-${process.pid}`;
  const handle = await open(temp, "w");
  const blockSamples = 1 << 16;
  const block = new Float32Array(2 * blockSamples);
  // Es/N0 = (P/Rs)/(σ²/fs) = 30 dB with P = 0.01: σ² = P·(fs/Rs)/1000, σ²/2 a component.
  const noise = Math.sqrt((0.01 * (fs / 50e3)) / 1000 / 2);
  try {
    for (let n = 0; n < total; n += blockSamples) {
      const m = Math.min(blockSamples, total - n);
      const x = frequencyShift(rrcPsk(symbols, n, m, { symbolRateBd: 50e3, sampleRateHz: fs, rollOff: 0.35, amplitude: 0.1 }), fs, 120e3, n);
      for (let k = 0; k < 2 * m; k++) block[k] = (x[k] as number) + noise * rng.gaussian();
      await handle.write(new Uint8Array(block.buffer, 0, 8 * m));
    }
  } finally {
    await handle.close();
  }
  await rename(temp, path);
  return path;
}
