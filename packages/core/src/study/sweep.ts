import { badArgument, checkAnalysis, checkOptions, describe } from "../circuit/arguments.js";
import type { Circuit, StudyMeasure, SweepAnalysis } from "../circuit/circuit.js";
import { runCircuit, type CircuitRun } from "../analyses/run.js";
import { polesAt } from "../analyses/poles.js";
import { ZERO_CELSIUS } from "../devices/thermal-noise.js";
import { runStartup } from "../analyses/startup.js";
import type { RunOptions } from "../analyses/transient.js";
import { budgetOf, RUN_LIMITS, RunBudget } from "../analyses/limits.js";
import { stepsSpan, sweepCount } from "./sweep-count.js";
import type { StartupVerdict } from "../metrics/verdict.js";
import { startupAnalysisOf } from "./sample.js";
import { steadyAnalysisOf, steadyVerdict } from "./steady-sample.js";
import { sweepHasMeasure, sweepNothingToMeasure } from "./study-size.js";
import { runSteadySetting, settingRun } from "./sweep-steady.js";
import type { CircuitBuilder } from "./tolerance.js";

/**
 * One setting of a sweep and what ran at it: the file's analyses, or under measure=steady its
 * steady state only (`run.results` holds the one steady result, `run.spec` is judged on it).
 */
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
  /** What each setting was measured by: its start-up run (with the file's other analyses) or its periodic steady state. */
  readonly measure: StudyMeasure;
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

/** The verdict a setting is judged on: its first start-up run's, or under measure=steady its orbit's (see `steadyVerdict`). */
function verdictAt(run: CircuitRun, measure: StudyMeasure): StartupVerdict | undefined {
  for (const r of run.results) {
    if (measure === "startup" && r.analysis === "startup") return r.verdict;
    if (measure === "steady" && r.analysis === "steady") return steadyVerdict(r);
  }
  return undefined;
}

/** The checked arguments of a sweep: its options with one budget for every setting and the bisection, and the settings. */
export function sweepSetup<O extends SweepOptions>(api: string, build: CircuitBuilder, analysis: SweepAnalysis, given: O): { options: O & { budget: RunBudget }; values: number[] } {
  if (typeof build !== "function") throw badArgument(`${api}: build must be a function from overrides to a circuit, got ${describe(build)}`);
  checkAnalysis(api, analysis, "sweep");
  checkOptions(api, given);
  // The wall time counts from here.
  const options = { ...given, budget: budgetOf(given) };
  return { options, values: sweepValues(analysis, options.budget.maxSweepPoints) };
}

/** The circuit at one setting, refused when it holds nothing the sweep measures. */
export function settingCircuit(build: CircuitBuilder, analysis: SweepAnalysis, value: number, budget: RunBudget): Circuit {
  budget.check(`before the sweep setting ${analysis.target} = ${value}`, analysis.span);
  const circuit = build({ [analysis.target]: value });
  if (!sweepHasMeasure(circuit, analysis)) throw sweepNothingToMeasure(analysis);
  return circuit;
}

/**
 * Runs the file's analyses at every setting of the sweep (under measure=steady, its periodic
 * steady state: see `runSteadySetting`), then refines the start threshold by bisection between
 * the two neighbouring settings whose verdicts differ (oscillating or not).
 */
export function runSweep(build: CircuitBuilder, analysis: SweepAnalysis, given: SweepOptions = {}): SweepResult {
  const { options, values } = sweepSetup("runSweep", build, analysis, given);
  const points: SweepPoint[] = [];
  values.forEach((value, k) => {
    const circuit = settingCircuit(build, analysis, value, options.budget);
    const run = analysis.measure === "steady" ? settingRun(runSteadySetting(circuit, options.tolerances, options.budget)) : runCircuit(circuit, { ...options, seedSpread: false });
    const point = { value, run };
    points.push(point);
    options.onPoint?.(point, k + 1, values.length);
  });
  return sweepResult(build, analysis, points, options);
}

/** The sweep's result from its settings' runs (in setting order): the first start threshold between two of them, refined. */
export function sweepResult(build: CircuitBuilder, analysis: SweepAnalysis, points: readonly SweepPoint[], options: SweepOptions): SweepResult {
  const measure = analysis.measure ?? "startup";
  let threshold: StartThreshold | null = null;
  for (let k = 1; k < points.length && !threshold; k++) {
    const a = verdictAt(points[k - 1]!.run, measure);
    const b = verdictAt(points[k]!.run, measure);
    if (!a || !b || oscillates(a) === oscillates(b)) continue;
    threshold = bisectThreshold(build, analysis, points[k - 1]!.value, points[k]!.value, oscillates(a), options);
  }
  return { analysis: "sweep", target: analysis.target, log: analysis.log, measure, points, threshold };
}

/**
 * Whether the circuit starts at a setting: its start-up run's verdict; under measure=steady its
 * poles (the dominant pair in the right half-plane), which is where an orbit appears, at the
 * cost of a bias point instead of a simulation.
 */
function startsAt(build: CircuitBuilder, analysis: SweepAnalysis, value: number, options: SweepOptions): boolean {
  options.budget?.check(`while bisecting for the start threshold`);
  const circuit: Circuit = build({ [analysis.target]: value });
  if (analysis.measure === "steady") {
    // At the steady analysis' ambient, as its settings were measured.
    const temperature = steadyAnalysisOf(circuit)?.temperature;
    return polesAt(circuit, options, temperature === undefined ? undefined : temperature + ZERO_CELSIUS).starts;
  }
  const startup = startupAnalysisOf(circuit);
  if (!startup) return false;
  return oscillates(runStartup(circuit, startup, options).verdict);
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
  for (let k = 0; k < 40 && !narrow(lo, hi); k++) {
    const mid = analysis.log ? Math.sqrt(lo * hi) : 0.5 * (lo + hi);
    if (startsAt(build, analysis, mid, options) === loOscillates) lo = mid;
    else hi = mid;
  }
  const value = analysis.log ? Math.sqrt(lo * hi) : 0.5 * (lo + hi);
  const startsAbove = loOscillates ? lo > hi : lo < hi;
  const nominal = options.nominal ?? null;
  const margin = nominal === null || value === 0 ? null : ((startsAbove ? 1 : -1) * (nominal - value)) / Math.abs(value);
  return { value, precision: analysis.log ? value * (Math.sqrt(Math.max(hi, lo) / Math.min(hi, lo)) - 1) : Math.abs(hi - lo) / 2, startsAbove, nominal, margin };
}
