import { withPrefix } from "../units/si-prefix.js";

/** `value` with an SI prefix and four significant digits, for explanation lines: 1.581 kHz. */
export function formatQuantity(value: number, unit: string): string {
  if (value === 0 || !Number.isFinite(value)) return `${value} ${unit}`;
  // Beyond femto and tera a prefix would carry an exponent of its own (3.671e-18 fV).
  const magnitude = Math.abs(value);
  if (magnitude < 0.99995e-15 || magnitude >= 999.95e12) return `${value.toPrecision(4)} ${unit}`;
  const { mantissa, prefix } = withPrefix(value);
  return `${mantissa} ${prefix}${unit}`;
}

/** A fraction as a percentage with two significant digits (one decimal from 10 % up): 2.3 %. */
export function formatPercent(fraction: number, signed = false): string {
  const percent = 100 * fraction;
  const text = Math.abs(percent) >= 10 ? percent.toFixed(1) : percent.toPrecision(2);
  return `${signed && percent > 0 ? "+" : ""}${Number(text)} %`;
}

/** A growth rate in 1/s with three significant digits and no prefix: σ ≈ -150 /s. */
export function formatRate(rate: number): string {
  return `${Number(rate.toPrecision(3))} /s`;
}
