// One case of the matrix-free suite, in a process of its own: `node bench/matrix-free-case.mjs
// <sections>` builds the ladder-network oscillator of bench/scaling-case.mjs at that many sections
// and prints one JSON line of processor times (user + system, ms): the start-up run to settled
// (until=auto), the steady analysis (its default path), and the shooting on both grids
// (refineOrbit, multipliers included) from one settled period, dense and matrix-free.
import { runStartup, runSteady } from "@onset/core";
import { buildSystem, probeReader, recordPeriod, refineOrbit, TransientStepper } from "@onset/core/engine";
import { ladderOscillator } from "./ladder-oscillator.mjs";

const sections = Number(process.argv[2]);
const circuit = ladderOscillator(sections);
const probe = { kind: "node", node: "o" };
const cpu = (f) => {
  const c0 = process.cpuUsage();
  const result = f();
  const c = process.cpuUsage(c0);
  return { result, ms: (c.user + c.system) / 1000 };
};
const startup = cpu(() => runStartup(circuit, { kind: "startup", probe, until: "auto" }));
const steady = cpu(() => runSteady(circuit, { kind: "steady", probe }));
// One period of a run settled as far as the start-up run's (its own period and end).
const system = buildSystem(circuit);
const period = 1 / startup.result.frequency;
const maxStep = period / 100;
const run = new TransientStepper(system, { start: "rest", maxStep });
run.advance(80 * period);
const { guess, fractions, trajectory } = recordPeriod(system, run.snapshot(), period, maxStep);
const read = probeReader(system, probe);
const shoot = (matrixFree) => cpu(() => refineOrbit(system, guess, fractions, trajectory, read, 10, { autonomous: true, multipliers: true, matrixFree }));
const dense = shoot(false);
const free = shoot(true);
console.log(
  JSON.stringify({
    sections,
    unknowns: system.n,
    startupMs: startup.ms,
    steadyMs: steady.ms,
    denseMs: dense.ms,
    freeMs: free.ms,
    startupFrequency: startup.result.frequency,
    steadyFrequency: steady.result.frequency,
    denseFrequency: dense.result.frequency,
    freeFrequency: free.result.frequency,
    denseMultiplier: dense.result.orbit.multipliers[1] ?? null,
    freeMultiplier: free.result.orbit.multipliers[1] ?? null,
  }),
);
