// Library code never prints (STYLE.md §6): a test whose code under test writes to the console fails.
import { afterEach, beforeEach } from "vitest";

const methods = ["log", "info", "warn", "error", "debug"] as const;
let calls: string[] = [];
const originals = new Map<string, (...args: unknown[]) => void>();

beforeEach(() => {
  calls = [];
  for (const m of methods) {
    originals.set(m, console[m] as (...args: unknown[]) => void);
    console[m] = (...args: unknown[]) => {
      calls.push(`console.${m}: ${args.map(String).join(" ")}`);
    };
  }
});

afterEach(() => {
  for (const m of methods) console[m] = originals.get(m) as never;
  if (calls.length > 0) throw new Error(`code under test wrote to the console:\n${calls.join("\n")}`);
});
