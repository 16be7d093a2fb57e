// Runs the benchmarks: `pnpm bench` runs all, `pnpm bench engine` one of them.
// Figures, not assertions: each suite prints a table and the targets it is measured against.
import { readdirSync } from "node:fs";
import { fileURLToPath } from "node:url";
import { dirname, join } from "node:path";

const here = dirname(fileURLToPath(import.meta.url));
const only = process.argv.slice(2);
const suites = readdirSync(join(here, "suites"))
  .filter((f) => f.endsWith(".mjs"))
  .sort()
  .filter((f) => only.length === 0 || only.some((o) => f.startsWith(o)));
for (const file of suites) {
  const suite = await import(join(here, "suites", file));
  console.log(`\n## ${suite.title}\n`);
  await suite.run();
}
