import { didYouMean, type SourceSpan } from "@onset/core";
import { isStackOverflow, raise } from "./errors.js";
import { formatSI } from "./format-number.js";
import type { Expr, Span } from "./syntax.js";

/** What an expression needs from its surroundings: the file, and the value of a parameter. */
export interface EvalContext {
  readonly file: string;
  /** The value of parameter `name`; raises when there is none. */
  param(name: string, span: SourceSpan): number;
}

/** The functions expressions may call, by name: [arity (−1 = one or more), function]. */
export const FUNCTIONS: Readonly<Record<string, readonly [number, (...args: number[]) => number]>> = {
  sqrt: [1, Math.sqrt],
  exp: [1, Math.exp],
  ln: [1, Math.log],
  log10: [1, Math.log10],
  sin: [1, Math.sin],
  cos: [1, Math.cos],
  tan: [1, Math.tan],
  atan: [1, Math.atan],
  abs: [1, Math.abs],
  min: [-1, Math.min],
  max: [-1, Math.max],
};

function at(ctx: EvalContext, span: Span): SourceSpan {
  return { file: ctx.file, start: span.start, end: span.end };
}

/**
 * Evaluates an expression with the language's own small evaluator: numbers, `pi`, parameters,
 * `+ - * / ^`, unary minus and the listed functions; nothing else is reachable. Units are not
 * tracked through arithmetic, so a unit symbol inside a compound expression is an error (`%` is
 * a plain hundredth and allowed).
 */
export function evaluate(expr: Expr, ctx: EvalContext): number {
  try {
    return evaluateNode(expr, ctx);
  } catch (e) {
    if (!isStackOverflow(e)) throw e;
    return raise("too-deep", "the expression is too deep to evaluate within this machine's stack", at(ctx, expr.span), {
      hint: "split the expression with param lines (or lower a raised operators or parameter-depth limit)",
    });
  }
}

function evaluateNode(expr: Expr, ctx: EvalContext): number {
  switch (expr.kind) {
    case "number": {
      const l = expr.literal;
      if (l.symbol !== undefined && l.form !== "percent") {
        raise("unit-in-expression", `unit '${l.unit}' inside an expression`, at(ctx, expr.span), {
          hint: `write ${l.mantissa}${l.prefix ?? ""} without the unit: units are checked where a value stands alone`,
        });
      }
      return l.value;
    }
    case "name": {
      if (expr.name === "pi") return Math.PI;
      if (expr.name.includes(".")) {
        raise("dotted-name", `'${expr.name}' cannot be used in an expression`, at(ctx, expr.span), {
          hint: "expressions read parameters by their plain names",
        });
      }
      return ctx.param(expr.name, at(ctx, expr.span));
    }
    case "unary":
      return -evaluateNode(expr.operand, ctx);
    case "group": {
      if (expr.items.length !== 1) {
        raise("unexpected-list", `a list of ${expr.items.length} items cannot be used as a number`, at(ctx, expr.span), {
          hint: "commas separate list items; inside an expression use one value per ( )",
        });
      }
      return evaluateNode(expr.items[0]!, ctx);
    }
    case "call":
      return call(expr, ctx);
    case "binary": {
      const a = evaluateNode(expr.left, ctx);
      const b = evaluateNode(expr.right, ctx);
      let r: number;
      switch (expr.op) {
        case "+":
          r = a + b;
          break;
        case "-":
          r = a - b;
          break;
        case "*":
          r = a * b;
          break;
        case "/":
          if (b === 0) raise("math-error", "division by zero", at(ctx, expr.span), { hint: "check the parameters used in the divisor" });
          r = a / b;
          break;
        case "^":
          r = Math.pow(a, b);
          break;
      }
      if (!Number.isFinite(r)) {
        raise("math-error", Number.isNaN(r) ? `${formatSI(a)} ${expr.op} ${formatSI(b)} is not a real number` : "the expression overflows", at(ctx, expr.span), {
          hint: "check the parameters in this expression",
        });
      }
      return r;
    }
  }
}

function call(expr: Extract<Expr, { kind: "call" }>, ctx: EvalContext): number {
  const name = expr.callee.name;
  const fn = FUNCTIONS[name];
  if (!fn) {
    raise("unknown-function", `unknown function '${name}'${didYouMean(name, Object.keys(FUNCTIONS))}`, at(ctx, expr.callee.span), {
      hint: `functions are ${Object.keys(FUNCTIONS).join(", ")}`,
    });
  }
  const [arity, f] = fn;
  if (arity >= 0 && expr.args.length !== arity) {
    raise("bad-arity", `${name}() takes ${arity} argument${arity === 1 ? "" : "s"}, got ${expr.args.length}`, at(ctx, expr.span), {
      hint: `write ${name}(x)`,
    });
  }
  const args = expr.args.map((a) => evaluateNode(a, ctx));
  const r = f(...args);
  if (!Number.isFinite(r)) {
    raise("math-error", `${name}(${args.map(formatSI).join(", ")}) is not a finite real number`, at(ctx, expr.span), {
      hint: "check the argument's range",
    });
  }
  return r;
}

/** The single literal an expression consists of, if any (through groups and unary minus). */
export function soleLiteral(expr: Expr): { literal: Extract<Expr, { kind: "number" }>["literal"]; negative: boolean; span: Span } | undefined {
  let negative = false;
  let e = expr;
  for (;;) {
    if (e.kind === "unary") {
      negative = !negative;
      e = e.operand;
    } else if (e.kind === "group" && e.items.length === 1) e = e.items[0]!;
    else break;
  }
  return e.kind === "number" ? { literal: e.literal, negative, span: e.span } : undefined;
}

/** The single name an expression consists of, if any (through groups). */
export function soleName(expr: Expr): { name: string; span: Span } | undefined {
  let e = expr;
  while (e.kind === "group" && e.items.length === 1) e = e.items[0]!;
  return e.kind === "name" ? { name: e.name, span: e.span } : undefined;
}

/** True for a plain number inside an expression (no unit; `%` is a plain hundredth). */
function plainNumber(expr: Expr): boolean {
  const lit = soleLiteral(expr);
  return lit !== undefined && (lit.literal.symbol === undefined || lit.literal.form === "percent");
}

/**
 * The one name an expression scales by plain numbers, if any — `(C)`, `(2*C)`, `(R/2)`, `(-R)`:
 * its value is in the same unit as the name's, so the name's unit can be read from the place.
 */
export function scaledName(expr: Expr): { name: string; span: Span } | undefined {
  switch (expr.kind) {
    case "name":
      return expr.name === "pi" ? undefined : { name: expr.name, span: expr.span };
    case "group":
      return expr.items.length === 1 ? scaledName(expr.items[0]!) : undefined;
    case "unary":
      return scaledName(expr.operand);
    case "binary":
      if (expr.op === "*") return plainNumber(expr.left) ? scaledName(expr.right) : plainNumber(expr.right) ? scaledName(expr.left) : undefined;
      if (expr.op === "/") return plainNumber(expr.right) ? scaledName(expr.left) : undefined;
      return undefined;
    default:
      return undefined;
  }
}
