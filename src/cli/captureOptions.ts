/** The capture options of the contract (interface.md), declared once and parsed once. */
import { Option, type Command } from "commander";
import type { CaptureArgs } from "../commands/analyseCapture.js";
import type { SampleFormat } from "../capture/index.js";
import { parseQuantity } from "./quantity.js";

export const FORMAT_CHOICES = ["cu8", "ci8", "ci16_le", "ci16_be", "cf32_le", "cf64_le", "wav"] as const;

export function addCaptureOptions(cmd: Command): Command {
  return cmd
    .addOption(
      new Option("--format <type>", "sample type of a raw file (SigMF names); default: from .sigmf-meta, WAV header or extension").choices(
        FORMAT_CHOICES,
      ),
    )
    .option("--rate <Hz>", "sample rate, 1k to 1T, e.g. 2.4M, 48k, 2.4e6 (required for a raw file without metadata)")
    .option("--center <Hz>", "RF centre frequency of the capture, e.g. 156.8M: results then also as absolute frequencies")
    .option("--ppm <x>", "known receiver clock error in ppm, removed from every frequency")
    .option("--start <s>", "analyse from this time (seconds from the first sample; 250ms also works)")
    .option("--duration <s>", "analyse this long (clamped to the end of the file, with a warning)")
    .option("--swap-iq", "the capture has I and Q swapped")
    .option("--real", "read a 1-channel WAV or a real SigMF dataset as a real signal (Q = 0)");
}

export interface RawCaptureFlags {
  format?: string;
  rate?: string;
  center?: string;
  ppm?: string;
  start?: string;
  duration?: string;
  swapIq?: boolean;
  real?: boolean;
}

export function captureArgs(flags: RawCaptureFlags): CaptureArgs {
  return {
    format: flags.format as SampleFormat | "wav" | undefined,
    sampleRateHz: flags.rate === undefined ? undefined : parseQuantity("--rate", flags.rate, { unit: "rate", min: 0 }),
    centerHz: flags.center === undefined ? undefined : parseQuantity("--center", flags.center, { unit: "Hz", min: 0, minInclusive: true }),
    ppm: flags.ppm === undefined ? undefined : parseQuantity("--ppm", flags.ppm, { unit: "none" }),
    startS: flags.start === undefined ? undefined : parseQuantity("--start", flags.start, { unit: "s", min: 0, minInclusive: true }),
    durationS: flags.duration === undefined ? undefined : parseQuantity("--duration", flags.duration, { unit: "s", min: 0 }),
    swapIq: flags.swapIq === true,
    real: flags.real === true,
  };
}
