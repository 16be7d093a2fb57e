// Worker-thread entry of the Monte Carlo pool: runs one sample per message.
import { parentPort } from "node:worker_threads";
import type { Circuit } from "./circuit/circuit.js";
import { runSample, type SampleSettings } from "./study/sample.js";

parentPort?.on("message", (message: { circuit: Circuit; settings: SampleSettings }) => {
  parentPort!.postMessage(runSample(message.circuit, message.settings));
});
