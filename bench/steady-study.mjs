// One tolerance study of bench/suites/steady.mjs, in a process of its own: the bridge source's
// samples measured by start-up runs (as bench/suites/tolerance.mjs) or by the steady analysis;
// prints one JSON line with the wall time, the CPU time of all its threads (a figure that holds on a
// loaded machine), when the first sample was in, the samples per second over the second half, the
// yield, the median frequency and a digest of every sample. POSTED=1: no portable builder (with
// two workers or more, each builds its own samples otherwise; one worker is always sent them).
// SAMPLES=file: the samples also written there as JSON (to compare two builds' figures).
// Usage: node bench/steady-study.mjs startup|startup-auto|steady JOBS RUNS.
import { createHash } from "node:crypto";
import { existsSync, readdirSync, readFileSync, writeFileSync } from "node:fs";
import { fileURLToPath } from "node:url";
import { runToleranceStudy, specCriteria, startupAnalysisOf, summarizeSamples } from "@onset/core";
import { workerPool } from "@onset/core/node";
import { elaborate, loadProgram } from "@onset/netlist-parser";
import { benchBuilder } from "./study-builder.mjs";

const [measure, jobs, runs] = process.argv.slice(2);
const file = fileURLToPath(new URL("../examples/bridge-excitation.onset", import.meta.url));
const { program } = loadProgram(file, readFileSync(file, "utf8"));
const nominal = elaborate(program).circuit;
const criteria = specCriteria(nominal);
// measure=startup: the baseline (as bench/suites/tolerance.mjs: 0.1 s from a noise kick);
// measure=startup-auto: the file's own start-up statement (until=auto, to settled), as a study runs it.
const startup = measure === "startup-auto" ? startupAnalysisOf(nominal) : { kind: "startup", probe: { kind: "node", node: "o" }, until: 0.1, kick: "noise" };
const steady = { kind: "steady", probe: { kind: "node", node: "o" } };
// Workers make the same builder from the module and the data (see runToleranceStudy's portable option).
const data = { program, analysis: measure === "steady" ? steady : startup };
const build = benchBuilder(data);
const portable = { module: new URL("./study-builder.mjs", import.meta.url).href, name: "benchBuilder", data };
const analysis = { kind: "tolerance", runs: Number(runs), seed: 2026, dist: "normal", ...(measure === "steady" ? { measure } : {}) };
const cpu = process.cpuUsage();
const started = performance.now();
const finished = [];
// Each thread's CPU time (Linux: /proc), read now and then while the workers still run.
const threads = new Map();
const readThreads = () => {
  if (!existsSync("/proc/self/task")) return;
  for (const tid of readdirSync("/proc/self/task")) {
    try {
      const stat = readFileSync(`/proc/self/task/${tid}/stat`, "utf8");
      const fields = stat.slice(stat.lastIndexOf(")") + 2).split(" ");
      threads.set(tid, (Number(fields[11]) + Number(fields[12])) * 10);
    } catch {}
  }
};
const onSample = () => {
  finished.push(performance.now() - started);
  if (finished.length % 20 === 0) readThreads();
};
const samples = await runToleranceStudy(build, nominal.tolerances, analysis, criteria, { pool: workerPool(Number(jobs)), onSample, ...(process.env.POSTED ? {} : { portable }) });
const ms = performance.now() - started;
// When the first sample was in, and the samples per second over the second half (the warm rate).
const half = Math.floor(finished.length / 2);
const firstMs = finished[0] ?? null;
const secondHalfRate = finished.length > 2 ? (finished.length - 1 - half) / ((finished.at(-1) - finished[half]) / 1000) : null;
const { user, system } = process.cpuUsage(cpu);
readThreads();
// This thread's CPU, the busiest other threads' (the workers, when there are some) and the rest's (the compiler's and the collector's helpers), in ms (process total, start-up included).
const main = threads.get(String(process.pid)) ?? null;
const others = [...threads].filter(([tid]) => tid !== String(process.pid)).map(([, ms]) => ms).sort((a, b) => b - a);
const workers = others.slice(0, Number(jobs) - 1);
const rest = others.slice(Number(jobs) - 1).reduce((a, b) => a + b, 0);
const summary = summarizeSamples(samples, criteria);
if (process.env.SAMPLES) writeFileSync(process.env.SAMPLES, JSON.stringify(samples));
console.log(
  JSON.stringify({
    measure,
    jobs: Number(jobs),
    runs: samples.length,
    ms,
    cpuMs: (user + system) / 1000,
    threadsMs: main === null ? null : { main, workers, rest },
    firstMs,
    secondHalfRate,
    yield: summary.yield.value,
    medianFrequency: summary.percentiles.frequency?.median ?? null,
    medianAmplitude: summary.percentiles.amplitude?.median ?? null,
    digest: createHash("sha256").update(JSON.stringify(samples)).digest("hex").slice(0, 16),
  }),
);
