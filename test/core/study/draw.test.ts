import { describe, expect, test } from "vitest";
import { drawSample } from "@onset/core";
import { elaborate, parseText } from "@onset/netlist-parser";

function tolerancesOf(text: string) {
  const { program } = parseText(text, "t.onset");
  const { circuit, diagnostics } = elaborate(program);
  expect(diagnostics.filter((d) => d.severity === "error")).toEqual([]);
  return circuit!.tolerances;
}

/** Pearson's sample correlation coefficient. */
function correlation(x: readonly number[], y: readonly number[]): number {
  const mean = (v: readonly number[]) => v.reduce((a, b) => a + b, 0) / v.length;
  const mx = mean(x);
  const my = mean(y);
  let sxy = 0;
  let sxx = 0;
  let syy = 0;
  for (let i = 0; i < x.length; i++) {
    sxy += (x[i]! - mx) * (y[i]! - my);
    sxx += (x[i]! - mx) ** 2;
    syy += (y[i]! - my) ** 2;
  }
  return sxy / Math.sqrt(sxx * syy);
}

describe("drawSample over per-use entries (param … each)", () => {
  const parts = "resistor R1 a gnd (R)\nresistor R2 a gnd (R)\nvsource V1 a gnd 1\n";

  test("a shared parameter is one draw; each use of an `each` parameter draws independently (correlation ≈ 0)", () => {
    const shared = tolerancesOf(`param R = 10k±1%\n${parts}`);
    expect(shared.map((t) => t.target)).toEqual(["R"]);
    const each = tolerancesOf(`param R = 10k±1% each\n${parts}`);
    expect(each.map((t) => t.target)).toEqual(["R@R1", "R@R2"]);
    const n = 4000;
    const r1: number[] = [];
    const r2: number[] = [];
    for (let i = 0; i < n; i++) {
      const d = drawSample(each, 7, i, "uniform");
      r1.push(d["R@R1"]!);
      r2.push(d["R@R2"]!);
    }
    // Independent draws have correlation 0; the sample estimate's standard error is about 1/√n
    // (mathematics), so |r| stays well inside 4/√n.
    expect(Math.abs(correlation(r1, r2))).toBeLessThan(4 / Math.sqrt(n));
    // Uniform over ±1 %: the variance of each is (0.01·10k)²/3 (mathematics).
    const variance = r1.reduce((a, v) => a + (v - 10e3) ** 2, 0) / n;
    expect(variance / (100 ** 2 / 3)).toBeCloseTo(1, 1);
  });

  test("the draws depend on (seed, index) alone, so a sample reproduces", () => {
    const each = tolerancesOf(`param R = 10k±1% each\n${parts}`);
    expect(drawSample(each, 3, 41, "normal")).toEqual(drawSample(each, 3, 41, "normal"));
    expect(drawSample(each, 3, 41, "normal")).not.toEqual(drawSample(each, 3, 42, "normal"));
  });
});
