// Runs the built command line (dist/cli.js, made by `npm test`'s tsc step) as a user would.
import { spawn, spawnSync, type ChildProcess, type StdioOptions } from "node:child_process";
import { existsSync } from "node:fs";
import { fileURLToPath, pathToFileURL } from "node:url";
import { expect } from "vitest";

export const CLI = fileURLToPath(new URL("../../dist/cli.js", import.meta.url));

/** Loaded with `node --import` into the CLI under test: a disk that fills up, or slow writes (writeFaults.mjs). */
export const WRITE_FAULTS = pathToFileURL(fileURLToPath(new URL("./writeFaults.mjs", import.meta.url))).href;

export interface CliResult {
  readonly status: number | null;
  readonly signal: NodeJS.Signals | null;
  readonly stdout: string;
  readonly stderr: string;
}

export interface CliOptions {
  /** Extra environment variables (e.g. those of writeFaults.mjs). */
  readonly env?: Readonly<Record<string, string>>;
  /** Load writeFaults.mjs into the CLI. */
  readonly faults?: boolean;
  /** Where stdout goes, instead of a pipe (e.g. a file descriptor of /dev/full). */
  readonly stdout?: number;
  /**
   * Kill the child after this long (status null): a bound for a case that must not hang, since a
   * synchronous spawn keeps the test's own timeout from firing.
   */
  readonly timeoutMs?: number;
}

function nodeArgs(args: readonly string[], options: CliOptions): string[] {
  if (!existsSync(CLI)) throw new Error(`${CLI} is missing: run \`npx tsc -p .\` (npm test does) before these tests`);
  return [...(options.faults === true ? ["--import", WRITE_FAULTS] : []), CLI, ...args];
}

function stdio(options: CliOptions): StdioOptions {
  return ["ignore", options.stdout ?? "pipe", "pipe"];
}

export function runCli(args: readonly string[], cwd?: string, options: CliOptions = {}): CliResult {
  const r = spawnSync(process.execPath, nodeArgs(args, options), {
    encoding: "utf8",
    cwd,
    stdio: stdio(options),
    env: { ...process.env, NO_COLOR: "1", ...options.env },
    timeout: options.timeoutMs,
  });
  return { status: r.status, signal: r.signal, stdout: r.stdout ?? "", stderr: r.stderr ?? "" };
}

/** Starts the CLI without waiting for it (for tests that interrupt or kill it). */
export function startCli(args: readonly string[], cwd?: string, options: CliOptions = {}): ChildProcess {
  return spawn(process.execPath, nodeArgs(args, options), { cwd, stdio: stdio(options), env: { ...process.env, NO_COLOR: "1", ...options.env } });
}

/** Resolves with the exit code and signal of a started CLI, and its stderr. */
export function finished(child: ChildProcess): Promise<{ status: number | null; signal: NodeJS.Signals | null; stderr: string }> {
  let stderr = "";
  child.stderr?.setEncoding("utf8");
  child.stderr?.on("data", (d: string) => (stderr += d));
  child.stdout?.resume();
  return new Promise((resolve) => child.on("close", (status, signal) => resolve({ status, signal, stderr })));
}

/**
 * The contract for bad input (interface.md, "Exit codes"): exit 2, nothing on stdout, exactly
 * one line on stderr that begins "iqaudit: ", no stack trace. Returns that line.
 */
export function expectOneErrorLine(r: CliResult): string {
  expect(r.status, r.stderr).toBe(2);
  expect(r.stdout).toBe("");
  const lines = r.stderr.split("\n").filter((l) => l.length > 0);
  expect(lines, r.stderr).toHaveLength(1);
  expect(lines[0]).toMatch(/^iqaudit: /);
  expect(r.stderr).not.toMatch(/\n\s+at /); // no stack trace
  return lines[0] as string;
}
