import { availableParallelism } from "node:os";
import { Worker } from "node:worker_threads";
import { runLimitError, type RunLimitRecord, type WorkerLimits } from "../analyses/limits.js";
import { runJob, type Job, type JobResult, type SeedOutcome } from "./jobs.js";
import { inThreadPool, type JobPool, type JobPoolContext, type JobPoolFactory } from "./pool.js";
import type { Circuit } from "../circuit/circuit.js";
import type { SampleOutcome, SampleSettings } from "./sample.js";
import type { SeedStart } from "./seed-predictor.js";
import type { SteadySettingOutcome } from "./sweep-steady.js";
import type { SharedPlan, SharedStudy, SharedStudyReport } from "./shared-study.js";

/** Node flags a worker thread cannot take (ERR_WORKER_INVALID_EXEC_ARGV), known before trying. */
const WORKER_REFUSED_FLAGS = new Set(["--expose-gc", "--expose_gc", "--prof", "--cpu-prof", "--heap-prof", "--cpu-prof-dir", "--cpu-prof-name", "--heap-prof-dir", "--heap-prof-name"]);

/**
 * A worker thread on `entry` with the parent's flags, less those a worker refuses: the ones known
 * above, and any other the refusal names (V8's own flags such as --max-old-space-size or
 * --stack-size, which hold for the whole process anyway, and the process's own such as --title).
 */
function startWorker(entry: URL, execArgv: string[]): Worker {
  try {
    return new Worker(entry, { execArgv });
  } catch (error) {
    if ((error as { code?: unknown }).code !== "ERR_WORKER_INVALID_EXEC_ARGV") throw error;
    const named = /flags: (.*)$/.exec((error as Error).message)?.[1]?.split(", ") ?? [];
    const kept = execArgv.filter((a) => !named.includes(a));
    // Unless the refusal names what to leave out, the worker starts with none of the flags.
    return new Worker(entry, { execArgv: kept.length < execArgv.length ? kept : [] });
  }
}

/**
 * A job as posted: a sample's settings, one object shared by every sample of a study (with the
 * nominal's orbit in it), go to each worker once and are named by a number afterwards.
 */
export type PostedJob = Exclude<Job, { readonly kind: "sample" }> | { readonly kind: "sample"; readonly circuit: Circuit; readonly settings: number; readonly start?: SeedStart };

/**
 * What a worker is sent: one job, the limits it runs within (the wall time as what is left), and
 * settings it has not seen yet; or a shared study to take samples from.
 */
export type WorkerRequest =
  | {
      readonly job: PostedJob;
      readonly limits: WorkerLimits;
      /** Settings the job (or a later one) names by `id`. */
      readonly settings?: { readonly id: number; readonly value: SampleSettings };
    }
  | { readonly share: SharedStudy; readonly limits: WorkerLimits }
  | { readonly plan: SharedPlan };

/** A worker's answer: the job's outcome, or the limit that stopped it; or a report on its shared study. */
export type WorkerReply = { readonly outcome: SampleOutcome | SeedOutcome | SteadySettingOutcome } | { readonly limit: RunLimitRecord } | { readonly report: SharedStudyReport };

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

interface Pending {
  resolve(outcome: SampleOutcome | SeedOutcome | SteadySettingOutcome): void;
  reject(error: unknown): void;
}

/**
 * Runs jobs (Monte Carlo samples, start-up seeds) `jobs` at a time: on `jobs − 1` worker threads
 * and this thread, whose code the nominal's own run has already compiled (a worker starts cold);
 * one job, or running from TypeScript sources, runs them in this thread alone. Each worker is
 * handed the job after the one it runs, so it does not wait for this thread between jobs. The
 * budget goes with every job (its wall time as what is left); an aborted signal or the end of
 * the wall time terminates the workers at once, so a job stuck between its checks cannot hold
 * the call. Every job is deterministic, so the results do not depend on `jobs`.
 */
export function workerPool(jobs: number = defaultJobs()): JobPoolFactory {
  return (context) => {
    const entry = workerEntry();
    const count = Math.min(jobs, Math.max(1, context.count));
    if (count <= 1 || entry === null) return inThreadPool(context);
    return startWorkers(entry, count - 1, context);
  };
}

/** Jobs handed to a worker at once: the one it runs and the next. */
const WORKER_DEPTH = 2;

