import { badArgument, checkAnalysis, checkOptions, describe } from "../circuit/arguments.js";
import type { Circuit, SweepAnalysis } from "../circuit/circuit.js";
import { runCircuit, type CircuitRun } from "../analyses/run.js";
import { runStartup, type StartupResult } from "../analyses/startup.js";
import type { RunOptions } from "../analyses/transient.js";
import { budgetOf, RUN_LIMITS, RunBudget } from "../analyses/limits.js";
import { stepsSpan, sweepCount } from "./sweep-count.js";
import type { StartupVerdict } from "../metrics/verdict.js";
import { startupAnalysisOf } from "./sample.js";
import type { CircuitBuilder } from "./tolerance.js";

/** One setting of a sweep and the file's analyses run at it. */
export interface SweepPoint {
  readonly value: number;
  readonly run: CircuitRun;
}

/** Where the verdict changes from not oscillating to oscillating, refined by bisection. */
export interface StartThreshold {
  readonly value: number;
  /** Half the width of the final bracket: the threshold lies within value ± precision. */
  readonly precision: number;
  /** True when the circuit starts for settings above the threshold. */
  readonly startsAbove: boolean;
  /** The setting written in the file (before overrides), when known. */
  readonly nominal: number | null;
  /** (nominal − threshold)/|threshold| signed so that a positive margin means the nominal setting starts. */
  readonly margin: number | null;
}

/** What `runSweep` returns: every setting's run and the start threshold, when the verdict changes. */
export interface SweepResult {
  readonly analysis: "sweep";
  readonly target: string;
  readonly log: boolean;
  readonly points: readonly SweepPoint[];
  readonly threshold: StartThreshold | null;
}

/**
 * The settings a sweep visits: `steps=N` is N values from `from` to `to` inclusive; `step=` an
 * increment (a ratio with `log`). More than `maxPoints` settings is a `sweep-limit` error,
 * found before anything is allocated.
 */
export function sweepValues(s: SweepAnalysis, maxPoints: number = RUN_LIMITS.maxSweepPoints): number[] {
  checkAnalysis("sweepValues", s, "sweep");
  const count = sweepCount(s);
  new RunBudget({ maxSweepPoints: maxPoints }).refuseStudy("maxSweepPoints", count, `the sweep of ${s.target} visits ${count} settings`, stepsSpan(s));
  if (s.steps !== undefined) {
    if (count === 1) return [s.from];
    return Array.from({ length: count }, (_, k) => {
      const u = k / (count - 1);
      return s.log ? s.from * Math.pow(s.to / s.from, u) : s.from + u * (s.to - s.from);
    });
  }
  const step = s.step!;
  return Array.from({ length: count }, (_, k) => (s.log ? s.from * Math.pow(step, k) : s.from + k * step));
}

/**
 * An oscillating verdict: it settled (as the predicted sine, a relaxation or a parasitic
 * oscillation), is still growing, or oscillates without settling (also with a bouncing envelope). Silent, decaying and latched
 * records do not oscillate.
 */
export function oscillates(verdict: StartupVerdict): boolean {
  return verdict === "settled" || verdict === "relaxation" || verdict === "parasitic" || verdict === "growing" || verdict === "unsettled" || verdict === "bouncing";
}

/** How a sweep runs: the run options of each setting, the nominal value, the bisection's precision and a progress callback. */
export interface SweepOptions extends RunOptions {
  /** The target's value as written, for the margin. */
  readonly nominal?: number;
  /** Bisection stops when the bracket is narrower than this (default 1e-3 of the span, or of the ratio with log). */
  readonly precision?: number;
  readonly onPoint?: (point: SweepPoint, done: number, total: number) => void;
}

function firstStartup(run: CircuitRun): StartupResult | undefined {
  return run.results.find((r): r is StartupResult => r.analysis === "startup");
}

/**
 * Runs the file's analyses at every setting of the sweep, then refines the start threshold by
 * bisection between the two neighbouring settings whose verdicts differ (oscillating or not).
 */
export function runSweep(build: CircuitBuilder, analysis: SweepAnalysis, given: SweepOptions = {}): SweepResult {
  if (typeof build !== "function") throw badArgument(`runSweep: build must be a function from overrides to a circuit, got ${describe(build)}`);
  checkAnalysis("runSweep", analysis, "sweep");
  checkOptions("runSweep", given);
  // One budget for every setting and the bisection: the wall time counts from here.
  const options = { ...given, budget: budgetOf(given) };
  const values = sweepValues(analysis, options.budget.maxSweepPoints);
  const points: SweepPoint[] = [];
  values.forEach((value, k) => {
    options.budget.check(`before the sweep setting ${analysis.target} = ${value}`, analysis.span);
    const point = { value, run: runCircuit(build({ [analysis.target]: value }), { ...options, seedSpread: false }) };
    points.push(point);
    options.onPoint?.(point, k + 1, values.length);
  });
  let threshold: StartThreshold | null = null;
  for (let k = 1; k < points.length && !threshold; k++) {
    const a = firstStartup(points[k - 1]!.run);
    const b = firstStartup(points[k]!.run);
    if (!a || !b || oscillates(a.verdict) === oscillates(b.verdict)) continue;
    threshold = bisectThreshold(build, analysis, points[k - 1]!.value, points[k]!.value, oscillates(a.verdict), options);
  }
  return { analysis: "sweep", target: analysis.target, log: analysis.log, points, threshold };
}

function bisectThreshold(
  build: CircuitBuilder,
  analysis: SweepAnalysis,
  lo: number,
  hi: number,
  loOscillates: boolean,
  options: SweepOptions,
): StartThreshold {
  const span = Math.abs(analysis.to - analysis.from);
  const precision = options.precision ?? (analysis.log ? 1e-3 : 1e-3 * span);
  const narrow = (a: number, b: number) => (analysis.log ? Math.abs(Math.log(b / a)) < precision : Math.abs(b - a) < precision);
  const startsAt = (value: number): boolean => {
    options.budget?.check(`while bisecting for the start threshold`);
    const circuit: Circuit = build({ [analysis.target]: value });
    const startup = startupAnalysisOf(circuit);
    if (!startup) return false;
    return oscillates(runStartup(circuit, startup, options).verdict);
  };
  for (let k = 0; k < 40 && !narrow(lo, hi); k++) {
    const mid = analysis.log ? Math.sqrt(lo * hi) : 0.5 * (lo + hi);
    if (startsAt(mid) === loOscillates) lo = mid;
    else hi = mid;
  }
  const value = analysis.log ? Math.sqrt(lo * hi) : 0.5 * (lo + hi);
  const startsAbove = loOscillates ? lo > hi : lo < hi;
  const nominal = options.nominal ?? null;
  const margin = nominal === null || value === 0 ? null : ((startsAbove ? 1 : -1) * (nominal - value)) / Math.abs(value);
  return { value, precision: analysis.log ? value * (Math.sqrt(Math.max(hi, lo) / Math.min(hi, lo)) - 1) : Math.abs(hi - lo) / 2, startsAbove, nominal, margin };
}
