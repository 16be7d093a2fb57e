import type { Wave } from "./wave.js";

export interface PulseSettings {
  readonly low: number;
  readonly high: number;
  readonly delay: number;
  readonly rise: number;
  readonly fall: number;
  readonly width: number;
  readonly period: number;
}

/**
 * A trapezoidal pulse train. Corners at delay + k·period + {0, rise, rise+width,
 * rise+width+fall}; an edge of zero duration jumps at its corner (the left value is the old level).
 */
export function pulseWave(s: PulseSettings): Wave {
  const corners = [0, s.rise, s.rise + s.width, s.rise + s.width + s.fall];
  const repeats = Number.isFinite(s.period);
  const levelInCycle = (tau: number, left: boolean): number => {
    if (left ? tau <= 0 : tau < 0) return s.low;
    if (tau < s.rise) return s.low + ((s.high - s.low) * tau) / s.rise;
    const fallStart = s.rise + s.width;
    if (left ? tau <= fallStart : tau < fallStart) return s.high;
    if (tau < fallStart + s.fall) return s.high - ((s.high - s.low) * (tau - fallStart)) / s.fall;
    return s.low;
  };
  return {
    value(t, left) {
      let tau = t - s.delay;
      // Times within rounding of a corner are on it: a corner delay + k·period + c is rounded
      // when computed (`nextBreakpoint`), and the solver lands on exactly that rounded time.
      const snap = 1e-12 * Math.max(Number.isFinite(s.period) ? s.period : 0, Math.abs(t));
      if (repeats && tau > 0) {
        const k = Math.floor(tau / s.period);
        tau -= k * s.period;
        if (tau > s.period - snap) tau = 0;
        // At a period boundary the level just before it is the previous cycle's end.
        if (left && tau <= snap && (k > 0 || tau > 0)) return levelInCycle(s.period, left);
        if (tau <= snap) tau = 0;
      }
      for (const c of corners) if (Math.abs(tau - c) <= snap) tau = c;
      return levelInCycle(tau, left);
    },
    nextBreakpoint(t) {
      // Each cycle's corners from delay + k·period with k whole, never accumulated.
      const first = repeats && t >= s.delay ? Math.floor((t - s.delay) / s.period) : 0;
      for (let cycle = first; cycle < first + 2; cycle++) {
        const base = s.delay + cycle * s.period;
        for (const c of corners) {
          const tc = base + c;
          if (tc > t && Number.isFinite(tc)) return tc;
        }
        if (!repeats) return Infinity;
      }
      return Infinity;
    },
  };
}
