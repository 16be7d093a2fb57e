import { parseNumberToken, parseParenItems, parsePrimary } from "./parse-expression.js";
import { ParserState, cover, sp } from "./parser-state.js";
import type { Expr, Identifier, OptionNode, Tolerance, Value } from "./syntax.js";
import { describeToken } from "./tokens.js";

/** True when the next tokens start a value: a number, `-`, `(`, `[` or a word. */
export function atValueStart(state: ParserState): boolean {
  const k = state.peek().kind;
  return k === "number" || k === "minus" || k === "lparen" || k === "lbracket" || k === "name";
}

/** value := ['-'] number [tolerance] | ['-'] '(' items ')' [tolerance] | word ('-' word)* | points */
export function parseValue(state: ParserState, what = "a value"): Value {
  const first = state.peek();
  const minus = state.eat("minus");
  const t = state.peek();
  if (t.kind === "number") {
    state.next();
    const literal = parseNumberToken(state, t);
    const tolerance = parseTolerance(state);
    const base = { kind: "number", negative: minus !== undefined, literal, span: cover(first, tolerance ? tolerance.span : t) } as const;
    return tolerance ? { ...base, tolerance } : base;
  }
  if (t.kind === "lparen") {
    const { items, close } = parseParenItems(state);
    const tolerance = parseTolerance(state);
    const base = { kind: "paren", negative: minus !== undefined, items, span: cover(first, tolerance ? tolerance.span : close) } as const;
    return tolerance ? { ...base, tolerance } : base;
  }
  if (minus) return state.fail("expected", `expected a number or '(' after '-', found ${describeToken(t)}`, t);
  if (t.kind === "name") {
    // A word may have dashes, written without spaces like a key (`kick=power-on`).
    const word = parseKey(state, what);
    return { kind: "word", name: word.name, span: word.span };
  }
  if (t.kind === "lbracket") return parsePoints(state);
  return state.fail("expected", `expected ${what}, found ${describeToken(t)}`, t, {
    hint: "a value is a number such as 10k, an expression in ( ), a word, or a list in [ ]",
  });
}

/** tolerance := ('±' | '+-') (number | '(' expr ')'), with `+-` written without a space. */
function parseTolerance(state: ParserState): Tolerance | undefined {
  const start = state.peek();
  let ascii = false;
  if (start.kind === "plusminus") state.next();
  else if (start.kind === "plus" && state.peek(1).kind === "minus" && ParserState.adjacent(start, state.peek(1))) {
    state.next();
    state.next();
    ascii = true;
  } else return undefined;
  const t = state.peek();
  if (t.kind === "number") {
    state.next();
    return { ascii, value: { kind: "number", literal: parseNumberToken(state, t), span: sp(t) }, span: cover(start, t) };
  }
  if (t.kind === "lparen") {
    const { items, open, close } = parseParenItems(state);
    return { ascii, value: { kind: "paren", items, span: cover(open, close) }, span: cover(start, close) };
  }
  return state.fail("expected", `expected a tolerance after '${ascii ? "+-" : "±"}', found ${describeToken(t)}`, t, {
    hint: "write a relative tolerance such as ±1% or an absolute one such as ±2mV",
  });
}

/** points := '[' [row (',' row)*] ']', row := item item … with item := ['-'] primary. */
function parsePoints(state: ParserState): Value {
  const open = state.expect("lbracket", "'['");
  return state.nested(open, () => {
    const rows: Expr[][] = [];
    if (state.at("rbracket")) {
      const close = state.next();
      return { kind: "points", rows, span: cover(open, close) };
    }
    for (;;) {
      const row: Expr[] = [];
      while (!state.at("comma") && !state.at("rbracket")) {
        if (state.atStatementEnd()) state.fail("expected", "expected ']' to close the points list", state.peek(), { hint: "write points as [t0 v0, t1 v1, ...]" });
        const minus = state.eat("minus");
        const item = parsePrimary(state);
        row.push(minus ? { kind: "unary", op: "-", operand: item, span: cover(minus, item.span) } : item);
      }
      if (row.length === 0) state.fail("expected", `expected a point, found ${describeToken(state.peek())}`, state.peek(), { hint: "write points as [t0 v0, t1 v1, ...]" });
      rows.push(row);
      if (state.eat("comma")) continue;
      const close = state.expect("rbracket", "']'");
      return { kind: "points", rows, span: cover(open, close) };
    }
  });
}

/** key := name ('-' name)*, written without spaces (`max-step`, `per-decade`). */
export function parseKey(state: ParserState, what: string): Identifier {
  const first = state.expect("name", what);
  let name = first.text;
  let last = first;
  while (state.at("minus") && ParserState.adjacent(last, state.peek()) && state.peek(1).kind === "name" && ParserState.adjacent(state.peek(), state.peek(1))) {
    state.next();
    last = state.next();
    name += `-${last.text}`;
  }
  return { name, span: cover(first, last) };
}

/** True when the next tokens are `key=` (a key possibly with dashes). */
export function atOption(state: ParserState): boolean {
  let i = 0;
  if (state.peek(i).kind !== "name") return false;
  while (state.peek(i + 1).kind === "minus" && state.peek(i + 2).kind === "name") i += 2;
  return state.peek(i + 1).kind === "equals";
}

/** option := key '=' value */
export function parseOption(state: ParserState): OptionNode {
  const key = parseKey(state, "an option name");
  state.expect("equals", `'=' after '${key.name}'`, "options are written key=value, without spaces around =");
  const value = parseValue(state, `a value for ${key.name}=`);
  return { key: key.name, keySpan: key.span, value, span: cover(key.span, value.span) };
}

/** Options up to the end of the statement. */
export function parseOptions(state: ParserState): OptionNode[] {
  const options: OptionNode[] = [];
  while (!state.atStatementEnd()) {
    if (!atOption(state)) {
      const t = state.peek();
      state.fail("expected", `expected an option key=value, found ${describeToken(t)}`, t, { hint: "options are written key=value, e.g. at=0.5" });
    }
    options.push(parseOption(state));
  }
  return options;
}
