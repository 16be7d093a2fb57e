import type { TransientAnalysis } from "../../circuit/circuit.js";
import type { AnalysisModel } from "../analysis-model.js";
import { runTransient, type TransientResult } from "../transient.js";

/** `transient`: the time response from the bias point or from rest. */
export const transient: AnalysisModel<TransientAnalysis, TransientResult> = {
  keyword: "transient",
  summary: "the time response from the bias point or from rest, probes recorded at every accepted step",
  options: {
    until: { type: "number", unit: "s", min: 0, minExclusive: true, required: true, summary: "end time" },
    "max-step": { type: "number", unit: "s", min: 0, minExclusive: true, summary: "largest time step" },
    start: { type: "word", words: ["bias", "rest"], summary: "starting state: the bias point or rest" },
    probes: { type: "probes", summary: "list of probes to record (default: every node)" },
    accuracy: { type: "number", unit: "1", min: 1e-10, max: 0.1, summary: "relative accuracy of the step control (default 1e-4)" },
    "accuracy-floor": { type: "number", unit: "V", min: 1e-15, max: 1, summary: "absolute accuracy of a voltage (default 1 µV; currents 1 nA per µV)" },
  },
  build: (o) => ({
    kind: "transient",
    until: o.numbers.until!,
    ...(o.numbers["max-step"] === undefined ? {} : { maxStep: o.numbers["max-step"] }),
    start: (o.words.start ?? "bias") as "bias" | "rest",
    probes: o.probeLists.probes ?? [],
    ...(o.numbers.accuracy === undefined ? {} : { accuracy: o.numbers.accuracy }),
    ...(o.numbers["accuracy-floor"] === undefined ? {} : { accuracyFloor: o.numbers["accuracy-floor"] }),
  }),
  run: runTransient,
};
