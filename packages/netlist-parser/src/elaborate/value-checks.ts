import type { SourceSpan, UnitSymbol } from "@onset/core";
import { raise } from "../errors.js";
import { formatQuantity } from "../format-number.js";
import { unitMismatch, unitName, unitSuffix, type NumberLiteral, type UnitExpectation } from "../units.js";

/** What a numeric context accepts. */
export interface NumberExpectation extends UnitExpectation {
  readonly allowInfinite?: boolean;
}

/** Range rules of a number (the schema's). */
export interface RangeRule {
  readonly min?: number;
  readonly minExclusive?: boolean;
  readonly max?: number;
  readonly integer?: boolean;
}

/** `is in ohms (Ω)`, or `is a plain ratio`. */
export function isIn(unit: UnitSymbol): string {
  return unit === "1" ? "is a plain ratio" : `is in ${unitName(unit)}`;
}

function formName(literal: NumberLiteral): string {
  switch (literal.form) {
    case "percent":
      return "percent";
    case "decibel":
      return "decibels";
    case "degree":
      return "degrees";
    case "si":
      return unitName(literal.symbol!);
  }
}

/** Raises `unit-mismatch` when a literal's unit does not fit. */
export function checkUnit(literal: NumberLiteral, expect: NumberExpectation, what: string, span: SourceSpan | undefined): void {
  const reason = unitMismatch(literal, expect);
  if (reason === undefined) return;
  const plain = `${literal.mantissa}${literal.prefix ?? ""}`;
  const exp = expect.unit!;
  const suffix = unitSuffix(exp);
  const hint =
    exp === "1"
      ? `write a plain number such as ${plain}${expect.decibel ? ", a percentage or a gain in dB" : " or a percentage"}`
      : `write ${plain} or ${plain}${suffix}`;
  raise("unit-mismatch", `unit mismatch: '${literal.text}' is in ${formName(literal)}, but ${what} ${isIn(exp)}`, span, { hint });
}

/**
 * The magnitudes a value may have besides 0: below 1e-300 a number is (nearly) subnormal and
 * loses its precision in the first product, above 1e300 its square overflows. Both would
 * surface far from the option as a singular matrix or an infinity, so they are refused here.
 */
export const SMALLEST_VALUE = 1e-300;
export const LARGEST_VALUE = 1e300;

/** Raises `unrepresentable` for a nonzero finite value outside [{@link SMALLEST_VALUE}, {@link LARGEST_VALUE}]. */
export function refuseUnrepresentable(v: number, unit: UnitSymbol | undefined, what: string, span: SourceSpan | undefined): void {
  const size = Math.abs(v);
  if (v === 0 || !Number.isFinite(v) || (size >= SMALLEST_VALUE && size <= LARGEST_VALUE)) return;
  const small = size < SMALLEST_VALUE;
  raise("unrepresentable", `${what} is ${v}${unit === undefined || unit === "1" ? "" : ` ${unit}`}, too ${small ? "small" : "large"} to compute with (nonzero values lie between 1e-300 and 1e300 in size)`, span, {
    hint: small ? "write 0, or a value of at least 1e-300" : "write a value of at most 1e300 (or inf where the option takes it)",
  });
}

/** Raises `out-of-range` or `not-integer` when `v` breaks the rule. */
export function checkRange(v: number, rule: RangeRule, unit: UnitSymbol | undefined, what: string, span: SourceSpan | undefined, hint?: string): void {
  const extra = hint === undefined ? {} : { hint };
  if (rule.integer && Number.isFinite(v) && !Number.isInteger(v)) {
    raise("not-integer", `${what} must be a whole number, got ${formatQuantity(v, unit)}`, span, extra);
  }
  refuseUnrepresentable(v, unit, what, span);
  const { min, max } = rule;
  const belowMin = min !== undefined && (rule.minExclusive ? !(v > min) : !(v >= min));
  const aboveMax = max !== undefined && !(v <= max);
  if (!belowMin && !aboveMax) return;
  // A count reads as digits (100000, not 100k; 1e9 read as 1G would look like a quantity).
  const shown = (x: number) => (rule.integer && (unit === undefined || unit === "1") && Math.abs(x) < 1e21 ? String(x) : formatQuantity(x, unit));
  let rangeText: string;
  if (min !== undefined && max !== undefined) rangeText = rule.minExclusive ? `greater than ${shown(min)} and at most ${shown(max)}` : `between ${shown(min)} and ${shown(max)}`;
  else if (min !== undefined) rangeText = `${rule.minExclusive ? "greater than" : "at least"} ${shown(min)}`;
  else rangeText = `at most ${shown(max!)}`;
  raise("out-of-range", `${what} must be ${rangeText}, got ${shown(v)}`, span, extra);
}
