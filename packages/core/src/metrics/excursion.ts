import type { CycleTable } from "./cycles.js";
import { cubicLevelCrossing, cubicOnInterval, cubicScratch, cubicStationaryPoints, cubicValue } from "./local-cubic.js";

/** A cycle whose centre lies this share of the threshold away from the settled offset sits on a DC level still moving. */
const DC_MOVED = 0.05;

/**
 * Start-up: the first moment the oscillation reaches `threshold` about its centre. The first
 * cycle (beginning at or after `from`) whose envelope reaches the threshold is found, and from
 * the cycle before it (from `from` if it is the first), the first time |v − c| reaches the
 * threshold on the local cubic; c is the settled `offset`, or, when the middle of that cycle's
 * extremes lies {@link DC_MOVED} of the threshold or more away from it, that middle: a DC level
 * still settling (the supplies coming up at power-on) is not taken for the oscillation.
 */
export function startupMoment(t: Float64Array, v: Float64Array, cycles: CycleTable, offset: number, threshold: number, from: number): number | null {
  for (let k = 0; k < cycles.count; k++) {
    if (cycles.start[k] < from || !(cycles.envelope[k] >= threshold)) continue;
    const own = 0.5 * (cycles.maximum[k] + cycles.minimum[k]);
    const centre = Math.abs(own - offset) <= DC_MOVED * threshold ? offset : own;
    return firstExcursion(t, v, centre, threshold, k > 0 ? Math.max(from, cycles.start[k - 1]) : from);
  }
  return null;
}

/**
 * The first time at or after `from` at which |v − center| reaches `threshold` on the local
 * cubic, or null if it never does. A peak that falls between two samples counts: intervals
 * whose samples come within half the threshold have their cubic's stationary points checked too.
 */
export function firstExcursion(t: Float64Array, v: Float64Array, center: number, threshold: number, from = t[0]): number | null {
  let first = 0;
  while (first + 1 < t.length && t[first] < from) first++;
  if (Math.abs(v[first] - center) >= threshold) return t[first];
  const c = cubicScratch();
  const roots = new Float64Array(2);
  for (let i = first; i + 1 < t.length; i++) {
    const a = Math.abs(v[i] - center);
    const b = Math.abs(v[i + 1] - center);
    if (Math.max(a, b) < 0.5 * threshold) continue;
    cubicOnInterval(t, v, i, c);
    // The earliest point of the interval known to exceed: a stationary point, else the end.
    let uEnd = b >= threshold ? 1 : -1;
    const count = cubicStationaryPoints(c, roots);
    for (let r = 0; r < count; r++) {
      const u = roots[r];
      if (Math.abs(cubicValue(c, u) - center) >= threshold && (uEnd < 0 || u < uEnd)) uEnd = u;
    }
    if (uEnd < 0) continue;
    const side = cubicValue(c, uEnd) >= center ? 1 : -1;
    const u = cubicLevelCrossing(c, center + side * threshold, 0, uEnd);
    return t[i] + u * (t[i + 1] - t[i]);
  }
  return null;
}
