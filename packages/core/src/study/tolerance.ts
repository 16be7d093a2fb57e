import { badArgument, checkAnalysis, checkOptions, describe } from "../circuit/arguments.js";
import type { Circuit, SpecCriterion, ToleranceAnalysis, ToleranceSpec } from "../circuit/circuit.js";
import { inputError } from "../circuit/diagnostic.js";
import type { Tolerances } from "../solver/tolerances.js";
import { drawSample } from "./draw.js";
import { hasMeasure, nothingToMeasure } from "./study-size.js";
import { nominalSeed } from "./steady-sample.js";
import { predictedStart, seedPredictor, type SeedPredictor } from "./seed-predictor.js";
import { budgetOf, type BudgetOptions } from "../analyses/limits.js";
import { inThreadPool, type JobPoolFactory } from "./pool.js";
import type { SampleSettings } from "./sample.js";
import type { ToleranceSample } from "./summary.js";

/** Builds the circuit with some values overridden by name (the elaborator behind it). */
export type CircuitBuilder = (overrides: Readonly<Record<string, number>>) => Circuit;

/** A slice of the samples: shard `index` (0-based) of `count`. */
export interface Shard {
  readonly index: number;
  readonly count: number;
}

/** The sample indices of a shard: the contiguous slice [⌊i·N/n⌋, ⌊(i+1)·N/n⌋). */
export function shardIndices(runs: number, shard: Shard | undefined): number[] {
  const from = shard ? Math.floor((shard.index * runs) / shard.count) : 0;
  const to = shard ? Math.floor(((shard.index + 1) * runs) / shard.count) : runs;
  return Array.from({ length: to - from }, (_, k) => from + k);
}

/**
 * The tolerances with their nominals at a setting (a sweep value): a part written `(R)±1%`, or a
 * per-use draw of `R`, is drawn around the swept R, not around the file's. The same values
 * `onset run --sample I --set R=…` draws around, so a sample reproduces.
 */
export function nominalsAt(build: CircuitBuilder, tolerances: readonly ToleranceSpec[], fixed: Readonly<Record<string, number>>): ToleranceSpec[] {
  const at = new Map(build(fixed).tolerances.map((t) => [t.target, t.nominal]));
  return tolerances.map((t) => {
    const nominal = at.get(t.target);
    return nominal === undefined || nominal === t.nominal ? t : { ...t, nominal };
  });
}

/** How a tolerance study runs: which samples, where, and within which limits. */
export interface ToleranceStudyOptions extends BudgetOptions {
  /**
   * Where the samples run.
   * @defaultValue {@link inThreadPool} (this thread); `workerPool(jobs)` from `@onset/core/node` uses worker threads
   */
  readonly pool?: JobPoolFactory;
  /** Run only this slice of the samples. */
  readonly shard?: Shard;
  /** Indices already done (resume): skipped. */
  readonly done?: ReadonlySet<number>;
  /** Run only these indices (reproduce one sample). */
  readonly only?: readonly number[];
  readonly tolerances?: Partial<Tolerances>;
  /** Overrides applied to every sample before the draws (a sweep value). */
  readonly fixed?: Readonly<Record<string, number>>;
  /** Called as each sample finishes, in completion order. */
  readonly onSample?: (sample: ToleranceSample) => void;
}

/** Lets timers and I/O run (setImmediate where there is one: Node; else a zero timeout). */
export function yieldToEvents(): Promise<void> {
  const later: (callback: () => void) => unknown = (globalThis as { setImmediate?: (callback: () => void) => unknown }).setImmediate ?? ((callback) => setTimeout(callback, 0));
  return new Promise((resolve) => later(resolve));
}

/**
 * Runs the Monte Carlo samples of a `tolerance` analysis. The values are drawn and elaborated
 * here; the simulations run on the pool. Returns the samples in index order. The limits
 * (`options.limits`) bound each sample's run (steps, simulated time) and the whole study
 * (wall time, signal): when one runs out the study stops with a `RunLimitError`, after the
 * samples already finished were handed to `onSample`.
 */
export async function runToleranceStudy(
  build: CircuitBuilder,
  tolerances: readonly ToleranceSpec[],
  analysis: ToleranceAnalysis,
  criteria: readonly SpecCriterion[],
  options: ToleranceStudyOptions = {},
): Promise<ToleranceSample[]> {
  if (typeof build !== "function") throw badArgument(`runToleranceStudy: build must be a function from overrides to a circuit, got ${describe(build)}`);
  if (!Array.isArray(tolerances)) throw badArgument(`runToleranceStudy: tolerances must be an array, got ${describe(tolerances)}`);
  checkAnalysis("runToleranceStudy", analysis, "tolerance");
  if (!Array.isArray(criteria)) throw badArgument(`runToleranceStudy: criteria must be an array, got ${describe(criteria)}`);
  checkOptions("runToleranceStudy", options);
  if (!(Number.isInteger(analysis.runs) && analysis.runs > 0)) {
    throw inputError("out-of-range", `tolerance runs=${analysis.runs} must be a whole number above 0`, { span: analysis.span });
  }
  const budget = budgetOf(options);
  budget.refuseStudy("maxRuns", analysis.runs, `the tolerance study draws ${analysis.runs} runs`, analysis.optionSpans?.runs ?? analysis.span);
  const indices = (options.only ?? shardIndices(analysis.runs, options.shard)).filter((i) => !options.done?.has(i));
  const drawnAround = options.fixed && indices.length > 0 ? nominalsAt(build, tolerances, options.fixed) : tolerances;
  // The pool first: worker threads start up while this thread computes the nominal's orbit.
  const pool = (options.pool ?? inThreadPool)({ count: indices.length, budget });
  const samples: ToleranceSample[] = [];
  let next = 0;
  // One lane per job the pool takes at once keeps it busy; in this thread a lane yields between
  // samples so progress can be drawn and results written as they finish.
  const lane = async (settings: SampleSettings, predictor: SeedPredictor | undefined) => {
    while (next < indices.length) {
      budget.check("between samples");
      const index = indices[next++]!;
      const drawn = drawSample(drawnAround, analysis.seed, index, analysis.dist);
      const circuit = build({ ...options.fixed, ...drawn });
      if (!hasMeasure(circuit, analysis)) throw nothingToMeasure(analysis);
      const start = predictor && settings.seed ? predictedStart(settings.seed, predictor, drawn) : undefined;
      const outcome = await pool.run({ kind: "sample", circuit, settings, ...(start ? { start } : {}) });
      const sample: ToleranceSample = { index, drawn, ...outcome };
      samples.push(sample);
      options.onSample?.(sample);
      if (pool.jobs === 1) await yieldToEvents();
    }
  };
  try {
    const seed = analysis.measure === "steady" && indices.length > 0 ? nominalSeed(build({ ...options.fixed }), options.tolerances, budget) : undefined;
    // One object for every sample: a worker is sent it once (see worker-pool.ts).
    const settings: SampleSettings = {
      criteria,
      ...(options.tolerances ? { tolerances: options.tolerances } : {}),
      ...(analysis.measure === "steady" ? { measure: "steady" as const } : {}),
      ...(seed ? { seed } : {}),
    };
    const predictor = seed ? seedPredictor(build, options.fixed, drawnAround, seed, { ...(options.tolerances ? { tolerances: options.tolerances } : {}), budget }) : undefined;
    await Promise.all(Array.from({ length: pool.lanes ?? pool.jobs }, () => lane(settings, predictor)));
  } finally {
    await pool.close();
  }
  return samples.sort((a, b) => a.index - b.index);
}
