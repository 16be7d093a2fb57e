import type { SteadyAnalysis } from "../../circuit/circuit.js";
import type { AnalysisModel } from "../analysis-model.js";
import { settledFigureOptions } from "./settled-figures.js";
import { runSteady, type SteadyResult } from "../steady.js";
import { steadyOptions as options } from "./steady-options.js";

/** `steady`: the periodic steady state by shooting, its figures over one period and its stability. */
export const steady: AnalysisModel<SteadyAnalysis, SteadyResult> = {
  keyword: "steady",
  summary: "the periodic steady state by shooting: frequency, amplitude, THD over one period of the orbit, and its stability",
  options,
  build: (o, checks) => {
    const n = o.numbers;
    return {
      kind: "steady",
      probe: o.probes.probe!,
      from: (o.words.from ?? "startup") as "startup" | "poles",
      ...(n.cycles === undefined ? {} : { cycles: n.cycles }),
      ...(n["max-step"] === undefined ? {} : { maxStep: n["max-step"] }),
      ...(n.temperature === undefined ? {} : { temperature: n.temperature }),
      ...settledFigureOptions("steady", o, checks),
    };
  },
  run: runSteady,
};
