import { checkCircuit, checkOptions } from "../circuit/arguments.js";
import type { AnalysisSpec, Circuit, SpecAnalysis } from "../circuit/circuit.js";
import { evaluateSpec, sampleCriteria, type SpecReport } from "../spec/evaluate.js";
import { runBias, type BiasResult } from "./bias-report.js";
import { runPoles, type PolesResult } from "./poles.js";
import { runResponse, type ResponseResult } from "./response.js";
import { runStartup, type StartupResult } from "./startup.js";
import { runTransient, type RunOptions, type TransientResult } from "./transient.js";
import { budgetOf } from "./limits.js";
import { startupSpread } from "../study/startup-spread.js";

/** The result of one simulating analysis. */
export type AnalysisResult = BiasResult | TransientResult | StartupResult | ResponseResult | PolesResult;

/** Analyses that simulate the circuit once (as opposed to studies and specs). */
export type SimulatingAnalysis = Extract<AnalysisSpec, { kind: "bias" | "transient" | "startup" | "response" | "poles" }>;

/** True for an analysis that simulates the circuit once (bias, transient, startup, response, poles). */
export function isSimulating(a: AnalysisSpec): a is SimulatingAnalysis {
  return a.kind === "bias" || a.kind === "transient" || a.kind === "startup" || a.kind === "response" || a.kind === "poles";
}

/** Runs one simulating analysis. */
export function runAnalysis(circuit: Circuit, analysis: SimulatingAnalysis, options: RunOptions = {}): AnalysisResult {
  switch (analysis.kind) {
    case "bias":
      return runBias(circuit, analysis, options);
    case "transient":
      return runTransient(circuit, analysis, options);
    case "startup": {
      // The further seeds share the first run's budget: the wall time counts from this call.
      const shared = { ...options, budget: budgetOf(options) };
      const first = runStartup(circuit, analysis, shared);
      if (!((analysis.seeds ?? 1) > 1) || options.seedSpread === false) return first;
      return { ...first, startupTimeSpread: startupSpread(circuit, analysis, first, shared) };
    }
    case "response":
      return runResponse(circuit, analysis, options);
    case "poles":
      return runPoles(circuit, analysis, options);
  }
}

/** What `runCircuit` returns: every simulating analysis's result in file order, and the spec checked. */
export interface CircuitRun {
  readonly results: readonly AnalysisResult[];
  /** The file's `spec` checked on its first startup result (yield criteria are left to the tolerance study). */
  readonly spec: SpecReport | null;
}

/** The file's spec statements merged into one list of criteria. */
export function specCriteria(circuit: Circuit): SpecAnalysis["criteria"] {
  return circuit.analyses.flatMap((a) => (a.kind === "spec" ? a.criteria : []));
}

/** The file's spec checked on the first start-up result (null without either). */
export function circuitSpec(circuit: Circuit, results: readonly AnalysisResult[]): SpecReport | null {
  const criteria = sampleCriteria(specCriteria(circuit));
  const startup = results.find((r): r is StartupResult => r.analysis === "startup");
  return criteria.length > 0 && startup ? evaluateSpec(criteria, startup) : null;
}

/** Runs every simulating analysis of a circuit in file order and checks its spec. */
export function runCircuit(circuit: Circuit, options: RunOptions = {}): CircuitRun {
  checkCircuit("runCircuit", circuit);
  checkOptions("runCircuit", options);
  const shared = { ...options, budget: budgetOf(options) };
  const results = circuit.analyses.filter(isSimulating).map((a) => runAnalysis(circuit, a, shared));
  return { results, spec: circuitSpec(circuit, results) };
}
