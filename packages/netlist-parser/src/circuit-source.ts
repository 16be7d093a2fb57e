import { checkTopology, isOnsetError, type Circuit, type Diagnostic } from "@onset/core";
import { elaborate } from "./elaborate/elaborate.js";
import type { Overrides } from "./elaborate/context.js";
import { hasErrors } from "./errors.js";
import { loadProgram, type IncludeResolver } from "./loader.js";
import { SourceError } from "./source-error.js";
import type { SourceLimits } from "./source-limits.js";
import type { Program } from "./syntax.js";

/** A circuit file read and parsed without errors, with its includes. */
export interface CircuitSource {
  /** The top file's name, as messages show it. */
  readonly file: string;
  readonly program: Program;
  /** The text of every file read, by name, the top file first. */
  readonly sources: ReadonlyMap<string, string>;
  /** Problems that do not stop the file from being used. */
  readonly warnings: readonly Diagnostic[];
}

/** How {@link loadSource} reads includes and how much it may read. */
export interface LoadSourceOptions {
  /**
   * Reads included files; without one an `include` is an error (`include-missing`).
   * `fileReader` from `@onset/netlist-parser/node` reads the file system.
   */
  readonly reader?: IncludeResolver;
  /** Bounds on size, include depth and file count. */
  readonly limits?: SourceLimits;
}

/**
 * Parses circuit text and follows its includes through `options.reader`; throws a
 * {@link SourceError} carrying every problem when the text has an error.
 */
export function loadSource(file: string, text: string, options: LoadSourceOptions = {}): CircuitSource {
  const loaded = loadProgram(file, text, options.reader, options.limits);
  if (hasErrors(loaded.diagnostics)) throw new SourceError(loaded.diagnostics, loaded.sources);
  return { file, program: loaded.program, sources: loaded.sources, warnings: loaded.diagnostics };
}

/** A circuit ready to run, and the warnings found on the way. */
export interface BuiltCircuit {
  readonly circuit: Circuit;
  readonly warnings: readonly Diagnostic[];
}

/**
 * Elaborates a loaded source into the engine's circuit model (with `--set`-style overrides by
 * name) and checks its wiring (a node without a DC path to gnd, a loop of voltage sources);
 * throws a {@link SourceError} with every error found.
 */
export function buildCircuit(source: CircuitSource, options: { readonly overrides?: Overrides } = {}): BuiltCircuit {
  const { circuit, diagnostics } = elaborate(source.program, options.overrides === undefined ? {} : { overrides: options.overrides });
  if (!circuit || hasErrors(diagnostics)) throw new SourceError(diagnostics, source.sources);
  let wiring: Diagnostic[];
  try {
    wiring = checkTopology(circuit);
  } catch (error) {
    if (!isOnsetError(error)) throw error;
    wiring = [error.diagnostic];
  }
  if (hasErrors(wiring)) throw new SourceError([...wiring, ...diagnostics], source.sources);
  return { circuit, warnings: [...diagnostics, ...wiring] };
}
