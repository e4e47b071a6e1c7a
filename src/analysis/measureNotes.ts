/**
 * The notes of a measurement that depend on where and what it measured: each is said only where
 * it applies, and once (docs/methods.md, "Warnings").
 */

/** The measured channel: offset from the capture centre and width, Hz. */
export interface ChannelSpan {
  readonly offsetHz: number;
  readonly widthHz: number;
}

/** True when 0 Hz (the capture centre, where a receiver's DC spike sits) lies inside the channel. */
export function channelHoldsDc(channel: ChannelSpan): boolean {
  return Math.abs(channel.offsetHz) <= channel.widthHz / 2;
}

/**
 * The DC-spike note, or null: a receiver DC spike is named only when 0 Hz lies inside the
 * measured channel (outside it, the spike cannot touch the figures). `skipped`: the spike was set
 * aside; `inside`: the line at 0 Hz was measured as part of the emission.
 */
export function dcSpikeNote(
  spike: { readonly skipped: boolean; readonly inside: boolean; readonly levelDbfs: number },
  channel: ChannelSpan,
): string | null {
  if (!channelHoldsDc(channel)) return null;
  const level = spike.levelDbfs.toFixed(1);
  if (spike.skipped) return `a receiver DC spike at 0 Hz (${level} dBFS) lies inside the channel and was not taken for the emission`;
  if (spike.inside) return `the line at 0 Hz (${level} dBFS) lies inside the emission and was measured as part of it: it may be the receiver's DC spike rather than a carrier`;
  return null;
}

/** Classes whose figures pass through the audio low-pass (FM deviation, AM depth). */
const AUDIO_CLASSES: ReadonlySet<string> = new Set(["fm", "am"]);

/**
 * The note that the audio low-pass was narrowed to fit the channel (wantedHz → usedHz at the
 * channel rate fscHz), or null: only for FM and AM, whose figures are read after that filter,
 * and only when it was narrowed.
 */
export function audioNarrowedNote(cls: string, wantedHz: number, usedHz: number, fscHz: number): string | null {
  if (!AUDIO_CLASSES.has(cls) || !(usedHz < wantedHz)) return null;
  return `the audio low-pass is narrowed from ${wantedHz} Hz to ${usedHz.toFixed(0)} Hz to fit the ${fscHz.toFixed(0)} S/s channel (widen --channel to keep it)`;
}
