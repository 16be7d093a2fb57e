import type { AnalysisResult, SimulatingAnalysis } from "@onset/core";

/** One simulating analysis of the file with its result, in file order. */
export interface AnalysisRun {
  readonly analysis: SimulatingAnalysis;
  readonly result: AnalysisResult;
}

/** The unit a probe's values are in: amperes for a branch current, else volts. */
export function probeUnit(analysis: SimulatingAnalysis): "V" | "A" {
  if (analysis.kind === "startup") return analysis.probe.kind === "current" ? "A" : "V";
  if (analysis.kind === "response") return analysis.to.kind === "current" ? "A" : "V";
  return "V";
}
