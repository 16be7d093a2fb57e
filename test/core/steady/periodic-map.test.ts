import { describe, expect, test } from "vitest";
import fc from "fast-check";
import { PeriodicMap, resolveTolerances } from "@onset/core/engine";
import { clippedWien, settledPeriod } from "./support.js";

// The map of one period near the clipped Wien's limit cycle, and its carried derivatives.
const { system, guess, fractions, trajectory } = settledPeriod(clippedWien(3.1), "p", 1 / 1580.7, 0.03);
const map = new PeriodicMap(system, resolveTolerances({ newtonRelative: 1e-13, newtonVoltage: 1e-15, newtonCurrent: 1e-18 }));
map.solver.reference.fill(10);
const n = system.n;
const base = map.run(guess, fractions, trajectory, true);
const end = Float64Array.from(base.x);
const s = base.sensitivity!;

describe("PeriodicMap: one period by TR-BDF2 with its variational equations", () => {
  test("dx_N/dx₀ times any direction equals the central difference of the map (mathematics: the chain rule)", () => {
    fc.assert(
      fc.property(fc.array(fc.double({ min: -1, max: 1, noNaN: true }), { minLength: n, maxLength: n }), (direction) => {
        const step = 1e-5;
        const shifted = (sign: number) => map.run({ ...guess, x: Float64Array.from(guess.x, (v, i) => v + sign * step * direction[i]!) }, fractions, trajectory, false).x.slice();
        const plus = shifted(1);
        const minus = shifted(-1);
        for (let i = 0; i < n; i++) {
          let predicted = 0;
          for (let j = 0; j < n; j++) predicted += s.x[i * s.columns + j]! * direction[j]!;
          const measured = (plus[i]! - minus[i]!) / (2 * step);
          expect(Math.abs(measured - predicted)).toBeLessThan(1e-4 * (1 + Math.abs(predicted)));
        }
      }),
      { numRuns: 8 },
    );
  });

  test("dx_N/dT equals the central difference in the period", () => {
    const step = 1e-9 * guess.period;
    const at = (T: number) => map.run({ ...guess, period: T }, fractions, trajectory, false).x.slice();
    const plus = at(guess.period + step);
    const minus = at(guess.period - step);
    for (let i = 0; i < n; i++) {
      const predicted = s.x[i * s.columns + n]!;
      expect(Math.abs((plus[i]! - minus[i]!) / (2 * step) - predicted)).toBeLessThan(1e-4 * (1 + Math.abs(predicted)));
    }
    expect(end.length).toBe(n);
  });
});
