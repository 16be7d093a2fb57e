import type { Diagnostic } from "@onset/core";

/**
 * A problem the command reports and exits on: one or more diagnostics (the first is the one a
 * JSON error document names) and the source texts their spans point into.
 */
export class CliError extends Error {
  readonly diagnostics: readonly Diagnostic[];
  readonly sources: ReadonlyMap<string, string>;
  constructor(diagnostics: readonly Diagnostic[], sources: ReadonlyMap<string, string> = new Map()) {
    super(diagnostics[0]?.message ?? "error");
    this.name = "CliError";
    this.diagnostics = diagnostics;
    this.sources = sources;
  }
}

/** A command-line problem (exit status 2): no file position, a hint on how to fix it. */
export function usageError(code: string, message: string, hint?: string): CliError {
  const d: Diagnostic = { severity: "error", stage: "input", code, message, ...(hint === undefined ? {} : { hint }) };
  return new CliError([d]);
}
