import fc from "fast-check";
import { describe, expect, test } from "vitest";
import { orbitFigures } from "@onset/core/engine";
import { jitteredOrbit } from "../../support/jittered-orbit.js";

const T = 1e-3;

const orbitOf = (wave: (t: number) => number, N: number, jitter: number[]) => jitteredOrbit(wave, T, N, jitter);
const read = (x: Float64Array) => x[0]!;
const grids = fc.record({ N: fc.integer({ min: 100, max: 400 }), jitter: fc.array(fc.double({ min: -1, max: 1, noNaN: true }), { minLength: 1, maxLength: 7 }), phase: fc.double({ min: 0, max: 2 * Math.PI, noNaN: true }) });

describe("extremes on a corner", () => {
  test("a sine's extremes are never taken for corners, on any grid of 100 to 400 uneven steps (its curvature changes by a few per cent over three steps)", () => {
    fc.assert(
      fc.property(grids, ({ N, jitter, phase }) => {
        const { extremes } = orbitFigures(orbitOf((t) => 0.3 + 2 * Math.sin((2 * Math.PI * t) / T + phase), N, jitter), read, 5);
        expect(extremes.maximumCorner).toBe(false);
        expect(extremes.minimumCorner).toBe(false);
      }),
    );
  });

  test("a full-wave rectified sine's minimum (where the slope jumps from −ω to +ω) is a corner, its maximum is not", () => {
    fc.assert(
      fc.property(grids, ({ N, jitter, phase }) => {
        const { extremes } = orbitFigures(orbitOf((t) => Math.abs(Math.sin((2 * Math.PI * t) / T + phase)), N, jitter), read, 5);
        expect(extremes.minimumCorner).toBe(true);
        expect(extremes.maximumCorner).toBe(false);
      }),
    );
  });

  test("the interpolation spread at a smooth extremum is O(h⁴) (below 1e-6 of the swing at 100 steps), at a corner O(h) (above 1e-3 of it unless a sample sits on the corner)", () => {
    const smooth = orbitFigures(orbitOf((t) => Math.sin((2 * Math.PI * t) / T + 0.1), 100, [0.5, -0.2, 0.9]), read, 5).extremes;
    expect(Math.max(smooth.maximumSpread, smooth.minimumSpread)).toBeLessThan(2e-6);
    const corner = orbitFigures(orbitOf((t) => Math.abs(Math.sin((2 * Math.PI * t) / T + 0.1)), 100, [0.5, -0.2, 0.9]), read, 5).extremes;
    expect(corner.minimumSpread).toBeGreaterThan(1e-3);
  });
});
