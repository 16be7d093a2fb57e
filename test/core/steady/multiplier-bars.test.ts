// The Floquet multipliers' error bars (`multiplierError`) against an independent reference: the
// monodromy matrix from scipy 1.17 solve_ivp (Radau, rtol 1e-11, atol 1e-11, largest step T/1000)
// on the variational equation dΦ/dt = J(x)·Φ of the same circuits' state equations over one
// period of the settled orbit (test/validation/reference/floquet.py, after the settling of
// orbit.py); the multipliers are Φ(T)'s eigenvalues, the trivial one (1 to 1e-9) left out.
import { describe, expect, test } from "vitest";
import { readFileSync } from "node:fs";
import { runSteady } from "@onset/core";
import { buildCircuit, loadSource } from "@onset/netlist-parser";
import { refineOrbit } from "@onset/core/engine";
import { multiplierBars } from "../../../packages/core/src/steady/stability.js";
import { clippedWien, settledPeriod } from "./support.js";

const probe = { kind: "node", node: "o" } as const;

const cases = [
  // scipy (floquet.py wien-diode-2k): 1.0000000000009588, 0.3770473488797185, 4.5e-18.
  { name: "wien-diode-2k", multipliers: [0.3770473488797185] },
  // scipy (floquet.py phase-shift-ladder): 1.000000000600706, 0.885646478499442, 0.04400368595149976, 1.2e-16 (a slowly attracting orbit).
  { name: "phase-shift-ladder", multipliers: [0.885646478499442, 0.04400368595149976] },
  // scipy (floquet.py twin-t): 1.0000000006166478, 0.9472184077588122, 0.001662218591852636, 3.4e-19 (a slowly attracting orbit).
  { name: "twin-t", multipliers: [0.9472184077588122, 0.001662218591852636] },
  // scipy (floquet.py wien-rail-hard): 1.0000000000403242, 1.1519274122566508e-06, 6.3e-18 (corners at the rails).
  { name: "wien-rail-hard", multipliers: [1.1519274122566508e-6] },
];

describe("the Floquet multipliers' error bars against scipy's monodromy matrix", () => {
  for (const c of cases) {
    for (const accuracy of [1e-3, 1e-4]) {
      test(`${c.name}, accuracy=${accuracy}: each listed multiplier lies within its bar of scipy's`, () => {
        const text = readFileSync(`test/validation/circuits/${c.name}.onset`, "utf8").replace(/^startup .*$/m, "");
        const r = runSteady(buildCircuit(loadSource(`${c.name}.onset`, text)).circuit!, { kind: "steady", probe, accuracy });
        expect(r.found).toBe(true);
        expect(r.multiplierError).not.toBeNull();
        expect(r.multiplierError!.length).toBe(r.multipliers.length);
        for (const [k, reference] of c.multipliers.entries()) {
          const m = r.multipliers[k]!;
          const bar = r.multiplierError![k]!;
          expect(Math.hypot(m.re - reference, m.im), `multiplier ${k}`).toBeLessThanOrEqual(bar);
          // Not absurdly loose: within a hundredth of the multiplier's own size or of 1e-6.
          expect(bar).toBeLessThan(Math.max(1e-2 * Math.abs(reference), 1e-6));
        }
      });
    }
  }
});

describe("multiplierBars", () => {
  test("twice the distance to the finer grid's nearest multiplier, a complex one by its distance in the plane", () => {
    const bars = multiplierBars(
      [
        { re: 0.5, im: 0 },
        { re: 0.3, im: 0.4 },
      ],
      [
        { re: 0.3, im: 0.41 },
        { re: 0.501, im: 0 },
        { re: 0.3, im: -0.41 },
      ],
    )!;
    expect(bars[0]).toBeCloseTo(0.002, 12);
    expect(bars[1]).toBeCloseTo(0.02, 12);
  });
  test("null without the finer grid's multipliers (a matrix-free shooting), empty with nothing listed", () => {
    expect(multiplierBars([{ re: 0.5, im: 0 }], [])).toBeNull();
    expect(multiplierBars([], [])).toEqual([]);
  });
});

describe("the halved grid's multipliers of a matrix-free shooting", () => {
  test("its Arnoldi run gives the dominant multipliers the dense sensitivities give (a three-state Wien: the Krylov space is the whole space)", () => {
    const { system, guess, fractions, trajectory, read } = settledPeriod(clippedWien(3.1), "p", 1 / 1580.7, 0.04);
    const dense = refineOrbit(system, guess, fractions, trajectory, read, 20, { multipliers: true, matrixFree: false });
    const krylov = refineOrbit(system, guess, fractions, trajectory, read, 20, { multipliers: true, matrixFree: true });
    expect(krylov.orbit.jacobian.matrix.length).toBe(0);
    const largest = (ms: readonly { re: number; im: number }[]) => ms.filter((m) => Math.hypot(m.re, m.im) > 1e-6);
    const [a, b] = [largest(dense.finerMultipliers), largest(krylov.finerMultipliers)];
    expect(b.length).toBe(a.length);
    for (const [k, m] of a.entries()) expect(Math.hypot(m.re - b[k]!.re, m.im - b[k]!.im)).toBeLessThan(1e-6);
  });
});
