import { describe, expect, test } from "vitest";
import { isOnsetError, runStartup, runSteady, steadySeed } from "@onset/core";
import { buildSystem, orbitMetrics, recordPeriod, shootOrbit, TransientStepper } from "@onset/core/engine";
import { circuit, part } from "../../support/circuits.js";
import { KRYLOV_PRODUCTS, MATRIX_FREE_FROM } from "../../../packages/core/src/steady/matrix-free-shooting.js";
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

describe("shootOrbit with matrixFree from a start far from the orbit", () => {
  const { system, guess, fractions } = settledPeriod(clippedWien(3.1), "p", 1 / 1580.7, 0.04);
  // The settled state with the period guessed at a third of the orbit's: Newton's first step triples it.
  const far = { ...guess, period: guess.period / 3 };

  test.each([1.1, 1.2])("from the settled state with the period guessed at 1/%d of the orbit's, the trust region brings it to the orbit", (share) => {
    const found = shootOrbit(system, { ...guess, period: guess.period / share }, fractions, undefined, { autonomous: true, matrixFree: true });
    expect(Math.abs(found.start.period / guess.period - 1)).toBeLessThan(1e-3);
  });

  test("with giveUpAfter it gives up at once with a typed error (the first step would move the period by more than a fifth)", () => {
    let periods = 0;
    let code = "converged";
    try {
      shootOrbit(system, far, fractions, undefined, { autonomous: true, matrixFree: true, giveUpAfter: 5, check: () => periods++ });
    } catch (error) {
      code = isOnsetError(error) ? error.diagnostic.code : String(error);
    }
    expect(code).toBe("orbit-not-converged");
    // (One period, then the tangent passes of its Newton step: no second period.)
    expect(periods).toBeLessThanOrEqual(1 + KRYLOV_PRODUCTS);
  });
});

describe("shootOrbit with matrixFree on a driven circuit (the period is the drive's)", () => {
  test("a 20-section RC ladder driven by a 1 kHz sine: the same orbit as the dense shooting (within 1e-7 of the output's peak), T unchanged", () => {
    const parts = [part("vsource", "V1", ["l0", "gnd"], undefined, { wave: "sine", amp: 1, freq: 1e3 })];
    for (let k = 1; k <= 20; k++) parts.push(part("resistor", `R${k}`, [`l${k - 1}`, `l${k}`], 1e3), part("capacitor", `C${k}`, [`l${k}`, "gnd"], 10e-9 * (1 + (k % 3))));
    const system = buildSystem(circuit(parts));
    const stepper = new TransientStepper(system, { start: "bias", maxStep: 1e-5 });
    stepper.advance(2e-3);
    const { guess, fractions, trajectory } = recordPeriod(system, stepper.snapshot(), 1e-3, 1e-5);
    const dense = shootOrbit(system, guess, fractions, trajectory, { autonomous: false, matrixFree: false });
    const free = shootOrbit(system, guess, fractions, trajectory, { autonomous: false, matrixFree: true });
    expect(free.start.period).toBe(1e-3);
    const out = system.nodeIndex.get("l20")!;
    const peak = Math.max(...dense.states.map((x) => Math.abs(x[out]!)));
    for (let k = 0; k < dense.states.length; k++) expect(Math.abs(free.states[k]![out]! - dense.states[k]![out]!)).toBeLessThan(1e-7 * peak);
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
    expect(steady.shooting).toBe("matrix-free");
    expect(Math.abs(steady.frequency! / startup.frequency! - 1)).toBeLessThan(5e-4);
  });
});

describe("a study's seed from a matrix-free orbit", () => {
  test("has no matrix, and a neighbour (one ladder capacitor 2 % up) seeded from it shoots matrix-free to its orbit", () => {
    const nominal = ladderOscillator(60);
    const probe = { kind: "node", node: "o" } as const;
    const seed = steadySeed(nominal, { kind: "steady", probe })!;
    expect(seed.matrix.length).toBe(0);
    const neighbour = { ...nominal, parts: nominal.parts.map((p) => (p.name === "C30" ? { ...p, value: p.value! * 1.02 } : p)) };
    const orbit = shootOrbit(buildSystem(neighbour), { t0: 0, x: seed.x, period: seed.period }, seed.fractions, seed.states, {
      autonomous: true,
      relative: 1e-5,
      jacobian: { matrix: seed.matrix, phase: seed.phase },
    });
    expect(orbit.jacobian.matrix.length).toBe(0);
    expect(orbit.mismatch).toBeLessThanOrEqual(1);
    // (A larger capacitance lengthens the period, by well under the 2 % of one section in sixty.)
    expect(orbit.start.period).toBeGreaterThan(seed.period);
    expect(orbit.start.period / seed.period - 1).toBeLessThan(2e-3);
  });
});
