import type { Wave } from "./wave.js";

/** Piecewise-linear through (t, v) pairs; held before the first and after the last point. */
export function stepsWave(times: Float64Array, levels: Float64Array): Wave {
  const n = times.length;
  // Index of the last point with time ≤ t (or < t when `left`), by bisection.
  const segment = (t: number, left: boolean): number => {
    let lo = -1;
    let hi = n;
    while (hi - lo > 1) {
      const mid = (lo + hi) >> 1;
      if (left ? times[mid]! < t : times[mid]! <= t) lo = mid;
      else hi = mid;
    }
    return lo;
  };
  return {
    value(t, left) {
      const i = segment(t, left);
      if (i < 0) return levels[0]!;
      if (i >= n - 1) return levels[n - 1]!;
      const t0 = times[i]!;
      const t1 = times[i + 1]!;
      if (t1 === t0) return levels[i + 1]!;
      return levels[i]! + ((levels[i + 1]! - levels[i]!) * (t - t0)) / (t1 - t0);
    },
    nextBreakpoint(t) {
      const i = segment(t, false);
      return i + 1 < n ? times[i + 1]! : Infinity;
    },
  };
}
