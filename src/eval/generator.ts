/**
 * The seeded generator of evaluation captures: a plan of cases (variant, SNR band, seed), and for
 * each case a capture as a receiver would record it (emission at a random offset, white noise at
 * the drawn in-band SNR, sometimes a receiver DC offset stronger than the emission, quantised to
 * cu8 or written as cf32) with its truth. Seeds and draws are its own, apart from the unit tests.
 */
import { writeFile } from "node:fs/promises";
import { join } from "node:path";
import { encodeSamples } from "../capture/index.js";
import { SeededRandom, complexNoise, frequencyShift } from "../scenario/index.js";
import { BUILDERS, durationSOf } from "./emissions.js";
import { evmComparable, expectedEvmPercent } from "./theory.js";
import { QUANTITIES, VARIANT_LABEL, VARIANTS, type CaseTruth, type EvalCase, type FileFormat, type Quantity, type Variant } from "./truth.js";

/** The SNR bands of the tables, dB (in-band SNR, low edge included). */
export const SNR_BANDS: readonly (readonly [number, number])[] = [[5, 10], [10, 15], [15, 20], [20, 30], [30, 40]];

/** One case of a plan: which variant, in which SNR band, from which seed. */
export interface CaseSpec {
  readonly id: string;
  readonly variant: Variant;
  readonly band: number;
  readonly seed: number;
}

const SAMPLE_RATES_HZ = [200_000, 240_000, 250_000] as const;
/** Share of captures written as cu8, and with a receiver DC offset stronger than the emission. */
const CU8_SHARE = 0.5;
const DC_SHARE = 0.3;
/** Quantisation noise of cu8, E|e|² for a step of 1/127.5 per component: 2·Δ²/12 (uniform rounding error). */
const CU8_QUANTISATION_POWER = (2 * (1 / 127.5) ** 2) / 12;

/** A 32-bit mix of integers (the finaliser of MurmurHash3, public domain), for case seeds. */
export function mixSeed(...parts: number[]): number {
  let h = 0x2545f491;
  for (const p of parts) {
    h = Math.imul(h ^ (p >>> 0), 0x9e3779b1) >>> 0;
    h ^= h >>> 16;
    h = Math.imul(h, 0x85ebca6b) >>> 0;
    h ^= h >>> 13;
    h = Math.imul(h, 0xc2b2ae35) >>> 0;
    h ^= h >>> 16;
  }
  return h >>> 0;
}

/**
 * A plan: `counts[variant]` cases of each variant, spread over the SNR bands in turn (case k in
 * band k mod 5, or in the bands given), each with its own seed from the run seed.
 */
export function planCases(runSeed: number, counts: Partial<Record<Variant, number>>, bands: readonly number[] = [0, 1, 2, 3, 4]): CaseSpec[] {
  const out: CaseSpec[] = [];
  VARIANTS.forEach((variant, v) => {
    const count = counts[variant] ?? 0;
    for (let k = 0; k < count; k++) {
      const band = bands[k % bands.length] as number;
      out.push({ id: `${variant}-${String(k).padStart(2, "0")}`, variant, band, seed: mixSeed(0x6576616c, runSeed, v, k) });
    }
  });
  return out;
}

const between = (rng: SeededRandom, lo: number, hi: number): number => lo + (hi - lo) * rng.uniform();

/** A generated capture: its samples (full scale 1, before encoding) and its truth. */
export interface GeneratedCapture {
  readonly iq: Float64Array;
  readonly truth: CaseTruth;
}

