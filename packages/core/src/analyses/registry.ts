import type { AnalysisModel, ResultOf, SpecOf } from "./analysis-model.js";
import { bias } from "./kinds/bias.js";
import { poles } from "./kinds/poles.js";
import { response } from "./kinds/response.js";
import { startup } from "./kinds/startup.js";
import { steady } from "./kinds/steady.js";
import { transient } from "./kinds/transient.js";

/**
 * Every analysis that simulates the circuit once, by keyword, in the order the language lists
 * them; adding an analysis adds one line here (studies and specs, which run these, are not listed).
 */
export const analysisModels = {
  bias,
  transient,
  startup,
  steady,
  response,
  poles,
} as const;

/** The keyword of a simulating analysis (`bias`, `transient`, `startup`, …). */
export type SimulatingKind = keyof typeof analysisModels;

/** Analyses that simulate the circuit once (as opposed to studies and specs). */
export type SimulatingAnalysis = { [K in SimulatingKind]: SpecOf<(typeof analysisModels)[K]> }[SimulatingKind];

/** The result of one simulating analysis. */
export type AnalysisResult = { [K in SimulatingKind]: ResultOf<(typeof analysisModels)[K]> }[SimulatingKind];

/** The model of a simulating analysis by its keyword, or undefined for any other word. */
export function analysisModel(keyword: string): AnalysisModel<SimulatingAnalysis, AnalysisResult> | undefined {
  return Object.hasOwn(analysisModels, keyword) ? (analysisModels[keyword as SimulatingKind] as AnalysisModel<SimulatingAnalysis, AnalysisResult>) : undefined;
}
