/**
 * The Onset circuit language: lexer, parser, elaboration to the engine's circuit model,
 * checker, formatter and diagnostic renderer. No file I/O here (it runs on any JavaScript
 * platform): includes are read through a caller's reader, and `@onset/netlist-parser/node`
 * reads the file system.
 * @packageDocumentation
 */
export {
  buildCircuit,
  checkProgram,
  decodeNumber,
  elaborate,
  formatProgram,
  formatText,
  lineColumnAt,
  loadProgram,
  loadSource,
  overrideTargets,
  parseQuantity,
  parseText,
  printDesignedFile,
  renderDiagnostic,
  sourceLimits,
  tokenize,
} from "./door.js";
export type { IncludeResolver, LoadedProgram, SourceText } from "./loader.js";
export type { BuiltCircuit, CircuitSource, LoadSourceOptions } from "./circuit-source.js";
export { SourceError } from "./source-error.js";
export { programBuilder } from "./program-builder.js";
export type { ProgramBuilderData } from "./program-builder.js";
export { SOURCE_LIMIT_FLAGS, SOURCE_LIMITS } from "./source-limits.js";
export type { SourceLimits } from "./source-limits.js";
export type { Overrides } from "./elaborate/context.js";
export type { SourceFiles } from "./render.js";
export type { LexResult } from "./lexer.js";
export { SI_PREFIXES, UNIT_SPELLINGS } from "./units.js";
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
