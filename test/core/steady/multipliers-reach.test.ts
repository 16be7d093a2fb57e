import { describe, expect, test } from "vitest";
import { EigenvalueDecomposition, Matrix } from "ml-matrix";
import { PeriodicMap, resolveTolerances, shootOrbit } from "@onset/core/engine";
import { clippedWien, settledPeriod } from "./support.js";

/** |μ| of dx_N/dx₀ at a start, the map's Newton held at 1e-12 (relative), largest first. */
function monodromyMagnitudes(map: PeriodicMap, start: Parameters<PeriodicMap["run"]>[0], fractions: Float64Array, predictor: readonly Float64Array[]): number[] {
  const s = map.run(start, fractions, predictor, true).sensitivity!;
  const n = map.n;
  const m = new Matrix(n, n);
  for (let i = 0; i < n; i++) for (let c = 0; c < n; c++) m.set(i, c, s.x[i * s.columns + c]!);
  const eig = new EigenvalueDecomposition(m);
  return eig.realEigenvalues.map((re, k) => Math.hypot(re, eig.imaginaryEigenvalues[k]!)).sort((a, b) => b - a);
}

describe("shootOrbit's Floquet multipliers", () => {
  test.each([3.1, 3.3])("clipped Wien at A = %d: they are the monodromy matrix's eigenvalues at the converged orbit's own start, to 1e-4", (A) => {
    const { system, guess, fractions, trajectory } = settledPeriod(clippedWien(A), "p", 1 / 1560, 0.04);
    const orbit = shootOrbit(system, guess, fractions, trajectory, { autonomous: true, multipliers: true });
    const map = new PeriodicMap(system, resolveTolerances({ newtonRelative: 1e-12, newtonVoltage: 1e-14, newtonCurrent: 1e-17 }));
    map.solver.reference.fill(10);
    const exact = monodromyMagnitudes(map, orbit.start, fractions, orbit.states);
    const reported = orbit.multipliers.map((m) => Math.hypot(m.re, m.im));
    expect(reported.length).toBe(exact.length);
    for (let k = 0; k < exact.length; k++) expect(Math.abs(reported[k]! - exact[k]!)).toBeLessThan(1e-4 * Math.max(exact[k]!, 1e-3));
  });
});
