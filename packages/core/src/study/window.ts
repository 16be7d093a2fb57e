import type { SpecCriterion, SweepAnalysis, ToleranceAnalysis, ToleranceSpec } from "../circuit/circuit.js";
import { summarizeSamples, type ToleranceSample, type ToleranceSummary } from "./summary.js";
import { sweepValues } from "./sweep.js";
import { budgetOf } from "../analyses/limits.js";
import { runToleranceStudy, type CircuitBuilder, type ToleranceStudyOptions } from "./tolerance.js";

/** One setting of a design window: the tolerance study there and whether its yield meets the spec. */
export interface WindowPoint {
  readonly value: number;
  readonly summary: ToleranceSummary;
  readonly samples: readonly ToleranceSample[];
  readonly pass: boolean;
}

/** What `runDesignWindow` returns: the yield at every setting and the widest range that meets the spec. */
export interface DesignWindow {
  readonly analysis: "window";
  readonly target: string;
  /** The yield the window must meet: the spec's yield criterion, else 99 % (common practice). */
  readonly required: number;
  readonly points: readonly WindowPoint[];
  /** The widest contiguous range of settings whose yield meets the requirement, or null. */
  readonly window: { readonly from: number; readonly to: number } | null;
}

/** Yield required when the spec states none. */
export const DEFAULT_REQUIRED_YIELD = 0.99;

/** The yield a design window must meet: the spec's `yield>` limit, else 99 % (common practice). */
export function requiredYield(criteria: readonly SpecCriterion[]): number {
  const c = criteria.find((x) => x.metric === "yield");
  return c && c.test !== "within" ? c.limit : DEFAULT_REQUIRED_YIELD;
}

/** The widest contiguous run of passing settings (the first of equal width), or null. */
export function widestPassingRange(points: ReadonlyArray<{ readonly value: number; readonly pass: boolean }>): { from: number; to: number } | null {
  let best: { from: number; to: number; count: number } | null = null;
  let current: { from: number; to: number; count: number } | null = null;
  for (const p of points) {
    if (!p.pass) {
      current = null;
      continue;
    }
    current = current ? { from: current.from, to: p.value, count: current.count + 1 } : { from: p.value, to: p.value, count: 1 };
    if (!best || current.count > best.count) best = current;
  }
  return best ? { from: best.from, to: best.to } : null;
}

/**
 * Sweep × tolerance: the tolerance study at every sweep setting, and the range of settings in
 * which the yield meets the spec — the window a designer should set the trimmer in.
 */
export async function runDesignWindow(
  build: CircuitBuilder,
  sweep: SweepAnalysis,
  tolerances: readonly ToleranceSpec[],
  tolerance: ToleranceAnalysis,
  criteria: readonly SpecCriterion[],
  options: ToleranceStudyOptions & { readonly onPoint?: (point: WindowPoint, done: number, total: number) => void } = {},
): Promise<DesignWindow> {
  const required = requiredYield(criteria);
  const budget = budgetOf(options);
  const values = sweepValues(sweep, budget.maxSweepPoints);
  const samples = values.length * tolerance.runs;
  budget.refuseStudy("maxStudyRuns", samples, `the sweep's ${values.length} settings × ${tolerance.runs} runs make ${samples} samples`, tolerance.optionSpans?.runs ?? tolerance.span);
  const points: WindowPoint[] = [];
  // The swept value overrides its own tolerance: the trimmer is set, not drawn.
  const drawnTolerances = tolerances.filter((t) => t.target !== sweep.target);
  for (const value of values) {
    const samples = await runToleranceStudy(build, drawnTolerances, tolerance, criteria, { ...options, budget, fixed: { ...options.fixed, [sweep.target]: value } });
    const summary = summarizeSamples(samples, criteria);
    const point = { value, summary, samples, pass: summary.yield.value >= required };
    points.push(point);
    options.onPoint?.(point, points.length, values.length);
  }
  return { analysis: "window", target: sweep.target, required, points, window: widestPassingRange(points) };
}
