import type { BiasAnalysis } from "../../circuit/circuit.js";
import type { AnalysisModel } from "../analysis-model.js";
import { runBias, type BiasResult } from "../bias-report.js";

/** `bias`: the DC operating point. */
export const bias: AnalysisModel<BiasAnalysis, BiasResult> = {
  keyword: "bias",
  summary: "the DC operating point: node voltages and source currents",
  options: {},
  build: () => ({ kind: "bias" }),
  run: runBias,
};
