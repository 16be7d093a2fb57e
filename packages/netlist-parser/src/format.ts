import type { Diagnostic } from "@onset/core";
import { hasErrors } from "./errors.js";
import { EACH } from "./keywords.js";
import { parseText } from "./parser.js";
import { printArg, printCriterion, printOption, printString, printValue } from "./print.js";
import type { Program, Statement } from "./syntax.js";
import type { Comment } from "./tokens.js";

/** One output line of a statement: aligned cells, then an unaligned tail (its options). */
interface Row {
  readonly cells: readonly string[];
  readonly tail: string;
}

type Item =
  | { readonly kind: "comment"; readonly text: string; readonly blankBefore: boolean }
  | {
      readonly kind: "statement";
      readonly statement: Statement;
      readonly trailing?: string;
      readonly blankBefore: boolean;
      /** For a block: the comments of its body and the one after its `end`. */
      readonly body?: Comment[];
      readonly endTrailing?: string;
    };

const INDENT = "  ";

function section(s: Statement): string {
  switch (s.kind) {
    case "part":
    case "use":
      return "circuit";
    case "analysis":
    case "spec":
      return "analysis";
    default:
      return s.kind;
  }
}

function rowOf(s: Statement): Row | undefined {
  switch (s.kind) {
    case "part":
      return { cells: [s.partKind, s.name, ...s.pins.map((p) => p.name), ...(s.value ? [printValue(s.value)] : [])], tail: s.options.map(printOption).join(" ") };
    case "use":
      return { cells: ["use", s.name, s.block, ...s.nodes.map((n) => n.name)], tail: s.params.map(printOption).join(" ") };
    case "param":
      return { cells: ["param", s.name, "=", printValue(s.value)], tail: s.each ? EACH : "" };
    default:
      return undefined;
  }
}

function lineText(s: Statement): string {
  switch (s.kind) {
    case "title":
      return `title ${printString(s.text)}`;
    case "include":
      return `include ${printString(s.path)}`;
    case "preset":
      return [`preset ${s.name} ${s.partKind}`, ...s.options.map(printOption)].join(" ");
    case "analysis":
      return [s.analysis, ...(s.target ? [s.target.name] : []), ...s.args.map(printArg)].join(" ");
    case "spec":
      return ["spec", ...s.criteria.map(printCriterion)].join(" ");
    case "block": {
      const params = s.params.map((p) => (p.value ? `${p.name}=${printValue(p.value)}` : p.name));
      return [`block ${s.name} (${s.ports.map((p) => p.name).join(", ")})`, ...params].join(" ");
    }
    default: {
      const r = rowOf(s)!;
      return [...r.cells, ...(r.tail ? [r.tail] : [])].join(" ");
    }
  }
}

/** Prints rows with each cell column as wide as its widest entry in the run. */
function alignRows(rows: readonly Row[]): string[] {
  const widths: number[] = [];
  for (const r of rows) r.cells.forEach((c, i) => (widths[i] = Math.max(widths[i] ?? 0, [...c].length)));
  return rows.map((r) => {
    const parts = r.cells.map((c, i) => (i < r.cells.length - 1 || r.tail ? c + " ".repeat(widths[i]! - [...c].length) : c));
    return (r.tail ? `${parts.join(" ")} ${r.tail}` : parts.join(" ")).trimEnd();
  });
}

class LineIndex {
  private readonly starts: number[] = [0];
  constructor(private readonly text: string) {
    for (let i = 0; i < text.length; i++) if (text.charCodeAt(i) === 10) this.starts.push(i + 1);
  }
  lineOf(offset: number): number {
    let lo = 0;
    let hi = this.starts.length - 1;
    while (lo < hi) {
      const mid = (lo + hi + 1) >> 1;
      if (this.starts[mid]! <= offset) lo = mid;
      else hi = mid - 1;
    }
    return lo;
  }
  blankBetween(from: number, to: number): boolean {
    return /\n[ \t\r]*\n/.test(this.text.slice(from, to));
  }
}

/** Removes and returns the comment that sits on the same line as `end`, after it. */
function takeTrailing(comments: Comment[], lines: LineIndex, end: number): string | undefined {
  const i = comments.findIndex((c) => c.start >= end && lines.lineOf(c.start) === lines.lineOf(Math.max(0, end - 1)));
  if (i < 0) return undefined;
  return comments.splice(i, 1)[0]!.text;
}

