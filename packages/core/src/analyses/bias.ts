import { simulationError } from "../circuit/diagnostic.js";
import { NewtonSolver } from "../solver/newton.js";
import type { MnaSystem } from "../solver/system.js";
import { DEFAULT_TOLERANCES, type Tolerances } from "../solver/tolerances.js";

/** Which rung of the fallback ladder found the bias point. */
export type BiasMethod = "newton" | "gmin-stepping" | "source-stepping";

/** The DC operating point: the unknowns, the method that found it and the iterations spent. */
export interface BiasPoint {
  /** The unknown vector at the operating point. */
  readonly x: Float64Array;
  readonly method: BiasMethod;
  readonly iterations: number;
}

/** gmin ladder: from a conductance that swamps the circuit down to none. */
const GMIN_LADDER = [1e-2, 1e-3, 1e-4, 1e-5, 1e-6, 1e-7, 1e-8, 1e-9, 1e-10, 1e-11, 1e-12, 0];

function attempt(solver: NewtonSolver, x: Float64Array, scale: number, gmin: number, maxIterations: number): boolean {
  solver.gmin = gmin;
  solver.invalidate();
  // The operating point is the state just before t = 0: an edge at 0 has not happened yet.
  solver.loadSources(0, scale, true);
  return solver.solve(x, maxIterations).converged;
}

/**
 * DC operating point by Newton–Raphson with a fallback ladder: plain Newton from zero, then
 * gmin stepping, then source stepping (the usual continuation methods, e.g. Najm, *Circuit
 * Simulation*, ch. 5). Capacitors are open and inductors short because a = 0 drops every charge.
 */
export function solveBias(system: MnaSystem, solver: NewtonSolver, tolerances: Tolerances = DEFAULT_TOLERANCES): BiasPoint {
  const n = system.n;
  const x = new Float64Array(n);
  // Every attempt starts from rest: zero, but a body's temperature at its ambient.
  const rest = () => {
    x.fill(0);
    for (const d of system.devices) d.restingState?.(x);
  };
  rest();
  const max = tolerances.biasIterations;
  solver.setCoefficients(0, 0);
  solver.history.fill(0);
  const start = solver.iterations;
  if (attempt(solver, x, 1, 0, max)) return { x, method: "newton", iterations: solver.iterations - start };
  if (system.nonlinear.length > 0) {
    rest();
    let ok = true;
    for (const gmin of GMIN_LADDER) {
      if (!attempt(solver, x, 1, gmin, max)) {
        ok = false;
        break;
      }
    }
    if (ok) return { x, method: "gmin-stepping", iterations: solver.iterations - start };
    rest();
    let scale = 0;
    let step = 0.1;
    const saved = new Float64Array(n);
    ok = attempt(solver, x, 0, 0, max);
    while (ok && scale < 1) {
      saved.set(x);
      const next = Math.min(1, scale + step);
      if (attempt(solver, x, next, 0, max)) {
        scale = next;
        step = Math.min(0.5, step * 2);
      } else {
        x.set(saved);
        step /= 4;
        if (step < 1e-4) ok = false;
      }
    }
    if (ok && scale === 1) return { x, method: "source-stepping", iterations: solver.iterations - start };
  }
  solver.gmin = 0;
  solver.invalidate();
  solver.loadSources(0, 1, true);
  rest();
  const last = solver.solve(x, max);
  const worst = system.unknowns[last.worst]?.label ?? "?";
  throw simulationError(
    "bias-not-converged",
    `the bias point did not converge after ${solver.iterations - start} Newton iterations (largest change at '${worst}')`,
    {
      hint: "plain Newton, gmin stepping and source stepping all failed; check for a latch-up loop or values many decades apart near that node",
    },
  );
}
