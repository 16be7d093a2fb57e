// Worker-thread entry of the Monte Carlo pool: runs one sample per message.
import { parentPort } from "node:worker_threads";
import type { Circuit } from "./circuit/circuit.js";
import { isRunLimitError } from "./analyses/limits.js";
import { runSample, type SampleSettings } from "./study/sample.js";
import type { WorkerReply } from "./study/worker-pool.js";

parentPort?.on("message", (message: { circuit: Circuit; settings: SampleSettings }) => {
  let reply: WorkerReply;
  try {
    reply = { outcome: runSample(message.circuit, message.settings) };
  } catch (error) {
    if (!isRunLimitError(error)) throw error;
    reply = { limit: { diagnostic: error.diagnostic, limit: error.limit, value: error.value, reached: error.reached } };
  }
  parentPort!.postMessage(reply);
});
