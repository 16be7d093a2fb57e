// Issue 15: matrix-free shooting for larger circuits. The ladder-network oscillator at three sizes
// (bench/matrix-free-case.mjs, each in a process of its own, best of RUNS by processor time): the
// start-up run to settled, the steady analysis on its default path, and the shooting on both grids
// from one settled period, dense (n + 1 sensitivity columns per step) and matrix-free (GMRES on
// tangent passes).
import { spawnSync } from "node:child_process";
import { fileURLToPath } from "node:url";
import { printTable } from "../table.mjs";

export const title = "Matrix-free shooting: ladder-network oscillator, dense against Newton–Krylov (processor time)";

const CASE = fileURLToPath(new URL("../matrix-free-case.mjs", import.meta.url));
const RUNS = Number(process.env.ONSET_BENCH_RUNS ?? 2);

function runCase(sections) {
  let best;
  for (let r = 0; r < RUNS; r++) {
    const run = spawnSync(process.execPath, [CASE, String(sections)], { encoding: "utf8" });
    if (run.status !== 0) throw new Error(`${sections} sections: ${run.stderr}`);
    const result = JSON.parse(run.stdout.trim().split("\n").pop());
    best = best ? Object.fromEntries(Object.entries(result).map(([k, v]) => [k, k.endsWith("Ms") ? Math.min(v, best[k]) : v])) : result;
  }
  return best;
}

const rel = (a, b) => `${Math.abs(a / b - 1).toExponential(1)}`;

export async function run() {
  const rows = [];
  for (const sections of [40, 100, 300]) {
    const r = runCase(sections);
    rows.push({
      sections,
      unknowns: r.unknowns,
      "start-up ms": r.startupMs.toFixed(0),
      "steady ms": r.steadyMs.toFixed(0),
      "steady / start-up": r.steadyMs / r.startupMs > 0 ? `${(r.steadyMs / r.startupMs).toFixed(2)}×` : "—",
      "shooting dense ms": r.denseMs.toFixed(0),
      "shooting matrix-free ms": r.freeMs.toFixed(0),
      "dense / matrix-free": `${(r.denseMs / r.freeMs).toFixed(2)}×`,
      "Δf paths": rel(r.freeFrequency, r.denseFrequency),
      "Δf steady vs start-up": rel(r.steadyFrequency, r.startupFrequency),
      "μ₂ dense": r.denseMultiplier ? Math.hypot(r.denseMultiplier.re, r.denseMultiplier.im).toFixed(6) : "—",
      "μ₂ matrix-free": r.freeMultiplier ? Math.hypot(r.freeMultiplier.re, r.freeMultiplier.im).toFixed(6) : "—",
    });
  }
  printTable(rows);
  console.log(`\nprocessor time (user + system), best of ${RUNS} runs in fresh processes. start-up = the start-up run to settled (until=auto); steady = the steady analysis (matrix-free from 60 unknowns on);`);
  console.log("shooting = refineOrbit on the run's grid and on it halved, multipliers included, from one period of a run settled 80 periods; μ₂ = the largest non-trivial multiplier's magnitude");
}
