import type { Circuit, StartupAnalysis } from "../circuit/circuit.js";
import { isOnsetError } from "../circuit/diagnostic.js";
import { runStartup } from "../analyses/startup.js";
import type { Tolerances } from "../solver/tolerances.js";
import type { StartupVerdict } from "../metrics/verdict.js";
import { runSample, type SampleOutcome, type SampleSettings } from "./sample.js";

/** Work a pool runs: a Monte Carlo sample, or one seed of a start-up run (`seeds=`). */
export type Job =
  | { readonly kind: "sample"; readonly circuit: Circuit; readonly settings: SampleSettings }
  | { readonly kind: "seed"; readonly circuit: Circuit; readonly analysis: StartupAnalysis; readonly tolerances?: Partial<Tolerances> };

/** What one seed of a start-up run gives: its start-up time, or why there is none. */
export interface SeedOutcome {
  readonly seed: number;
  readonly verdict: StartupVerdict | null;
  readonly startupTime: number | null;
  /** When the simulation itself failed: its message. */
  readonly error?: string;
}

export type JobResult<J extends Job> = J extends { kind: "sample" } ? SampleOutcome : SeedOutcome;

/** Runs one seed of a start-up analysis (its own seed in `analysis.seed`), without a spread of its own. */
export function runSeed(circuit: Circuit, analysis: StartupAnalysis, tolerances?: Partial<Tolerances>): SeedOutcome {
  const seed = analysis.seed ?? 1;
  try {
    const r = runStartup(circuit, { ...analysis, seeds: 1 }, { tolerances });
    return { seed, verdict: r.verdict, startupTime: r.startupTime };
  } catch (error) {
    const message = isOnsetError(error) ? error.diagnostic.message : error instanceof Error ? error.message : String(error);
    return { seed, verdict: null, startupTime: null, error: message };
  }
}

/** Runs a job in this thread (the worker runs the same function). */
export function runJob(job: Job): SampleOutcome | SeedOutcome {
  return job.kind === "sample" ? runSample(job.circuit, job.settings) : runSeed(job.circuit, job.analysis, job.tolerances);
}
