// Runs the built command line (dist/cli.js, made by `npm test`'s tsc step) as a user would.
import { spawnSync } from "node:child_process";
import { existsSync } from "node:fs";
import { fileURLToPath } from "node:url";

export const CLI = fileURLToPath(new URL("../../dist/cli.js", import.meta.url));

export interface CliResult {
  readonly status: number | null;
  readonly stdout: string;
  readonly stderr: string;
}

export function runCli(args: readonly string[], cwd?: string): CliResult {
  if (!existsSync(CLI)) throw new Error(`${CLI} is missing: run \`npx tsc -p .\` (npm test does) before these tests`);
  const r = spawnSync(process.execPath, [CLI, ...args], { encoding: "utf8", cwd, env: { ...process.env, NO_COLOR: "1" } });
  return { status: r.status, stdout: r.stdout, stderr: r.stderr };
}
