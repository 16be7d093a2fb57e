import type { AnalysisSpec, Circuit } from "./circuit.js";
import { inputError } from "./diagnostic.js";

/** The kinds of analysis a circuit file can hold (`startup`, `transient`, `sweep`, …). */
export type AnalysisKind = AnalysisSpec["kind"];

/**
 * The circuit's first analysis of a kind, typed by that kind; throws an `OnsetError` with code
 * `missing-analysis` when the circuit has none, so callers need no `!`.
 *
 * @example
 * ```ts
 * const result = runStartup(circuit, analysisOf(circuit, "startup"));
 * ```
 */
export function analysisOf<K extends AnalysisKind>(circuit: Circuit, kind: K): Extract<AnalysisSpec, { kind: K }> {
  const found = circuit.analyses.find((a): a is Extract<AnalysisSpec, { kind: K }> => a.kind === kind);
  if (!found) {
    throw inputError("missing-analysis", `the circuit has no ${kind} analysis`, {
      hint: `add a ${kind} line to the file${kind === "startup" ? ", such as: startup probe=o until=auto" : ""}`,
    });
  }
  return found;
}
