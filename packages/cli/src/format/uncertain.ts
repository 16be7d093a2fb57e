import { prefixSymbol, siPrefixExponent, takesPrefix } from "./prefixes.js";
import { formatSI, withUnit } from "./si.js";
import { MINUS_SIGN } from "./symbols.js";

/** Most digits after the point a value with an error bar is printed with. */
const MOST_DECIMALS = 12;

/**
 * A value with its error bar, the value's digits matching the bar's: `1.2239 V ± 0.0004 V`,
 * `2441.51 Hz ± 0.28 Hz`, `2.2445 % ± 0.0004 %` (a fraction, unit `1`, in percent). The bar
 * keeps two significant digits when it begins with 1 or 2, else one (common practice in
 * stating uncertainties); the value is rounded at the same decimal place; both share the
 * value's prefix. Without a usable bar the value is printed to 6 significant digits.
 */
export function formatWithError(value: number, error: number, unit: string): string {
  const percent = unit === "1";
  const shownUnit = percent ? "%" : unit;
  const scale = percent ? 100 : 1;
  if (!Number.isFinite(value)) return formatSI(value, shownUnit);
  if (!(error > 0) || !Number.isFinite(error)) return formatSI(value * scale, shownUnit, 6);
  const exponent = takesPrefix(shownUnit) ? siPrefixExponent(value) : 0;
  const factor = 10 ** exponent;
  const v = (value * scale) / factor;
  const e = (error * scale) / factor;
  const lead = Math.floor(Math.log10(e));
  const digits = Math.floor(e / 10 ** lead) <= 2 ? 2 : 1;
  const decimals = Math.min(MOST_DECIMALS, Math.max(0, digits - 1 - lead));
  const unitWithPrefix = (takesPrefix(shownUnit) ? prefixSymbol(exponent) : "") + shownUnit;
  const text = (x: number) => {
    const fixed = Math.abs(x).toFixed(decimals);
    return Number(fixed) === 0 || x >= 0 ? fixed : MINUS_SIGN + fixed;
  };
  return `${withUnit(text(v), unitWithPrefix)} ± ${withUnit(text(e), unitWithPrefix)}`;
}
