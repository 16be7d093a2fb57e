/**
 * The Node-only part of the engine: Monte Carlo samples on worker threads. Pass
 * `workerPool(jobs)` as `pool` to `runToleranceStudy` or `runDesignWindow`.
 * @packageDocumentation
 */
export { defaultJobs, workerPool } from "./study/worker-pool.js";
export type { WorkerReply } from "./study/worker-pool.js";
