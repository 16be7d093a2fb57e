import type { Diagnostic, UnitSymbol } from "@onset/core";
import { problem, raisedDiagnostic } from "./errors.js";
import { checkUnit, type NumberExpectation } from "./elaborate/value-checks.js";
import { tokenize } from "./lexer.js";
import { decodeNumber, isNumberProblem } from "./units.js";

/**
 * Reads a number in the language's syntax (`2.5k`, `33n`, `-12V`, `10%`, `106dB`, `inf` where
 * allowed) for a context expecting `expect`; returns the value in SI units or a diagnostic
 * without a span (the text came from a command line, not a file).
 */
export function parseQuantityWith(text: string, expect: NumberExpectation, where = "the value"): number | Diagnostic {
  const tokens = tokenize(text.trim(), "<value>").tokens.filter((t) => t.kind !== "eof");
  const bad = problem("bad-quantity", `${where}: '${text}' is not a number`, undefined, {
    hint: "write a number such as 2.5k, 33n, 10% or 106dB",
  });
  let i = 0;
  const negative = tokens[0]?.kind === "minus";
  if (negative) i++;
  const t = tokens[i];
  if (!t || i + 1 !== tokens.length) return bad;
  if (t.kind === "name") {
    if (t.text !== "inf") return bad;
    if (!expect.allowInfinite) return problem("out-of-range", `${where} cannot be infinite`, undefined, { hint: "write a finite number" });
    return negative ? -Infinity : Infinity;
  }
  if (t.kind !== "number") return bad;
  const literal = decodeNumber(t.text);
  if (isNumberProblem(literal)) return problem(literal.code, `${where}: ${literal.message}`, undefined, { hint: literal.hint });
  try {
    checkUnit(literal, expect, where, undefined);
  } catch (e) {
    const d = raisedDiagnostic(e);
    if (!d) throw e;
    const { span: _span, ...rest } = d;
    return rest;
  }
  return negative ? -literal.value : literal.value;
}

/**
 * Reads a command-line quantity such as `2.5k`, `33n`, `10%` or `106dB` for a value in `unit`
 * (`dB` is accepted for plain ratios); returns the number in SI units or a diagnostic.
 */
export function parseQuantity(text: string, unit: UnitSymbol, where?: string): number | Diagnostic {
  return parseQuantityWith(text, { unit, decibel: unit === "1" }, where);
}
