import type { TransientAnalysis } from "../../circuit/circuit.js";
import type { AnalysisModel } from "../analysis-model.js";
import { runTransient, type TransientResult } from "../transient.js";
import { transientOptions } from "./transient-options.js";

/** `transient`: the time response from the bias point or from rest. */
export const transient: AnalysisModel<TransientAnalysis, TransientResult> = {
  keyword: "transient",
  summary: "the time response from the bias point or from rest, probes recorded at every accepted step",
  options: transientOptions,
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
