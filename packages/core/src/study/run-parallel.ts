import type { Circuit, StartupAnalysis } from "../circuit/circuit.js";
import { circuitSpec, isSimulating, runCircuit, type AnalysisResult, type CircuitRun } from "../analyses/run.js";
import type { RunOptions } from "../analyses/transient.js";
import { createJobPool, defaultJobs } from "./pool.js";
import { startupSpreadOnPool } from "./startup-spread.js";

/**
 * `runCircuit` with the further seeds of `startup … seeds=N` run on `jobs` worker threads
 * (default: the machine's cores). The spread is the same for any job count.
 */
export async function runCircuitInParallel(circuit: Circuit, options: RunOptions & { readonly jobs?: number } = {}): Promise<CircuitRun> {
  const analyses = circuit.analyses.filter(isSimulating);
  const first = runCircuit(circuit, { ...options, seedSpread: false });
  const seeded = analyses.flatMap((a, k) => (a.kind === "startup" && (a.seeds ?? 1) > 1 ? [{ analysis: a as StartupAnalysis, index: k }] : []));
  if (seeded.length === 0) return first;
  const extra = seeded.reduce((n, s) => n + (s.analysis.seeds ?? 1) - 1, 0);
  const pool = createJobPool(Math.min(options.jobs ?? defaultJobs(), extra));
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
