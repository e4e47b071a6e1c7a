/**
 * The numpy/scipy pass 1 (pass1Reference.py, beside this file's source) as a benchmark run:
 * whether python3 can run it here, and one run of it on a capture. The script times its own
 * sweep (after Python and the libraries have loaded), as the Node children time theirs.
 */
import { execFileSync } from "node:child_process";
import { fileURLToPath } from "node:url";

/** One run of the script: its JSON line. */
export interface ReferenceRun {
  readonly seconds: number;
  readonly maxRssMiB: number;
  readonly samples: number;
  readonly sha256: string;
}

/** Whether the script can run: the library versions, or why it cannot. */
export type ReferenceAvailability =
  | { readonly available: true; readonly numpyVersion: string; readonly scipyVersion: string }
  | { readonly available: false; readonly reason: string };

// From dist/bench/ and from src/bench/ alike, the script stays in the sources.
const SCRIPT = fileURLToPath(new URL("../../src/bench/pass1Reference.py", import.meta.url));

/** Asks python3 to import numpy and scipy; the reason names what failed when it cannot. */
export function referenceAvailability(): ReferenceAvailability {
  try {
    const out = execFileSync("python3", ["-c", "import numpy, scipy; print(numpy.__version__, scipy.__version__)"], {
      encoding: "utf8",
      stdio: ["ignore", "pipe", "pipe"],
    });
    const [numpyVersion = "?", scipyVersion = "?"] = out.trim().split(" ");
    return { available: true, numpyVersion, scipyVersion };
  } catch (e) {
    return { available: false, reason: failureReason(e) };
  }
}

function failureReason(e: unknown): string {
  const err = e as { code?: string; stderr?: string };
  if (err.code === "ENOENT") return "python3 is not on PATH";
  const lines = (err.stderr ?? "").trim().split("\n");
  return `python3 -c "import numpy, scipy" failed: ${lines[lines.length - 1] || String(e)}`;
}

/** Runs the script on `path` and returns its JSON line. */
export function runReference(path: string): ReferenceRun {
  const out = execFileSync("python3", [SCRIPT, path], { encoding: "utf8", stdio: ["ignore", "pipe", "inherit"] });
  return JSON.parse(out.trim().split("\n").pop() as string) as ReferenceRun;
}
