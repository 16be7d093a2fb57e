import type { AnalysisChecks, AnalysisOptions, AnalysisOptionValues } from "../circuit/analysis-schema.js";
import type { Circuit } from "../circuit/circuit.js";
import type { RunOptions } from "./transient.js";

/**
 * One analysis that simulates the circuit once (`bias`, `transient`, `startup`, …): its
 * keyword, its options, how its spec is built from them, and how it runs. One file per
 * analysis in `analyses/kinds/`, one line in `analyses/registry.ts`.
 *
 * @typeParam S - the analysis spec the circuit carries (`kind` is the keyword)
 * @typeParam R - its result (`analysis` is the keyword)
 */
export interface AnalysisModel<S extends { readonly kind: string }, R extends { readonly analysis: S["kind"] }> {
  readonly keyword: S["kind"];
  /** One line for docs and help. */
  readonly summary: string;
  readonly options: AnalysisOptions;
  /** The spec from options already checked against `options` (the caller adds the statement's span). */
  build(values: AnalysisOptionValues, checks: AnalysisChecks): S;
  run(circuit: Circuit, analysis: S, options: RunOptions): R;
}

/** The spec type of an analysis model. */
export type SpecOf<M> = M extends AnalysisModel<infer S, infer _R> ? S : never;

/** The result type of an analysis model. */
export type ResultOf<M> = M extends AnalysisModel<infer _S, infer R> ? R : never;
