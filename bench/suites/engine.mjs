// Issue 2: the MNA transient engine on linear circuits at a fixed step.
import { buildSystem, randomStream, TransientStepper } from "@onset/core/engine";
import { Matrix, solve } from "ml-matrix";
import { spawnSync } from "node:child_process";
import { loadavg } from "node:os";
import { fileURLToPath } from "node:url";
import { printTable, timeBest } from "../table.mjs";

export const title = "Engine: accepted steps per second at a fixed step (linear circuits)";

const part = (kind, name, nodes, value, options = {}) => ({ kind, name, nodes, value, options });

/**
 * The twin-T's stepping rate with the solver before the sparse merge (397449b^1), which this
 * bench cannot build: measured 2026-12-02 on this 2-core machine shared with other sessions, as
 * `twinTSteppingRate` measures (accepted steps per CPU second of advance, process.cpuUsage, best
 * of 20 runs after a warm-up in a fresh process), best of 30 such processes interleaved with 30
 * of the new code from throwaway worktrees (new then: 760,000, best/best 0.935, median of the
 * paired ratios 0.949). The old figure varied from 740,000 to 820,000 between such comparisons
 * under the machine's load; the paired ratio from 0.92 to 0.98.
 * 2026-12-03, after the small-circuit Markowitz ordering on dense arrays and the iterate load's
 * direct adds (which let the diode's branch stamp inline into the Newton loop): both engines
 * bundled alike (esbuild of packages/core/src/engine.ts at 397449b^1 and now), 40 pairs of fresh
 * processes alternating which runs first, load average 5.6–7.1 on the 2 cores: median of the
 * paired ratios 0.978 (quartiles 0.956–0.991), best/best 0.980 (788,000 then, 772,000 now);
 * against the branch point of those changes +6.1 % (median of 20 pairs). Twin-T results
 * bit-identical throughout (every unknown at 150 ms, and the start-up figures). The suite prints
 * such a pairing when ONSET_OLD_ENGINE names the old engine's bundle (see pairedAgainstOld): this
 * checkout's build against it, 20 pairs at load 5.5–6: median 0.979 (quartiles 0.957–0.985).
 */
const OLD_SOLVER_TWIN_T = 813_000;
const TWIN_T_PROCESSES = 15;
const TWIN_T = fileURLToPath(new URL("../twin-t.mjs", import.meta.url));

/** One fresh process's twin-T rate (the best of 20 runs) with the given engine module (default: this checkout's). */
function twinTProcess(engine) {
  const run = spawnSync(process.execPath, [TWIN_T, "20", ...(engine ? [engine] : [])], { encoding: "utf8" });
  if (run.status !== 0) throw new Error(`twin-T rate: ${run.stderr}`);
  return JSON.parse(run.stdout.trim().split("\n").pop());
}

/** Best twin-T stepping rate over fresh processes (each the best of 20 runs), as the old figure was taken. */
function twinTRate() {
  let best = { rate: 0, accepted: 0 };
  for (let p = 0; p < TWIN_T_PROCESSES; p++) {
    const result = twinTProcess();
    if (result.rate > best.rate) best = result;
  }
  return best;
}

/**
 * With ONSET_OLD_ENGINE set to a bundle of the old solver's engine (for instance
 * `git archive 397449b^1 packages/core tsconfig.base.json | tar -x -C OLD`, node_modules linked in,
 * then `esbuild OLD/packages/core/src/engine.ts --bundle --format=esm --platform=node
 * --outfile=OLD/engine.mjs`), fresh processes of the old and this engine in pairs, alternating
 * which runs first: the paired ratios say more under a shared machine's changing load than two
 * best figures taken at different times.
 */
function pairedAgainstOld(old, pairs = 20) {
  const ratios = [];
  let bestOld = 0;
  let bestNew = 0;
  for (let p = 0; p < pairs; p++) {
    const [a, b] = p % 2 === 0 ? [twinTProcess(old), twinTProcess()] : [null, twinTProcess()];
    const then = a ?? twinTProcess(old);
    ratios.push(b.rate / then.rate);
    bestOld = Math.max(bestOld, then.rate);
    bestNew = Math.max(bestNew, b.rate);
  }
  ratios.sort((x, y) => x - y);
  const at = (f) => ratios[Math.round(f * (ratios.length - 1))].toFixed(3);
  console.log(`paired against ${old} (${pairs} pairs of fresh processes, load average ${loadavg()[0].toFixed(1)} at the end): median now / then ${at(0.5)} (quartiles ${at(0.25)}–${at(0.75)}), best / best ${(bestNew / bestOld).toFixed(3)}`);
}

/** An RC ladder of `sections` with seeded random values around 1 kΩ / 10 nF, driven by a sine. */
function ladder(sections, seed) {
  const rng = randomStream(seed);
  const parts = [part("vsource", "Vs", ["n0", "gnd"], undefined, { wave: "sine", amp: 1, freq: 1e3 })];
  for (let k = 1; k <= sections; k++) {
    parts.push(part("resistor", `R${k}`, [`n${k - 1}`, `n${k}`], 1e3 * (0.5 + rng.uniform())));
    parts.push(part("capacitor", `C${k}`, [`n${k}`, "gnd"], 10e-9 * (0.5 + rng.uniform())));
  }
  return { parts, analyses: [], tolerances: [] };
}

const tank = {
  parts: [part("capacitor", "C1", ["t", "gnd"], 1e-6, { initial: 1 }), part("inductor", "L1", ["t", "gnd"], 1e-3, { series: 0 })],
  analyses: [],
  tolerances: [],
};

