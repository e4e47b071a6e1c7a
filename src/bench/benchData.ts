/**
 * Benchmark captures: cf32_le files of a given size with receiver noise, a few carriers and one
 * 25 kHz-wide FM emission (so later benchmarks can measure it), written block by block and kept
 * outside the repository (reused when present with the right size).
 */
import { open, rename, stat, mkdir, writeFile } from "node:fs/promises";
import { join } from "node:path";
import { tmpdir } from "node:os";
import { SeededRandom, frequencyShift, qpskSymbols, rrcPsk, speechLikeAudio } from "../scenario/index.js";

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

/** One emission of the survey bench capture: a phase increment generator at an offset. */
interface BenchEmission {
  readonly offsetHz: number;
  readonly amplitude: number;
  /** Instantaneous frequency deviation, Hz, and amplitude factor at time t (s). */
  at(t: number): { readonly deviationHz: number; readonly gain: number };
}

/** The survey bench's ten emissions (invented): FM, AM, CW, 2-FSK continuous and in 10 % bursts, OOK, a wide FM. */
function surveyBenchEmissions(): BenchEmission[] {
  const tone = (hz: number, t: number): number => Math.sin(2 * Math.PI * hz * t);
  const bit = (rate: number, t: number, seed: number): number => {
    const k = Math.floor(t * rate);
    return ((Math.imul(k ^ seed, 2654435761) >>> 16) & 1) === 1 ? 1 : -1;
  };
  return [
    { offsetHz: -1_000_000, amplitude: 0.05, at: (t) => ({ deviationHz: 3000 * tone(1000, t), gain: 1 }) },
    { offsetHz: -800_000, amplitude: 0.03, at: (t) => ({ deviationHz: 0, gain: 1 + 0.7 * tone(800, t) }) },
    { offsetHz: -600_000, amplitude: 0.02, at: () => ({ deviationHz: 0, gain: 1 }) },
    { offsetHz: -400_000, amplitude: 0.04, at: (t) => ({ deviationHz: 2400 * bit(4800, t, 11), gain: 1 }) },
    { offsetHz: -150_000, amplitude: 0.05, at: (t) => ({ deviationHz: 1800 * bit(4800, t, 23), gain: t % 0.1 < 0.01 ? 1 : 0 }) },
    { offsetHz: 250_000, amplitude: 0.04, at: (t) => ({ deviationHz: 0, gain: bit(1200, t, 37) > 0 ? 1 : 0 }) },
    { offsetHz: 450_000, amplitude: 0.05, at: (t) => ({ deviationHz: 5000 * tone(1500, t), gain: 1 }) },
    { offsetHz: 650_000, amplitude: 0.01, at: () => ({ deviationHz: 0, gain: 1 }) },
    { offsetHz: 850_000, amplitude: 0.05, at: (t) => ({ deviationHz: 2500 * tone(600, t), gain: 1 }) },
    { offsetHz: -1_050_000 + 2_000_000, amplitude: 0.04, at: (t) => ({ deviationHz: 60_000 * tone(5000, t), gain: 1 }) },
  ];
}

/**
 * Writes (or reuses) `<benchDir>/bench_survey_<MiB>MiB_2.4Msps.cf32`: ten emissions of mixed
 * classes (FM, AM, CW, 2-FSK continuous and in 10 % bursts, OOK, a 130 kHz-wide FM) in −50 dBFS
 * of noise, built block by block.
 */
export async function benchSurveyCapture(mebibytes: number): Promise<string> {
  const dir = benchDir();
  await mkdir(dir, { recursive: true });
  const path = join(dir, `bench_survey_${mebibytes}MiB_2.4Msps.cf32`);
  const bytes = mebibytes * 2 ** 20;
  const existing = await stat(path).catch(() => null);
  if (existing !== null && existing.size === bytes) return path;
  const fs = BENCH_RATE_HZ;
  const total = bytes / 8;
  const emissions = surveyBenchEmissions();
  const phases = new Float64Array(emissions.length);
  const rng = new SeededRandom(2027);
  const noise = Math.sqrt(1e-5 / 2);
  const temp = `${path}.tmp-${process.pid}`;
  const handle = await open(temp, "w");
  const blockSamples = 1 << 18;
  const block = new Float32Array(2 * blockSamples);
  try {
    for (let n = 0; n < total; n += blockSamples) {
      const m = Math.min(blockSamples, total - n);
      for (let k = 0; k < m; k++) {
        const t = (n + k) / fs;
        let i = noise * rng.gaussian();
        let q = noise * rng.gaussian();
        for (let e = 0; e < emissions.length; e++) {
          const em = emissions[e] as BenchEmission;
          const { deviationHz, gain } = em.at(t);
          const ph = (phases[e] as number) + (2 * Math.PI * (em.offsetHz + deviationHz)) / fs;
          phases[e] = ph > 1e4 ? ph % (2 * Math.PI) : ph;
          i += em.amplitude * gain * Math.cos(ph);
          q += em.amplitude * gain * Math.sin(ph);
        }
        block[2 * k] = i;
        block[2 * k + 1] = q;
      }
      await handle.write(new Uint8Array(block.buffer, 0, 8 * m));
    }
  } finally {
    await handle.close();
  }
  await rename(temp, path);
  return path;
}

