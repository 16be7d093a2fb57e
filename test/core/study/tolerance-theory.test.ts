import { describe, expect, test } from "vitest";
import { drawSample, DEFAULT_TOLERANCES, shardIndices, type ToleranceSpec } from "@onset/core";
import { pencilPoles, dominantPair, linearize, buildSystem, NewtonSolver, solveBias } from "@onset/core/engine";
import { circuit, part, wienNetwork } from "../../support/circuits.js";

const tolerances: ToleranceSpec[] = [
  { target: "R1", nominal: 1e3, relative: 0.01 },
  { target: "R2", nominal: 1e3, relative: 0.01 },
  { target: "C1", nominal: 100e-9, relative: 0.05 },
  { target: "C2", nominal: 100e-9, relative: 0.05 },
];

/** Frequency of the linearised equal-RC Wien bridge around an ideal gain of 3 for drawn values. */
function wienFrequency(v: Record<string, number>): number {
  const c = circuit([...wienNetwork({ R1: v.R1!, R2: v.R2!, C1: v.C1!, C2: v.C2! }), part("vcvs", "E1", ["o", "gnd", "p", "gnd"], 3)]);
  const system = buildSystem(c);
  const bias = solveBias(system, new NewtonSolver(system, DEFAULT_TOLERANCES));
  return dominantPair(pencilPoles(linearize(system, bias.x)))!.imag / (2 * Math.PI);
}

function relativeSpread(dist: "uniform" | "normal", runs: number) {
  const f = Array.from({ length: runs }, (_, i) => wienFrequency(drawSample(tolerances, 11, i, dist)));
  const mean = f.reduce((s, x) => s + x, 0) / runs;
  const sd = Math.sqrt(f.reduce((s, x) => s + (x - mean) ** 2, 0) / (runs - 1));
  return sd / mean;
}

describe("tolerance Monte Carlo against first-order theory (docs/references.md §6)", () => {
  const runs = 4000;
  // Standard error of a sample standard deviation ≈ σ/√(2N) (normal theory), plus 0.3 % for the
  // second-order terms the first-order formula leaves out (docs/references.md §6 measured +0.2 %).
  const bound = (theory: number) => 3 * (theory / Math.sqrt(2 * runs)) + 0.003 * theory;

  test("uniform R ±1 %, C ±5 %: σ_f/f = ½√Σσᵢ² with σ = tol/√3 → 2.0817 %", () => {
    const theory = 0.5 * Math.sqrt(2 * (0.01 / Math.sqrt(3)) ** 2 + 2 * (0.05 / Math.sqrt(3)) ** 2);
    expect(theory).toBeCloseTo(0.020817, 6);
    expect(Math.abs(relativeSpread("uniform", runs) - theory)).toBeLessThan(bound(theory));
  });

  test("normal, tol = 3σ truncated at ±tol: 1.2019 % × √(variance of a normal truncated at ±3σ) (mathematics)", () => {
    // Var of N(0,1) truncated to [−3, 3]: 1 − 6φ(3)/(2Φ(3) − 1) = 0.973336
    const phi3 = Math.exp(-4.5) / Math.sqrt(2 * Math.PI);
    const truncated = 1 - (6 * phi3) / 0.9973002039367398;
    const theory = 0.5 * Math.sqrt(2 * (0.01 / 3) ** 2 + 2 * (0.05 / 3) ** 2) * Math.sqrt(truncated);
    expect(0.5 * Math.sqrt(2 * (0.01 / 3) ** 2 + 2 * (0.05 / 3) ** 2)).toBeCloseTo(0.012019, 6);
    expect(Math.abs(relativeSpread("normal", runs) - theory)).toBeLessThan(bound(theory));
  });

  test("a sample's draws depend on (seed, index) alone; draws stay inside ±tol", () => {
    expect(drawSample(tolerances, 5, 123, "normal")).toEqual(drawSample(tolerances, 5, 123, "normal"));
    expect(drawSample(tolerances, 5, 123, "normal")).not.toEqual(drawSample(tolerances, 5, 124, "normal"));
    for (let i = 0; i < 500; i++) {
      const d = drawSample(tolerances, 9, i, "normal");
      expect(Math.abs(d.C1! / 100e-9 - 1)).toBeLessThanOrEqual(0.05);
      expect(Math.abs(d.R1! / 1e3 - 1)).toBeLessThanOrEqual(0.01);
    }
  });

  test("shards are contiguous slices that cover every sample once", () => {
    const all = [0, 1, 2, 3].flatMap((index) => shardIndices(10, { index, count: 4 }));
    expect(all).toEqual([0, 1, 2, 3, 4, 5, 6, 7, 8, 9]);
    expect(shardIndices(10, { index: 0, count: 4 })).toEqual([0, 1]);
  });
});
