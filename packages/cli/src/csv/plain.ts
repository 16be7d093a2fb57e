import type { AnalysisResult } from "@onset/core";
import { writersOf } from "../analyses/registry.js";

/**
 * The CSV of one result, or null when its analysis has none (each analysis's writer in
 * `analyses/`); every heading carries its unit, values in SI base units.
 */
export function resultCsv(r: AnalysisResult): string | null {
  const csv = writersOf(r.analysis).csv;
  return csv ? csv(r) : null;
}

/** True when an analysis of this kind writes a CSV. */
export function hasCsv(kind: AnalysisResult["analysis"]): boolean {
  return writersOf(kind).csv !== undefined;
}
