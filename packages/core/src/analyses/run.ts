import { checkCircuit, checkOptions } from "../circuit/arguments.js";
import type { AnalysisSpec, Circuit, SpecAnalysis } from "../circuit/circuit.js";
import { evaluateSpec, sampleCriteria, type SpecReport } from "../spec/evaluate.js";
import type { StartupResult } from "./startup.js";
import type { SteadyResult } from "./steady.js";
import { steadyMetrics } from "../study/steady-sample.js";
import type { RunOptions } from "./transient.js";
import { budgetOf } from "./limits.js";
import { analysisModel, type AnalysisResult, type SimulatingAnalysis } from "./registry.js";

export type { AnalysisResult, SimulatingAnalysis } from "./registry.js";

/** True for an analysis that simulates the circuit once (one listed in `analysisModels`). */
export function isSimulating(a: AnalysisSpec): a is SimulatingAnalysis {
  return analysisModel(a.kind) !== undefined;
}

/** Runs one simulating analysis. */
export function runAnalysis(circuit: Circuit, analysis: SimulatingAnalysis, options: RunOptions = {}): AnalysisResult {
  return analysisModel(analysis.kind)!.run(circuit, analysis, options);
}

/** What `runCircuit` returns: every simulating analysis's result in file order, and the spec checked. */
export interface CircuitRun {
  readonly results: readonly AnalysisResult[];
  /** The file's `spec` checked on its first startup result, else its first steady state (yield criteria are left to the tolerance study). */
  readonly spec: SpecReport | null;
}

/** The file's spec statements merged into one list of criteria. */
export function specCriteria(circuit: Circuit): SpecAnalysis["criteria"] {
  return circuit.analyses.flatMap((a) => (a.kind === "spec" ? a.criteria : []));
}

/**
 * The file's spec checked on the first start-up result, or, in a file without one, on the first
 * steady state (a stable orbit counts as settled; null without criteria or either result).
 */
export function circuitSpec(circuit: Circuit, results: readonly AnalysisResult[]): SpecReport | null {
  const criteria = sampleCriteria(specCriteria(circuit));
  if (criteria.length === 0) return null;
  const startup = results.find((r): r is StartupResult => r.analysis === "startup");
  if (startup) return evaluateSpec(criteria, startup);
  const steady = results.find((r): r is SteadyResult => r.analysis === "steady");
  return steady ? evaluateSpec(criteria, steadyMetrics(steady)) : null;
}

/** Runs every simulating analysis of a circuit in file order and checks its spec. */
export function runCircuit(circuit: Circuit, options: RunOptions = {}): CircuitRun {
  checkCircuit("runCircuit", circuit);
  checkOptions("runCircuit", options);
  const shared = { ...options, budget: budgetOf(options) };
  const results = circuit.analyses.filter(isSimulating).map((a) => runAnalysis(circuit, a, shared));
  return { results, spec: circuitSpec(circuit, results) };
}
