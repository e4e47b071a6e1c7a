/**
 * `npm run eval`: generates the evaluation set into a temporary folder, measures every capture
 * as `iqaudit measure` does, and prints the confusion matrices, the reliability of the stated
 * confidence, the coverage of the stated uncertainties and every miss, in Markdown.
 *
 *   npm run eval                         full set (380 captures)
 *   npm run eval -- --quick              quick subset (90 captures)
 *   npm run eval -- --seed 7             another draw of the set
 *   npm run eval -- --workers 0          in one thread
 *   npm run eval -- --write-doc          also write the tables into docs/classification.md
 *   npm run eval -- --json results.json  also write every case with its truth and figures
 */
import { mkdtemp, readFile, rm, writeFile } from "node:fs/promises";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { fileURLToPath } from "node:url";
import { evalMarkdown, replaceDocTables } from "./markdown.js";
import { DEFAULT_SEED, fullPlan, quickPlan } from "./plans.js";
import { defaultWorkers, runCases } from "./runner.js";

interface Args {
  readonly quick: boolean;
  readonly seed: number;
  readonly workers: number;
  readonly writeDoc: boolean;
  readonly json: string | null;
}

function parseArgs(argv: readonly string[]): Args {
  let quick = false;
  let seed = DEFAULT_SEED;
  let workers = defaultWorkers();
  let writeDoc = false;
  let json: string | null = null;
  for (let i = 0; i < argv.length; i++) {
    const a = argv[i];
    const value = (): string => {
      const v = argv[++i];
      if (v === undefined) throw new Error(`${a} needs a value`);
      return v;
    };
    if (a === "--quick") quick = true;
    else if (a === "--write-doc") writeDoc = true;
    else if (a === "--seed") seed = integer(a, value());
    else if (a === "--workers") workers = integer(a, value());
    else if (a === "--json") json = value();
    else throw new Error(`unknown option ${a} (--quick, --seed N, --workers N, --write-doc, --json FILE)`);
  }
  return { quick, seed, workers, writeDoc, json };
}

function integer(name: string, text: string): number {
  const n = Number(text);
  if (!Number.isInteger(n) || n < 0) throw new Error(`${name} ${text} must be a whole number ≥ 0`);
  return n;
}

async function main(): Promise<void> {
  const args = parseArgs(process.argv.slice(2));
  const specs = args.quick ? quickPlan(args.seed) : fullPlan(args.seed);
  const dir = await mkdtemp(join(tmpdir(), "iqaudit-eval-"));
  const t0 = performance.now();
  try {
    const results = await runCases(specs, {
      dir,
      workers: args.workers,
      onResult: (r, done, total) => {
        const ok = r.measuredLabel === r.truth.label ? "ok  " : "MISS";
        process.stderr.write(`[${String(done).padStart(3)}/${total}] ${ok} ${r.id.padEnd(14)} ${r.truth.snrDb.toFixed(1).padStart(5)} dB ${r.truth.label} -> ${r.measuredLabel} (${r.confidence.toFixed(2)})\n`);
      },
    });
    const elapsedS = (performance.now() - t0) / 1000;
    const md = evalMarkdown(results, { seed: args.seed, quick: args.quick, elapsedS, workers: args.workers, date: new Date().toISOString().slice(0, 10) });
    process.stdout.write(`${md}\n`);
    if (args.json !== null) await writeFile(args.json, `${JSON.stringify(results, null, 1)}\n`);
    if (args.writeDoc) {
      const doc = fileURLToPath(new URL("../../docs/classification.md", import.meta.url));
      await writeFile(doc, replaceDocTables(await readFile(doc, "utf8").catch(() => "# Classification: the evaluation set\n"), md));
      process.stderr.write(`tables written into ${doc}\n`);
    }
  } finally {
    await rm(dir, { recursive: true, force: true });
  }
}

main().catch((e: unknown) => {
  process.stderr.write(`eval: ${e instanceof Error ? e.message : String(e)}\n`);
  process.exit(1);
});
