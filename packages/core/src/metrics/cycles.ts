import type { CrossingList } from "./crossings.js";
import { cubicOnInterval, cubicScratch, cubicStationaryPoints, cubicValue } from "./local-cubic.js";

/**
 * The complete cycles between consecutive rising crossings, with each cycle's extremes refined
 * on the local cubic. Cycle k runs from `start[k]` to `start[k+1]`.
 */
export interface CycleTable {
  readonly count: number;
  /** Crossing times; `count + 1` of them. */
  readonly start: Float64Array;
  readonly maximum: Float64Array;
  readonly minimum: Float64Array;
  /** Per-cycle envelope (maximum − minimum)/2, V. */
  readonly envelope: Float64Array;
  /** Midpoint of each cycle, the time its envelope value is plotted and fitted at. */
  readonly midTime: Float64Array;
}

/** How far below its inner neighbour each outer node of a cap must lie, relative to their span. */
const CAP_MARGIN = 1e-4;

/**
 * Largest (`sign` = 1) or smallest (`sign` = −1) value of the piecewise cubic near sample `k`,
 * over the intervals either side of it that lie within `[from, to]`.
 *
 * An interval's cubic is trusted between samples only where its four samples form a cap (each
 * outer one clearly below its inner neighbour, for a maximum): a smooth peak always does. At
 * the edge of a clipped plateau the outer sample on the plateau side is level with the inner
 * one, and the cubic there bulges past the plateau by a few tenths of a percent of the swing,
 * by an amount that changes with where the samples fall; that would make a clipped, perfectly
 * steady oscillation look unsettled. There the extreme sample itself is used.
 */
function refinedExtreme(
  t: Float64Array,
  v: Float64Array,
  k: number,
  sign: 1 | -1,
  from: number,
  to: number,
  c: Float64Array,
  roots: Float64Array,
): number {
  let best = sign * v[k];
  for (let i = k - 1; i <= k; i++) {
    if (i < 1 || i + 2 >= t.length) continue;
    const a = sign * v[i - 1];
    const b = sign * v[i];
    const d = sign * v[i + 1];
    const e = sign * v[i + 2];
    const margin = CAP_MARGIN * (Math.max(a, b, d, e) - Math.min(a, b, d, e));
    if (!(b - a > margin && d - e > margin)) continue;
    cubicOnInterval(t, v, i, c);
    const count = cubicStationaryPoints(c, roots);
    const h = t[i + 1] - t[i];
    for (let r = 0; r < count; r++) {
      const time = t[i] + roots[r] * h;
      if (time < from || time > to) continue;
      const value = sign * cubicValue(c, roots[r]);
      if (value > best) best = value;
    }
  }
  return sign * best;
}

/** Builds the cycle table from the crossings found by `findRisingCrossings`. */
export function cyclesBetween(t: Float64Array, v: Float64Array, crossings: CrossingList): CycleTable {
  const count = Math.max(0, crossings.times.length - 1);
  const maximum = new Float64Array(count);
  const minimum = new Float64Array(count);
  const envelope = new Float64Array(count);
  const midTime = new Float64Array(count);
  const c = cubicScratch();
  const roots = new Float64Array(2);
  for (let k = 0; k < count; k++) {
    const from = crossings.times[k];
    const to = crossings.times[k + 1];
    // Samples strictly after the first crossing's interval start, up to the second crossing's.
    const first = crossings.intervals[k] + 1;
    const last = Math.max(first, crossings.intervals[k + 1]);
    let iMax = first;
    let iMin = first;
    for (let i = first + 1; i <= last; i++) {
      if (v[i] > v[iMax]) iMax = i;
      if (v[i] < v[iMin]) iMin = i;
    }
    maximum[k] = refinedExtreme(t, v, iMax, 1, from, to, c, roots);
    minimum[k] = refinedExtreme(t, v, iMin, -1, from, to, c, roots);
    envelope[k] = 0.5 * (maximum[k] - minimum[k]);
    midTime[k] = 0.5 * (from + to);
  }
  return { count, start: crossings.times, maximum, minimum, envelope, midTime };
}
