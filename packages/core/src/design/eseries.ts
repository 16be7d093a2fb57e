import { badArgument, describe } from "../circuit/arguments.js";
import { inputError } from "../circuit/diagnostic.js";

/**
 * IEC 60063 preferred-number series, one decade each, stored as tables: E12 and E24 do not
 * follow the rounding formula round(10^(i/n), 1) (eight E24 positions differ; docs/references.md §1).
 */
export const E_SERIES = {
  E6: [1.0, 1.5, 2.2, 3.3, 4.7, 6.8],
  E12: [1.0, 1.2, 1.5, 1.8, 2.2, 2.7, 3.3, 3.9, 4.7, 5.6, 6.8, 8.2],
  E24: [1.0, 1.1, 1.2, 1.3, 1.5, 1.6, 1.8, 2.0, 2.2, 2.4, 2.7, 3.0, 3.3, 3.6, 3.9, 4.3, 4.7, 5.1, 5.6, 6.2, 6.8, 7.5, 8.2, 9.1],
  E96: [
    1.0, 1.02, 1.05, 1.07, 1.1, 1.13, 1.15, 1.18, 1.21, 1.24, 1.27, 1.3, 1.33, 1.37, 1.4, 1.43, 1.47, 1.5, 1.54, 1.58, 1.62, 1.65, 1.69,
    1.74, 1.78, 1.82, 1.87, 1.91, 1.96, 2.0, 2.05, 2.1, 2.15, 2.21, 2.26, 2.32, 2.37, 2.43, 2.49, 2.55, 2.61, 2.67, 2.74, 2.8, 2.87,
    2.94, 3.01, 3.09, 3.16, 3.24, 3.32, 3.4, 3.48, 3.57, 3.65, 3.74, 3.83, 3.92, 4.02, 4.12, 4.22, 4.32, 4.42, 4.53, 4.64, 4.75, 4.87,
    4.99, 5.11, 5.23, 5.36, 5.49, 5.62, 5.76, 5.9, 6.04, 6.19, 6.34, 6.49, 6.65, 6.81, 6.98, 7.15, 7.32, 7.5, 7.68, 7.87, 8.06, 8.25,
    8.45, 8.66, 8.87, 9.09, 9.31, 9.53, 9.76,
  ],
} as const satisfies Record<string, readonly number[]>;

/** The name of an IEC 60063 series the designer knows: `E6`, `E12`, `E24`, `E96`. */
export type SeriesName = keyof typeof E_SERIES;

/** True when `name` is one of the IEC 60063 series the designer knows. */
export function isSeriesName(name: string): name is SeriesName {
  return typeof name === "string" && Object.prototype.hasOwnProperty.call(E_SERIES, name);
}

/**
 * The series value nearest to `x` in the log sense: the one minimising |ln(x/v)| over the
 * decades below, at and above x, so the boundary between neighbours a < b is √(ab), not
 * (a + b)/2. IEC 60063 gives no snapping rule; nearest-in-log is the natural one for a
 * geometric series and is Onset's documented choice.
 */
export function snapToSeries(x: number, series: SeriesName): number {
  if (!isSeriesName(series)) throw badArgument(`snapToSeries: series must be E6, E12, E24 or E96, got ${describe(series)}`);
  if (typeof x !== "number" || !(x > 0) || !Number.isFinite(x)) {
    throw inputError("out-of-range", `cannot snap ${describe(x)} to ${series}: values must be positive and finite`);
  }
  const table = E_SERIES[series];
  const decade = Math.floor(Math.log10(x));
  let best = x;
  let bestDistance = Infinity;
  for (let d = decade - 1; d <= decade + 1; d++) {
    const scale = Math.pow(10, d);
    for (const mantissa of table) {
      // Round away the binary noise of mantissa·10^d (0.1 is not exact in binary).
      const v = Number((mantissa * scale).toPrecision(12));
      const distance = Math.abs(Math.log(x / v));
      if (distance < bestDistance) {
        bestDistance = distance;
        best = v;
      }
    }
  }
  return best;
}
