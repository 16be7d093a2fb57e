import { OnsetError, type Diagnostic, type Severity, type SourceSpan } from "@onset/core";

/** What a problem may carry besides its code, message and place. */
export interface ProblemExtra {
  readonly hint?: string;
  readonly notes?: readonly string[];
  readonly severity?: Severity;
}

/** Builds a diagnostic of the input stage (the user's file or command). */
export function problem(code: string, message: string, span: SourceSpan | undefined, extra: ProblemExtra = {}): Diagnostic {
  const d: { -readonly [K in keyof Diagnostic]: Diagnostic[K] } = {
    severity: extra.severity ?? "error",
    stage: "input",
    code,
    message,
  };
  if (span) d.span = span;
  if (extra.hint !== undefined) d.hint = extra.hint;
  if (extra.notes !== undefined && extra.notes.length > 0) d.notes = extra.notes;
  return d;
}

/**
 * A raised problem in flight. Not an `Error`: a statement with a problem is routine input, and
 * capturing a stack trace for each would dominate the cost of checking a faulty file.
 */
export class RaisedProblem {
  constructor(readonly diagnostic: Diagnostic) {}
}

/** The one way the language raises a problem: throws it as a typed value, caught per statement. */
export function raise(code: string, message: string, span: SourceSpan | undefined, extra: ProblemExtra = {}): never {
  throw new RaisedProblem(problem(code, message, span, extra));
}

/** The diagnostic a caught value carries: a raised problem, or an `OnsetError` from a device model. */
/**
 * True for the engine's "Maximum call stack size exceeded": a raised depth limit let recursion
 * run past the stack. No regular expression: compiling one this close to the stack's end fails.
 */
export function isStackOverflow(e: unknown): boolean {
  return e instanceof RangeError && e.message.includes("call stack");
}

export function raisedDiagnostic(e: unknown): Diagnostic | undefined {
  if (e instanceof RaisedProblem) return e.diagnostic;
  if (e instanceof OnsetError) return e.diagnostic.stage === "input" ? e.diagnostic : { ...e.diagnostic, stage: "input" };
  return undefined;
}

/**
 * Thrown when a statement cannot go on because of a problem that is already reported (a
 * parameter that failed to evaluate): the statement is skipped without a second message.
 */
export class AlreadyReported {
  readonly reason = "already reported";
}

/** True when any diagnostic is an error (warnings do not count). */
export function hasErrors(diagnostics: readonly Diagnostic[]): boolean {
  return diagnostics.some((d) => d.severity === "error");
}
