// Issue 12: the start-up analysis as a user runs it (until=auto) on the example oscillators and
// a hard-clipped Wien bridge: the start-up time under each excitation (thermal noise over 20
// seeds, power-on, the old injected kick), and the steps and wall time of one run.
import { readFileSync } from "node:fs";
import { fileURLToPath } from "node:url";
import { runStartup, startupAnalysisOf, startupSpread } from "@onset/core";
import { elaborate, loadProgram } from "@onset/netlist-parser";
import { printTable } from "../table.mjs";

export const title = "Start-up of the example oscillators: thermal (20 seeds), power-on and the old injected kick";

const SEEDS = Number(process.env.ONSET_BENCH_SEEDS ?? 20);
const RUNS = 3;

function example(name) {
  const file = fileURLToPath(new URL(`../../examples/${name}.onset`, import.meta.url));
  const { program } = loadProgram(file, readFileSync(file, "utf8"));
  const { circuit } = elaborate(program, {});
  return { name, circuit, analysis: startupAnalysisOf(circuit) };
}

/** The hard-clipped Wien bridge: gain 1M, gbw 1G, rails ±10 V, rout 1 mΩ, no headroom, 1 kΩ / 100 nF, A = 3.3. */
function hardClipped() {
  const part = (kind, name, nodes, value, options = {}) => ({ kind, name, nodes, value, options });
  const parts = [
    part("resistor", "R1", ["o", "s"], 1e3),
    part("capacitor", "C1", ["s", "p"], 100e-9),
    part("resistor", "R2", ["p", "gnd"], 1e3),
    part("capacitor", "C2", ["p", "gnd"], 100e-9),
    part("resistor", "Rf", ["o", "n"], 2.3e3),
    part("resistor", "Rg", ["n", "gnd"], 1e3),
    part("opamp", "U1", ["p", "n", "o"], undefined, { gain: 1e6, gbw: 1e9, rails: [-10, 10], rout: 1e-3, headroom: 0 }),
  ];
  return { name: "hard-clipped Wien", circuit: { parts, analyses: [], tolerances: [] }, analysis: { kind: "startup", probe: { kind: "node", node: "o" }, until: "auto" } };
}

const ms = (t) => (t === null || t === undefined ? "—" : `${(t * 1e3).toFixed(2)} ms`);

export async function run() {
  const rows = [];
  const timing = [];
  for (const { name, circuit, analysis } of [example("bridge-excitation"), example("tuning-reference"), example("cable-tracer"), hardClipped()]) {
    const thermalAnalysis = { ...analysis, kick: "thermal", seed: 1, seeds: SEEDS };
    const thermal = runStartup(circuit, thermalAnalysis);
    const spread = startupSpread(circuit, thermalAnalysis, thermal);
    const powerOn = runStartup(circuit, { ...analysis, kick: "power-on", seed: 1 });
    const noise = runStartup(circuit, { ...analysis, kick: "noise", seed: 1 });
    rows.push({
      oscillator: name,
      "thermal, seed 1": ms(thermal.startupTime),
      [`thermal median (${SEEDS} seeds)`]: ms(spread.median),
      "thermal min … max": `${ms(spread.min)} … ${ms(spread.max)}`,
      "power-on (1 ms)": ms(powerOn.startupTime),
      "injected kick (noise)": ms(noise.startupTime),
    });
    for (const [kick, r] of [["thermal", thermal], ["noise", noise]]) {
      const times = [];
      for (let i = 0; i < RUNS; i++) {
        const t0 = performance.now();
        runStartup(circuit, { ...analysis, kick, seed: 1 });
        times.push(performance.now() - t0);
      }
      times.sort((a, b) => a - b);
      const s = r.run.solver;
      timing.push({
        oscillator: name,
        kick,
        verdict: r.verdict,
        simulated: ms(r.run.until),
        steps: s.accepted,
        rejected: s.rejected,
        "steps per simulated ms": (s.accepted / (r.run.until * 1e3)).toFixed(1),
        "wall ms": `${times[0].toFixed(1)} (median ${times[Math.floor(RUNS / 2)].toFixed(1)})`,
      });
    }
  }
  printTable(rows);
  console.log("");
  printTable(timing);
  console.log(`\nstart-up time: first moment the probe reaches 90 % of the settled amplitude; thermal: every resistance's 4kT/R and each op-amp's input noise for the whole run; wall: best and median of ${RUNS} runs (the whole analysis: bias, poles, noise level, transient, metrics)`);
}
