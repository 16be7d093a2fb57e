import { checkCircuit, checkOptions } from "../circuit/arguments.js";
import type { BiasAnalysis, Circuit } from "../circuit/circuit.js";
import { NewtonSolver } from "../solver/newton.js";
import { buildSystem } from "../solver/system.js";
import { resolveTolerances } from "../solver/tolerances.js";
import type { RunOptions } from "./transient.js";
import { solveBias, type BiasMethod } from "./bias.js";
import { budgetOf } from "./limits.js";
import { implausibleOperation, type ImplausiblePart } from "./operating-check.js";

/** What `runBias` returns: node voltages, voltage-source currents and how the operating point was found. */
export interface BiasResult {
  readonly analysis: "bias";
  /** Node voltages (V), in the order nodes first appear in the file. */
  readonly nodes: ReadonlyArray<{ readonly node: string; readonly voltage: number }>;
  /** Currents (A) through every independent voltage source, from plus through the source to minus. */
  readonly sources: ReadonlyArray<{ readonly part: string; readonly current: number }>;
  readonly method: BiasMethod;
  readonly iterations: number;
  /** Parts far outside any physical operating point (`implausible-operation`); absent when there are none. */
  readonly warnings?: readonly ImplausiblePart[];
}

/** Runs a `bias` analysis: the DC operating point with node voltages and source currents. */
export function runBias(circuit: Circuit, _analysis: BiasAnalysis, options: RunOptions = {}): BiasResult {
  checkCircuit("runBias", circuit);
  checkOptions("runBias", options);
  budgetOf(options).check("before the bias point");
  const system = buildSystem(circuit, options.extraParts);
  const solver = new NewtonSolver(system, resolveTolerances(options.tolerances));
  const point = solveBias(system, solver, solver.tolerances);
  const rates = new Float64Array(system.n);
  const warnings = implausibleOperation(system, point.x, "at the bias point");
  return {
    analysis: "bias",
    nodes: system.unknowns.flatMap((u, i) => (u.isNode ? [{ node: u.label, voltage: point.x[i]! }] : [])),
    sources: system.devices
      .filter((d) => d.part.kind === "vsource")
      .map((d) => ({ part: d.part.name, current: d.current!(point.x, rates, 0) })),
    method: point.method,
    iterations: point.iterations,
    ...(warnings.length > 0 ? { warnings } : {}),
  };
}
