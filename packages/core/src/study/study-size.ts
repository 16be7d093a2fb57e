import type { Circuit, SweepAnalysis, ToleranceAnalysis } from "../circuit/circuit.js";
import { inputError, type OnsetError } from "../circuit/diagnostic.js";
import { isSimulating } from "../analyses/run.js";
import { budgetOf, type BudgetOptions } from "../analyses/limits.js";
import { stepsSpan, sweepCount } from "./sweep-count.js";

/** A tolerance study on a file without the analysis its samples are judged on (`startup`; `steady` or `startup` under measure=steady). */
export function nothingToMeasure(tolerance: ToleranceAnalysis): OnsetError {
  const steady = tolerance.measure === "steady";
  return inputError("nothing-to-measure", `the tolerance study has nothing to measure: the file has no ${steady ? "steady or startup" : "startup"} analysis`, {
    span: tolerance.span,
    hint: `each sample is judged on its ${steady ? "steady state" : "start-up"}: add a line such as: ${steady ? "steady probe=o" : "startup probe=o until=auto"}`,
  });
}

/** Whether a file holds the analysis a tolerance study's samples are judged on. */
export function hasMeasure(circuit: Circuit, tolerance: ToleranceAnalysis): boolean {
  return circuit.analyses.some((a) => a.kind === "startup" || (tolerance.measure === "steady" && a.kind === "steady"));
}

/**
 * Refuses, before anything runs or is allocated, a study larger than its limits (settings of a
 * sweep, samples of a tolerance study, settings × samples of both) and a study with nothing
 * to measure: a tolerance study needs a `startup` analysis (its samples are judged on one),
 * a sweep needs some analysis to run at each setting (a `steady` or `startup` one under measure=steady).
 */
export function refuseStudy(circuit: Circuit, options: BudgetOptions = {}): void {
  const budget = budgetOf(options);
  const sweep = circuit.analyses.find((a): a is SweepAnalysis => a.kind === "sweep");
  const tolerance = circuit.analyses.find((a): a is ToleranceAnalysis => a.kind === "tolerance");
  const settings = sweep ? sweepCount(sweep) : 1;
  if (sweep) budget.refuseStudy("maxSweepPoints", settings, `the sweep of ${sweep.target} visits ${settings} settings`, stepsSpan(sweep));
  if (tolerance) {
    if (!(Number.isSafeInteger(tolerance.runs) && tolerance.runs > 0)) {
      throw inputError("out-of-range", `tolerance runs=${tolerance.runs} must be a whole number above 0`, { span: tolerance.span });
    }
    budget.refuseStudy("maxRuns", tolerance.runs, `the tolerance study draws ${tolerance.runs} runs`, tolerance.optionSpans?.runs ?? tolerance.span);
    if (sweep) {
      budget.refuseStudy("maxStudyRuns", settings * tolerance.runs, `the sweep's ${settings} settings × ${tolerance.runs} runs make ${settings * tolerance.runs} samples`, tolerance.optionSpans?.runs ?? tolerance.span);
    }
    if (!hasMeasure(circuit, tolerance)) throw nothingToMeasure(tolerance);
  }
  if (sweep && !tolerance && !sweepHasMeasure(circuit, sweep)) throw sweepNothingToMeasure(sweep);
}

/** Whether a file holds what a sweep runs at each setting: some simulating analysis, or under measure=steady a `steady` or `startup` one. */
export function sweepHasMeasure(circuit: Circuit, sweep: SweepAnalysis): boolean {
  return circuit.analyses.some((a) => (sweep.measure === "steady" ? a.kind === "steady" || a.kind === "startup" : isSimulating(a)));
}

/** A sweep on a file without what its settings are measured by (see {@link sweepHasMeasure}). */
export function sweepNothingToMeasure(sweep: SweepAnalysis): OnsetError {
  if (sweep.measure === "steady") {
    return inputError("nothing-to-measure", `the sweep of ${sweep.target} has nothing to measure: the file has no steady or startup analysis`, {
      span: sweep.span,
      hint: "each setting is measured by its steady state: add a line such as: steady probe=o",
    });
  }
  return inputError("nothing-to-measure", `the sweep of ${sweep.target} has nothing to measure: the file has no analysis to run at each setting`, {
    span: sweep.span,
    hint: "add the analysis to repeat, such as: startup probe=o until=auto",
  });
}
