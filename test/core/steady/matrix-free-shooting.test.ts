import { describe, expect, test } from "vitest";
import { orbitMetrics, shootOrbit } from "@onset/core/engine";
import { nonTrivialMultipliers } from "../../../packages/core/src/steady/stability.js";
import { clippedWien, settledPeriod } from "./support.js";

describe("shootOrbit with matrixFree (Newton–Krylov) against the dense shooting", () => {
  test.each([3.1, 3.3])("clipped Wien at A = %d: same period and amplitude within 1e-7 relative, same dominant multiplier within 1e-4", (A) => {
    const { system, guess, fractions, trajectory, read } = settledPeriod(clippedWien(A), "p", 1 / 1560, 0.04);
    const dense = shootOrbit(system, guess, fractions, trajectory, { autonomous: true, multipliers: true, matrixFree: false });
    const free = shootOrbit(system, guess, fractions, trajectory, { autonomous: true, multipliers: true, matrixFree: true });
    expect(free.jacobian.matrix.length).toBe(0);
    expect(dense.jacobian.matrix.length).toBeGreaterThan(0);
    expect(Math.abs(free.start.period / dense.start.period - 1)).toBeLessThan(1e-7);
    const a = orbitMetrics(dense, read, 10).amplitude;
    const b = orbitMetrics(free, read, 10).amplitude;
    expect(Math.abs(b / a - 1)).toBeLessThan(1e-7);
    // (The trivial multiplier, ≈ 1, the largest here: the same too.)
    expect(Math.hypot(free.multipliers[0]!.re - dense.multipliers[0]!.re, free.multipliers[0]!.im - dense.multipliers[0]!.im)).toBeLessThan(1e-4);
    const [mDense] = nonTrivialMultipliers(dense.multipliers, true);
    const [mFree] = nonTrivialMultipliers(free.multipliers, true);
    expect(Math.hypot(mFree!.re - mDense!.re, mFree!.im - mDense!.im)).toBeLessThan(1e-4);
  });

  test("a shooting given a matrix-free Jacobian (an empty matrix) shoots matrix-free, from its phase", () => {
    const { system, guess, fractions, trajectory } = settledPeriod(clippedWien(3.1), "p", 1 / 1580.7, 0.04);
    const free = shootOrbit(system, guess, fractions, trajectory, { autonomous: true, matrixFree: true });
    const again = shootOrbit(system, free.start, fractions, free.states, { autonomous: true, jacobian: free.jacobian, sensitivities: "given" });
    expect(again.jacobian.matrix.length).toBe(0);
    expect(again.jacobian.phase).toBe(free.jacobian.phase);
    expect(Math.abs(again.start.period / free.start.period - 1)).toBeLessThan(1e-7);
  });
});
