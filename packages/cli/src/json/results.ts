import { writersOf } from "../analyses/registry.js";
import type { AnalysisRun } from "../report/plain-types.js";

/** A JSON value as the documents carry it. */
export type Json = null | boolean | number | string | readonly Json[] | { readonly [key: string]: Json | undefined };

/** The JSON of each result, in file order (each analysis's writer in `analyses/`; poles compare against the file's first start-up). */
export function resultsJson(runs: readonly AnalysisRun[]): Json[] {
  return runs.map(({ result }) => writersOf(result.analysis).json(result, runs));
}
