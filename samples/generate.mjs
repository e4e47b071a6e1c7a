// Regenerates the sample captures of the invented Ostrel Bay scenario into this folder.
// Build first (npx tsc -p .), then: node samples/generate.mjs
// Files already present with the right size are kept; delete them to force a rewrite.
import { dirname } from "node:path";
import { fileURLToPath } from "node:url";
import { writeScenario, writeScenarioLicences } from "../dist/scenario/index.js";

const here = dirname(fileURLToPath(import.meta.url));
const files = await writeScenario(here);
for (const f of files) {
  const name = f.path.slice(here.length + 1);
  console.log(`${f.written ? "wrote" : "kept "}  ${name}  ${f.flags.join(" ")}`);
}
for (const p of await writeScenarioLicences(here)) console.log(`wrote  ${p.slice(here.length + 1)}`);
