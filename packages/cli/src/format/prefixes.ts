import { MICRO_SIGN } from "./symbols.js";

/** SI prefixes used in reports, from femto to tera, keyed by their power of ten. */
export const SI_PREFIXES: ReadonlyMap<number, string> = new Map([
  [-15, "f"],
  [-12, "p"],
  [-9, "n"],
  [-6, MICRO_SIGN],
  [-3, "m"],
  [0, ""],
  [3, "k"],
  [6, "M"],
  [9, "G"],
  [12, "T"],
]);

const SMALLEST_PREFIX = -15;
const LARGEST_PREFIX = 12;

// Units that read wrong with a prefix ("5 m%", "2 kdB") or have no unit at all.
const UNPREFIXED_UNITS: ReadonlySet<string> = new Set(["", "1", "%", "dB", "dBc", "\u00b0"]);

/** Whether a unit takes an SI prefix: V A Ω F H s Hz S … do; `%`, dB, `°` and plain numbers do not. */
export function takesPrefix(unit: string): boolean {
  return !UNPREFIXED_UNITS.has(unit);
}

/**
 * The power of ten (a multiple of 3 from −15 to 12) whose prefix suits a number written
 * `d.ddd × 10^decimalExponent`, so that 1 ≤ mantissa < 1000 whenever the table allows.
 */
export function prefixExponentFor(decimalExponent: number): number {
  const exponent = Math.floor(decimalExponent / 3) * 3;
  return Math.min(LARGEST_PREFIX, Math.max(SMALLEST_PREFIX, exponent));
}

/** The prefix exponent for a value (0 for zero and non-finite values). */
export function siPrefixExponent(value: number): number {
  if (!Number.isFinite(value) || value === 0) return 0;
  const decimalExponent = Number(Math.abs(value).toExponential().split("e")[1]);
  return prefixExponentFor(decimalExponent);
}

/** The prefix for a power of ten that is in {@link SI_PREFIXES}. */
export function prefixSymbol(exponent: number): string {
  const symbol = SI_PREFIXES.get(exponent);
  if (symbol === undefined) throw new RangeError(`prefixSymbol: no SI prefix for 10^${exponent}`);
  return symbol;
}
