// Runs the benchmarks: `pnpm bench` runs all, `pnpm bench engine` one of them.
// Figures, not assertions: each suite prints a table and the targets it is measured against.
// Each suite runs in a process of its own, so one suite's warmed-up code paths (the JIT's
// type feedback) do not slow or speed the next.
import { readdirSync } from "node:fs";
import { fileURLToPath, pathToFileURL } from "node:url";
import { dirname, join } from "node:path";
import { spawnSync } from "node:child_process";

const here = dirname(fileURLToPath(import.meta.url));
const [first] = process.argv.slice(2);
if (first === "--suite") {
  const suite = await import(pathToFileURL(process.argv[3]).href);
  console.log(`\n## ${suite.title}\n`);
  await suite.run();
} else {
  const only = process.argv.slice(2);
  const suites = readdirSync(join(here, "suites"))
    .filter((f) => f.endsWith(".mjs"))
    .sort()
    .filter((f) => only.length === 0 || only.some((o) => f.startsWith(o)));
  for (const file of suites) {
    const run = spawnSync(process.execPath, [fileURLToPath(import.meta.url), "--suite", join(here, "suites", file)], { stdio: "inherit" });
    if (run.status !== 0) process.exit(run.status ?? 1);
  }
}
