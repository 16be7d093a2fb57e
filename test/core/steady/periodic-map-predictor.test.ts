import { describe, expect, test } from "vitest";
import fc from "fast-check";
import { PeriodicMap, resolveTolerances } from "@onset/core/engine";
import { clippedWien, settledPeriod } from "./support.js";

// One period near the clipped Wien's limit cycle, the map's Newton held at 1e-12 (relative).
const { system, guess, fractions, trajectory } = settledPeriod(clippedWien(3.1), "p", 1 / 1580.7, 0.03);
const tolerances = resolveTolerances({ newtonRelative: 1e-12, newtonVoltage: 1e-14, newtonCurrent: 1e-17 });
const n = system.n;
const mapAt = () => {
  const map = new PeriodicMap(system, tolerances);
  map.solver.reference.fill(10);
  return map;
};
const reference = mapAt().run(guess, fractions, undefined, false).x.slice();

describe("PeriodicMap's predictor only starts the Newton solves", () => {
  test("the period's end from a predictor of another start (a shooting's last period) equals the end without one, to the map's tolerance", () => {
    fc.assert(
      fc.property(fc.array(fc.double({ min: -1, max: 1, noNaN: true }), { minLength: n, maxLength: n }), fc.double({ min: 1e-6, max: 1e-2, noNaN: true }), (direction, size) => {
        const map = mapAt();
        // The predictor: the period run from a start moved by `size` (volts) along `direction`, and its period 0.1 % longer.
        const moved = { ...guess, x: Float64Array.from(guess.x, (v, i) => v + size * direction[i]!), period: guess.period * 1.001 };
        map.run(moved, fractions, trajectory, false);
        const end = map.run(guess, fractions, map.states, false).x;
        // Each of the 2N stages' Newton solves stops within 1e-12 × 10 V; a period adds them up
        // (and its modes may amplify them a few times), far below the predictor's own error.
        const within = 10 * 2 * fractions.length * 1e-11;
        for (let i = 0; i < n; i++) expect(Math.abs(end[i]! - reference[i]!)).toBeLessThan(within);
      }),
      { numRuns: 6 },
    );
  });

  test("a period without sensitivities (devices' values only) is the same map as one carrying them, to the bit", () => {
    const plain = mapAt().run(guess, fractions, trajectory, false).x.slice();
    const carried = mapAt().run(guess, fractions, trajectory, true).x.slice();
    expect(Array.from(plain)).toEqual(Array.from(carried));
  });
});
