import { analysisModels, partKinds, type SimulatingKind } from "@onset/core";

/** Statements that describe the file and its definitions. */
export const definitionKeywords = ["title", "param", "include", "preset", "block", "end", "use"] as const;

/** The statements that run the simulating analyses (sweep, tolerance) and the spec. */
export const studyKeywords = ["sweep", "tolerance", "spec"] as const;

export type AnalysisKeyword = SimulatingKind | (typeof studyKeywords)[number];

/** Analysis statements: the simulating analyses of core's registry, then the studies and the spec. */
export const analysisKeywords: readonly AnalysisKeyword[] = [...(Object.keys(analysisModels) as SimulatingKind[]), ...studyKeywords];

const analysisSet: ReadonlySet<string> = new Set(analysisKeywords);

export function isAnalysisKeyword(word: string): word is AnalysisKeyword {
  return analysisSet.has(word);
}

/** Every word that may start a statement: keywords and part kinds. */
export function statementWords(): string[] {
  return [...definitionKeywords, ...analysisKeywords, ...Object.keys(partKinds)];
}

/** After a parameter's toleranced value: each use draws its own value (`param R = 10k±1% each`). */
export const EACH = "each";

/** Names a parameter may not take (the expression constant and function names). */
export const reservedNames: ReadonlySet<string> = new Set([
  "pi",
  "sqrt",
  "exp",
  "ln",
  "log10",
  "sin",
  "cos",
  "tan",
  "atan",
  "abs",
  "min",
  "max",
  "inf",
]);
