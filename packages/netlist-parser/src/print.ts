import type { AnalysisArg, CriterionNode, Expr, OptionNode, Tolerance, Value } from "./syntax.js";

/** Prints an expression from its tree; explicit groups keep the written parentheses. */
export function printExpr(e: Expr): string {
  switch (e.kind) {
    case "number":
      return e.literal.text;
    case "name":
      return e.name;
    case "unary":
      return `-${printExpr(e.operand)}`;
    case "binary":
      return `${printExpr(e.left)}${e.op}${printExpr(e.right)}`;
    case "call":
      return `${e.callee.name}(${e.args.map(printExpr).join(", ")})`;
    case "group":
      return `(${e.items.map(printExpr).join(", ")})`;
  }
}

function printTolerance(t: Tolerance | undefined): string {
  if (!t) return "";
  const v = t.value.kind === "number" ? t.value.literal.text : `(${t.value.items.map(printExpr).join(", ")})`;
  return `${t.ascii ? "+-" : "±"}${v}`;
}

/** Prints a value as written: numbers keep their spelling (`10.7k` stays `10.7k`). */
export function printValue(v: Value): string {
  switch (v.kind) {
    case "number":
      return `${v.negative ? "-" : ""}${v.literal.text}${printTolerance(v.tolerance)}`;
    case "paren":
      return `${v.negative ? "-" : ""}(${v.items.map(printExpr).join(", ")})${printTolerance(v.tolerance)}`;
    case "word":
      return v.name;
    case "points":
      return `[${v.rows.map((row) => row.map(printExpr).join(" ")).join(", ")}]`;
  }
}

export function printOption(o: OptionNode): string {
  return `${o.key}=${printValue(o.value)}`;
}

export function printArg(a: AnalysisArg): string {
  return a.kind === "flag" ? a.name : printOption(a);
}

export function printCriterion(c: CriterionNode): string {
  const low = printValue(c.value);
  if (!c.high) return `${c.metric}${c.op}${low}`;
  // `3...5` would lex as `3` `..` `.5`: keep a number ending in "." apart from the range.
  return `${c.metric}=${low}${low.endsWith(".") ? " " : ""}..${printValue(c.high)}`;
}

/** A string literal with `"` and `\` escaped. */
export function printString(s: string): string {
  return `"${s.replace(/\\/g, "\\\\").replace(/"/g, '\\"')}"`;
}
