// The ceiling of the steady analysis' speed-up on one example: the start-up run reports its settled
// figures from the periodic orbit next to the run (a two-grid shooting from the settled state, the
// closest start there is), and a steady analysis needs at least that shooting, so
// start-up ÷ steady can never exceed start-up ÷ (the start-up run's own orbit step). Measured by
// sampling the warm start-up runs with the inspector's profiler (a difference of two timed runs
// drowns in their spread): the share of their time spent inside `settledOrbit`. Prints one JSON line.
import { readFileSync } from "node:fs";
import { Session } from "node:inspector/promises";
import { fileURLToPath } from "node:url";
import { runStartup, startupAnalysisOf } from "@onset/core";
import { elaborate, loadProgram } from "@onset/netlist-parser";

const [name] = process.argv.slice(2);
const file = fileURLToPath(new URL(`../examples/${name}.onset`, import.meta.url));
const { program } = loadProgram(file, readFileSync(file, "utf8"));
const { circuit } = elaborate(program, {});
// The start-up run to settled, as bench/steady-measure.mjs times it.
const startup = { ...startupAnalysisOf(circuit), until: "auto" };
const seconds = Number(process.env.ONSET_BENCH_WARM_SECONDS ?? 2);

/** Runs the start-up run for at least `ms` of processor time (and three times). */
function runFor(ms) {
  const c0 = process.cpuUsage();
  for (let k = 0; ; k++) {
    runStartup(circuit, startup);
    const c = process.cpuUsage(c0);
    if (k >= 2 && (c.user + c.system) / 1000 >= ms) return k + 1;
  }
}

/** Microseconds sampled inside a call of each named function (nested calls of it counted once). */
function inclusive(profile, names) {
  const byId = new Map(profile.nodes.map((n) => [n.id, n]));
  const parent = new Map();
  for (const n of profile.nodes) for (const c of n.children ?? []) parent.set(c, n.id);
  const sums = Object.fromEntries(names.map((k) => [k, 0]));
  for (let i = 0; i < profile.samples.length; i++) {
    const dt = profile.timeDeltas[i + 1] ?? 0;
    const seen = new Set();
    for (let id = profile.samples[i]; id !== undefined; id = parent.get(id)) {
      const fn = byId.get(id).callFrame.functionName;
      if (fn in sums && !seen.has(fn)) {
        sums[fn] += dt;
        seen.add(fn);
      }
    }
  }
  return sums;
}

runFor(seconds * 1000);
const session = new Session();
session.connect();
await session.post("Profiler.enable");
await session.post("Profiler.setSamplingInterval", { interval: 100 });
await session.post("Profiler.start");
const runs = runFor(seconds * 1000);
const { profile } = await session.post("Profiler.stop");
session.disconnect();
const sums = inclusive(profile, ["runStartup", "settledOrbit"]);
const share = sums.settledOrbit / sums.runStartup;
console.log(JSON.stringify({ name, runs, share, ceiling: 1 / share }));
