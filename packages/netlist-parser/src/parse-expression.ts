import { ParserState, cover, sp } from "./parser-state.js";
import type { Expr } from "./syntax.js";
import { decodeNumber, isNumberProblem, type NumberLiteral } from "./units.js";
import { describeToken, type Token } from "./tokens.js";

/** A number token decoded, or a positioned error. */
export function parseNumberToken(state: ParserState, token: Token): NumberLiteral {
  const literal = decodeNumber(token.text);
  if (isNumberProblem(literal)) return state.fail(literal.code, literal.message, token, { hint: literal.hint });
  return literal;
}

/** `( item, item, … )`: the contents of parentheses, one or more expressions. */
export function parseParenItems(state: ParserState): { items: Expr[]; open: Token; close: Token } {
  const open = state.expect("lparen", "'('");
  return state.nested(open, () => {
    const items = [parseExpression(state)];
    while (state.eat("comma")) items.push(parseExpression(state));
    const close = state.expect("rparen", "')' or ','", "every '(' needs its ')'");
    return { items, open, close };
  });
}

/** expression := term (('+' | '-') term)* */
export function parseExpression(state: ParserState): Expr {
  let left = parseTerm(state);
  for (;;) {
    const t = state.peek();
    if (t.kind !== "plus" && t.kind !== "minus") return left;
    state.next();
    state.operator(t);
    const right = parseTerm(state);
    left = { kind: "binary", op: t.kind === "plus" ? "+" : "-", left, right, span: cover(left.span, right.span) };
  }
}

/** term := unary (('*' | '/') unary)* */
function parseTerm(state: ParserState): Expr {
  let left = parseUnary(state);
  for (;;) {
    const t = state.peek();
    if (t.kind !== "star" && t.kind !== "slash") return left;
    state.next();
    state.operator(t);
    const right = parseUnary(state);
    left = { kind: "binary", op: t.kind === "star" ? "*" : "/", left, right, span: cover(left.span, right.span) };
  }
}

/** unary := '-' unary | power. Unary minus binds looser than `^`, so -2^2 is -4. */
function parseUnary(state: ParserState): Expr {
  const minus = state.eat("minus");
  if (!minus) return parsePower(state);
  return state.nested(minus, () => {
    const operand = parseUnary(state);
    return { kind: "unary", op: "-", operand, span: cover(minus, operand.span) };
  });
}

/** power := primary ('^' unary)?, right-associative. */
function parsePower(state: ParserState): Expr {
  const base = parsePrimary(state);
  const caret = state.eat("caret");
  if (!caret) return base;
  return state.nested(caret, () => {
    const exponent = parseUnary(state);
    return { kind: "binary", op: "^", left: base, right: exponent, span: cover(base.span, exponent.span) };
  });
}

/**
 * primary := number | name | name'(' args ')' | '(' items ')'. A call needs its `(` right after
 * the function name, so `[t0 (x)]` in a points list stays two items.
 */
export function parsePrimary(state: ParserState): Expr {
  const t = state.peek();
  if (t.kind === "number") {
    state.next();
    return { kind: "number", literal: parseNumberToken(state, t), span: sp(t) };
  }
  if (t.kind === "name") {
    state.next();
    const open = state.peek();
    if (open.kind === "lparen" && ParserState.adjacent(t, open)) {
      const { items, close } = parseParenItems(state);
      return { kind: "call", callee: { name: t.text, span: sp(t) }, args: items, span: cover(t, close) };
    }
    return { kind: "name", name: t.text, span: sp(t) };
  }
  if (t.kind === "lparen") {
    const { items, open, close } = parseParenItems(state);
    return { kind: "group", items, span: cover(open, close) };
  }
  return state.fail("expected", `expected a number, a name or '(', found ${describeToken(t)}`, t, {
    hint: "expressions use numbers, parameter names, + - * / ^, functions and parentheses",
  });
}
