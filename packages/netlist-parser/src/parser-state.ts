import type { Diagnostic, SourceSpan } from "@onset/core";
import { raise, type ProblemExtra } from "./errors.js";
import type { Span } from "./syntax.js";
import { describeToken, type Token, type TokenKind } from "./tokens.js";
import { raiseHint, SOURCE_LIMITS } from "./source-limits.js";

/** What bounds the parser's recursion: bracket depth, and operators per statement (see `SourceLimits`). */
export interface ExpressionLimits {
  readonly maxExpressionDepth: number;
  readonly maxOperators: number;
}

/** All the parser's state: the tokens, where it is, and what it has reported. */
export class ParserState {
  pos = 0;
  private depth = 0;
  private operators = 0;
  readonly diagnostics: Diagnostic[] = [];

  constructor(
    readonly tokens: readonly Token[],
    readonly file: string,
    private readonly limits: ExpressionLimits = SOURCE_LIMITS,
  ) {}

  peek(ahead = 0): Token {
    return this.tokens[Math.min(this.pos + ahead, this.tokens.length - 1)]!;
  }

  at(kind: TokenKind): boolean {
    return this.peek().kind === kind;
  }

  next(): Token {
    const t = this.peek();
    if (t.kind !== "eof") this.pos++;
    return t;
  }

  /** Consumes the next token when it has this kind. */
  eat(kind: TokenKind): Token | undefined {
    return this.at(kind) ? this.next() : undefined;
  }

  /** Consumes a token of this kind or reports what was expected. */
  expect(kind: TokenKind, what: string, hint?: string): Token {
    const t = this.peek();
    if (t.kind === kind) return this.next();
    return this.fail("expected", `expected ${what}, found ${describeToken(t)}`, t, hint === undefined ? {} : { hint });
  }

  /** True when the statement has ended (a line end or the end of the file). */
  atStatementEnd(): boolean {
    const k = this.peek().kind;
    return k === "newline" || k === "eof";
  }

  /** A source span in this file. */
  span(from: Span | Token, to: Span | Token = from): SourceSpan {
    return { file: this.file, start: from.start, end: Math.max(from.start, to.end) };
  }

  fail(code: string, message: string, where: Span | Token, extra: ProblemExtra = {}): never {
    return raise(code, message, this.span(where), extra);
  }

  /** Guards recursion in nested brackets and expressions. */
  nested<T>(where: Token, work: () => T): T {
    const max = this.limits.maxExpressionDepth;
    if (this.depth >= max) this.fail("too-deep", `brackets nest deeper than ${max} levels, past the expression-depth limit`, where, { hint: `split the expression with param lines, or ${raiseHint("maxExpressionDepth", String(2 * max))}` });
    this.depth++;
    try {
      return work();
    } finally {
      this.depth--;
    }
  }

  /** Counts one binary operator of the current statement; too many is reported. */
  operator(where: Token): void {
    const max = this.limits.maxOperators;
    if (++this.operators > max) this.fail("too-deep", `the statement holds more than ${max} operators, past the operators limit`, where, { hint: `split the expression with param lines, or ${raiseHint("maxOperators", String(2 * max))}` });
  }

  /** Starts the budget of a new statement. */
  startStatement(): void {
    this.operators = 0;
  }

  /** Skips to the end of the current statement (recovery after an error). */
  skipStatement(): void {
    while (!this.atStatementEnd()) this.next();
  }

  /** Skips blank lines. */
  skipNewlines(): void {
    while (this.eat("newline")) {
      /* blank line */
    }
  }

  /** True when `b` starts exactly where `a` ends (no space between). */
  static adjacent(a: Span | Token, b: Span | Token): boolean {
    return a.end === b.start;
  }
}

/** A span covering two nodes or tokens. */
export function cover(a: Span | Token, b: Span | Token): Span {
  return { start: a.start, end: Math.max(a.end, b.end) };
}

/** The plain offsets of a token or node (never the token object itself, so trees stay small). */
export function sp(t: Span | Token): Span {
  return { start: t.start, end: t.end };
}
