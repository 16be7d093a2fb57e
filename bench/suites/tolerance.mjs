// Issue 6: a 1000-sample tolerance study of a 100 ms start-up, on 1 and 2 worker threads.
import { readFileSync } from "node:fs";
import { fileURLToPath } from "node:url";
import { runToleranceStudy, summarizeSamples, specCriteria } from "@onset/core";
import { workerPool } from "@onset/core/node";
import { elaborate, loadProgram } from "@onset/netlist-parser";
import { printTable } from "../table.mjs";

export const title = "Tolerance Monte Carlo: 1000 samples of the bridge source's 100 ms start-up";

const RUNS = Number(process.env.ONSET_BENCH_RUNS ?? 1000);

function study() {
  const file = fileURLToPath(new URL("../../examples/bridge-excitation.onset", import.meta.url));
  const { program } = loadProgram(file, readFileSync(file, "utf8"));
  const nominal = elaborate(program).circuit;
  const startup = { kind: "startup", probe: { kind: "node", node: "o" }, until: 0.1, kick: "noise" };
  const build = (overrides) => ({ ...elaborate(program, { overrides }).circuit, analyses: [startup] });
  return { build, nominal, criteria: specCriteria(nominal) };
}

export async function run() {
  const { build, nominal, criteria } = study();
  const analysis = { kind: "tolerance", runs: RUNS, seed: 2026, dist: "normal" };
  const rows = [];
  const results = {};
  for (const jobs of [1, 2]) {
    const started = performance.now();
    const samples = await runToleranceStudy(build, nominal.tolerances, analysis, criteria, { pool: workerPool(jobs) });
    const ms = performance.now() - started;
    results[jobs] = { ms, samples };
    const summary = summarizeSamples(samples, criteria);
    rows.push({
      workers: jobs,
      samples: samples.length,
      "wall s": (ms / 1000).toFixed(2),
      "ms/sample": (ms / samples.length).toFixed(1),
      yield: `${(summary.yield.value * 100).toFixed(1)} %`,
      "median f": `${summary.percentiles.frequency?.median.toFixed(2)} Hz`,
    });
  }
  printTable(rows);
  const same = JSON.stringify(results[1].samples) === JSON.stringify(results[2].samples);
  console.log(`\nspeed-up on 2 workers: ${(results[1].ms / results[2].ms).toFixed(2)}×; samples identical on 1 and 2 workers: ${same}`);
  console.log("target: ≤ 15 s for 1000 samples on 2 cores");
}
