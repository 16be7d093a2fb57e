// The twin-T tuning reference as the start-up and engine suites run it: the example circuit with
// the diodes' series resistance set to 0 and a 0.5 V start on Ca (one initial state for every run).
import { readFileSync } from "node:fs";
import { fileURLToPath } from "node:url";
import { elaborate, loadProgram } from "@onset/netlist-parser";

export const TWIN_T_MAX_STEP = 1 / 440 / 100; // T0/100, as the startup analysis chooses

export function twinTCircuit() {
  const file = fileURLToPath(new URL("../examples/tuning-reference.onset", import.meta.url));
  const { program } = loadProgram(file, readFileSync(file, "utf8"));
  const { circuit } = elaborate(program, {
    overrides: { "D1.series": 0, "D2.series": 0, "D3.series": 0, "D4.series": 0, "N1.Ca.initial": 0.5 },
  });
  return circuit;
}

/**
 * The stepping rate (accepted steps per CPU second of `advance`, the system and stepper built
 * outside it) of 150 ms from rest, best of `runs` after one warm-up.
 */
export async function twinTSteppingRate(runs, engine = "@onset/core/engine") {
  const { buildSystem, TransientStepper } = await import(engine);
  const circuit = twinTCircuit();
  let best = Infinity;
  let accepted = 0;
  for (let r = 0; r <= runs; r++) {
    const stepper = new TransientStepper(buildSystem(circuit), { start: "rest", maxStep: TWIN_T_MAX_STEP });
    let sum = 0;
    stepper.observe((_t, x) => {
      sum += x[0];
    });
    const before = process.cpuUsage();
    stepper.advance(0.15);
    const used = process.cpuUsage(before);
    if (r > 0) best = Math.min(best, used.user + used.system);
    accepted = stepper.stats.accepted;
  }
  return { accepted, rate: accepted / (best / 1e6) };
}

// `node bench/twin-t.mjs <runs> [engine module]` prints one process's rate as JSON (the engine
// suite runs it in fresh processes); the engine defaults to this checkout's built one.
if (process.argv[1] === fileURLToPath(import.meta.url)) console.log(JSON.stringify(await twinTSteppingRate(Number(process.argv[2] ?? 20), process.argv[3])));