/** Runs `steps` fixed steps of length h (an LTE tolerance so loose that no step is cut). */
function fixedSteps(circuit, h, steps, start) {
  const system = buildSystem(circuit);
  const stepper = new TransientStepper(system, { start, maxStep: h, firstStep: h, tolerances: { lteRelative: 1e12 } });
  stepper.advance(h * steps);
  return { accepted: stepper.stats.accepted, unknowns: system.n, factorizations: stepper.stats.factorizations };
}

/**
 * The naive path: the same MNA equations (the engine's G, C and sources), but the trapezoidal
 * system G + (2/h)·C is rebuilt as an ml-matrix Matrix and solved with ml-matrix every step.
 */
function naiveSteps(circuit, h, steps, start) {
  const system = buildSystem(circuit);
  const { n, G, C } = system;
  const a = 2 / h;
  const x = new Float64Array(n);
  // From rest only the tank is run: its capacitor starts at 1 V (unknown 0 is its node).
  if (start === "rest") x[0] = 1;
  let qdot = new Float64Array(n);
  const u = new Float64Array(n);
  const charges = (v) => Array.from({ length: n }, (_, i) => v.reduce((s, vj, j) => s + C[i * n + j] * vj, 0));
  let t = 0;
  for (let k = 0; k < steps; k++) {
    t += h;
    const rows = Array.from({ length: n }, (_, i) => Array.from({ length: n }, (_, j) => G[i * n + j] + a * C[i * n + j]));
    u.fill(0);
    for (const s of system.sources) s.addSource(t, 1, u, false);
    const q = charges(x);
    const rhs = Matrix.columnVector(Array.from({ length: n }, (_, i) => u[i] + a * q[i] + qdot[i]));
    const next = solve(new Matrix(rows), rhs).to1DArray();
    const qn = charges(next);
    qdot = qdot.map((d, i) => a * (qn[i] - q[i]) - d);
    x.set(next);
  }
  return { accepted: steps, unknowns: n };
}

export async function run() {
  const rows = [];
  let ladderTen;
  for (const sections of [10, 50, 200]) {
    const steps = 10_000;
    const timing = timeBest(() => fixedSteps(ladder(sections, 42), 1e-6, steps, "bias"), sections === 200 ? 3 : 30);
    if (sections === 10) ladderTen = timing;
    const { ms, result } = timing;
    rows.push({
      case: `RC ladder, ${sections} sections`,
      unknowns: result.unknowns,
      steps: result.accepted,
      "wall ms": ms.toFixed(1),
      "steps/s": Math.round(result.accepted / (ms / 1000)).toLocaleString("en-US"),
      factorizations: result.factorizations,
    });
  }
  const tankSteps = 1_000_000;
  const engine = timeBest(() => fixedSteps(tank, 1e-6, tankSteps, "rest"));
  rows.push({
    case: "LC tank, h = 1 µs",
    unknowns: 2,
    steps: engine.result.accepted,
    "wall ms": engine.ms.toFixed(1),
    "steps/s": Math.round(engine.result.accepted / (engine.ms / 1000)).toLocaleString("en-US"),
    factorizations: engine.result.factorizations,
  });
  const naive = timeBest(() => naiveSteps(tank, 1e-6, 100_000, "rest"));
  rows.push({
    case: "LC tank, naive path (ml-matrix rebuild + solve every step)",
    unknowns: 2,
    steps: naive.result.accepted,
    "wall ms": naive.ms.toFixed(1),
    "steps/s": Math.round(naive.result.accepted / (naive.ms / 1000)).toLocaleString("en-US"),
    factorizations: naive.result.accepted,
  });
  const naiveLadder = timeBest(() => naiveSteps(ladder(10, 42), 1e-6, 10_000, "bias"), 1);
  rows.push({
    case: "RC ladder, 10 sections, naive path",
    unknowns: naiveLadder.result.unknowns,
    steps: naiveLadder.result.accepted,
    "wall ms": naiveLadder.ms.toFixed(1),
    "steps/s": Math.round(naiveLadder.result.accepted / (naiveLadder.ms / 1000)).toLocaleString("en-US"),
    factorizations: naiveLadder.result.accepted,
  });
  printTable(rows);
  const ratio = (fast, slow) => (fast.result.accepted / fast.ms / (slow.result.accepted / slow.ms)).toFixed(1);
  console.log(`\nengine / naive speed ratio: LC tank ${ratio(engine, naive)}×, 10-section ladder ${ratio(ladderTen, naiveLadder)}×`);
  console.log("target: ≥ 1,000,000 accepted steps/s for a ~10-unknown circuit (the 10-section ladder has 12 unknowns)");
  const twinT = twinTRate();
  const fmt = (r) => Math.round(r).toLocaleString("en-US");
  console.log(`\ntwin-T tuning reference (10 unknowns, 4 diodes, op-amp; ${twinT.accepted} steps over 150 ms from rest): ${fmt(twinT.rate)} accepted steps per CPU second (best of ${TWIN_T_PROCESSES} processes × 20 runs)`);
  console.log(`solver before the sparse merge, same measure: ${fmt(OLD_SOLVER_TWIN_T)}; now / then: ${(twinT.rate / OLD_SOLVER_TWIN_T).toFixed(3)} (target: ≥ 0.95; the load average now is ${loadavg()[0].toFixed(1)})`);
  if (process.env.ONSET_OLD_ENGINE) pairedAgainstOld(process.env.ONSET_OLD_ENGINE);
}
