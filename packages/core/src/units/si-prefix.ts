/** SI prefixes from tera to femto with their scale, largest first. */
export const SI_PREFIX_SCALES: ReadonlyArray<readonly [scale: number, prefix: string]> = [
  [1e12, "T"],
  [1e9, "G"],
  [1e6, "M"],
  [1e3, "k"],
  [1, ""],
  [1e-3, "m"],
  [1e-6, "µ"],
  [1e-9, "n"],
  [1e-12, "p"],
  [1e-15, "f"],
];

/**
 * The prefix that shows `value` with a mantissa from 1 to below 1000 at four significant
 * digits (a value that rounds up to 1000 takes the next prefix), and the mantissa so rounded.
 */
export function withPrefix(value: number): { mantissa: number; prefix: string } {
  const magnitude = Math.abs(value);
  const [scale, prefix] = SI_PREFIX_SCALES.find(([s]) => magnitude >= s * 0.99995) ?? SI_PREFIX_SCALES[SI_PREFIX_SCALES.length - 1]!;
  return { mantissa: Number((value / scale).toPrecision(4)), prefix };
}
