import type { Diagnostic } from "@onset/core";
import { problem } from "./errors.js";
import { parseText } from "./parser.js";
import type { IncludeStatement, Program, Statement } from "./syntax.js";

/** Finds included files for the caller, so the library itself does no file I/O. */
export interface IncludeResolver {
  /** Resolve `path` as written in `fromFile`; return the canonical file name and its text, or undefined if missing. */
  resolve(fromFile: string, path: string): { file: string; text: string } | undefined;
}

/**
 * Parses a file and follows its includes through `resolver`. Each file is included once (a
 * second include of the same canonical file is skipped); an include that leads back to a file
 * still being read is an `include-cycle`; a file the resolver cannot find is `include-missing`.
 */
export function loadProgram(file: string, text: string, resolver?: IncludeResolver): { program: Program; sources: Map<string, string>; diagnostics: Diagnostic[] } {
  const sources = new Map<string, string>();
  const diagnostics: Diagnostic[] = [];
  const done = new Set<string>();

  const load = (name: string, source: string, chain: readonly string[]): Program => {
    sources.set(name, source);
    done.add(name);
    const parsed = parseText(source, name);
    diagnostics.push(...parsed.diagnostics);
    const statements = parsed.program.statements.map((s): Statement => (s.kind === "include" ? follow(s, name, [...chain, name]) : s));
    return { ...parsed.program, statements };
  };

  const follow = (s: IncludeStatement, from: string, chain: readonly string[]): IncludeStatement => {
    const at = { file: from, start: s.pathSpan.start, end: s.pathSpan.end };
    let found: { file: string; text: string } | undefined;
    // The resolver is the caller's code: anything it throws or returns malformed counts as missing.
    try {
      found = resolver?.resolve(from, s.path);
    } catch {
      found = undefined;
    }
    if (!found || typeof found.file !== "string" || typeof found.text !== "string") {
      diagnostics.push(
        problem("include-missing", `cannot find included file '${s.path}'`, at, {
          hint: resolver ? "the path is relative to the folder of the including file" : "includes are followed only when a resolver is given",
        }),
      );
      return { ...s, repeated: true };
    }
    if (chain.includes(found.file)) {
      diagnostics.push(
        problem("include-cycle", `including '${s.path}' leads back to ${found.file === from ? "this file" : `'${found.file}'`}`, at, {
          hint: "move the shared definitions into a file that both include",
          notes: [`include chain: ${[...chain, found.file].join(" → ")}`],
        }),
      );
      return { ...s, repeated: true };
    }
    if (done.has(found.file)) return { ...s, repeated: true };
    return { ...s, program: load(found.file, found.text, chain) };
  };

  const program = load(file, text, []);
  return { program, sources, diagnostics };
}
