// One measurement of bench/suites/steady.mjs, in a process of its own: the example's start-up run
// to settled (its own startup statement) or the steady analysis on the same probe, timed (processor
// time, best of the repeats) after one warm-up run; prints one JSON line.
import { readFileSync } from "node:fs";
import { fileURLToPath } from "node:url";
import { runStartup, runSteady, startupAnalysisOf } from "@onset/core";
import { elaborate, loadProgram } from "@onset/netlist-parser";

const [name, method, repeats = "3"] = process.argv.slice(2);
const file = fileURLToPath(new URL(`../examples/${name}.onset`, import.meta.url));
const { program } = loadProgram(file, readFileSync(file, "utf8"));
const { circuit } = elaborate(program, {});
const startup = startupAnalysisOf(circuit);
const steady = { kind: "steady", probe: startup.probe };
const once = () => (method === "startup" ? runStartup(circuit, startup) : runSteady(circuit, steady));
let result = once();
// Processor time of the run (user + system), the best of the repeats: on a shared machine the
// other processes lengthen the wall time, not the work done.
const times = [];
for (let k = 0; k < Number(repeats); k++) {
  const c0 = process.cpuUsage();
  result = once();
  const c = process.cpuUsage(c0);
  times.push((c.user + c.system) / 1000);
}
times.sort((a, b) => a - b);
console.log(
  JSON.stringify({
    name,
    method,
    ms: times[0],
    verdict: result.verdict ?? (result.found ? "found" : "none"),
    frequency: result.frequency,
    amplitude: result.amplitude,
    thd: result.thd,
  }),
);
