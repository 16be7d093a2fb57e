const PREFIX_BY_EXPONENT: Readonly<Record<number, string>> = { [-15]: "f", [-12]: "p", [-9]: "n", [-6]: "u", [-3]: "m", 0: "", 3: "k", 6: "M", 9: "G", 12: "T" };

/** A number in engineering notation with an SI prefix, six significant digits: `10.7k`, `33n`. */
export function formatSI(value: number): string {
  if (Number.isNaN(value)) return "NaN";
  if (!Number.isFinite(value)) return value > 0 ? "inf" : "-inf";
  if (value === 0) return "0";
  let exponent = Math.floor(Math.log10(Math.abs(value)) / 3) * 3;
  exponent = Math.max(-15, Math.min(12, exponent));
  let mantissa = Number((value / Math.pow(10, exponent)).toPrecision(6));
  if (Math.abs(mantissa) >= 1000 && exponent < 12) {
    exponent += 3;
    mantissa = Number((value / Math.pow(10, exponent)).toPrecision(6));
  }
  return `${mantissa}${PREFIX_BY_EXPONENT[exponent]}`;
}

/** A value with its unit for messages: `-1k Ω`, `1.2` for a ratio. */
export function formatQuantity(value: number, unit: string | undefined): string {
  return unit === undefined || unit === "1" ? formatSI(value) : `${formatSI(value)} ${unit}`;
}
