import type { Diagnostic, SourceSpan } from "@onset/core";
import { problem } from "../errors.js";
import { lineColumnAt } from "../positions.js";
import type { AnalysisStatement, BlockStatement, PresetStatement, Program, Span, SpecStatement, Statement, TitleStatement } from "../syntax.js";

/** A statement with the file (and its text) it was written in. */
export interface Located<T> {
  readonly node: T;
  readonly file: string;
  readonly text: string;
}

/** What elaboration needs to know about a program before evaluating anything; computed once per program. */
export interface ProgramIndex {
  /** Top-level statements other than definitions, in file order, includes spliced in. */
  readonly statements: readonly Located<Statement>[];
  readonly blocks: ReadonlyMap<string, Located<BlockStatement>>;
  readonly presets: ReadonlyMap<string, Located<PresetStatement>>;
  readonly title?: Located<TitleStatement>;
  readonly analyses: readonly Located<AnalysisStatement | SpecStatement>[];
  /** Problems of the program's structure (duplicate definitions, includes not loaded). */
  readonly diagnostics: readonly Diagnostic[];
}

const cache = new WeakMap<Program, ProgramIndex>();

export function located<T>(node: T, file: string, text: string): Located<T> {
  return { node, file, text };
}

/** A source span of a node in a located file. */
export function spanIn(l: { file: string }, span: Span): SourceSpan {
  return { file: l.file, start: span.start, end: span.end };
}

/** `file:line` of an offset, for notes that point at a first definition. */
export function placeOf(l: { file: string; text: string }, span: Span): string {
  return `${l.file}:${lineColumnAt(l.text, span.start).line}`;
}

/** Indexes a program: blocks and presets by name, the title, the analyses, the rest in order. */
export function indexProgram(program: Program): ProgramIndex {
  const hit = cache.get(program);
  if (hit) return hit;
  const statements: Located<Statement>[] = [];
  const blocks = new Map<string, Located<BlockStatement>>();
  const presets = new Map<string, Located<PresetStatement>>();
  const analyses: Located<AnalysisStatement | SpecStatement>[] = [];
  const diagnostics: Diagnostic[] = [];
  let title: Located<TitleStatement> | undefined;

  const walk = (p: Program) => {
    for (const node of p.statements) {
      const l = located(node, p.file, p.text);
      switch (node.kind) {
        case "include":
          if (node.program) walk(node.program);
          else if (!node.repeated) {
            diagnostics.push(
              problem("include-missing", `included file '${node.path}' was not loaded`, spanIn(l, node.pathSpan), {
                hint: "load the file with loadProgram and an include resolver, so includes are followed",
              }),
            );
          }
          break;
        case "block": {
          const first = blocks.get(node.name);
          if (first) diagnostics.push(duplicate(`block '${node.name}'`, l, node.nameSpan, first, first.node.nameSpan));
          else blocks.set(node.name, located(node, p.file, p.text));
          break;
        }
        case "preset": {
          const first = presets.get(node.name);
          if (first) diagnostics.push(duplicate(`preset '${node.name}'`, l, node.nameSpan, first, first.node.nameSpan));
          else presets.set(node.name, located(node, p.file, p.text));
          break;
        }
        case "title":
          if (title) {
            diagnostics.push(
              problem("duplicate-title", "the program already has a title", spanIn(l, node.span), {
                hint: "keep one title line",
                notes: [`first title at ${placeOf(title, title.node.span)}`],
              }),
            );
          }
          else title = located(node, p.file, p.text);
          break;
        case "analysis":
        case "spec":
          analyses.push(located(node, p.file, p.text));
          break;
        default:
          statements.push(l);
      }
    }
  };
  walk(program);
  const index: ProgramIndex = title ? { statements, blocks, presets, title, analyses, diagnostics } : { statements, blocks, presets, analyses, diagnostics };
  cache.set(program, index);
  return index;
}

/** `'x' is already defined`, with a note at the first definition. */
export function duplicate(what: string, l: Located<unknown>, span: Span, first: { file: string; text: string }, firstSpan: Span): Diagnostic {
  return problem("duplicate-name", `${what} is already defined`, spanIn(l, span), {
    hint: "give each one its own name",
    notes: [`first defined at ${placeOf(first, firstSpan)}`],
  });
}
