// A child process for the archive's durability tests: adds the folders named on the command line
// to the archive, one after another, printing each entry's id; exits 1 with the message on error.
// Usage: node archiveChild.mjs <archive.sqlite> <folder>...
import { Archive } from "../../dist/archive/index.js";

const [path, ...folders] = process.argv.slice(2);
try {
  const a = Archive.open(path);
  for (const f of folders) {
    const r = await a.add(f, { tags: ["durability"] });
    process.stdout.write(`${r.id}\n`);
  }
  a.close();
} catch (e) {
  process.stderr.write(`${e instanceof Error ? e.message : String(e)}\n`);
  process.exit(1);
}
