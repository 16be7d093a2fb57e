/** Smallest and largest value an axis must show, or undefined when there is none. */
export type Extent = readonly [number, number] | undefined;

/** Whether a value can be placed on an axis. */
export function showable(value: number, log: boolean): boolean {
  return Number.isFinite(value) && (!log || value > 0);
}

/** Grows an extent to include `value` (ignored when the axis cannot show it). */
export function include(extent: Extent, value: number, log: boolean): Extent {
  if (!showable(value, log)) return extent;
  if (extent === undefined) return [value, value];
  return [Math.min(extent[0], value), Math.max(extent[1], value)];
}

/** The extent of the showable values of an array. */
export function extentOf(values: ArrayLike<number>, log: boolean, start: Extent = undefined): Extent {
  let lo = start?.[0] ?? Number.POSITIVE_INFINITY;
  let hi = start?.[1] ?? Number.NEGATIVE_INFINITY;
  for (let i = 0; i < values.length; i += 1) {
    const v = values[i] as number;
    if (!showable(v, log)) continue;
    if (v < lo) lo = v;
    if (v > hi) hi = v;
  }
  return lo <= hi ? [lo, hi] : undefined;
}

/**
 * A drawable domain from an extent: `padding` (a fraction of the span, in decades on a log
 * axis) added at both ends. An empty extent becomes [0, 1] ([1, 10] on a log axis); a single
 * value gets a span of its own (±10 % of it, or ±1 around zero; ±½ decade on a log axis).
 */
export function domainOf(extent: Extent, log: boolean, padding: number): [number, number] {
  if (extent === undefined) return log ? [1, 10] : [0, 1];
  const [lo, hi] = extent;
  if (log) {
    const l0 = Math.log10(lo);
    const l1 = Math.log10(hi);
    const span = l1 - l0;
    if (!(span > 1e-12)) return [lo / Math.sqrt(10), hi * Math.sqrt(10)];
    return [10 ** (l0 - padding * span), 10 ** (l1 + padding * span)];
  }
  const span = hi - lo;
  // A span lost in rounding (1e-300 apart, or constant) is treated as a constant series.
  if (!(span > 1e-12 * Math.max(Math.abs(lo), Math.abs(hi), 1e-290))) {
    const half = lo === 0 ? 1 : Math.max(Math.abs(lo) * 0.1, 1e-300);
    return [lo - half, hi + half];
  }
  const lower = lo - padding * span;
  const upper = hi + padding * span;
  // Padding never pushes a non-negative range below zero: counts and magnitudes start at 0.
  return [lo >= 0 && lower < 0 ? 0 : lower, upper];
}
