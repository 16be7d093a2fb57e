import type { SweepAnalysis } from "../circuit/circuit.js";
import { inputError, type SourceSpan } from "../circuit/diagnostic.js";

/** Where a sweep's count of settings is written: its `steps=` or `step=`, else the line. */
export function stepsSpan(s: SweepAnalysis): SourceSpan | undefined {
  return s.optionSpans?.steps ?? s.optionSpans?.step ?? s.span;
}

/**
 * How many settings a sweep visits, without listing them (so a sweep of 10¹² steps is counted,
 * not allocated). Limits that lead nowhere are an `out-of-range` error at the sweep.
 */
export function sweepCount(s: SweepAnalysis): number {
  if (!(Number.isFinite(s.from) && Number.isFinite(s.to))) {
    throw inputError("out-of-range", `a sweep needs finite limits, got from=${s.from} to=${s.to}`, { span: s.span });
  }
  if (s.log && !(s.from > 0 && s.to > 0)) {
    throw inputError("out-of-range", `a log sweep needs positive limits, got from=${s.from} to=${s.to}`, { span: s.span });
  }
  if (s.steps !== undefined) {
    if (!(Number.isInteger(s.steps) && s.steps >= 1)) throw inputError("out-of-range", `sweep steps=${s.steps} must be a whole number ≥ 1`, { span: s.span });
    return s.steps;
  }
  const step = s.step ?? NaN;
  const forward = s.to >= s.from;
  if (s.log ? !(step > 0 && step !== 1 && step > 1 === forward && Number.isFinite(step)) : !(step !== 0 && step > 0 === forward && Number.isFinite(step))) {
    throw inputError("out-of-range", `sweep step=${s.step} does not lead from ${s.from} to ${s.to}`, {
      span: s.span,
      hint: s.log ? "with log, step= is a ratio greater than 1 (or below 1 going down)" : "give a step with the sign of to − from",
    });
  }
  const intervals = s.log ? Math.log(s.to / s.from) / Math.log(step) : (s.to - s.from) / step;
  return Math.floor(intervals + 1e-9) + 1;
}
