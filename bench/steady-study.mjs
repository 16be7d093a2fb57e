// One tolerance study of bench/suites/steady.mjs, in a process of its own: the bridge source's
// samples measured by start-up runs (as bench/suites/tolerance.mjs) or by the steady analysis;
// prints one JSON line with the wall time, the CPU time of all its threads (a figure that holds on a
// loaded machine), the yield, the median frequency and a digest of every sample.
import { createHash } from "node:crypto";
import { readFileSync } from "node:fs";
import { fileURLToPath } from "node:url";
import { runToleranceStudy, specCriteria, summarizeSamples } from "@onset/core";
import { workerPool } from "@onset/core/node";
import { elaborate, loadProgram } from "@onset/netlist-parser";

const [measure, jobs, runs] = process.argv.slice(2);
const file = fileURLToPath(new URL("../examples/bridge-excitation.onset", import.meta.url));
const { program } = loadProgram(file, readFileSync(file, "utf8"));
const nominal = elaborate(program).circuit;
const criteria = specCriteria(nominal);
const startup = { kind: "startup", probe: { kind: "node", node: "o" }, until: 0.1, kick: "noise" };
const steady = { kind: "steady", probe: { kind: "node", node: "o" } };
const build = (overrides) => ({ ...elaborate(program, { overrides }).circuit, analyses: [measure === "steady" ? steady : startup] });
const analysis = { kind: "tolerance", runs: Number(runs), seed: 2026, dist: "normal", ...(measure === "steady" ? { measure } : {}) };
const cpu = process.cpuUsage();
const started = performance.now();
const samples = await runToleranceStudy(build, nominal.tolerances, analysis, criteria, { pool: workerPool(Number(jobs)) });
const ms = performance.now() - started;
const { user, system } = process.cpuUsage(cpu);
const summary = summarizeSamples(samples, criteria);
console.log(
  JSON.stringify({
    measure,
    jobs: Number(jobs),
    runs: samples.length,
    ms,
    cpuMs: (user + system) / 1000,
    yield: summary.yield.value,
    medianFrequency: summary.percentiles.frequency?.median ?? null,
    medianAmplitude: summary.percentiles.amplitude?.median ?? null,
    digest: createHash("sha256").update(JSON.stringify(samples)).digest("hex").slice(0, 16),
  }),
);
