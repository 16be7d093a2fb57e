import { isOnsetError, type Diagnostic, type SourceSpan } from "@onset/core";
import { madeProgram } from "./arguments.js";
import { problem } from "./errors.js";
import { capPerFile } from "./diagnostic-cap.js";
import { rememberLimits } from "./program-limits.js";
import { parseText } from "./parser.js";
import { exactSize, raiseHint, sourceLimits, tooLargeWords, utf8Length, type SourceLimits } from "./source-limits.js";
import type { IncludeStatement, Program, Statement } from "./syntax.js";

/** A source file as a reader returns it. */
export interface SourceText {
  /** The file's name as messages show it; two includes of one file must give the same name. */
  readonly file: string;
  readonly text: string;
}

/**
 * Reads included files for the loader, so the library itself does no file I/O: the caller
 * decides what an `include` may read. `fileReader` (`@onset/netlist-parser/node`) reads the
 * file system, confined to the top file's folder tree; a service can hand over a reader of
 * its own (files kept in a database, an in-memory map).
 */
export interface IncludeResolver {
  /**
   * Resolves `path` as written in `fromFile` and returns the file's name and text, or
   * undefined when there is no such file. A refusal is thrown as an `OnsetError` (its code and
   * message are reported at the include); `request.maxBytes` is the size limit, so a reader can
   * stop reading there.
   */
  resolve(fromFile: string, path: string, request?: { readonly maxBytes: number }): SourceText | undefined;
}

/** What {@link loadProgram} returns: the program with its includes, every source text, and every problem. */
export interface LoadedProgram {
  readonly program: Program;
  /** Every file read, by name, in load order (the top file first). */
  readonly sources: Map<string, string>;
  readonly diagnostics: Diagnostic[];
}

/** A `source-too-large` problem for a text already in memory. */
function tooLarge(file: string, bytes: number, limit: number, at: SourceSpan): Diagnostic {
  const { message, hint } = tooLargeWords(file, exactSize(bytes), limit);
  return problem("source-too-large", message, at, { hint });
}

/**
 * Parses a file and follows its includes through `resolver`. Each file is included once (a
 * second include of the same file name is skipped); an include that leads back to a file still
 * being read is an `include-cycle`; a file the resolver cannot find is `include-missing`; a
 * refusal of the resolver is reported with its own code. The {@link SourceLimits} bound the
 * size of each file (`source-too-large`), the include depth (`include-too-deep`) and the
 * number of files (`too-many-sources`).
 */
export function loadProgram(file: string, text: string, resolver?: IncludeResolver, limits: SourceLimits = {}): LoadedProgram {
  const max = sourceLimits(limits);
  const sources = new Map<string, string>();
  const diagnostics: Diagnostic[] = [];
  const done = new Set<string>();

  const load = (name: string, source: string, chain: readonly string[]): Program => {
    sources.set(name, source);
    done.add(name);
    const parsed = parseText(source, name, max);
    diagnostics.push(...parsed.diagnostics);
    const statements = parsed.program.statements.map((s): Statement => (s.kind === "include" ? follow(s, name, [...chain, name]) : s));
    return { ...parsed.program, statements };
  };

  const refuse = (s: IncludeStatement, d: Diagnostic): IncludeStatement => {
    diagnostics.push(d);
    return { ...s, repeated: true };
  };

  const follow = (s: IncludeStatement, from: string, chain: readonly string[]): IncludeStatement => {
    const at = { file: from, start: s.pathSpan.start, end: s.pathSpan.end };
    if (chain.length > max.maxIncludeDepth) {
      return refuse(
        s,
        problem("include-too-deep", `including '${s.path}' nests includes ${chain.length} deep, past the include-depth limit of ${max.maxIncludeDepth}`, at, {
          hint: raiseHint("maxIncludeDepth", String(Math.max(chain.length, 2 * max.maxIncludeDepth))),
          notes: [`include chain: ${chain.join(" → ")} → ${s.path}`],
        }),
      );
    }
    let found: SourceText | undefined;
    try {
      found = resolver?.resolve(from, s.path, { maxBytes: max.maxSourceBytes });
    } catch (error) {
      // The resolver is the caller's code: a refusal it raised keeps its code and words; anything
      // else it throws counts as missing.
      if (isOnsetError(error)) return refuse(s, { ...error.diagnostic, stage: "input", span: at });
      found = undefined;
    }
    if (!found || typeof found.file !== "string" || typeof found.text !== "string") {
      return refuse(
        s,
        problem("include-missing", `cannot find included file '${s.path}'`, at, {
          hint: resolver ? "the path is relative to the folder of the including file" : "includes are followed only when a resolver is given",
        }),
      );
    }
    if (chain.includes(found.file)) {
      return refuse(
        s,
        problem("include-cycle", `including '${s.path}' leads back to ${found.file === from ? "this file" : `'${found.file}'`}`, at, {
          hint: "move the shared definitions into a file that both include",
          notes: [`include chain: ${[...chain, found.file].join(" → ")}`],
        }),
      );
    }
    if (done.has(found.file)) return { ...s, repeated: true };
    if (sources.size >= max.maxSourceFiles) {
      return refuse(
        s,
        problem("too-many-sources", `including '${s.path}' would make ${sources.size + 1} source files, past the limit of ${max.maxSourceFiles}`, at, {
          hint: raiseHint("maxSourceFiles", String(2 * max.maxSourceFiles)),
        }),
      );
    }
    const bytes = utf8Length(found.text);
    if (bytes > max.maxSourceBytes) return refuse(s, tooLarge(found.file, bytes, max.maxSourceBytes, at));
    return { ...s, program: load(found.file, found.text, chain) };
  };

  const bytes = utf8Length(text);
  if (bytes > max.maxSourceBytes) {
    // Not parsed: the text is larger than the caller allowed any source to be.
    const empty = parseText("", file);
    return { program: empty.program, sources: new Map([[file, ""]]), diagnostics: [tooLarge(file, bytes, max.maxSourceBytes, { file, start: 0, end: 0 })] };
  }
  const program = madeProgram(load(file, text, []));
  rememberLimits(program, max);
  return { program, sources, diagnostics: capPerFile(diagnostics, max.maxDiagnostics) };
}
