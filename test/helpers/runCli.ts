// Runs the built command line (dist/cli.js, made by `npm test`'s tsc step) as a user would.
import { spawnSync } from "node:child_process";
import { existsSync } from "node:fs";
import { fileURLToPath } from "node:url";
import { expect } from "vitest";

export const CLI = fileURLToPath(new URL("../../dist/cli.js", import.meta.url));

export interface CliResult {
  readonly status: number | null;
  readonly stdout: string;
  readonly stderr: string;
}

/**
 * Runs `iqaudit args…` and waits for it. With `timeoutMs` the child is killed after that long
 * (status null): a bound for a case that must not hang, since a synchronous spawn keeps the
 * test's own timeout from firing.
 */
export function runCli(args: readonly string[], cwd?: string, timeoutMs?: number): CliResult {
  if (!existsSync(CLI)) throw new Error(`${CLI} is missing: run \`npx tsc -p .\` (npm test does) before these tests`);
  const r = spawnSync(process.execPath, [CLI, ...args], { encoding: "utf8", cwd, env: { ...process.env, NO_COLOR: "1" }, timeout: timeoutMs });
  return { status: r.status, stdout: r.stdout, stderr: r.stderr };
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
