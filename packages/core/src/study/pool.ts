import type { Circuit } from "../circuit/circuit.js";
import type { RunBudget } from "../analyses/limits.js";
import { runSample, type SampleOutcome, type SampleSettings } from "./sample.js";

/** Runs the samples of a study, in this thread or on worker threads. */
export interface SamplePool {
  /** How many samples it runs at once. */
  readonly jobs: number;
  /** Runs one sample; rejects with a `RunLimitError` when the study's budget runs out. */
  run(circuit: Circuit): Promise<SampleOutcome>;
  /** Stops the pool; samples still running are rejected. */
  close(): Promise<void>;
}

/** What a pool is made for: the samples' shared settings, how many samples at most, and the study's budget. */
export interface SamplePoolContext {
  readonly settings: SampleSettings;
  /** The number of samples the study will run (no use for more workers than that). */
  readonly samples: number;
  readonly budget: RunBudget;
}

/**
 * Makes the pool a study runs on. {@link inThreadPool} is the default; `workerPool(jobs)` from
 * `@onset/core/node` runs samples on worker threads.
 */
export type SamplePoolFactory = (context: SamplePoolContext) => SamplePool;

/** Runs every sample in this thread, one at a time (works on any JavaScript platform). */
export const inThreadPool: SamplePoolFactory = ({ settings, budget }) => ({
  jobs: 1,
  run: (circuit) => {
    try {
      return Promise.resolve(runSample(circuit, settings, budget));
    } catch (error) {
      return Promise.reject(error);
    }
  },
  close: () => Promise.resolve(),
});
