// Worker-thread entry of the job pool: runs one job (a Monte Carlo sample, a start-up seed) per message.
import { parentPort } from "node:worker_threads";
import { isRunLimitError, RunBudget } from "./analyses/limits.js";
import { runJob } from "./study/jobs.js";
import type { WorkerReply, WorkerRequest } from "./study/worker-pool.js";

parentPort?.on("message", ({ job, limits }: WorkerRequest) => {
  let reply: WorkerReply;
  try {
    reply = { outcome: runJob(job, new RunBudget(limits)) };
  } catch (error) {
    if (!isRunLimitError(error)) throw error;
    reply = { limit: { diagnostic: error.diagnostic, limit: error.limit, value: error.value, reached: error.reached } };
  }
  parentPort!.postMessage(reply);
});
