import type { Diagnostic } from "@onset/core";
import { lineColumnAt, renderDiagnostic } from "@onset/netlist-parser";
import type { CliError } from "../cli-error.js";
import { EXIT } from "../exit.js";
import type { Json } from "../json/results.js";
import type { CommandContext } from "./context.js";

/** Exit status of an error: 3 when the simulation failed, 2 for anything wrong with the input. */
export function exitOf(error: CliError): number {
  return error.diagnostics.some((d) => d.stage === "simulation") ? EXIT.simulationFailed : EXIT.badInput;
}

/** Warnings on stderr (`file:line:col: warning: …` with the line and caret), unless quiet. */
export function renderWarnings(ctx: CommandContext, warnings: readonly Diagnostic[]): void {
  if (ctx.quiet) return;
  for (const w of warnings) ctx.io.stderr(`${renderDiagnostic(w, ctx.sources, { color: ctx.paintErr.isColorSupported })}\n`);
}

/** Every diagnostic of an error, rendered for a terminal: position, the line, a caret, the hint. */
export function renderError(error: CliError, ctx: CommandContext): string {
  const sources = error.sources.size > 0 ? error.sources : ctx.sources;
  return `${error.diagnostics.map((d) => renderDiagnostic(d, sources, { color: ctx.paintErr.isColorSupported })).join("\n")}\n`;
}

function place(d: Diagnostic, sources: ReadonlyMap<string, string>): { file: string | null; line: number | null; column: number | null } {
  if (!d.span) return { file: null, line: null, column: null };
  const text = sources.get(d.span.file);
  if (text === undefined) return { file: d.span.file, line: null, column: null };
  const { line, column } = lineColumnAt(text, d.span.start);
  return { file: d.span.file, line, column };
}

function diagnosticJson(d: Diagnostic, sources: ReadonlyMap<string, string>): Json {
  return { code: d.code, message: d.message, ...place(d, sources), severity: d.severity, stage: d.stage, hint: d.hint, notes: d.notes ? [...d.notes] : undefined };
}

/** The JSON error document: `{ "error": { code, message, file, line, column, … }, "diagnostics": [...], "exit" }`. */
export function errorDocument(error: CliError, ctx: CommandContext, exit: number): Json {
  const sources = error.sources.size > 0 ? error.sources : ctx.sources;
  const all = error.diagnostics.map((d) => diagnosticJson(d, sources));
  return { error: all[0] ?? { code: "error", message: error.message, file: null, line: null, column: null }, diagnostics: all, exit };
}
