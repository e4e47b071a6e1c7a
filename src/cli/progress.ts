/**
 * Progress on stderr for long runs, only when stderr is a terminal and --quiet is not given
 * (interface.md: stdout carries nothing but the requested output). One line, rewritten in place.
 */
import { formatBytes } from "../report/format.js";

export interface Progress {
  readonly onProgress: ((doneBytes: number, totalBytes: number) => void) | undefined;
  done(): void;
}

/** The progress line on the terminal now, if any: an error or warning printed later clears it first. */
let active: { clear(): void } | null = null;

/** Clears a progress line left on the terminal (before an error line, so the two are not glued). */
export function clearProgressLine(): void {
  active?.clear();
  active = null;
}

export function createProgress(label: string, enabled: boolean, stream: NodeJS.WriteStream = process.stderr): Progress {
  if (!enabled || !stream.isTTY) return { onProgress: undefined, done: () => undefined };
  const started = Date.now();
  let lastDraw = 0;
  let drawn = false;
  const clear = (): void => {
    if (drawn) stream.write("\r\x1b[K");
    drawn = false;
  };
  active = { clear };
  return {
    onProgress(doneBytes, totalBytes) {
      const now = Date.now();
      if (now - lastDraw < 200 && doneBytes < totalBytes) return;
      lastDraw = now;
      const fraction = totalBytes > 0 ? doneBytes / totalBytes : 1;
      const seconds = (now - started) / 1000;
      const rate = seconds > 0 ? doneBytes / seconds : 0;
      const eta = rate > 0 ? (totalBytes - doneBytes) / rate : 0;
      const barWidth = 24;
      const filled = Math.round(fraction * barWidth);
      const bar = "#".repeat(filled) + ".".repeat(barWidth - filled);
      stream.write(
        `\r${label} [${bar}] ${(fraction * 100).toFixed(0).padStart(3)} %  ${formatBytes(doneBytes)} of ${formatBytes(totalBytes)}` +
          `  ${formatBytes(rate)}/s  ${eta.toFixed(0)} s left \x1b[K`,
      );
      drawn = true;
    },
    done() {
      clear();
      if (active?.clear === clear) active = null;
    },
  };
}

/**
 * A progress line made at its first report (`make` may end the line before it): for a second
 * stage whose start the caller does not see, such as the survey's extraction read after pass 1.
 */
export function lazyProgress(make: () => Progress): Progress {
  let made: Progress | null = null;
  return {
    onProgress(doneBytes, totalBytes) {
      made ??= make();
      made.onProgress?.(doneBytes, totalBytes);
    },
    done() {
      made?.done();
    },
  };
}
