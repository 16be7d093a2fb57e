import type { Circuit } from "../circuit/circuit.js";
import { isOnsetError, OnsetError, type Diagnostic } from "../circuit/diagnostic.js";
import { isRunLimitError, RunBudget } from "../analyses/limits.js";
import { specCriteria, type CircuitRun } from "../analyses/run.js";
import { runSteady } from "../analyses/steady.js";
import type { Tolerances } from "../solver/tolerances.js";
import { evaluateSpec, sampleCriteria } from "../spec/evaluate.js";
import { steadyAnalysisOf, steadyMetrics } from "./steady-sample.js";

/**
 * What one setting of a `sweep … measure=steady` gives: its run (the steady result, the spec
 * judged on it), or the diagnostic of the error that stopped it — a value, so it crosses from a
 * worker thread intact.
 */
export type SteadySettingOutcome = { readonly run: CircuitRun } | { readonly error: Diagnostic };

/**
 * One setting measured by its periodic steady state: the file's `steady` analysis, or one on its
 * start-up's probe (see `steadyAnalysisOf`), shot on both grids so that the figures carry their
 * error bars (a sweep has few settings, unlike a tolerance study's samples), with the predicted
 * start-up time. A simulation error is returned; a limit that runs out is thrown.
 */
export function runSteadySetting(circuit: Circuit, tolerances: Partial<Tolerances> | undefined, budget: RunBudget = new RunBudget()): SteadySettingOutcome {
  const analysis = steadyAnalysisOf(circuit);
  if (!analysis) return { error: { severity: "error", stage: "input", code: "nothing-to-measure", message: "the file has neither a steady nor a startup analysis" } };
  try {
    const result = runSteady(circuit, analysis, { ...(tolerances ? { tolerances } : {}), budget, hardStart: false });
    const criteria = sampleCriteria(specCriteria(circuit));
    return { run: { results: [result], spec: criteria.length > 0 ? evaluateSpec(criteria, steadyMetrics(result)) : null } };
  } catch (error) {
    if (!isOnsetError(error) || isRunLimitError(error)) throw error;
    return { error: error.diagnostic };
  }
}

/** The run of a setting, or its error thrown again (here, in the calling thread). */
export function settingRun(outcome: SteadySettingOutcome): CircuitRun {
  if ("error" in outcome) throw new OnsetError(outcome.error);
  return outcome.run;
}
