import { withPrefix } from "../units/si-prefix.js";
import { checkFinite, checkFunction, checkPositive, checkSeries, positiveResults } from "./design-arguments.js";
import { E_SERIES, snapToSeries, type SeriesName } from "./eseries.js";

/** A value as written in a circuit file: up to four significant digits and an SI prefix (`13.7k`, `4.7n`). */
export function writeValue(value: number): string {
  checkFinite("writeValue", "value", value);
  if (value === 0) return "0";
  const { mantissa, prefix } = withPrefix(value);
  // The language also accepts µ; u keeps generated files plain ASCII.
  return `${mantissa}${prefix === "µ" ? "u" : prefix}`;
}

/** The impedance level resistors are aimed at when the capacitor is free (common practice). */
export const TARGET_RESISTANCE = 10e3;
/** The band the resistors may land in: large next to an op-amp's output resistance, small next to its input resistance. */
export const RESISTANCE_BAND: readonly [number, number] = [2e3, 50e3];

/**
 * A capacitor from the E6 decade values (100 pF … 1 µF) for which the resistor the formula
 * asks for lies between 2 kΩ and 50 kΩ and, once snapped to `series`, lands the formula's
 * frequency nearest the target; among near-equal choices (within 0.1 %) the one whose resistor
 * is nearest 10 kΩ.
 */
export function chooseCapacitor(
  resistanceFor: (c: number) => number,
  frequencyWith: (r: number, c: number) => number,
  target: number,
  series: SeriesName,
): number {
  checkFunction("chooseCapacitor", "resistanceFor", resistanceFor);
  checkFunction("chooseCapacitor", "frequencyWith", frequencyWith);
  checkPositive("chooseCapacitor", "target", target);
  checkSeries("chooseCapacitor", series);
  const idealFor = positiveResults("chooseCapacitor", "resistanceFor", resistanceFor);
  const frequency = positiveResults("chooseCapacitor", "frequencyWith", frequencyWith);
  let best = { c: 10e-9, error: Infinity, distance: Infinity };
  for (let decade = -10; decade <= -7; decade++) {
    for (const m of E_SERIES.E6) {
      const c = Number((m * Math.pow(10, decade)).toPrecision(12));
      const ideal = idealFor(c);
      if (ideal < RESISTANCE_BAND[0] || ideal > RESISTANCE_BAND[1]) continue;
      const error = Math.abs(frequency(snapToSeries(ideal, series), c) / target - 1);
      const distance = Math.abs(Math.log(ideal / TARGET_RESISTANCE));
      if (error < best.error - 1e-3 || (Math.abs(error - best.error) <= 1e-3 && distance < best.distance)) best = { c, error, distance };
    }
  }
  return best.c;
}

/**
 * Values of `series` from `from` upwards in steps of about a twelfth of a decade (whatever the
 * series' own spacing), `count` of them: a search that reaches far quickly.
 */
export function seriesUpwards(from: number, series: SeriesName, count: number): number[] {
  const values: number[] = [];
  for (let k = 0; values.length < count && k < 4 * count; k++) {
    const v = snapToSeries(from * Math.pow(10, k / 12), series);
    if (values.length === 0 || v > values[values.length - 1]!) values.push(v);
  }
  return values;
}
