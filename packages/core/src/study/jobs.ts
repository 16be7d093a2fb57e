import type { Circuit, StartupAnalysis } from "../circuit/circuit.js";
import { RunBudget } from "../analyses/limits.js";
import { runStartup } from "../analyses/startup.js";
import type { RunOptions } from "../analyses/transient.js";
import type { Tolerances } from "../solver/tolerances.js";
import type { StartupVerdict } from "../metrics/verdict.js";
import { failureMessage, runSample, type SampleOutcome, type SampleSettings } from "./sample.js";
import type { SeedStart } from "./seed-predictor.js";
import { runSteadySetting, type SteadySettingOutcome } from "./sweep-steady.js";

/**
 * Work a pool runs: a Monte Carlo sample, one seed of a start-up run (`seeds=`), or one setting
 * of a `sweep … measure=steady`. Plain data, so it can be posted to a worker thread.
 */
export type Job =
  | { readonly kind: "sample"; readonly circuit: Circuit; readonly settings: SampleSettings; readonly start?: SeedStart }
  | { readonly kind: "seed"; readonly circuit: Circuit; readonly analysis: StartupAnalysis; readonly tolerances?: Partial<Tolerances> }
  | { readonly kind: "steady-setting"; readonly circuit: Circuit; readonly tolerances?: Partial<Tolerances> };

/** What one seed of a start-up run gives: its start-up time, or why there is none. */
export interface SeedOutcome {
  /** The noise seed of this run. */
  readonly seed: number;
  /** The run's verdict; null when the simulation failed. */
  readonly verdict: StartupVerdict | null;
  /** The start-up time (s); null where the run did not settle. */
  readonly startupTime: number | null;
  /** When the simulation itself failed: its message. */
  readonly error?: string;
}

/** What a job gives: a {@link SampleOutcome} for a sample, a {@link SeedOutcome} for a seed, a {@link SteadySettingOutcome} for a sweep's setting. */
export type JobResult<J extends Job> = J extends { kind: "sample" } ? SampleOutcome : J extends { kind: "seed" } ? SeedOutcome : SteadySettingOutcome;

/**
 * Runs one seed of a start-up analysis (its own seed in `analysis.seed`), without a spread of
 * its own. A simulation failure is the seed's outcome; a limit that runs out is thrown.
 */
export function runSeed(circuit: Circuit, analysis: StartupAnalysis, options: RunOptions = {}): SeedOutcome {
  const seed = analysis.seed ?? 1;
  try {
    const r = runStartup(circuit, { ...analysis, seeds: 1 }, options);
    return { seed, verdict: r.verdict, startupTime: r.startupTime };
  } catch (error) {
    return { seed, verdict: null, startupTime: null, error: failureMessage(error) };
  }
}

/** Runs a job in this thread within `budget` (a worker runs the same function). */
export function runJob<J extends Job>(job: J, budget: RunBudget = new RunBudget()): JobResult<J> {
  const work: Job = job;
  switch (work.kind) {
    case "sample":
      return runSample(work.circuit, work.settings, budget, work.start) as JobResult<J>;
    case "seed":
      return runSeed(work.circuit, work.analysis, { ...(work.tolerances ? { tolerances: work.tolerances } : {}), budget }) as JobResult<J>;
    case "steady-setting":
      return runSteadySetting(work.circuit, work.tolerances, budget) as JobResult<J>;
  }
}