function startWorkers(entry: URL, threads: number, { budget }: JobPoolContext): JobPool {
  // Workers inherit the parent's flags, except those Node refuses in a worker.
  const execArgv = process.execArgv.filter((a) => !a.startsWith("--input-type") && !WORKER_REFUSED_FLAGS.has(a.split("=")[0]!));
  const waiting: Array<{ job: Job; pending: Pending }> = [];
  /** Each worker's jobs in the order posted (a worker answers in that order). */
  const queued = new Map<Worker, Pending[]>();
  const workers: Worker[] = [];
  let hereBusy = false;
  let stopped: unknown = null;
  /** The shared study under way: who hears its reports, and how many workers have not ended their part. */
  let sharing: { onReport: (report: SharedStudyReport) => void; running: number; resolve(): void; reject(error: unknown): void } | null = null;
  let timer: ReturnType<typeof setTimeout> | undefined;
  const stop = (reason: unknown) => {
    if (stopped !== null) return;
    stopped = reason;
    for (const pending of [...[...queued.values()].flat(), ...waiting.map((w) => w.pending), ...(sharing ? [sharing] : [])]) pending.reject(reason);
    for (const q of queued.values()) q.length = 0;
    waiting.length = 0;
    clearTimeout(timer);
    budget.signal?.removeEventListener("abort", onAbort);
    // Not awaited: tearing down a busy worker takes up to a few hundred ms, which would hold
    // the caller past its limit; the threads end on their own.
    for (const w of workers) w.terminate().catch(() => {});
  };
  const stopByBudget = () => {
    try {
      budget.check("while jobs ran on worker threads");
    } catch (error) {
      stop(error);
    }
  };
  const onAbort = () => stopByBudget();
  budget.signal?.addEventListener("abort", onAbort);
  // At the deadline, in case a worker is busy between its own checks.
  const left = budget.remaining();
  if (left !== Infinity) timer = setTimeout(stopByBudget, Math.max(0, left * 1000));
  timer?.unref?.();
  const settingsIds = new Map<SampleSettings, number>();
  const sent = new Map<Worker, Set<number>>();
  const post = (worker: Worker, job: Job, pending: Pending) => {
    queued.get(worker)!.push(pending);
    const limits = budget.forWorker();
    if (job.kind !== "sample") {
      worker.postMessage({ job, limits } satisfies WorkerRequest);
      return;
    }
    let id = settingsIds.get(job.settings);
    if (id === undefined) settingsIds.set(job.settings, (id = settingsIds.size));
    const known = sent.get(worker)!;
    const posted = { kind: "sample" as const, circuit: job.circuit, settings: id, ...(job.start ? { start: job.start } : {}) };
    if (known.has(id)) worker.postMessage({ job: posted, limits } satisfies WorkerRequest);
    else {
      known.add(id);
      worker.postMessage({ job: posted, limits, settings: { id, value: job.settings } } satisfies WorkerRequest);
    }
  };
  const runHere = (job: Job, pending: Pending) => {
    hereBusy = true;
    // Later, so that the other lanes can first hand their jobs to the workers.
    setImmediate(() => {
      if (stopped !== null) pending.reject(stopped);
      else {
        try {
          pending.resolve(runJob(job, budget));
        } catch (error) {
          pending.reject(error);
          stop(error);
        }
      }
      hereBusy = false;
      drain();
    });
  };
  /** The worker with the fewest jobs, and how many it has. */
  const leastQueued = (): [Worker, number] => {
    let best = workers[0]!;
    for (const w of workers) if (queued.get(w)!.length < queued.get(best)!.length) best = w;
    return [best, queued.get(best)!.length];
  };
  // An idle worker first, then this thread, then a worker's queue.
  const place = (job: Job, pending: Pending): boolean => {
    const [worker, count] = leastQueued();
    if (count === 0) post(worker, job, pending);
    else if (!hereBusy) runHere(job, pending);
    else if (count < WORKER_DEPTH) post(worker, job, pending);
    else return false;
    return true;
  };
  const drain = () => {
    while (stopped === null && waiting.length > 0 && place(waiting[0]!.job, waiting[0]!.pending)) waiting.shift();
  };
  const heard = (report: SharedStudyReport) => {
    if (stopped !== null || !sharing) return;
    if ("limit" in report) stop(runLimitError(report.limit));
    else {
      sharing.onReport(report);
      if (("done" in report || "unavailable" in report) && --sharing.running === 0) sharing.resolve();
    }
  };
  for (let k = 0; k < threads; k++) {
    const worker = startWorker(entry, execArgv);
    worker.on("message", (reply: WorkerReply) => {
      if ("report" in reply) {
        heard(reply.report);
        return;
      }
      const pending = queued.get(worker)!.shift();
      if (!pending) return;
      if ("limit" in reply) {
        stop(runLimitError(reply.limit));
        return;
      }
      pending.resolve(reply.outcome);
      drain();
    });
    // A worker that fails outside a job leaves the call without it: stop rather than wait.
    worker.on("error", (error) => stop(error));
    workers.push(worker);
    queued.set(worker, []);
    sent.set(worker, new Set());
  }
  return {
    jobs: threads + 1,
    lanes: threads * WORKER_DEPTH + 1,
    run<J extends Job>(job: J) {
      return new Promise<JobResult<J>>((resolve, reject) => {
        if (stopped !== null) {
          reject(stopped);
          return;
        }
        const pending: Pending = { resolve: (outcome) => resolve(outcome as JobResult<J>), reject };
        if (waiting.length > 0 || !place(job, pending)) waiting.push({ job, pending });
      });
    },
    share(study, onReport) {
      const ended = new Promise<void>((resolve, reject) => {
        if (stopped !== null) {
          reject(stopped);
          return;
        }
        sharing = { onReport, running: workers.length, resolve, reject };
        for (const w of workers) w.postMessage({ share: study, limits: budget.forWorker() } satisfies WorkerRequest);
      });
      return {
        ended,
        planned(plan) {
          if (stopped === null) for (const w of workers) w.postMessage({ plan } satisfies WorkerRequest);
        },
      };
    },
    close() {
      stop(new Error("the job pool was closed"));
      return Promise.resolve();
    },
  };
}
