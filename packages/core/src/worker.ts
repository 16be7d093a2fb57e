// Worker-thread entry of the job pool: runs one job (a Monte Carlo sample, a start-up seed) per message.
import { parentPort } from "node:worker_threads";
import { runJob, type Job } from "./study/jobs.js";

parentPort?.on("message", (job: Job) => {
  parentPort!.postMessage(runJob(job));
});
