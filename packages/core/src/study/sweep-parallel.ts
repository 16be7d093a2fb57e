import type { SweepAnalysis } from "../circuit/circuit.js";
import { inThreadPool, type JobPoolFactory } from "./pool.js";
import { runSweep, settingCircuit, sweepResult, sweepSetup, type SweepOptions, type SweepPoint, type SweepResult } from "./sweep.js";
import { settingRun } from "./sweep-steady.js";
import { yieldToEvents, type CircuitBuilder } from "./tolerance.js";

/** How {@link runSweepInParallel} runs: a sweep's options, and where the settings run. */
export interface ParallelSweepOptions extends SweepOptions {
  /**
   * Where the settings of a `sweep … measure=steady` run (a start-up sweep runs in this thread).
   * @defaultValue {@link inThreadPool} (this thread); `workerPool(jobs)` from `@onset/core/node` uses worker threads
   */
  readonly pool?: JobPoolFactory;
}

/**
 * `runSweep` with the settings of a `sweep … measure=steady` run on a pool (`options.pool`), all
 * within one budget; `onPoint` is called in completion order, the result is in setting order and
 * the same on any pool and job count (each setting is deterministic). The start threshold is
 * bisected here, on the poles. A start-up sweep runs as `runSweep` does.
 */
export async function runSweepInParallel(build: CircuitBuilder, analysis: SweepAnalysis, given: ParallelSweepOptions = {}): Promise<SweepResult> {
  if (analysis?.measure !== "steady") return runSweep(build, analysis, given);
  const { options, values } = sweepSetup("runSweepInParallel", build, analysis, given);
  const points: SweepPoint[] = [];
  const pool = (options.pool ?? inThreadPool)({ count: values.length, budget: options.budget });
  let next = 0;
  let done = 0;
  const lane = async () => {
    while (next < values.length) {
      const k = next++;
      const value = values[k]!;
      const circuit = settingCircuit(build, analysis, value, options.budget);
      const outcome = await pool.run({ kind: "steady-setting", circuit, ...(options.tolerances ? { tolerances: options.tolerances } : {}) });
      const point = { value, run: settingRun(outcome) };
      points[k] = point;
      options.onPoint?.(point, ++done, values.length);
      if (pool.jobs === 1) await yieldToEvents();
    }
  };
  try {
    await Promise.all(Array.from({ length: pool.lanes ?? pool.jobs }, lane));
  } finally {
    await pool.close();
  }
  return sweepResult(build, analysis, points, options);
}
