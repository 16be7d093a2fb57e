// Worker-thread entry of the job pool: runs one job (a Monte Carlo sample, a start-up seed) per
// message, or takes a shared study's samples until none is left.
import { parentPort } from "node:worker_threads";
import { isRunLimitError, RunBudget } from "./analyses/limits.js";
import { runJob, type Job } from "./study/jobs.js";
import { limitRecord, runSharedStudy, type SharedPlan } from "./study/shared-study.js";
import type { SampleSettings } from "./study/sample.js";
import type { PostedJob, WorkerReply, WorkerRequest } from "./study/worker-pool.js";

/** The studies' settings this worker was sent, by the number its jobs name them with. */
const settingsById = new Map<number, SampleSettings>();

function received(job: PostedJob): Job {
  if (job.kind !== "sample") return job;
  const settings = settingsById.get(job.settings);
  if (!settings) throw new Error(`worker: a sample named settings ${job.settings}, which it was never sent`);
  return { kind: "sample", circuit: job.circuit, settings, ...(job.start ? { start: job.start } : {}) };
}

/** The plan of the shared study under way, when it comes. */
let planned: ((plan: SharedPlan) => void) | undefined;

parentPort?.on("message", (request: WorkerRequest) => {
  if ("share" in request) {
    const plan = new Promise<SharedPlan>((resolve) => (planned = resolve));
    void runSharedStudy(request.share, request.limits, plan, (report) => parentPort!.postMessage({ report } satisfies WorkerReply));
    return;
  }
  if ("plan" in request) {
    planned?.(request.plan);
    return;
  }
  const { job, limits, settings } = request;
  if (settings) settingsById.set(settings.id, settings.value);
  let reply: WorkerReply;
  try {
    reply = { outcome: runJob(received(job), new RunBudget(limits)) };
  } catch (error) {
    if (!isRunLimitError(error)) throw error;
    reply = { limit: limitRecord(error) };
  }
  parentPort!.postMessage(reply);
});
