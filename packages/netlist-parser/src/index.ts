/**
 * The Onset circuit language: lexer, parser, elaboration to the engine's circuit model,
 * checker, formatter and diagnostic renderer.
 */
export { parseText } from "./parser.js";
export { loadProgram } from "./loader.js";
export type { IncludeResolver } from "./loader.js";
export { elaborate, overrideTargets } from "./elaborate/elaborate.js";
export type { Overrides } from "./elaborate/context.js";
export { checkProgram } from "./check.js";
export { formatText, formatProgram } from "./format.js";
export { renderDiagnostic } from "./render.js";
export type { SourceFiles } from "./render.js";
export { lineColumnAt } from "./positions.js";
export { parseQuantity } from "./quantity.js";
export { tokenize } from "./lexer.js";
export type { LexResult } from "./lexer.js";
export { decodeNumber, SI_PREFIXES, UNIT_SPELLINGS } from "./units.js";
export type { NumberLiteral, NumberProblem, UnitForm } from "./units.js";
export { FUNCTIONS } from "./evaluate.js";
export { analysisOptions, specMetrics } from "./elaborate/analyses.js";
export type { AnalysisOption } from "./elaborate/analyses.js";
export type { Comment, Token, TokenKind } from "./tokens.js";
export type {
  AnalysisArg,
  AnalysisStatement,
  BlockParamNode,
  BlockStatement,
  CriterionNode,
  Expr,
  Identifier,
  IncludeStatement,
  OptionNode,
  ParamStatement,
  PartStatement,
  PresetStatement,
  Program,
  Span,
  SpecStatement,
  Statement,
  TitleStatement,
  Tolerance,
  UseStatement,
  Value,
} from "./syntax.js";
export type { UnitSymbol } from "@onset/core";
