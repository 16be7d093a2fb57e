import { availableParallelism } from "node:os";
import { Worker } from "node:worker_threads";
import type { Circuit } from "../circuit/circuit.js";
import { runJob, type Job, type JobResult } from "./jobs.js";
import type { SampleOutcome, SampleSettings } from "./sample.js";

/** Runs jobs, in this thread or on worker threads. */
export interface JobPool {
  readonly jobs: number;
  run<J extends Job>(job: J): Promise<JobResult<J>>;
  close(): Promise<void>;
}

/** Runs samples, in this thread or on worker threads. */
export interface SamplePool {
  readonly jobs: number;
  run(circuit: Circuit): Promise<SampleOutcome>;
  close(): Promise<void>;
}

/** Node flags a worker thread cannot take (ERR_WORKER_INVALID_EXEC_ARGV). */
const WORKER_REFUSED_FLAGS = new Set(["--expose-gc", "--expose_gc", "--prof", "--cpu-prof", "--heap-prof"]);

/** The default number of workers: the machine's cores. */
export function defaultJobs(): number {
  return Math.max(1, availableParallelism());
}

/**
 * The built worker entry next to this module (`worker.js` beside the ESM build, `worker.cjs`
 * beside the CJS build), or null when running from TypeScript sources, which Node cannot load
 * in a worker.
 */
function workerEntry(): URL | null {
  const here = import.meta.url;
  if (here.endsWith(".ts")) return null;
  return new URL(here.endsWith(".cjs") ? "./worker.cjs" : "./worker.js", here);
}

function inThread(): JobPool {
  return {
    jobs: 1,
    run: <J extends Job>(job: J) => Promise.resolve(runJob(job) as JobResult<J>),
    close: () => Promise.resolve(),
  };
}

interface Pending {
  resolve(outcome: unknown): void;
  reject(error: Error): void;
}

/** A pool of `jobs` workers (one job each at a time); one job, or sources, run in this thread. */
export function createJobPool(jobs: number): JobPool {
  const entry = workerEntry();
  if (jobs <= 1 || entry === null) return inThread();
  // Workers inherit the parent's flags, except those Node refuses in a worker.
  const execArgv = process.execArgv.filter((a) => !a.startsWith("--input-type") && !WORKER_REFUSED_FLAGS.has(a));
  const idle: Worker[] = [];
  const waiting: Array<{ job: Job; pending: Pending }> = [];
  const busy = new Map<Worker, Pending>();
  const workers: Worker[] = [];
  const dispatch = (worker: Worker, job: Job, pending: Pending) => {
    busy.set(worker, pending);
    worker.postMessage(job);
  };
  for (let k = 0; k < jobs; k++) {
    const worker = new Worker(entry, { execArgv });
    worker.on("message", (outcome: unknown) => {
      const pending = busy.get(worker)!;
      busy.delete(worker);
      const next = waiting.shift();
      if (next) dispatch(worker, next.job, next.pending);
      else idle.push(worker);
      pending.resolve(outcome);
    });
    worker.on("error", (error) => {
      busy.get(worker)?.reject(error);
      busy.delete(worker);
    });
    workers.push(worker);
    idle.push(worker);
  }
  return {
    jobs,
    run<J extends Job>(job: J) {
      return new Promise<JobResult<J>>((resolve, reject) => {
        const pending: Pending = { resolve: (o) => resolve(o as JobResult<J>), reject };
        const worker = idle.pop();
        if (worker) dispatch(worker, job, pending);
        else waiting.push({ job, pending });
      });
    },
    async close() {
      await Promise.all(workers.map((w) => w.terminate()));
    },
  };
}

/** A pool that runs Monte Carlo samples with the given settings. */
export function createSamplePool(jobs: number, settings: SampleSettings): SamplePool {
  const pool = createJobPool(jobs);
  return { jobs: pool.jobs, run: (circuit) => pool.run({ kind: "sample", circuit, settings }), close: () => pool.close() };
}
