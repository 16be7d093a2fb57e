import { formatSI, withUnit, type SIFormatOptions } from "./si.js";
import { MINUS_SIGN } from "./symbols.js";

/**
 * A fraction as a percentage with `significant` digits: `formatPercent(0.0512)` → `5.12 %`.
 * Results carry fractions; this is where they become percent.
 */
export function formatPercent(fraction: number, significant = 4, options: SIFormatOptions = {}): string {
  return formatSI(fraction * 100, "%", significant, options);
}

/**
 * A level already in decibels, with a fixed number of decimals: `formatDecibel(-43.21, "dBc")`
 * → `−43.2 dBc`. Levels read best with fixed decimals rather than significant digits.
 *
 * @param decimals - digits after the point, 0 to 20. @defaultValue 1
 */
export function formatDecibel(level: number, unit: "dB" | "dBc" = "dB", decimals = 1): string {
  if (!(Number.isInteger(decimals) && decimals >= 0 && decimals <= 20)) {
    throw new RangeError(`formatDecibel: decimals must be an integer from 0 to 20, got ${decimals}`);
  }
  // toFixed turns scientific from 1e21 on; such levels are nonsense but must still print.
  if (!Number.isFinite(level) || Math.abs(level) >= 1e21) return formatSI(level, unit);
  const text = Math.abs(level).toFixed(decimals);
  const sign = level < 0 && Number(text) !== 0 ? MINUS_SIGN : "";
  return withUnit(sign + text, unit);
}

/** A plain number (a gain, a count, a ratio) with `significant` digits and no unit: `0.3333`. */
export function formatPlain(value: number, significant = 4, options: SIFormatOptions = {}): string {
  return formatSI(value, "", significant, options);
}
