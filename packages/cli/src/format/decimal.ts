import { MINUS_SIGN } from "./symbols.js";

/**
 * A finite non-negative number as decimal digits: `value = d0.d1d2… × 10^exponent`.
 * Built from `toExponential`, whose rounding is exact on the binary value, so a carry such as
 * 999.96 → 1.000e3 has already moved the exponent.
 */
export interface Decimal {
  readonly digits: string;
  readonly exponent: number;
}

function parseExponential(text: string): Decimal {
  const [mantissa = "0", exponent = "0"] = text.split("e");
  return { digits: mantissa.replace(".", ""), exponent: Number(exponent) };
}

/** `|value|` rounded to `significant` digits (1–21). */
export function roundedDecimal(value: number, significant: number): Decimal {
  return parseExponential(Math.abs(value).toExponential(significant - 1));
}

/**
 * `|value|` with the fewest digits that give it back within a relative `tolerance`, so a tick
 * computed as 0.30000000000000004 prints as 0.3.
 */
export function shortestDecimal(value: number, tolerance: number): Decimal {
  const magnitude = Math.abs(value);
  for (let significant = 1; significant < 17; significant += 1) {
    const text = magnitude.toExponential(significant - 1);
    if (Math.abs(Number(text) - magnitude) <= tolerance * magnitude) return parseExponential(text);
  }
  return parseExponential(magnitude.toExponential(16));
}

function trimFraction(text: string): string {
  if (!text.includes(".")) return text;
  return text.replace(/0+$/, "").replace(/\.$/, "");
}

/**
 * The digits written out positionally after dividing by `10^shift`, e.g. digits "1320",
 * exponent −2, shift −3 → "13.20" (or "13.2" when trailing zeros are trimmed).
 */
export function positional(decimal: Decimal, shift: number, keepZeros: boolean): string {
  const { digits } = decimal;
  const integerCount = decimal.exponent - shift + 1;
  let text: string;
  if (integerCount <= 0) text = `0.${"0".repeat(-integerCount)}${digits}`;
  else if (integerCount >= digits.length) text = digits + "0".repeat(integerCount - digits.length);
  else text = `${digits.slice(0, integerCount)}.${digits.slice(integerCount)}`;
  return keepZeros ? text : trimFraction(text);
}

/** The digits in scientific notation, `1.23e−9`, with the project's minus sign. */
export function scientific(decimal: Decimal, keepZeros: boolean): string {
  const mantissa = positional({ digits: decimal.digits, exponent: 0 }, 0, keepZeros);
  const exponent = decimal.exponent < 0 ? `${MINUS_SIGN}${-decimal.exponent}` : `${decimal.exponent}`;
  return `${mantissa}e${exponent}`;
}
