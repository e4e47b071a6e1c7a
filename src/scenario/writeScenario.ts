/**
 * Writes the sample scenario's captures (scenario.ts) into a folder: raw files block by block,
 * the WAV in one buffer (small by design), SigMF as data then metadata. Each file is written
 * under a temporary name and renamed when complete, and a file that already exists with the
 * right size is kept.
 */
import { mkdir, open, rename, rm, stat, writeFile } from "node:fs/promises";
import { join } from "node:path";
import { encodeSamples, formatInfo } from "../capture/sampleFormat.js";
import type { Container, SampleFormat } from "../capture/source.js";
import { encodeWav, encodeWavHeader } from "../capture/wavWriter.js";
import { captureStream } from "./captureSynthesis.js";
import { SCENARIO_CAPTURES } from "./scenario.js";
import type { ScenarioCapture } from "./scenario.js";
import { sigmfMetadataText } from "./sigmfMeta.js";

/** What `writeScenario` wrote (or found already in place) for one capture. */
export interface ScenarioFile {
  readonly captureId: string;
  /** The file to give the CLI (the .sigmf-meta for SigMF). */
  readonly path: string;
  /** The file holding the samples (the .sigmf-data for SigMF, else `path`). */
  readonly dataPath: string;
  readonly container: Container;
  readonly format: SampleFormat;
  readonly sampleRateHz: number;
  readonly centerHz: number;
  /** CLI flags needed (or useful) to read it, e.g. ["--format", "cu8", "--rate", "1000000", ...]. */
  readonly flags: readonly string[];
  readonly description: string;
  /** false when an existing file of the right size was kept. */
  readonly written: boolean;
}

/** Samples synthesised per block: bounds memory to a few MB whatever the capture length. */
const BLOCK_SAMPLES = 65_536;

/**
 * Writes every capture of the scenario into `dir` (created if missing) and returns one entry per
 * capture, in the order of SCENARIO_CAPTURES. Deterministic: the same bytes on every run.
 * Raw files carry the rate (`_1Msps`) and centre (`_165.2MHz`) in their names as well.
 */
export async function writeScenario(dir: string): Promise<ScenarioFile[]> {
  await mkdir(dir, { recursive: true });
  const files: ScenarioFile[] = [];
  for (const capture of SCENARIO_CAPTURES) files.push(await writeCapture(dir, capture));
  return files;
}

async function writeCapture(dir: string, capture: ScenarioCapture): Promise<ScenarioFile> {
  const path = join(dir, capture.fileName);
  const frameBytes = formatInfo(capture.format).frameBytes;
  const dataBytes = capture.sampleCount * frameBytes;
  let written = false;
  let dataPath = path;
  switch (capture.container) {
    case "raw":
      if (!(await hasSize(path, dataBytes))) {
        await writeRaw(path, capture);
        written = true;
      }
      break;
    case "wav": {
      const headerBytes = encodeWavHeader({ format: capture.format, sampleRateHz: capture.sampleRateHz }, capture.sampleCount).byteLength;
      if (!(await hasSize(path, headerBytes + dataBytes + (dataBytes % 2)))) {
        const iq = captureStream(capture).next(capture.sampleCount);
        await writeAtomically(path, encodeWav({ format: capture.format, sampleRateHz: capture.sampleRateHz }, iq));
        written = true;
      }
      break;
    }
    case "sigmf": {
      dataPath = path.replace(/\.sigmf-meta$/, ".sigmf-data");
      if (!(await hasSize(dataPath, dataBytes))) {
        await writeRaw(dataPath, capture);
        written = true;
      }
      const meta = Buffer.from(sigmfMetadataText(capture), "utf8");
      if (written || !(await hasSize(path, meta.byteLength))) {
        await writeAtomically(path, meta);
        written = true;
      }
      break;
    }
  }
  return {
    captureId: capture.id,
    path,
    dataPath,
    container: capture.container,
    format: capture.format,
    sampleRateHz: capture.sampleRateHz,
    centerHz: capture.centerHz,
    flags: cliFlags(capture),
    description: capture.description,
    written,
  };
}

/** Flags for the CLI (interface.md, capture options): format and rate for raw files, centre unless in SigMF. */
function cliFlags(capture: ScenarioCapture): string[] {
  const flags: string[] = [];
  if (capture.container === "raw") {
    flags.push("--format", capture.format, "--rate", String(capture.sampleRateHz));
  }
  if (capture.container !== "sigmf") flags.push("--center", String(capture.centerHz));
  return flags;
}

async function hasSize(path: string, bytes: number): Promise<boolean> {
  try {
    const s = await stat(path);
    return s.isFile() && s.size === bytes;
  } catch {
    return false;
  }
}

function temporaryName(path: string): string {
  return `${path}.tmp-${process.pid}`;
}

async function writeAtomically(path: string, data: Uint8Array): Promise<void> {
  const tmp = temporaryName(path);
  try {
    await writeFile(tmp, data);
    await rename(tmp, path);
  } catch (e) {
    await rm(tmp, { force: true });
    throw e;
  }
}

/** Streams the capture into `path` in blocks of BLOCK_SAMPLES, via a temporary file. */
async function writeRaw(path: string, capture: ScenarioCapture): Promise<void> {
  const tmp = temporaryName(path);
  const handle = await open(tmp, "w");
  try {
    const stream = captureStream(capture);
    while (stream.position < stream.sampleCount) {
      const block = stream.next(BLOCK_SAMPLES);
      await handle.write(encodeSamples(capture.format, block));
    }
    await handle.close();
    await rename(tmp, path);
  } catch (e) {
    await handle.close().catch(() => undefined);
    await rm(tmp, { force: true });
    throw e;
  }
}
