import { describe, expect, test } from "vitest";
import { DEFAULT_TOLERANCES, THERMAL_VOLTAGE } from "@onset/core";
import { buildSystem, NewtonSolver, solveBias } from "@onset/core/engine";
import { circuit, part } from "../../support/circuits.js";

function bias(c: ReturnType<typeof circuit>) {
  const system = buildSystem(c);
  const solver = new NewtonSolver(system, DEFAULT_TOLERANCES);
  const point = solveBias(system, solver);
  const at = (node: string) => point.x[system.nodeIndex.get(node)!]!;
  return { system, point, at };
}

describe("bias point", () => {
  test("thermal voltage at 300.15 K is 25.8649 mV (docs/references.md §7, SI 2019 exact k and e)", () => {
    expect(THERMAL_VOLTAGE).toBeCloseTo(25.8649e-3, 7);
  });

  test("diode + resistor: I = 4.307112168 mA, V_D = 0.692887832 V (docs/references.md §7, Lambert W closed form)", () => {
    const { at, point } = bias(
      circuit([
        part("vsource", "V1", ["in", "gnd"], 5),
        part("resistor", "R1", ["in", "a"], 1e3),
        part("diode", "D1", ["a", "gnd"], undefined, { saturation: 1e-14, emission: 1, series: 0 }),
      ]),
    );
    // The junction leak (1e-12 S) shifts the current by under 1e-12 A, far below the digits checked.
    expect(at("a")).toBeCloseTo(0.692887832, 8);
    expect((5 - at("a")) / 1e3).toBeCloseTo(4.307112168e-3, 11);
    // Junction-voltage limiting keeps plain Newton from 0 V in a few tens of iterations (docs/references.md §7: 12).
    expect(point.method).toBe("newton");
    expect(point.iterations).toBeLessThan(40);
  });

  test("resistive divider with a VCVS and a VCCS matches nodal analysis by hand", () => {
    // in = 2 V; m = in/2 = 1 V; VCVS: o = 3·m = 3 V; VCCS injects 2 mA/V · m into node k through 1 kΩ: k = −2 V
    const { at } = bias(
      circuit([
        part("vsource", "V1", ["in", "gnd"], 2),
        part("resistor", "R1", ["in", "m"], 1e3),
        part("resistor", "R2", ["m", "gnd"], 1e3),
        part("vcvs", "E1", ["o", "gnd", "m", "gnd"], 3),
        part("resistor", "RL", ["o", "gnd"], 10e3),
        part("vccs", "G1", ["k", "gnd", "m", "gnd"], 2e-3),
        part("resistor", "Rk", ["k", "gnd"], 1e3),
      ]),
    );
    expect(at("m")).toBeCloseTo(1, 12);
    expect(at("o")).toBeCloseTo(3, 12);
    expect(at("k")).toBeCloseTo(-2, 12);
  });

  test("an inductor is a short and a capacitor open at DC", () => {
    const { at } = bias(
      circuit([
        part("vsource", "V1", ["in", "gnd"], 1),
        part("inductor", "L1", ["in", "a"], 1e-3, { series: 0 }),
        part("resistor", "R1", ["a", "gnd"], 100),
        part("capacitor", "C1", ["a", "b"], 1e-6),
        part("resistor", "R2", ["b", "gnd"], 100),
      ]),
    );
    expect(at("a")).toBeCloseTo(1, 12);
    expect(at("b")).toBeCloseTo(0, 12);
  });
});
