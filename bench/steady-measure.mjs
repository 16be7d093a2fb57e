// One measurement of bench/suites/steady.mjs, in a process of its own: the example's start-up run
// to settled (its own startup statement) or the steady analysis on the same probe. Two figures of
// processor time (user + system: on a shared machine the other processes lengthen the wall time,
// not the work done): the first run in this fresh process (cold: the code not yet compiled, as a
// one-off command-line run meets it), and the best of the repeats after it (warm, as inside a
// study or a sweep): at least `repeats` of them, and more until both methods have had the same
// processor time to compile their code (ONSET_BENCH_WARM_SECONDS, default 2 s; a run of a few
// milliseconds is not compiled fully after ten repeats). Prints one JSON line.
import { readFileSync } from "node:fs";
import { fileURLToPath } from "node:url";
import { runStartup, runSteady, startupAnalysisOf } from "@onset/core";
import { elaborate, loadProgram } from "@onset/netlist-parser";

const [name, method, repeats = "3"] = process.argv.slice(2);
const file = fileURLToPath(new URL(`../examples/${name}.onset`, import.meta.url));
const { program } = loadProgram(file, readFileSync(file, "utf8"));
const { circuit } = elaborate(program, {});
// To settled: until=auto stops once the start-up run's own test says the oscillation has settled
// (an example's fixed until= runs on past that: the JFET source's 0.4 s is four times its settling).
const startup = { ...startupAnalysisOf(circuit), until: "auto" };
const steady = { kind: "steady", probe: startup.probe };
const once = () => (method === "startup" ? runStartup(circuit, startup) : runSteady(circuit, steady));
const timed = () => {
  const c0 = process.cpuUsage();
  const result = once();
  const c = process.cpuUsage(c0);
  return { result, ms: (c.user + c.system) / 1000 };
};
const cold = timed();
let result = cold.result;
const times = [];
const warmMs = Number(process.env.ONSET_BENCH_WARM_SECONDS ?? 2) * 1000;
let spent = 0;
for (let k = 0; k < Number(repeats) || spent < warmMs; k++) {
  const run = timed();
  result = run.result;
  times.push(run.ms);
  spent += run.ms;
}
times.sort((a, b) => a - b);
console.log(
  JSON.stringify({
    name,
    method,
    coldMs: cold.ms,
    warmMs: times[0] ?? cold.ms,
    repeats: times.length,
    verdict: result.verdict ?? (result.found ? "found" : "none"),
    frequency: result.frequency,
    amplitude: result.amplitude,
    thd: result.thd,
    // The steady analysis' work: transient periods before the shooting, shooting periods on each grid.
    periods: result.transient?.periods ?? null,
    iterations: result.iterations ?? null,
  }),
);
