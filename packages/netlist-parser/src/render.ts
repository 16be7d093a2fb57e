import type { Diagnostic } from "@onset/core";
import { codePointLength, lineBounds, lineColumnAt } from "./positions.js";

/** Where the renderer finds the text of a file named in a span (a Map works). */
export interface SourceFiles {
  get(file: string): string | undefined;
}

const RED = "\u001b[1;31m";
const YELLOW = "\u001b[1;33m";
const BOLD = "\u001b[1m";
const CYAN = "\u001b[36m";
const RESET = "\u001b[0m";

/**
 * Renders a diagnostic for a terminal:
 * `file:line:col: error: message`, the source line, a caret line under the span (`^~~~`),
 * `hint: …`, then `note: …` lines. Without a span (a command-line problem) the first line is
 * `error: message`. `color` colours the severity word only.
 */
export function renderDiagnostic(d: Diagnostic, sources: SourceFiles, options: { color?: boolean } = {}): string {
  const color = options.color ?? false;
  const severity = color ? `${d.severity === "error" ? RED : YELLOW}${d.severity}${RESET}` : d.severity;
  const lines: string[] = [];
  const text = d.span ? sources.get(d.span.file) : undefined;
  if (d.span && text !== undefined) {
    const { line, column } = lineColumnAt(text, d.span.start);
    const place = `${d.span.file}:${line}:${column}`;
    lines.push(`${color ? `${BOLD}${place}${RESET}` : place}: ${severity}: ${d.message}`);
    const bounds = lineBounds(text, d.span.start);
    const source = text.slice(bounds.start, bounds.end);
    lines.push(`  ${source}`);
    const start = Math.min(d.span.start, bounds.end);
    const end = Math.max(start, Math.min(d.span.end, bounds.end));
    // Tabs are kept in the caret line's padding, so the caret lines up under any tab width.
    const pad = [...text.slice(bounds.start, start)].map((c) => (c === "\t" ? "\t" : " ")).join("");
    const width = Math.max(1, codePointLength(text, start, end));
    const caret = `^${"~".repeat(width - 1)}`;
    lines.push(`  ${pad}${color ? `${CYAN}${caret}${RESET}` : caret}`);
  } else if (d.span) {
    lines.push(`${d.span.file}: ${severity}: ${d.message}`);
  } else {
    lines.push(`${severity}: ${d.message}`);
  }
  if (d.hint !== undefined) lines.push(`hint: ${d.hint}`);
  for (const note of d.notes ?? []) lines.push(`note: ${note}`);
  return lines.join("\n");
}
