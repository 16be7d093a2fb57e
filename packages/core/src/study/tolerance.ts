import { badArgument, checkAnalysis, checkOptions, describe } from "../circuit/arguments.js";
import type { SpecCriterion, ToleranceAnalysis, ToleranceSpec } from "../circuit/circuit.js";
import { inputError } from "../circuit/diagnostic.js";
import type { Tolerances } from "../solver/tolerances.js";
import { budgetOf, type BudgetOptions, type RunBudget } from "../analyses/limits.js";
import { inThreadPool, type JobPool, type JobPoolFactory } from "./pool.js";
import { nominalKey, takeNext, takeNoMore, type PortableBuilder, type SharedStudy } from "./shared-study.js";
import { sampleHere, sampleJob, studyPlan, type CircuitBuilder, type StudyPlan } from "./study-plan.js";
import type { ToleranceSample } from "./summary.js";

export type { CircuitBuilder };

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
  /**
   * `build` in a form worker threads can make for themselves (see {@link PortableBuilder}): on a
   * pool of two workers or more, each then draws, builds and runs its own samples. Otherwise this
   * thread builds every sample's circuit and posts it to a worker.
   */
  readonly portable?: PortableBuilder;
}

/**
 * Jobs from which a portable study is shared. With one worker, this thread building and posting
 * the worker's circuits costs less than the worker loading and warming up its own builder
 * (measured on the bridge source, 1000 samples on 2 cores: 0.2–0.3 s less CPU in all, the wall
 * time no worse); with more workers, building for all of them would hold this thread up.
 */
const SHARED_FROM_JOBS = 3;

/** Lets timers and I/O run (setImmediate where there is one: Node; else a zero timeout). */
export function yieldToEvents(): Promise<void> {
  const later: (callback: () => void) => unknown = (globalThis as { setImmediate?: (callback: () => void) => unknown }).setImmediate ?? ((callback) => setTimeout(callback, 0));
  return new Promise((resolve) => later(resolve));
}

/**
 * Runs the Monte Carlo samples of a `tolerance` analysis. The values are drawn and elaborated
 * here; the simulations run on the pool. Given `options.portable`, a pool with two worker threads
 * or more lets each of them draw, build and run samples itself, taking them from a counter shared
 * with this thread, so no worker waits on this thread. Returns the samples in index order. The limits
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
  if (options.portable !== undefined) checkPortable(options.portable);
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
  const finished = (sample: ToleranceSample) => {
    samples.push(sample);
    options.onSample?.(sample);
  };
  const planOf = () =>
    studyPlan(build, drawnAround, analysis, criteria, { ...(options.fixed ? { fixed: options.fixed } : {}), ...(options.tolerances ? { tolerances: options.tolerances } : {}), budget });
  try {
    if (options.portable && pool.share && pool.jobs >= SHARED_FROM_JOBS && indices.length > 1) {
      const study: SharedStudy = {
        builder: options.portable,
        tolerances: drawnAround,
        analysis,
        ...(options.fixed ? { fixed: options.fixed } : {}),
        jobs: pool.jobs,
        indices,
        next: new SharedArrayBuffer(4),
      };
      await sharedStudy(pool, study, build, planOf, budget, finished);
    } else {
      let next = 0;
      // One lane per job the pool takes at once keeps it busy; in this thread a lane yields between
      // samples so progress can be drawn and results written as they finish.
      const lane = async (plan: StudyPlan) => {
        while (next < indices.length) {
          budget.check("between samples");
          const index = indices[next++]!;
          const { drawn, circuit, start } = sampleJob(plan, build, index);
          const outcome = await pool.run({ kind: "sample", circuit, settings: plan.settings, ...(start ? { start } : {}) });
          finished({ index, drawn, ...outcome });
          if (pool.jobs === 1) await yieldToEvents();
        }
      };
      const plan = indices.length > 0 ? planOf() : undefined;
      if (plan) await Promise.all(Array.from({ length: pool.lanes ?? pool.jobs }, () => lane(plan)));
    }
  } finally {
    await pool.close();
  }
  return samples.sort((a, b) => a.index - b.index);
}

/**
 * This thread's part of a shared study: it plans the study (while the workers make their
 * builders), hands them the plan and takes samples from the shared counter as they do, yielding
 * between samples to hear theirs; a sample a worker hands back (it could not build it) runs
 * here, where the builder's error, if any, is thrown.
 */
async function sharedStudy(pool: JobPool, study: SharedStudy, build: CircuitBuilder, planOf: () => StudyPlan, budget: RunBudget, finished: (sample: ToleranceSample) => void): Promise<void> {
  const counter = new Int32Array(study.next);
  const count = study.indices.length;
  const returned: number[] = [];
  let failure: unknown = null;
  let nominal: string | undefined;
  const stop = (error: unknown) => {
    failure ??= error;
    takeNoMore(counter, count);
  };
  const run = pool.share!(study, (report) => {
    if (failure !== null) return;
    // Heard between this thread's samples: what goes wrong here (onSample, the builder) is thrown by this thread's loop.
    try {
      if ("nominal" in report) {
        nominal ??= nominalKey(build, study.fixed);
        if (report.nominal !== nominal) stop(badArgument("runToleranceStudy: options.portable builds another nominal circuit than build does (a worker thread's samples would not be the study's)"));
      } else if ("sample" in report) finished(report.sample);
      else if ("returned" in report) returned.push(report.returned);
    } catch (error) {
      stop(error);
    }
  });
  // A worker's limit (or failure) stops this thread's samples too.
  run.ended.catch(stop);
  const plan = planOf();
  run.planned({ settings: plan.settings, ...(plan.predictor ? { predictor: plan.predictor } : {}) });
  const fail = () => {
    if (failure !== null) throw failure;
  };
  for (let k = takeNext(counter, count); k >= 0; k = takeNext(counter, count)) {
    fail();
    budget.check("between samples");
    finished(sampleHere(plan, build, study.indices[k]!, budget));
    await yieldToEvents();
  }
  await run.ended;
  fail();
  for (const index of returned) finished(sampleHere(plan, build, index, budget));
}

function checkPortable(portable: PortableBuilder): void {
  if (typeof portable !== "object" || portable === null || typeof portable.module !== "string" || typeof portable.name !== "string") {
    throw badArgument(`runToleranceStudy: options.portable must be { module, name, data } (a module URL and the name of its builder-making export), got ${describe(portable)}`);
  }
}
