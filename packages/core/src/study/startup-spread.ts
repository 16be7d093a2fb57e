import type { Circuit, StartupAnalysis } from "../circuit/circuit.js";
import { budgetOf } from "../analyses/limits.js";
import type { StartupResult, StartupTimeSpread } from "../analyses/startup.js";
import type { RunOptions } from "../analyses/transient.js";
import type { Tolerances } from "../solver/tolerances.js";
import { percentileOfSorted } from "../stats/percentiles.js";
import { runSeed, type SeedOutcome } from "./jobs.js";
import type { JobPool } from "./pool.js";

/** The seeds a `seeds=N` start-up runs with: seed, seed + 1, …, seed + N − 1 (seed default 1). */
export function seedsOf(analysis: StartupAnalysis): number[] {
  const first = analysis.seed ?? 1;
  return Array.from({ length: Math.max(1, analysis.seeds ?? 1) }, (_, k) => first + k);
}

/** Min, median (Hyndman & Fan definition 7) and max of the start-up times that exist. */
export function timeSpread(outcomes: readonly SeedOutcome[]): StartupTimeSpread {
  const ordered = [...outcomes].sort((a, b) => a.seed - b.seed);
  const times = ordered.map((o) => o.startupTime);
  const present = times.filter((t): t is number => t !== null).sort((a, b) => a - b);
  const some = present.length > 0;
  return {
    seeds: ordered.map((o) => o.seed),
    times,
    min: some ? present[0]! : null,
    median: some ? percentileOfSorted(present, 50) : null,
    max: some ? present[present.length - 1]! : null,
  };
}

const firstOutcome = (first: StartupResult, seed: number): SeedOutcome => ({ seed, verdict: first.verdict, startupTime: first.startupTime });

/**
 * The spread over the analysis's seeds, the first seed's run given, the others run here one by
 * one within the call's limits (`options.budget` or `options.limits`).
 */
export function startupSpread(
  circuit: Circuit,
  analysis: StartupAnalysis,
  first: StartupResult,
  options: Pick<RunOptions, "tolerances" | "limits" | "budget"> = {},
): StartupTimeSpread {
  const [seed, ...others] = seedsOf(analysis);
  const shared = { ...(options.tolerances ? { tolerances: options.tolerances } : {}), budget: budgetOf(options) };
  return timeSpread([firstOutcome(first, seed!), ...others.map((s) => runSeed(circuit, { ...analysis, seed: s }, shared))]);
}

/**
 * The same on a pool (which holds the budget): every seed's run is independent and
 * deterministic, so any job count gives the same spread.
 */
export async function startupSpreadOnPool(
  circuit: Circuit,
  analysis: StartupAnalysis,
  first: StartupResult,
  pool: JobPool,
  tolerances?: Partial<Tolerances>,
): Promise<StartupTimeSpread> {
  const [seed, ...others] = seedsOf(analysis);
  const outcomes = await Promise.all(others.map((s) => pool.run({ kind: "seed", circuit, analysis: { ...analysis, seed: s }, ...(tolerances ? { tolerances } : {}) })));
  return timeSpread([firstOutcome(first, seed!), ...outcomes]);
}
