import type { RunBudget } from "../analyses/limits.js";
import { runJob, type Job, type JobResult } from "./jobs.js";
import type { SharedPlan, SharedStudy, SharedStudyReport } from "./shared-study.js";

/** Runs jobs (Monte Carlo samples, start-up seeds), in this thread or on worker threads. */
export interface JobPool {
  /** How many jobs it runs at once. */
  readonly jobs: number;
  /** How many jobs to hand it at once (running, or queued at a worker so that it never waits between jobs). @defaultValue `jobs` */
  readonly lanes?: number;
  /** Runs one job; rejects with a `RunLimitError` when the budget runs out. */
  run<J extends Job>(job: J): Promise<JobResult<J>>;
  /**
   * Sets the pool's worker threads on a shared study (absent on a pool without them): each makes
   * its builder, waits for the plan (`planned`), then takes samples from `study.next` until none
   * is left, reporting as it goes. `ended` resolves when every worker has ended its part; it
   * rejects with a `RunLimitError` when the budget runs out.
   */
  share?(study: SharedStudy, onReport: (report: SharedStudyReport) => void): SharedRun;
  /** Stops the pool; jobs still running are rejected. */
  close(): Promise<void>;
}

/** A shared study under way on a pool's workers. */
export interface SharedRun {
  /** Hands every worker the study's plan. */
  planned(plan: SharedPlan): void;
  readonly ended: Promise<void>;
}

/** What a pool is made for: how many jobs at most, and the budget they all run within. */
export interface JobPoolContext {
  /** The number of jobs the caller will run (no use for more threads than that). */
  readonly count: number;
  /**
   * The call's limits: each job's run is held to the steps and simulated time, all of them
   * together to the wall time and the signal.
   */
  readonly budget: RunBudget;
}

/**
 * Makes the pool a study or a `seeds=N` start-up runs on. {@link inThreadPool} is the default;
 * `workerPool(jobs)` from `@onset/core/node` runs the jobs on worker threads.
 */
export type JobPoolFactory = (context: JobPoolContext) => JobPool;

/** Runs every job in this thread, one at a time (works on any JavaScript platform). */
export const inThreadPool: JobPoolFactory = ({ budget }) => ({
  jobs: 1,
  run: <J extends Job>(job: J) => {
    try {
      return Promise.resolve(runJob(job, budget));
    } catch (error) {
      return Promise.reject(error);
    }
  },
  close: () => Promise.resolve(),
});