/** The long recording of the check benchmark: 10 minutes at 48 kS/s, ci16, and its licence. */
export const BENCH_CHECK = { rateHz: 48_000, seconds: 600, centreHz: 164_990_000, assignedHz: 165_000_000, wordStartS: 540, wordS: 0.8, voiceHz: 2200, wordHz: 3400 } as const;

/**
 * Writes (or reuses) `<benchDir>/bench_check_10min_48ksps.cs16` and its licence
 * `bench_check.licence.json`: FM speech-like audio at ±2.2 kHz, 10 kHz above the centre, with one
 * word at minute 9 (540 s) whose audio is raised so that the deviation reaches ±3.4 kHz (20 ms
 * raised-cosine ramps), at −8 dBFS with −110 dBFS/Hz of noise; built block by block.
 */
export async function benchCheckCapture(): Promise<{ path: string; licencePath: string }> {
  const b = BENCH_CHECK;
  const dir = benchDir();
  await mkdir(dir, { recursive: true });
  const path = join(dir, "bench_check_10min_48ksps.cs16");
  const licencePath = join(dir, "bench_check.licence.json");
  await writeFile(licencePath, JSON.stringify({ assignedFrequencyHz: b.assignedHz, frequencyTolerancePpm: 2.5, maxDeviationHz: 2500, authorisedBandwidthHz: 11_250, mask: "cfr-90.210-d", channelSpacingHz: 12_500 }));
  const total = b.rateHz * b.seconds;
  const existing = await stat(path).catch(() => null);
  if (existing !== null && existing.size === 4 * total) return { path, licencePath };
  const temp = `${path}.tmp-${process.pid}`;
  const handle = await open(temp, "w");
  const rng = new SeededRandom(2027);
  const blockSamples = 1 << 16;
  const out = new Int16Array(2 * blockSamples);
  const noise = Math.sqrt((10 ** (-110 / 10) * b.rateHz) / 2);
  const amplitude = 10 ** (-8 / 20);
  const step = (2 * Math.PI * b.voiceHz) / b.rateHz;
  const offset = (2 * Math.PI * (b.assignedHz - b.centreHz)) / b.rateHz;
  let phase = 0;
  try {
    for (let n = 0; n < total; n += blockSamples) {
      const m = Math.min(blockSamples, total - n);
      const audio = speechLikeAudio(n, m, b.rateHz);
      const word = speechLikeAudio(n, m, b.rateHz, { peakTimeS: b.wordStartS + 0.15 });
      for (let k = 0; k < m; k++) {
        const t = (n + k) / b.rateHz - b.wordStartS;
        const w = wordWindow(t, b.wordS, 0.02);
        const a = (1 - w) * (audio[k] as number) + w * (b.wordHz / b.voiceHz) * (word[k] as number);
        phase += step * a + offset;
        if (phase > Math.PI) phase -= 2 * Math.PI * Math.ceil((phase - Math.PI) / (2 * Math.PI));
        out[2 * k] = Math.round(32767 * (amplitude * Math.cos(phase) + noise * rng.gaussian()));
        out[2 * k + 1] = Math.round(32767 * (amplitude * Math.sin(phase) + noise * rng.gaussian()));
      }
      await handle.write(new Uint8Array(out.buffer, 0, 4 * m));
    }
  } finally {
    await handle.close();
  }
  await rename(temp, path);
  return { path, licencePath };
}

/** 1 over [ramp, length − ramp], raised-cosine ramps at both ends, 0 outside [0, length). */
function wordWindow(t: number, length: number, ramp: number): number {
  if (t < 0 || t >= length) return 0;
  const edge = Math.min(t, length - t);
  return edge >= ramp ? 1 : 0.5 - 0.5 * Math.cos((Math.PI * edge) / ramp);
}
