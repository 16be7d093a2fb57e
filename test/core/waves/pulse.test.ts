import { describe, expect, test } from "vitest";
import fc from "fast-check";
import { pulseWave } from "../../../packages/core/src/waves/pulse.js";

describe("pulse wave at its corners", () => {
  test("at every period boundary the solver lands on, the level just before is low and just after is the new edge's", () => {
    fc.assert(
      fc.property(
        fc.double({ min: 1e-7, max: 1, noNaN: true }),
        fc.double({ min: 0, max: 1, noNaN: true }),
        fc.integer({ min: 1, max: 100_000 }),
        (period, delayFraction, k) => {
          const delay = delayFraction * period;
          const wave = pulseWave({ low: -1, high: 1, delay, rise: 0, fall: 0, width: 0.5 * period, period });
          // the corner found from half a period before the k-th boundary, as the stepper finds it
          const corner = wave.nextBreakpoint(delay + (k - 0.5) * period + 0.25 * period);
          expect(Math.abs(corner - (delay + k * period))).toBeLessThanOrEqual(1e-12 * (delay + k * period));
          expect(wave.value(corner, true)).toBe(-1);
          expect(wave.value(corner, false)).toBe(1);
        },
      ),
    );
  });

  test("at every fall corner the solver lands on (delay + k·period + width, rounded), the level just before is high and just after low", () => {
    fc.assert(
      fc.property(
        fc.double({ min: 1e-7, max: 1, noNaN: true }),
        fc.double({ min: 0, max: 1, noNaN: true }),
        fc.double({ min: 0.05, max: 0.95, noNaN: true }),
        fc.integer({ min: 1, max: 100_000 }),
        (period, delayFraction, duty, k) => {
          const delay = delayFraction * period;
          const wave = pulseWave({ low: -1, high: 1, delay, rise: 0, fall: 0, width: duty * period, period });
          // the fall corner found from just after the k-th rising edge, as the stepper finds it
          const corner = wave.nextBreakpoint(delay + k * period + 0.01 * duty * period);
          expect(Math.abs(corner - (delay + k * period + duty * period))).toBeLessThanOrEqual(1e-12 * corner);
          expect(wave.value(corner, true)).toBe(1);
          expect(wave.value(corner, false)).toBe(-1);
        },
      ),
    );
  });

  test("width=0 with rise + fall = period is a triangle: linear up, linear down, corners exact", () => {
    const wave = pulseWave({ low: -1, high: 1, delay: 0, rise: 0.5e-3, fall: 0.5e-3, width: 0, period: 1e-3 });
    for (const [t, v] of [
      [0.25e-3, 0],
      [0.5e-3, 1],
      [0.75e-3, 0],
      [1e-3, -1],
      [1.125e-3, -0.5],
      [7.5e-3, 1],
    ] as const) {
      expect(wave.value(t, false)).toBeCloseTo(v, 9);
      expect(wave.value(t, true)).toBeCloseTo(v, 9);
    }
  });
});
