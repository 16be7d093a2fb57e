import type { SimulatingKind } from "@onset/core";
import type { AnalysisWriters } from "./analysis-writers.js";
import { biasWriters } from "./bias.js";
import { polesWriters } from "./poles.js";
import { responseWriters } from "./response.js";
import { startupWriters } from "./startup.js";
import { steadyWriters } from "./steady.js";
import { transientWriters } from "./transient.js";

/**
 * The writers of every simulating analysis of core's registry (`analysisModels`), by keyword;
 * adding an analysis adds one line here (the type asks for one entry per kind).
 */
export const analysisWriters: { readonly [K in SimulatingKind]: AnalysisWriters<K> } = {
  bias: biasWriters,
  transient: transientWriters,
  startup: startupWriters,
  steady: steadyWriters,
  response: responseWriters,
  poles: polesWriters,
};

/** The writers of an analysis kind (a kind core's registry lists). */
export function writersOf(kind: SimulatingKind): AnalysisWriters<SimulatingKind> {
  return analysisWriters[kind] as AnalysisWriters<SimulatingKind>;
}
