import type { AnalysisResult, SimulatingAnalysis } from "@onset/core";

/** One simulating analysis of the file with its result, in file order. */
export interface AnalysisRun {
  readonly analysis: SimulatingAnalysis;
  readonly result: AnalysisResult;
}
