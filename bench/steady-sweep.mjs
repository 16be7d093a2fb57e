// One sweep of bench/suites/steady.mjs, in a process of its own: the bridge source's gain trimmer
// (examples/bridge-excitation-trimmer.onset: P1.at from 0 to 1, 11 settings) with each setting
// measured by its start-up run or by its periodic steady state; prints one JSON line with the wall
// time, the start threshold, the settings that oscillate and a digest of every setting's figures.
import { createHash } from "node:crypto";
import { readFileSync } from "node:fs";
import { fileURLToPath } from "node:url";
import { analysisOf, runSweepInParallel } from "@onset/core";
import { workerPool } from "@onset/core/node";
import { buildCircuit, loadSource } from "@onset/netlist-parser";

const [measure, jobs, steps] = process.argv.slice(2);
const read = (name) => readFileSync(fileURLToPath(new URL(`../examples/${name}`, import.meta.url)), "utf8");
// The trimmer file with its include written out (the bridge source, then the sweep).
const text = read("bridge-excitation.onset") + read("bridge-excitation-trimmer.onset").replace('include "bridge-excitation.onset"', "");
const source = loadSource("bridge-excitation-trimmer.onset", text);
const build = (overrides) => buildCircuit(source, { overrides }).circuit;
// steps= as written (11), or more settings to see how the workers pay off.
const sweep = { ...analysisOf(build({}), "sweep"), ...(steps ? { steps: Number(steps) } : {}), ...(measure === "steady" ? { measure } : {}) };
const started = performance.now();
const result = await runSweepInParallel(build, sweep, { pool: workerPool(Number(jobs)) });
const ms = performance.now() - started;
const figures = result.points.map((p) => {
  const r = p.run.results.find((x) => x.analysis === measure);
  return { value: p.value, frequency: r?.frequency ?? null, amplitude: r?.amplitude ?? null, thd: r?.thd ?? null };
});
console.log(
  JSON.stringify({
    measure,
    jobs: Number(jobs),
    settings: result.points.length,
    ms,
    threshold: result.threshold?.value ?? null,
    oscillating: figures.filter((f) => f.amplitude !== null).length,
    figures,
    digest: createHash("sha256").update(JSON.stringify(figures)).digest("hex").slice(0, 16),
  }),
);
