/**
 * The characters every formatted number in Onset uses, in one place so reports, tables and
 * plots agree.
 *
 * @remarks
 * `µ` is U+00B5 MICRO SIGN, the one the circuit language accepts. Negative numbers carry
 * U+2212 MINUS SIGN: it is as wide as a digit in most fonts, so columns and axis labels line
 * up, and formatted text (which puts a space before the unit) is never fed back to the
 * parser anyway. A value that is not a number prints as an em dash.
 */
export const MICRO_SIGN = "\u00b5";
/** U+2212 MINUS SIGN, used for every negative formatted number. */
export const MINUS_SIGN = "\u2212";
/** Printed for NaN (an undefined measurement). */
export const NOT_A_NUMBER = "\u2014";
/** Printed, with its sign and unit, for ±Infinity. */
export const INFINITY_SIGN = "\u221e";
