import { afterEach, describe, expect, test, vi } from "vitest";
import { PeriodicMap, shootOrbit } from "@onset/core/engine";
import { periodAt } from "../../../packages/core/src/steady/shooting.js";
import { clippedWien, settledPeriod } from "./support.js";

describe("shootOrbit's Newton matrix after the multipliers' period at the orbit", () => {
  afterEach(() => vi.restoreAllMocks());

  // Two starts whose shooting converges on a period without sensitivities, far from the last one that had them.
  test.each([
    [3.3, 0.01],
    [4, 0.006],
  ])("clipped Wien at A = %d settled for %d s: the matrix handed on is the map's own at the orbit's start (what a finer grid starts from)", (A, until) => {
    const { system, guess, fractions, trajectory } = settledPeriod(clippedWien(A), "p", 1 / 1580.7, until);
    const run = vi.spyOn(PeriodicMap.prototype, "run");
    const relative = 1e-8;
    const orbit = shootOrbit(system, guess, fractions, trajectory, { autonomous: true, multipliers: true, relative });
    const last = run.mock.calls[run.mock.calls.length - 1]!;
    // The multipliers took one more period, with sensitivities, at the converged start.
    expect(last[3]).toBe(true);
    expect(last[0].x).toEqual(orbit.start.x);
    const exact = periodAt(system, orbit.start, fractions, orbit.states, { relative, phase: orbit.jacobian.phase }).matrix!;
    let largest = 0;
    for (const v of exact) largest = Math.max(largest, Math.abs(v));
    for (let k = 0; k < exact.length; k++) expect(Math.abs(orbit.jacobian.matrix[k]! - exact[k]!)).toBeLessThan(1e-6 * largest);
  });
});
