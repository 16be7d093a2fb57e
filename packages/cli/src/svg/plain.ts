import type { SimulatingKind } from "@onset/core";
import { writersOf } from "../analyses/registry.js";
import type { Figure } from "../plot/index.js";
import type { AnalysisRun } from "../report/plain-types.js";

/** True when an analysis of this kind has a figure (bias and poles are tables). */
export function hasFigure(kind: SimulatingKind): boolean {
  return writersOf(kind).figure !== undefined;
}

/** The figure of one analysis (each analysis's writer in `analyses/`), or null when it has none. */
export function resultFigure(run: AnalysisRun, title: string): Figure | null {
  const figure = writersOf(run.result.analysis).figure;
  return figure ? figure(run.result, title) : null;
}
