const PREFIXES: ReadonlyArray<readonly [number, string]> = [
  [1e9, "G"],
  [1e6, "M"],
  [1e3, "k"],
  [1, ""],
  [1e-3, "m"],
  [1e-6, "µ"],
  [1e-9, "n"],
  [1e-12, "p"],
];

/** `value` with an SI prefix and four significant digits, for explanation lines: 1.581 kHz. */
export function formatQuantity(value: number, unit: string): string {
  if (value === 0 || !Number.isFinite(value)) return `${value} ${unit}`;
  const magnitude = Math.abs(value);
  const [scale, prefix] = PREFIXES.find(([s]) => magnitude >= s * 0.99995) ?? PREFIXES[PREFIXES.length - 1];
  return `${Number((value / scale).toPrecision(4))} ${prefix}${unit}`;
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
