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
      if (repeats && tau > 0) {
        const k = Math.floor(tau / s.period);
        tau -= k * s.period;
        // Exactly at a period boundary the new cycle's rising edge applies.
        if (left && tau === 0 && k > 0) tau = s.period;
      }
      return levelInCycle(tau, left);
    },
    nextBreakpoint(t) {
      let base = s.delay;
      if (repeats && t >= s.delay) base = s.delay + Math.floor((t - s.delay) / s.period) * s.period;
      for (let cycle = 0; cycle < 2; cycle++) {
        for (const c of corners) {
          const tc = base + c;
          if (tc > t && Number.isFinite(tc)) return tc;
        }
        if (!repeats) return Infinity;
        base += s.period;
      }
      return Infinity;
    },
  };
}
