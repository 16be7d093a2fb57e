import type { Diagnostic } from "@onset/core";
import { checkProgram, loadProgram, renderDiagnostic, type IncludeResolver, type Program } from "@onset/netlist-parser";

/** An include resolver over an in-memory folder tree (paths relative to the including file). */
export function memoryResolver(files: Readonly<Record<string, string>>): IncludeResolver {
  return {
    resolve(fromFile, path) {
      const dir = fromFile.includes("/") ? fromFile.slice(0, fromFile.lastIndexOf("/") + 1) : "";
      const parts: string[] = [];
      for (const seg of (dir + path).split("/")) {
        if (seg === "..") parts.pop();
        else if (seg !== "." && seg !== "") parts.push(seg);
      }
      const file = parts.join("/");
      const text = Object.hasOwn(files, file) ? files[file] : undefined;
      return text === undefined ? undefined : { file, text };
    },
  };
}

export interface ReportOptions {
  readonly warnings?: boolean;
  readonly file?: string;
  readonly files?: Record<string, string>;
}

/** What `onset check` finds in a one-file program (syntax errors stop before elaboration). */
export function diagnose(text: string, options: ReportOptions = {}): { diagnostics: Diagnostic[]; sources: Map<string, string> } {
  const file = options.file ?? "t.onset";
  const loaded = loadProgram(file, text, memoryResolver({ ...options.files, [file]: text }));
  const all = loaded.diagnostics.some((d) => d.severity === "error") ? loaded.diagnostics : [...loaded.diagnostics, ...checkProgram(loaded.program)];
  return { diagnostics: all.filter((d) => options.warnings || d.severity === "error"), sources: loaded.sources };
}

/** Everything `onset check` would print for a one-file program. */
export function report(text: string, options: ReportOptions = {}): string {
  const { diagnostics, sources } = diagnose(text, options);
  return diagnostics.map((d) => renderDiagnostic(d, sources)).join("\n\n");
}

/** A program's statements and comment texts without offsets, so layouts compare equal. */
export function shape(program: Program): unknown {
  return {
    statements: JSON.parse(JSON.stringify(program.statements), (key, v) => (key === "span" || key.endsWith("Span") ? undefined : v)),
    comments: program.comments.map((c) => c.text),
  };
}
