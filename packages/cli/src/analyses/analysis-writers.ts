import type { AnalysisResult, SimulatingAnalysis, SimulatingKind, StartupResult } from "@onset/core";
import type { Paint } from "../color.js";
import type { Json } from "../json/results.js";
import type { Figure } from "../plot/index.js";
import type { AnalysisRun } from "../report/plain-types.js";

/** One analysis of a kind with its result. */
export interface RunOf<K extends SimulatingKind> {
  readonly analysis: Extract<SimulatingAnalysis, { kind: K }>;
  readonly result: Extract<AnalysisResult, { analysis: K }>;
}

/**
 * How the command writes one simulating analysis: its section of the text report, its entry
 * in the JSON document, its CSV and its figure. One file per analysis in `analyses/`, one line
 * in `analyses/registry.ts`. `runs` is every run of the file, for an analysis that compares
 * itself with another (poles with the first start-up).
 */
export interface AnalysisWriters<K extends SimulatingKind> {
  text(run: RunOf<K>, runs: readonly AnalysisRun[], p: Paint): string[];
  json(result: RunOf<K>["result"], runs: readonly AnalysisRun[]): Json;
  /** Absent when the analysis has no CSV. */
  csv?(result: RunOf<K>["result"]): string;
  /** Absent when the analysis has no figure (a table: bias, poles); null when this result has nothing to draw (a steady state with no orbit). */
  figure?(result: RunOf<K>["result"], title: string): Figure | null;
}

/** The file's first start-up result, if any. */
export function firstStartup(runs: readonly AnalysisRun[]): StartupResult | undefined {
  return runs.map((x) => x.result).find((r): r is StartupResult => r.analysis === "startup");
}