export function generateCase(spec: CaseSpec): GeneratedCapture {
  const rng = new SeededRandom(spec.seed);
  const fs = SAMPLE_RATES_HZ[rng.integer(SAMPLE_RATES_HZ.length)] as number;
  const durationS = durationSOf(spec.variant);
  const samples = Math.round(fs * durationS);
  const built = BUILDERS[spec.variant]({ rng, sampleRateHz: fs, samples });
  const [lo, hi] = SNR_BANDS[spec.band] as readonly [number, number];
  const drawnSnrDb = between(rng, lo, hi);
  const format: FileFormat = rng.uniform() < CU8_SHARE ? "cu8" : "cf32";
  const dcSpikeDbc = rng.uniform() < DC_SHARE ? between(rng, 3, 15) : null;
  const offsetHz = drawOffset(rng, fs, built.halfWidthHz, dcSpikeDbc !== null);
  const centerHz = 150e6 + 100 * Math.round(rng.uniform() * 200_000);

  const x = frequencyShift(built.iq, fs, offsetHz);
  const noisePower = (built.powerFs * fs) / (10 ** (drawnSnrDb / 10) * built.snrReferenceHz);
  const noise = new Float64Array(x.length);
  complexNoise(new SeededRandom(mixSeed(spec.seed, 0x6e6f6973)), noise, noisePower);
  const dcPhase = 2 * Math.PI * rng.uniform();
  const dcAmplitude = dcSpikeDbc === null ? 0 : Math.sqrt(built.powerFs * 10 ** (dcSpikeDbc / 10));
  for (let k = 0; k < x.length; k += 2) {
    x[k] = (x[k] as number) + (noise[k] as number) + dcAmplitude * Math.cos(dcPhase);
    x[k + 1] = (x[k + 1] as number) + (noise[k + 1] as number) + dcAmplitude * Math.sin(dcPhase);
  }
  // Receiver gain: cu8 set to use most of the range (peak 0.9 of full scale); cf32 anywhere.
  const gain = (format === "cu8" ? 0.9 : between(rng, 0.05, 0.8)) / peakComponent(x);
  for (let k = 0; k < x.length; k++) x[k] = (x[k] as number) * gain;
  const g2 = gain * gain;
  const quantisation = format === "cu8" ? CU8_QUANTISATION_POWER : 0;
  const snrDb = 10 * Math.log10((built.powerFs * g2 * fs) / ((noisePower * g2 + quantisation) * built.snrReferenceHz));
  return { iq: x, truth: truthOf(spec, built, { fs, durationS, format, dcSpikeDbc, drawnSnrDb, snrDb, offsetHz, centerHz }) };
}

interface Placement {
  readonly fs: number; readonly durationS: number; readonly format: FileFormat; readonly dcSpikeDbc: number | null;
  readonly drawnSnrDb: number; readonly snrDb: number; readonly offsetHz: number; readonly centerHz: number;
}

function truthOf(spec: CaseSpec, built: ReturnType<(typeof BUILDERS)[Variant]>, p: Placement): CaseTruth {
  const figures: Record<Quantity, number | null> = Object.fromEntries(QUANTITIES.map((q) => [q, null])) as Record<Quantity, number | null>;
  Object.assign(figures, built.figures);
  figures.carrierOffsetHz = p.offsetHz;
  const rate = built.params.symbolRateBd;
  const linear = built.params.rollOff !== undefined && rate !== undefined;
  // Es/N0 = P/(Rs·N0) with N0 = P/(SNR·B): SNR·B/Rs (B the bandwidth the SNR is stated in).
  const esN0Db = linear ? p.snrDb + 10 * Math.log10(built.snrReferenceHz / rate) : null;
  if (esN0Db !== null && evmComparable(spec.variant, esN0Db)) figures.evmRmsPercent = expectedEvmPercent(esN0Db);
  return {
    variant: spec.variant,
    label: VARIANT_LABEL[spec.variant],
    sampleRateHz: p.fs,
    centerHz: p.centerHz,
    durationS: p.durationS,
    format: p.format,
    dcSpikeDbc: p.dcSpikeDbc,
    drawnSnrDb: p.drawnSnrDb,
    snrDb: p.snrDb,
    snrReferenceHz: built.snrReferenceHz,
    params: { ...built.params, ...(esN0Db === null ? {} : { esN0Db }) },
    figures,
  };
}

/**
 * A carrier offset with the emission inside ±0.42·fs; with a DC spike, clear of 0 Hz by at least
 * 5 kHz beyond the emission's half-width (the spike must not sit inside the emission).
 */
function drawOffset(rng: SeededRandom, fs: number, halfWidthHz: number, dc: boolean): number {
  const maxAbs = 0.42 * fs - halfWidthHz;
  const minAbs = dc ? Math.min(halfWidthHz + 5000, maxAbs) : 0;
  const sign = rng.uniform() < 0.5 ? -1 : 1;
  return sign * between(rng, minAbs, maxAbs);
}

function peakComponent(x: Float64Array): number {
  let m = 0;
  for (const v of x) { const a = Math.abs(v); if (a > m) m = a; }
  return m;
}

/** File name by the project's name convention: rate and centre in tokens (docs/formats.md). */
export function captureFileName(id: string, truth: CaseTruth): string {
  const mhz = (truth.centerHz / 1e6).toFixed(4);
  return `${id}_${truth.sampleRateHz / 1000}ksps_${mhz}MHz.${truth.format}`;
}

/** Generates the case and writes its capture into `dir`; returns the path and the truth. */
export async function writeCase(dir: string, spec: CaseSpec): Promise<EvalCase & { readonly path: string }> {
  const { iq, truth } = generateCase(spec);
  const path = join(dir, captureFileName(spec.id, truth));
  await writeFile(path, encodeSamples(truth.format === "cu8" ? "cu8" : "cf32_le", iq));
  return { id: spec.id, seed: spec.seed, truth, path };
}
