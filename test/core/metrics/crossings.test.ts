import fc from "fast-check";
import { describe, expect, test } from "vitest";
import { risingCrossings } from "../../../packages/core/src/metrics/crossings.js";
import { jitteredTimes, sampled } from "./signals.js";

const f = 1000;

describe("risingCrossings(t, v, level, hysteresis)", () => {
  test("a sine rises through 0 at whole periods (mathematics), timed to 1e-6 of a period", () => {
    // 32 to 320 samples per period as the step sweeps.
    const t = jitteredTimes(-0.25e-3, 20.1e-3, 1 / (f * 100), 3, { jitter: 0, sweep: true });
    const crossings = risingCrossings(t, sampled(t, (x) => Math.sin(2 * Math.PI * f * x)), 0, 0.01);
    expect(crossings.length).toBe(21);
    crossings.forEach((time, k) => expect(Math.abs(time - k / f) * f).toBeLessThan(1e-6));
  });

  test("an offset level: 0.2 + sin θ rises through 0.7 where sin θ = 0.5, θ = π/6 (mathematics)", () => {
    const t = jitteredTimes(0, 5e-3, 1 / (f * 60), 4);
    const crossings = risingCrossings(t, sampled(t, (x) => 0.2 + Math.sin(2 * Math.PI * f * x)), 0.7, 0.05);
    expect(crossings.length).toBe(5);
    crossings.forEach((time, k) => expect(Math.abs(time - (k + 1 / 12) / f) * f).toBeLessThan(1e-6));
  });

  test("from and to restrict the samples used", () => {
    const t = jitteredTimes(-0.25e-3, 20.1e-3, 1 / (f * 40), 5);
    const v = sampled(t, (x) => Math.sin(2 * Math.PI * f * x));
    const crossings = risingCrossings(t, v, 0, 0.01, 4.5e-3, 9.5e-3);
    expect(Array.from(crossings, (time) => Math.round(time * f))).toEqual([5, 6, 7, 8, 9]);
  });

  test("a signal that never leaves the band gives no crossings", () => {
    const t = jitteredTimes(0, 5e-3, 1 / (f * 40), 6);
    expect(risingCrossings(t, sampled(t, (x) => 0.01 * Math.sin(2 * Math.PI * f * x)), 0, 0.02).length).toBe(0);
  });

  // The Schmitt-trigger argument: noise of peak size a < h can only re-arm an armed detector
  // below level − h, or re-fire near level + h after it fired, never both, as long as the clean
  // signal sweeps the whole band. fast-check draws the noise and the band.
  test("property: noise smaller than the hysteresis does not change the crossing count", () => {
    const t = jitteredTimes(-0.25e-3, 12.5e-3, 1 / (f * 40), 8);
    const clean = sampled(t, (x) => Math.sin(2 * Math.PI * f * x));
    const cleanCount = risingCrossings(t, clean, 0, 0).length;
    expect(cleanCount).toBe(13);
    fc.assert(
      fc.property(
        fc.double({ min: 1e-4, max: 0.3, noNaN: true }),
        fc.double({ min: 0, max: 0.999, noNaN: true }),
        fc.array(fc.double({ min: -1, max: 1, noNaN: true }), { minLength: t.length, maxLength: t.length }),
        (hysteresis, share, noise) => {
          const noisy = clean.map((x, i) => x + share * hysteresis * noise[i]);
          expect(risingCrossings(t, noisy, 0, hysteresis).length).toBe(cleanCount);
        },
      ),
      { numRuns: 200 },
    );
  });

  test("without hysteresis the same kind of noise does add crossings (the property above has teeth)", () => {
    const t = jitteredTimes(-0.25e-3, 12.5e-3, 1 / (f * 400), 9);
    let state = 12345;
    const noise = (): number => {
      state = (Math.imul(state, 1103515245) + 12345) >>> 0;
      return state / 2 ** 32 - 0.5;
    };
    const noisy = sampled(t, (x) => Math.sin(2 * Math.PI * f * x) + 0.05 * noise());
    expect(risingCrossings(t, noisy, 0, 0).length).toBeGreaterThan(13);
    expect(risingCrossings(t, noisy, 0, 0.05).length).toBe(13);
  });

  test("rejects bad input with the rule it breaks", () => {
    const t = Float64Array.from([0, 1, 2, 3]);
    expect(() => risingCrossings(t, new Float64Array(3), 0, 0)).toThrow(
      "risingCrossings: t and v must have the same length (got 4 and 3)",
    );
    expect(() => risingCrossings(Float64Array.from([0, 1, 1, 2]), new Float64Array(4), 0, 0)).toThrow(
      "risingCrossings: times must increase strictly (t[1] = 1, t[2] = 1)",
    );
    expect(() => risingCrossings(t, new Float64Array(4), 0, -1)).toThrow(
      "risingCrossings: hysteresis must be finite and >= 0 (got -1)",
    );
    expect(() => risingCrossings(t.subarray(0, 3), new Float64Array(3), 0, 0)).toThrow(
      "risingCrossings: need at least 4 samples for the local cubic (got 3)",
    );
  });
});
