import type { SpecCriterion, SpecMetric } from "../circuit/circuit.js";
import type { StartupMetrics } from "../metrics/startup.js";

/** One criterion with what was measured and whether it passed. */
export interface CriterionResult {
  readonly criterion: SpecCriterion;
  /** The measured value in SI units, or null when the run did not produce it. */
  readonly measured: number | null;
  readonly pass: boolean;
}

/** The spec checked on one result: each criterion with its measured value, and whether all pass. */
export interface SpecReport {
  readonly criteria: readonly CriterionResult[];
  readonly pass: boolean;
}

/** The metrics a criterion can read: a start-up result's, or a Monte Carlo sample's. */
export type JudgedMetrics = Pick<StartupMetrics, "verdict" | "frequency" | "amplitude" | "thd" | "startupTime" | "settlingTime" | "offset" | "rms" | "peakToPeak">;

/** The startup metric a criterion reads (yield is read by the tolerance study). */
export function metricValue(metrics: JudgedMetrics, metric: SpecMetric): number | null {
  switch (metric) {
    case "frequency":
      return metrics.frequency;
    case "amplitude":
      return metrics.amplitude;
    case "thd":
      return metrics.thd;
    case "startup":
      return metrics.startupTime;
    case "settling":
      return metrics.settlingTime;
    case "offset":
      return metrics.offset;
    case "rms":
      return metrics.rms;
    case "peakToPeak":
      return metrics.peakToPeak;
    case "yield":
      return null;
  }
}

/** Whether a measured value meets one criterion; a missing value fails. */
export function meets(criterion: SpecCriterion, measured: number | null): boolean {
  if (measured === null || !Number.isFinite(measured)) return false;
  switch (criterion.test) {
    case "within":
      return measured >= criterion.low && measured <= criterion.high;
    case "below":
      return measured < criterion.limit;
    case "above":
      return measured > criterion.limit;
  }
}

/**
 * The value a (non-yield) criterion is judged on. A run that did not settle has no settled
 * amplitude, THD or start-up time, so only its frequency is read and the other criteria fail.
 */
export function judgedValue(metrics: JudgedMetrics, criterion: SpecCriterion): number | null {
  return metrics.verdict === "settled" || criterion.metric === "frequency" ? metricValue(metrics, criterion.metric) : null;
}

/** Checks the criteria on one start-up result or steady state (see `judgedValue`); `yield` reads `yieldValue`. */
export function evaluateSpec(criteria: readonly SpecCriterion[], metrics: JudgedMetrics, yieldValue?: number): SpecReport {
  const results = criteria.map((criterion) => {
    const measured = criterion.metric === "yield" ? (yieldValue ?? null) : judgedValue(metrics, criterion);
    return { criterion, measured, pass: meets(criterion, measured) };
  });
  return { criteria: results, pass: results.every((r) => r.pass) };
}

/** Criteria that a single sample is judged on (all but the yield). */
export function sampleCriteria(criteria: readonly SpecCriterion[]): SpecCriterion[] {
  return criteria.filter((c) => c.metric !== "yield");
}
