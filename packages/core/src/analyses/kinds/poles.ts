import type { PolesAnalysis } from "../../circuit/circuit.js";
import type { AnalysisModel } from "../analysis-model.js";
import { runPoles, type PolesResult } from "../poles.js";

/** `poles`: the natural frequencies of the circuit linearised at its bias point. */
export const poles: AnalysisModel<PolesAnalysis, PolesResult> = {
  keyword: "poles",
  summary: "the natural frequencies of the circuit linearised at its bias point",
  options: {},
  build: () => ({ kind: "poles" }),
  run: runPoles,
};
