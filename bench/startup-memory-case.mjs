// One start-up run of the bridge-excitation example forced to about N accepted steps (a fixed
// until= and max-step = until / N), in a process of its own so its peak resident set is its own:
// prints one JSON line with the peak RSS, the stored waveform's length and the figures.
// Usage: node bench/startup-memory-case.mjs STEPS [UNTIL]; NO_ORBIT=1 keeps the run's own settled
// figures (the orbit's grid is the run's step pattern over one period: its memory follows max-step);
// STORED=N sets limits.maxStoredPoints; KIND=transient makes it a transient of the same circuit
// from its bias point, probing o (the stored figures then are its last value and extremes).
import { readFileSync } from "node:fs";
import { fileURLToPath } from "node:url";
import { isOnsetError, runStartup, runTransient } from "@onset/core";
import { buildCircuit, loadSource } from "@onset/netlist-parser";

const steps = Number(process.argv[2]);
const until = Number(process.argv[3] ?? 0.1);
const file = fileURLToPath(new URL("../examples/bridge-excitation.onset", import.meta.url));
const circuit = buildCircuit(loadSource(file, readFileSync(file, "utf8"))).circuit;
const transient = process.env.KIND === "transient";
const analysis = transient
  ? { kind: "transient", until, maxStep: until / steps, start: "bias", probes: [{ kind: "node", node: "o" }] }
  : { kind: "startup", probe: { kind: "node", node: "o" }, until, maxStep: until / steps, kick: "noise", seed: 1 };
const started = performance.now();
let r;
try {
  const stored = process.env.STORED ? { maxStoredPoints: Number(process.env.STORED) } : {};
  const limits = { maxSteps: Infinity, ...stored };
  r = transient ? runTransient(circuit, analysis, { limits }) : runStartup(circuit, analysis, { limits, settledFromOrbit: process.env.NO_ORBIT !== "1" });
} catch (error) {
  if (!isOnsetError(error)) throw error;
  console.log(JSON.stringify({ refused: error.diagnostic.code, peakRssMB: process.resourceUsage().maxRSS / 1024 }));
  process.exit(0);
}
const seconds = (performance.now() - started) / 1000;
if (transient) {
  const o = r.signals[0];
  console.log(JSON.stringify({ steps: r.stats.accepted, peakRssMB: process.resourceUsage().maxRSS / 1024, stored: r.time.length, seconds, final: o.values[o.values.length - 1], min: o.min, max: o.max }));
  process.exit(0);
}
console.log(
  JSON.stringify({
    steps: r.run.solver.accepted ?? null,
    peakRssMB: process.resourceUsage().maxRSS / 1024,
    stored: r.waveform.time.length,
    seconds,
    verdict: r.verdict,
    frequency: r.frequency,
    amplitude: r.amplitude,
    thd: r.thd,
    startupTime: r.startupTime,
    settlingTime: r.settlingTime,
    cycles: r.cycles,
    orbit: r.settled,
  }),
);
