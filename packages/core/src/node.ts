/**
 * The Node-only part of the engine: jobs (Monte Carlo samples, start-up seeds) on worker
 * threads. Pass `workerPool(jobs)` as `pool` to `runToleranceStudy`, `runDesignWindow` or
 * `runCircuitInParallel`.
 * @packageDocumentation
 */
export { defaultJobs, workerPool } from "./study/worker-pool.js";
export type { WorkerReply, WorkerRequest } from "./study/worker-pool.js";
