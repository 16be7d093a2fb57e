import { partKinds } from "@onset/core";

/** Statements that describe the file and its definitions. */
export const definitionKeywords = ["title", "param", "include", "preset", "block", "end", "use"] as const;

/** Analysis statements. */
export const analysisKeywords = ["bias", "transient", "startup", "steady", "response", "poles", "sweep", "tolerance", "spec"] as const;

export type AnalysisKeyword = (typeof analysisKeywords)[number];

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
