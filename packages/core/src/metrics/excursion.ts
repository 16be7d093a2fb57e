import { cubicLevelCrossing, cubicOnInterval, cubicScratch, cubicStationaryPoints, cubicValue } from "./local-cubic.js";

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
