/**
 * `--channel CENTRE:WIDTH` as typed, read against the capture's metadata: a centre whose
 * magnitude is at most the sample rate is an offset from the capture centre (as before); a larger
 * one cannot be an offset (the capture spans ±fs/2) and is an absolute RF frequency, which needs
 * the capture's centre frequency. The absolute form is turned into the offset at which the
 * receiver shows it (clockCorrection.ts: corrected for --ppm).
 */
import type { CaptureMeta } from "../capture/index.js";
import { UsageError } from "../errors.js";
import { reportedOffsetOfHz } from "./clockCorrection.js";

/** The channel as the user gave it, Hz. */
export interface ChannelRequest {
  readonly centreHz: number;
  readonly widthHz: number;
}

/** The channel as an offset from the capture centre; UsageError naming --channel (and --center). */
export function resolveChannel(request: ChannelRequest, meta: CaptureMeta): { offsetHz: number; widthHz: number } {
  const { centreHz, widthHz } = request;
  const fs = meta.sampleRateHz;
  if (Math.abs(centreHz) <= fs) return { offsetHz: centreHz, widthHz };
  const offsetHz = reportedOffsetOfHz(meta, centreHz);
  if (offsetHz === null) {
    throw new UsageError("--channel", `${centreHz} Hz is beyond the sample rate, so an absolute frequency, which needs the capture's centre frequency: give --center (${meta.path} does not say it), or give the channel as an offset`);
  }
  if (Math.abs(offsetHz) + widthHz / 2 > fs / 2) {
    throw new UsageError(
      "--channel",
      `${centreHz} Hz ± ${widthHz / 2} Hz is ${offsetHz.toFixed(0)} Hz from the capture's centre ${meta.centerHz} Hz, reaching outside its ±${fs / 2} Hz (rate ${fs} S/s of ${meta.path})`,
    );
  }
  return { offsetHz, widthHz };
}
