// Issue 14: the amplitude-controlled examples (lamp, thermistor, JFET loop) as `onset run` runs
// their start-up analysis: what they settle at, and the steps and wall time of one run (best of
// two), with the time per accepted step (the self-heated parts and the JFET stamp on every
// Newton iterate).
import { readFileSync } from "node:fs";
import { fileURLToPath } from "node:url";
import { runStartup, startupAnalysisOf } from "@onset/core";
import { elaborate, loadProgram } from "@onset/netlist-parser";
import { printTable } from "../table.mjs";

export const title = "Amplitude-controlled examples: settled figures, steps and wall time of one start-up run";

function example(name) {
  const file = fileURLToPath(new URL(`../../examples/${name}.onset`, import.meta.url));
  const { program } = loadProgram(file, readFileSync(file, "utf8"));
  const { circuit } = elaborate(program, {});
  return { name, circuit, analysis: startupAnalysisOf(circuit) };
}

export async function run() {
  const rows = [];
  for (const { name, circuit, analysis } of ["audio-test-source", "low-frequency-reference", "jfet-loop-source"].map(example)) {
    let best = Infinity;
    let r;
    for (let i = 0; i < 2; i++) {
      const t0 = performance.now();
      r = runStartup(circuit, analysis);
      best = Math.min(best, performance.now() - t0);
    }
    const s = r.run.solver;
    rows.push({
      example: name,
      verdict: r.verdict,
      frequency: `${r.frequency.toPrecision(6)} Hz`,
      amplitude: `${r.amplitude.toPrecision(5)} V`,
      THD: `${(r.thd * 100).toPrecision(3)} %`,
      settling: `${r.settlingTime.toPrecision(3)} s`,
      simulated: `${r.run.until} s`,
      steps: s.accepted,
      "wall (best of 2)": `${(best / 1e3).toFixed(2)} s`,
      "µs per step": ((best * 1e3) / s.accepted).toFixed(2),
    });
  }
  printTable(rows);
}
