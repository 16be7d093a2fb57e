import type { Program } from "./syntax.js";
import { sourceLimits, type SourceLimits } from "./source-limits.js";

/**
 * The limits a program was loaded with, so that elaborating it later (once per Monte Carlo
 * sample, by whichever caller) keeps the limits its author raised without passing them again.
 */
const loadedWith = new WeakMap<Program, Required<SourceLimits>>();

export function rememberLimits(program: Program, limits: Required<SourceLimits>): void {
  loadedWith.set(program, limits);
}

/** The program's limits: those given, else those it was loaded with, else the defaults. */
export function limitsOfProgram(program: Program, given?: SourceLimits): Required<SourceLimits> {
  if (given !== undefined) return sourceLimits(given);
  return loadedWith.get(program) ?? sourceLimits();
}