/** Sorts statements and the comments among them into items, in order. */
function itemsOf(statements: readonly Statement[], comments: Comment[], lines: LineIndex, from: number): Item[] {
  const items: Item[] = [];
  let cursor = from;
  const pushComment = (c: Comment) => {
    items.push({ kind: "comment", text: c.text, blankBefore: lines.blankBetween(cursor, c.start) });
    cursor = c.end;
  };
  for (const s of statements) {
    while (comments.length > 0 && comments[0]!.start < s.span.start) pushComment(comments.shift()!);
    const blankBefore = lines.blankBetween(cursor, s.span.start);
    if (s.kind === "block") {
      const trailing = takeTrailing(comments, lines, s.headerSpan.end);
      const endTrailing = takeTrailing(comments, lines, s.endSpan.end);
      const body: Comment[] = [];
      while (comments.length > 0 && comments[0]!.start < s.span.end) body.push(comments.shift()!);
      items.push({ kind: "statement", statement: s, blankBefore, body, ...(trailing ? { trailing } : {}), ...(endTrailing ? { endTrailing } : {}) });
      cursor = s.span.end;
      continue;
    }
    // Comments inside a statement that wraps over lines move above it.
    const lastLine = lines.lineOf(Math.max(s.span.start, s.span.end - 1));
    while (comments.length > 0 && comments[0]!.start < s.span.end && lines.lineOf(comments[0]!.start) < lastLine) {
      items.push({ kind: "comment", text: comments.shift()!.text, blankBefore: false });
    }
    const trailing = takeTrailing(comments, lines, s.span.end);
    items.push({ kind: "statement", statement: s, blankBefore, ...(trailing ? { trailing } : {}) });
    cursor = s.span.end;
  }
  while (comments.length > 0) pushComment(comments.shift()!);
  return items;
}

/** Marks where a section ends: before the comments that lead into a statement of another section. */
function sectionBreaks(items: readonly Item[]): boolean[] {
  const breaks = items.map(() => false);
  let previous: Statement | undefined;
  let gapStart = 0;
  items.forEach((item, i) => {
    if (item.kind !== "statement") return;
    const s = item.statement;
    if (previous && (section(previous) !== section(s) || previous.kind === "block" || s.kind === "block")) breaks[gapStart] = true;
    previous = s;
    gapStart = i + 1;
  });
  return breaks;
}

/** Lines of a list of statements and the comments among them. */
function formatBody(statements: readonly Statement[], comments: Comment[], lines: LineIndex, from: number, indent: string): string[] {
  const items = itemsOf(statements, [...comments].sort((a, b) => a.start - b.start), lines, from);
  const breaks = sectionBreaks(items);
  const out: string[] = [];
  let run: { rows: Row[]; slots: { at: number; trailing?: string }[]; kind: string } | undefined;
  const flush = () => {
    if (!run) return;
    const texts = alignRows(run.rows);
    // Trailing comments line up with each other, not with the longest line of the run.
    const width = Math.max(0, ...texts.filter((_, i) => run!.slots[i]!.trailing !== undefined).map((t) => [...t].length));
    run.slots.forEach((slot, i) => {
      const t = texts[i]!;
      out[slot.at] = indent + (slot.trailing ? `${t}${" ".repeat(width - [...t].length)}  ${slot.trailing}` : t);
    });
    run = undefined;
  };
  items.forEach((item, i) => {
    if (breaks[i] || item.blankBefore) {
      flush();
      if (out.length > 0 && out[out.length - 1] !== "") out.push("");
    }
    if (item.kind === "comment") {
      out.push(indent + item.text);
      return;
    }
    const s = item.statement;
    const row = rowOf(s);
    if (row) {
      if (run && run.kind !== s.kind) flush();
      run ??= { rows: [], slots: [], kind: s.kind };
      run.rows.push(row);
      run.slots.push(item.trailing ? { at: out.length, trailing: item.trailing } : { at: out.length });
      out.push("");
      return;
    }
    flush();
    const text = lineText(s);
    out.push(indent + (item.trailing ? `${text}  ${item.trailing}` : text));
    if (s.kind === "block") {
      const body = formatBody(s.body, item.body ?? [], lines, s.headerSpan.end, indent + INDENT);
      while (body.length > 0 && body[body.length - 1] === "") body.pop();
      while (body.length > 0 && body[0] === "") body.shift();
      out.push(...body, indent + (item.endTrailing ? `end  ${item.endTrailing}` : "end"));
    }
  });
  flush();
  return out;
}

/** Prints a parsed program in the canonical layout. */
export function formatProgram(program: Program): string {
  const lines = new LineIndex(program.text);
  const out = formatBody(program.statements, [...program.comments], lines, 0, "");
  while (out.length > 0 && out[out.length - 1] === "") out.pop();
  while (out.length > 0 && out[0] === "") out.shift();
  return out.length === 0 ? "" : `${out.join("\n")}\n`;
}

/**
 * Formats a file in the canonical layout: one statement per line, single spaces, the columns of
 * consecutive part (and param, and use) lines aligned, one blank line between sections, comments
 * kept, number spellings kept. Returns undefined text when the file has syntax errors.
 */
export function formatText(text: string, file = "<text>"): { text: string | undefined; diagnostics: Diagnostic[] } {
  const { program, diagnostics } = parseText(text, file);
  if (hasErrors(diagnostics)) return { text: undefined, diagnostics };
  return { text: formatProgram(program), diagnostics };
}
