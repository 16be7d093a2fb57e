import { OnsetError, type Diagnostic } from "@onset/core";
import { renderDiagnostic } from "./render.js";

/**
 * A circuit file that cannot be used as it is: every error found (and the warnings beside
 * them), with the source texts they point into, so `render()` can show each with its line and
 * caret. It is an `OnsetError` whose `diagnostic` is the first error.
 */
export class SourceError extends OnsetError {
  /** Every problem found, errors first. */
  readonly diagnostics: readonly Diagnostic[];
  /** The text of every file read, by name (what the spans point into). */
  readonly sources: ReadonlyMap<string, string>;

  constructor(diagnostics: readonly Diagnostic[], sources: ReadonlyMap<string, string>) {
    const errors = diagnostics.filter((d) => d.severity === "error");
    const ordered = [...errors, ...diagnostics.filter((d) => d.severity !== "error")];
    const first = ordered[0] ?? { severity: "error", stage: "input", code: "invalid", message: "the circuit is not valid" };
    super(errors.length > 1 ? { ...first, message: `${first.message} (and ${errors.length - 1} more error${errors.length > 2 ? "s" : ""})` } : first);
    this.name = "SourceError";
    this.diagnostics = ordered;
    this.sources = sources;
  }

  /** Every diagnostic as a terminal shows it (`file:line:col: error: …`, the line, a caret, the hint). */
  render(options: { color?: boolean } = {}): string {
    return this.diagnostics.map((d) => renderDiagnostic(d, this.sources, options)).join("\n\n");
  }
}
