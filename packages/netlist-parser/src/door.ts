import type { Circuit, Diagnostic, UnitSymbol } from "@onset/core";
import type { DesignedFile } from "@onset/core";
import {
  checkCircuitSource,
  checkDesignedFile,
  checkDiagnostic,
  checkMadeProgram,
  checkOffset,
  checkOptionalText,
  checkOptionsObject,
  checkOverrides,
  checkProgramOptions,
  checkResolver,
  checkSourceFiles,
  checkText,
} from "./arguments.js";
import { checkProgram as checkProgramInner } from "./check.js";
import { buildCircuit as buildCircuitInner, loadSource as loadSourceInner, type BuiltCircuit, type CircuitSource, type LoadSourceOptions } from "./circuit-source.js";
import type { Overrides } from "./elaborate/context.js";
import { elaborate as elaborateInner, overrideTargets as overrideTargetsInner } from "./elaborate/elaborate.js";
import { formatProgram as formatProgramInner, formatText as formatTextInner } from "./format.js";
import { tokenize as tokenizeInner, type LexResult } from "./lexer.js";
import { loadProgram as loadProgramInner, type IncludeResolver, type LoadedProgram } from "./loader.js";
import { parseText as parseTextInner } from "./parser.js";
import { lineColumnAt as lineColumnAtInner } from "./positions.js";
import { printDesignedFile as printDesignedFileInner } from "./print-design.js";
import { parseQuantity as parseQuantityInner } from "./quantity.js";
import { renderDiagnostic as renderDiagnosticInner, type SourceFiles } from "./render.js";
import { sourceLimits as sourceLimitsInner, type SourceLimits } from "./source-limits.js";
import type { Program } from "./syntax.js";
import { decodeNumber as decodeNumberInner, type NumberLiteral, type NumberProblem } from "./units.js";

// The package's public functions, each checking its arguments before the function behind it
// (which trusts them): what they cannot take is an OnsetError `bad-argument` (docs/language.md §6).

/** Parses one file (syntax only); problems are diagnostics, collected per statement. `limits` bound its expressions (see {@link SourceLimits}). */
export function parseText(text: string, file: string, limits: SourceLimits = {}): { program: Program; diagnostics: Diagnostic[] } {
  checkText("parseText", "text", text);
  checkText("parseText", "file", file);
  checkOptionsObject("parseText", "limits", limits);
  return parseTextInner(text, file, sourceLimitsInner(limits));
}

/** The tokens, comments and lexical problems of one file. */
export function tokenize(text: string, file: string): LexResult {
  checkText("tokenize", "text", text);
  checkText("tokenize", "file", file);
  return tokenizeInner(text, file);
}

/**
 * Parses a file and follows its includes through `resolver` (see `IncludeResolver`); the
 * {@link SourceLimits} bound sizes, depth and counts. Problems are diagnostics.
 */
export function loadProgram(file: string, text: string, resolver?: IncludeResolver, limits: SourceLimits = {}): LoadedProgram {
  checkText("loadProgram", "file", file);
  checkText("loadProgram", "text", text);
  checkResolver("loadProgram", "resolver", resolver);
  checkOptionsObject("loadProgram", "limits", limits);
  return loadProgramInner(file, text, resolver, limits);
}

/** Parses circuit text and follows its includes; throws a `SourceError` carrying every problem when the text has an error. */
export function loadSource(file: string, text: string, options: LoadSourceOptions = {}): CircuitSource {
  checkText("loadSource", "file", file);
  checkText("loadSource", "text", text);
  checkOptionsObject("loadSource", "options", options);
  checkResolver("loadSource", "options.reader", options.reader);
  checkOptionsObject("loadSource", "options.limits", options.limits);
  return loadSourceInner(file, text, options);
}

/** Elaborates a loaded source and checks its wiring; throws a `SourceError` with every error found. */
export function buildCircuit(source: CircuitSource, options: { readonly overrides?: Overrides } = {}): BuiltCircuit {
  checkCircuitSource("buildCircuit", source);
  checkOptionsObject("buildCircuit", "options", options);
  checkOverrides("buildCircuit", options.overrides);
  return buildCircuitInner(source, options);
}

/** The source limits with defaults filled in; a bad value is `bad-limit`. */
export function sourceLimits(given: SourceLimits = {}): Required<SourceLimits> {
  checkOptionsObject("sourceLimits", "limits", given);
  return sourceLimitsInner(given);
}

/** Elaborates a program into the engine's circuit model; the circuit is undefined when any error is found. */
export function elaborate(program: Program, options: { overrides?: Overrides; limits?: SourceLimits } = {}): { circuit: Circuit | undefined; diagnostics: Diagnostic[] } {
  checkMadeProgram("elaborate", program);
  checkProgramOptions("elaborate", options);
  return elaborateInner(program, options);
}

/** Every name `--set` and `sweep` accept. */
export function overrideTargets(program: Program): string[] {
  checkMadeProgram("overrideTargets", program);
  return overrideTargetsInner(program);
}

/** Everything `onset check` reports: elaboration errors, topology problems and warnings. */
export function checkProgram(program: Program, options: { overrides?: Overrides; limits?: SourceLimits } = {}): Diagnostic[] {
  checkMadeProgram("checkProgram", program);
  checkProgramOptions("checkProgram", options);
  return checkProgramInner(program, options);
}

/** Formats a file in the canonical layout; the text is undefined when it has syntax errors. */
export function formatText(text: string, file?: string): { text: string | undefined; diagnostics: Diagnostic[] } {
  checkText("formatText", "text", text);
  checkOptionalText("formatText", "file", file);
  return formatTextInner(text, file);
}

/** A parsed program in the canonical layout. */
export function formatProgram(program: Program): string {
  checkMadeProgram("formatProgram", program);
  return formatProgramInner(program);
}

/** A designed circuit (`designOscillator`'s `file`) in the language, in the canonical layout. */
export function printDesignedFile(file: DesignedFile): string {
  checkDesignedFile("printDesignedFile", file);
  return printDesignedFileInner(file);
}

/** Renders a diagnostic for a terminal, with its line and a caret when its file is in `sources`. */
export function renderDiagnostic(d: Diagnostic, sources: SourceFiles, options: { color?: boolean } = {}): string {
  checkDiagnostic("renderDiagnostic", d);
  checkSourceFiles("renderDiagnostic", sources);
  checkOptionsObject("renderDiagnostic", "options", options);
  // The texts come from the caller's map: one that is not a string is not there.
  const texts: SourceFiles = { get: (file) => { const t: unknown = sources.get(file); return typeof t === "string" ? t : undefined; } };
  return renderDiagnosticInner(d, texts, options);
}

/** Line and column (1-based, columns in code points) of an offset into a text. */
export function lineColumnAt(text: string, offset: number): { line: number; column: number } {
  checkText("lineColumnAt", "text", text);
  checkOffset("lineColumnAt", "offset", offset);
  return lineColumnAtInner(text, offset);
}

/** Reads a command-line quantity (`2.5k`, `33n`, `10%`, `106dB`) for a value in `unit`. */
export function parseQuantity(text: string, unit: UnitSymbol, where?: string): number | Diagnostic {
  checkText("parseQuantity", "text", text);
  checkText("parseQuantity", "unit", unit);
  checkOptionalText("parseQuantity", "where", where);
  return parseQuantityInner(text, unit, where);
}

/** A number literal's value, prefix and unit, or what is wrong with it. */
export function decodeNumber(text: string): NumberLiteral | NumberProblem {
  checkText("decodeNumber", "text", text);
  return decodeNumberInner(text);
}
