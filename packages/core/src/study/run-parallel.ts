import type { Circuit, StartupAnalysis } from "../circuit/circuit.js";
import { budgetOf } from "../analyses/limits.js";
import { circuitSpec, isSimulating, runCircuit, type AnalysisResult, type CircuitRun } from "../analyses/run.js";
import type { RunOptions } from "../analyses/transient.js";
import { inThreadPool, type JobPoolFactory } from "./pool.js";
import { startupSpreadOnPool } from "./startup-spread.js";

/** How {@link runCircuitInParallel} runs: the run options, and where the further seeds run. */
export interface ParallelRunOptions extends RunOptions {
  /**
   * Where the further seeds of `startup … seeds=N` run.
   * @defaultValue {@link inThreadPool} (this thread); `workerPool(jobs)` from `@onset/core/node` uses worker threads
   */
  readonly pool?: JobPoolFactory;
}

/**
 * `runCircuit` with the further seeds of `startup … seeds=N` run on a pool (`options.pool`), all
 * within one budget (`options.limits`). The spread is the same on any pool and job count.
 */
export async function runCircuitInParallel(circuit: Circuit, options: ParallelRunOptions = {}): Promise<CircuitRun> {
  const budget = budgetOf(options);
  const analyses = circuit.analyses.filter(isSimulating);
  const first = runCircuit(circuit, { ...options, budget, seedSpread: false });
  const seeded = analyses.flatMap((a, k) => (a.kind === "startup" && (a.seeds ?? 1) > 1 ? [{ analysis: a as StartupAnalysis, index: k }] : []));
  if (seeded.length === 0) return first;
  const extra = seeded.reduce((n, s) => n + (s.analysis.seeds ?? 1) - 1, 0);
  const pool = (options.pool ?? inThreadPool)({ count: extra, budget });
  try {
    const results: AnalysisResult[] = [...first.results];
    for (const { analysis, index } of seeded) {
      const r = results[index]!;
      if (r.analysis !== "startup") continue;
      results[index] = { ...r, startupTimeSpread: await startupSpreadOnPool(circuit, analysis, r, pool, options.tolerances) };
    }
    return { results, spec: circuitSpec(circuit, results) };
  } finally {
    await pool.close();
  }
}
