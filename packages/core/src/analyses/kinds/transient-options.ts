import type { AnalysisOptions } from "../../circuit/analysis-schema.js";

/** The `transient` statement's options; `runTransient` checks its argument against them too. Plain literals only (see steady-options.ts). */
export const transientOptions: AnalysisOptions = {
  until: { type: "number", unit: "s", min: 0, minExclusive: true, required: true, summary: "end time" },
  "max-step": { type: "number", unit: "s", min: 0, minExclusive: true, summary: "largest time step" },
  start: { type: "word", words: ["bias", "rest"], summary: "starting state: the bias point or rest" },
  probes: { type: "probes", summary: "list of probes to record (default: every node)" },
  accuracy: { type: "number", unit: "1", min: 1e-10, max: 0.1, summary: "relative accuracy of the step control (default 1e-4)" },
  "accuracy-floor": { type: "number", unit: "V", min: 1e-15, max: 1, summary: "absolute accuracy of a voltage (default 1 µV; currents 1 nA per µV)" },
};
