import { describe, expect, test } from "vitest";
import { runStartup, runSteady } from "@onset/core";
import { buildSystem, orbitMetrics, shootOrbit } from "@onset/core/engine";
import { MATRIX_FREE_FROM } from "../../../packages/core/src/steady/matrix-free-shooting.js";
import { nonTrivialMultipliers } from "../../../packages/core/src/steady/stability.js";
import { clippedWien, ladderOscillator, settledPeriod } from "./support.js";

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

describe("the steady analysis of a large ladder-network oscillator (matrix-free by default)", () => {
  test("100 sections (111 unknowns): its frequency agrees with the settled start-up run's within 5e-4 (source: the transient, until=auto)", () => {
    const c = ladderOscillator(100);
    expect(buildSystem(c).n).toBeGreaterThanOrEqual(MATRIX_FREE_FROM);
    const probe = { kind: "node", node: "o" } as const;
    const startup = runStartup(c, { kind: "startup", probe, until: "auto" });
    const steady = runSteady(c, { kind: "steady", probe });
    expect(steady.found).toBe(true);
    expect(Math.abs(steady.frequency! / startup.frequency! - 1)).toBeLessThan(5e-4);
  });
});
