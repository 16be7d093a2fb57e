import { prefixSymbol, siPrefixExponent, takesPrefix } from "./prefixes.js";
import { formatSI, withUnit } from "./si.js";
import { MINUS_SIGN } from "./symbols.js";

/** Most digits after the point a value with an error bar is printed with. */
const MOST_DECIMALS = 12;
/** More decimals than this under a multiple's prefix (k, M, …) read better one prefix down. */
const PREFIXED_DECIMALS = 4;

/**
 * A value with its error bar, the value's digits matching the bar's: `1.2239 V ± 0.0004 V`,
 * `2441.51 Hz ± 0.28 Hz`, `2.2445 % ± 0.0004 %` (a fraction, unit `1`, in percent). The bar
 * keeps two significant digits when it begins with 1 or 2, else one (common practice in
 * stating uncertainties); the value is rounded at the same decimal place; both share the
 * value's prefix, one step smaller when a multiple's prefix would need more than four decimals. Without a usable bar the value is printed to 6 significant digits.
 */
export function formatWithError(value: number, error: number, unit: string): string {
  const percent = unit === "1";
  const shownUnit = percent ? "%" : unit;
  const scale = percent ? 100 : 1;
  if (!Number.isFinite(value)) return formatSI(value, shownUnit);
  if (!(error > 0) || !Number.isFinite(error)) return formatSI(value * scale, shownUnit, 6);
  let exponent = takesPrefix(shownUnit) ? siPrefixExponent(value) : 0;
  let decimals = decimalsFor((error * scale) / 10 ** exponent);
  // `2441.51 Hz ± 0.28 Hz`, not `2.44151 kHz ± 0.00028 kHz`; a value below its unit keeps its prefix.
  while (exponent > 0 && decimals > PREFIXED_DECIMALS) {
    exponent -= 3;
    decimals = decimalsFor((error * scale) / 10 ** exponent);
  }
  const factor = 10 ** exponent;
  const v = (value * scale) / factor;
  const e = (error * scale) / factor;
  const unitWithPrefix = (takesPrefix(shownUnit) ? prefixSymbol(exponent) : "") + shownUnit;
  const text = (x: number) => {
    const fixed = Math.abs(x).toFixed(decimals);
    return Number(fixed) === 0 || x >= 0 ? fixed : MINUS_SIGN + fixed;
  };
  return `${withUnit(text(v), unitWithPrefix)} ± ${withUnit(text(e), unitWithPrefix)}`;
}

/** Decimals that show a bar with two significant digits when it begins with 1 or 2, else one. */
function decimalsFor(bar: number): number {
  const lead = Math.floor(Math.log10(bar));
  const digits = Math.floor(bar / 10 ** lead) <= 2 ? 2 : 1;
  return Math.min(MOST_DECIMALS, Math.max(0, digits - 1 - lead));
}
