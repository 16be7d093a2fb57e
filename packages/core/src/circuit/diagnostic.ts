/** A range of source text, as integer offsets into the file's text (end exclusive). */
export interface SourceSpan {
  readonly file: string;
  readonly start: number;
  readonly end: number;
}

/** An `error` stops the file from being used; a `warning` is reported and the work goes on. */
export type Severity = "error" | "warning";

/**
 * Where a problem was found: `input` problems are the user's file or command (exit status 2),
 * `simulation` problems arise while solving a valid file (exit status 3).
 */
export type Stage = "input" | "simulation";

/** One problem, as a value: a stable code, a sentence, where, and how to fix it. */
export interface Diagnostic {
  readonly severity: Severity;
  readonly stage: Stage;
  readonly code: string;
  readonly message: string;
  readonly span?: SourceSpan;
  readonly hint?: string;
  readonly notes?: readonly string[];
  /** The circuit part the diagnostic is about, by name (an `implausible-operation` warning's part). */
  readonly part?: string;
}

/** The one exception type the library throws; it carries its diagnostic. */
export class OnsetError extends Error {
  readonly diagnostic: Diagnostic;
  constructor(diagnostic: Diagnostic) {
    super(diagnostic.message);
    this.name = "OnsetError";
    this.diagnostic = diagnostic;
  }
}

/** True for an {@link OnsetError} (or one of its subclasses), the one error type the library throws on purpose. */
export function isOnsetError(value: unknown): value is OnsetError {
  return value instanceof OnsetError;
}

/** Raises an input error (bad circuit or options). */
export function inputError(
  code: string,
  message: string,
  extra: { span?: SourceSpan; hint?: string; notes?: readonly string[] } = {},
): OnsetError {
  return new OnsetError({ severity: "error", stage: "input", code, message, ...extra });
}

/** Raises a simulation error (the solver could not proceed on a valid circuit). */
export function simulationError(
  code: string,
  message: string,
  extra: { span?: SourceSpan; hint?: string; notes?: readonly string[] } = {},
): OnsetError {
  return new OnsetError({ severity: "error", stage: "simulation", code, message, ...extra });
}
