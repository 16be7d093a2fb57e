import { positional, roundedDecimal, scientific, shortestDecimal, type Decimal } from "./decimal.js";
import { prefixExponentFor, prefixSymbol, takesPrefix } from "./prefixes.js";
import { INFINITY_SIGN, MINUS_SIGN, NOT_A_NUMBER } from "./symbols.js";

/** Options of {@link formatSI}. */
export interface SIFormatOptions {
  /**
   * `"trim"` drops trailing zeros after the point (`4.73 V`, `47 nF`); `"keep"` prints exactly
   * `significant` digits (`4.730 V`, `47.00 nF`) so table columns line up.
   * @defaultValue `"trim"`
   */
  readonly zeros?: "trim" | "keep";
}

// Relative slack when looking for the shortest label of a computed tick value.
const TICK_TOLERANCE = 1e-9;

// How far a mantissa may run before scientific notation reads better: with a prefix, from
// 0.00ddd (below femto) to dddddd (above tera); without one, from 10^−6 to 10^9.
function fitsPositional(decimal: Decimal, shift: number, prefixed: boolean): boolean {
  const integerCount = decimal.exponent - shift + 1;
  return prefixed ? integerCount >= -2 && integerCount <= 6 : integerCount >= -5 && integerCount <= 10;
}

/**
 * Joins a number and its unit: a space before the unit (ISO 80000-1), none before `°`, and
 * nothing for the empty unit or `1` (dimensionless).
 */
export function withUnit(number: string, unit: string): string {
  if (unit === "" || unit === "1") return number;
  if (unit === "\u00b0") return `${number}${unit}`;
  return `${number} ${unit}`;
}

function nonFinite(value: number, unit: string): string {
  if (Number.isNaN(value)) return NOT_A_NUMBER;
  return withUnit(`${value < 0 ? MINUS_SIGN : ""}${INFINITY_SIGN}`, unit);
}

function write(negative: boolean, decimal: Decimal, unit: string, shift: number | undefined, keepZeros: boolean): string {
  const prefixed = takesPrefix(unit);
  const exponent = prefixed ? (shift ?? prefixExponentFor(decimal.exponent)) : 0;
  const sign = negative ? MINUS_SIGN : "";
  if (!fitsPositional(decimal, exponent, prefixed)) {
    return withUnit(sign + scientific(decimal, keepZeros), unit);
  }
  const prefix = prefixed ? prefixSymbol(exponent) : "";
  return withUnit(sign + positional(decimal, exponent, keepZeros), prefix + unit);
}

function checkSignificant(api: string, significant: number): void {
  if (!(Number.isInteger(significant) && significant >= 1 && significant <= 21)) {
    throw new RangeError(`${api}: significant must be an integer from 1 to 21, got ${significant}`);
  }
}

/**
 * A value in SI base units as text with an SI prefix, rounded to `significant` digits:
 * `formatSI(0.0132, "s")` → `13.2 ms`, `formatSI(2200, "Ω")` → `2.2 kΩ`,
 * `formatSI(-0.0015, "A")` → `−1.5 mA`, `formatSI(999.96, "V")` → `1 kV`.
 *
 * @remarks
 * Rounding happens before the prefix is chosen, so a carry moves to the next prefix instead
 * of printing `1000 V`. Prefixes run from f to T; beyond them the mantissa grows
 * (`0.0015 fF`) and then turns scientific (`1e−25 F`). Units `%`, `dB`, `dBc`, `°`, `1` and
 * the empty unit take no prefix. Zero prints as `0 V`, NaN as `—`, Infinity as `∞ V`.
 * Negative numbers use U+2212 MINUS SIGN (see {@link MINUS_SIGN}).
 *
 * @param significant - significant digits, 1 to 21. @defaultValue 4
 */
export function formatSI(value: number, unit: string, significant = 4, options: SIFormatOptions = {}): string {
  checkSignificant("formatSI", significant);
  if (!Number.isFinite(value)) return nonFinite(value, unit);
  const keepZeros = options.zeros === "keep";
  if (value === 0) return withUnit(keepZeros && significant > 1 ? `0.${"0".repeat(significant - 1)}` : "0", unit);
  return write(value < 0, roundedDecimal(value, significant), unit, undefined, keepZeros);
}

/**
 * The shortest label that states an axis tick exactly: `0`, `2 ms`, `2.5 ms`, `10 kHz`.
 * "Exactly" allows a relative 10⁻⁹, so float noise in a computed tick (0.30000000000000004)
 * does not lengthen the label. Zero is written bare. `prefixExponent` (a multiple of 3 from −15 to 12) forces one prefix
 * for every tick of an axis (`0.5 ms`, `1 ms`, `1.5 ms`); by default each tick picks its own.
 */
export function formatTickSI(value: number, unit: string, prefixExponent?: number): string {
  if (!Number.isFinite(value)) return nonFinite(value, unit);
  if (value === 0) return "0";
  return write(value < 0, shortestDecimal(value, TICK_TOLERANCE), unit, prefixExponent, false);
}
